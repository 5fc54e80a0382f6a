/**
 * The standard's minimum sensitivity, or null where the standard gives none
 * (the PHY answers #N/A, e.g. HT unequal-modulation MCS 33–76): such a link
 * cannot be promised at any level, so it is not a candidate.
 */
function sensitivityOrNull(link: Link): Dbm | null {
  try {
    return sensitivityDbm(link);
  } catch (e) {
    if (e instanceof AirtallyError && e.kind === "na") return null;
    throw e;
  }
}

/**
 * TOPLINK: the fastest link of a PHY family that a received level supports.
 */
import { describe, finiteNumber, isMissing } from "../args";
import { AirtallyError, invalid, noAnswer } from "../errors";
import { buildLink, FAMILIES, type Family, type Link } from "../link";
import { familyModule, rateMbps, sensitivityDbm } from "../phy/index";
import type { Db, Dbm } from "../units";
import { optionalNumber } from "./_lib";

/** Rounding guard for sensitivity + margin ≤ rssi, dB (margins like 0.1 dB are not exact in binary). */
const COMPARE_TOLERANCE_dB = 1e-9;

function readFamily(family: unknown): Family {
  const fam = typeof family === "string" ? FAMILIES.find((f) => f === family.trim().toUpperCase()) : undefined;
  if (!fam) invalid(`family: expected one of ${FAMILIES.join(", ")}, got ${describe(family)}`);
  return fam;
}

/** Every link of the family at these streams/width/band that the standard allows; the first refusal explains an empty list. */
function candidateLinks(family: Family, streams: unknown, widthMHz: unknown, bandGHz: unknown): { links: Link[]; refusal: string | null } {
  const links: Link[] = [];
  let refusal: string | null = null;
  for (const mcs of familyModule(family).mcsValues) {
    try {
      // HT: the MCS index implies the streams, so passing the stream count keeps only that count's MCSs.
      links.push(buildLink(family, mcs, streams, widthMHz, null, bandGHz, null));
    } catch (e) {
      if (!(e instanceof AirtallyError) || e.kind !== "value") throw e;
      refusal ??= e.message;
    }
  }
  return { links, refusal };
}

/**
 * TOPLINK: canonical text of the highest-rate link of `family` (at the given
 * streams, width and band, default GI and options) whose minimum input
 * sensitivity from the standard's table plus `margin_db` is at or below
 * `rssi_dbm`. For non-HT families the candidates are the family's data rates;
 * for HT the MCS indices with the requested stream count; for VHT/HE/EHT the
 * per-stream MCS at that stream count. Links for which the standard gives no
 * minimum sensitivity (HT unequal modulation) are not candidates. Ties in
 * rate keep the lower MCS.
 *
 * Omitted arguments: streams 1, width 20 MHz, margin 0 dB, band the family's
 * default band of the link text (5 GHz, or 2.4 GHz for DSSS, HR-DSSS and
 * ERP-OFDM which exist only there). A negative margin is allowed (a receiver
 * known to beat the standard's minimum).
 *
 * #N/A when no allowed link is reachable at that level; #VALUE! when the
 * family has no link at all at those streams/width/band.
 *
 * Minimum sensitivity is the standard's conformance floor, not what a given
 * receiver achieves; results are planning estimates, not a replacement for a
 * site survey, and local regulations, codes and licensed practice decide.
 *
 * Example: topLink("OFDM", -70) → "OFDM 36Mbps 5GHz" (IEEE 802.11-2020
 * Table 17-18: 36 Mb/s needs −70 dBm, 48 Mb/s −66 dBm).
 */
export function topLink(
  family: unknown,
  rssiDbm: unknown,
  streams?: unknown,
  widthMHz?: unknown,
  marginDb?: unknown,
  bandGHz?: unknown,
): string {
  const fam = readFamily(family);
  const rssi: Dbm = finiteNumber("rssi_dbm", rssiDbm);
  const margin: Db = optionalNumber("margin_db", marginDb, 0);
  // Streams default to 1 explicitly: for HT an omitted count would let every index (and so 1–4 streams) compete.
  const nss = optionalNumber("streams", streams, 1);
  if (!Number.isInteger(nss) || nss < 1 || nss > 16) invalid(`streams: must be a whole number of spatial streams from 1 to 16, got ${nss}`);
  if (!isMissing(widthMHz) && ![20, 40, 80, 160, 320].includes(finiteNumber("width_mhz", widthMHz))) {
    invalid(`width_mhz: must be 20, 40, 80, 160 or 320, got ${String(widthMHz)}`);
  }
  if (!isMissing(bandGHz) && ![2.4, 5, 6].includes(finiteNumber("band_ghz", bandGHz))) {
    invalid(`band_ghz: must be 2.4, 5 or 6, got ${String(bandGHz)}`);
  }
  const { links, refusal } = candidateLinks(fam, nss, widthMHz, bandGHz);
  if (links.length === 0) {
    invalid(`family: no ${fam} link exists with these streams, width_mhz and band_ghz (${refusal ?? "no MCS defined"})`);
  }
  let best: Link | null = null;
  let bestRate = -Infinity;
  let lowestNeed = Infinity;
  for (const link of links) {
    const sensitivity = sensitivityOrNull(link);
    if (sensitivity === null) continue;
    const need = sensitivity + margin;
    lowestNeed = Math.min(lowestNeed, need);
    if (need > rssi + COMPARE_TOLERANCE_dB) continue;
    const rate = rateMbps(link);
    if (rate > bestRate) {
      best = link;
      bestRate = rate;
    }
  }
  if (!best) {
    noAnswer(`rssi_dbm: ${rssi} dBm reaches no ${fam} link here; the most robust needs ${Math.round(lowestNeed * 100) / 100} dBm (minimum sensitivity + margin_db ${margin})`);
  }
  return best.text;
}
