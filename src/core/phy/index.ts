/**
 * PHY entry points used by the spreadsheet functions and the MAC layer:
 * rate, TXTIME, largest PSDU in a duration, minimum sensitivity.
 */
import { parseLink, type Link } from "../link";
import { finiteNumber, integerInRange } from "../args";
import { invalid } from "../errors";
import { familyModule } from "./registry";
import type { TxTime } from "./types";
import type { Bytes, Dbm, MbPerSecond, Microseconds } from "../units";

export type { TxTime, TxTimeTerm, PhyFamily } from "./types";
export { familyModule } from "./registry";

/** A Link from text or an already parsed Link. */
export function asLink(link: unknown): Link {
  if (typeof link === "object" && link !== null && "family" in link && "text" in link) return link as Link;
  return parseLink(link);
}

/** PHY data rate, Mb/s. */
export function rateMbps(link: unknown): MbPerSecond {
  const l = asLink(link);
  return familyModule(l.family).rateMbps(l);
}

/** Largest PSDU of this link, octets. */
export function maxPsduBytes(link: unknown): Bytes {
  const l = asLink(link);
  return familyModule(l.family).maxPsduBytes(l);
}

/** TXTIME with its terms; psdu_bytes must be a whole number from 0 to the family's maximum PSDU length. */
export function txtime(link: unknown, psduBytes: unknown): TxTime {
  const l = asLink(link);
  const module = familyModule(l.family);
  const max = module.maxPsduBytes(l);
  if (typeof psduBytes === "number" && psduBytes > max && Number.isFinite(psduBytes)) {
    invalid(`psdu_bytes: ${psduBytes} exceeds the largest ${l.family} PSDU (${max} octets) for ${l.text}`);
  }
  const n = integerInRange("psdu_bytes", psduBytes, 0, max, "octets");
  return module.txtime(l, n);
}

/** TXTIME, µs. */
export function txtimeUs(link: unknown, psduBytes: unknown): Microseconds {
  return txtime(link, psduBytes).totalUs;
}

/**
 * Largest PSDU whose TXTIME ≤ duration_us, octets; 0 when not even an empty
 * PSDU fits. TXTIME never falls as the PSDU grows, so a binary search over
 * 0..maxPsdu is exact.
 */
export function psduFit(link: unknown, durationUs: unknown): Bytes {
  const l = asLink(link);
  const d = finiteNumber("duration_us", durationUs);
  if (d < 0) invalid(`duration_us: must be 0 or more µs, got ${d}`);
  const module = familyModule(l.family);
  let hi = module.maxPsduBytes(l);
  if (module.txtime(l, 0).totalUs > d) return 0;
  if (module.txtime(l, hi).totalUs <= d) return hi;
  let lo = 0; // invariant: txtime(lo) ≤ d < txtime(hi)
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (module.txtime(l, mid).totalUs <= d) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Minimum input sensitivity, dBm. */
export function sensitivityDbm(link: unknown): Dbm {
  const l = asLink(link);
  return familyModule(l.family).sensitivityDbm(l);
}

/** Non-HT reference rate used to choose the control response rate, Mb/s. */
export function nonHtReferenceRateMbps(link: unknown): MbPerSecond {
  const l = asLink(link);
  return familyModule(l.family).nonHtReferenceRateMbps(l);
}

/** TXTIMEPARTS rows: [label, value] for each term, then ["TXTIME (µs)", total]. */
export function txtimeTable(link: unknown, psduBytes: unknown): (string | number)[][] {
  const t = txtime(link, psduBytes);
  const rows: (string | number)[][] = t.terms.map((term) => [term.label, term.value]);
  rows.push(["TXTIME (µs)", t.totalUs]);
  return rows;
}
