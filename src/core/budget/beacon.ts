/**
 * BEACONLOAD: the share of a channel's airtime that beacons take.
 */
import { finiteNumber, isMissing } from "../args";
import { AirtallyError, invalid } from "../errors";
import { edcaParameters } from "../mac/index";
import { asLink, txtimeUs } from "../phy/index";
import type { Bytes, Microseconds, Share } from "../units";
import { atMost, optionalNumber, wholeNonNegative } from "../rf/_lib";

/** TU, the time unit of beacon intervals: 1024 µs (IEEE 802.11-2020 3.1, definition of time unit). */
export const TU_us: Microseconds = 1024;

/** Catalog defaults (DESIGN.md §2). 350 octets and 100 TU are common practice for a beacon with a few vendor elements. */
export const DEFAULT_BEACON_BYTES: Bytes = 350;
export const DEFAULT_BEACON_LINK = "OFDM 6Mbps 5GHz";
export const DEFAULT_INTERVAL_TU = 100;

/** The Beacon Interval field is 2 octets, in TU (IEEE 802.11-2020 9.4.1.3). */
const BEACON_INTERVAL_MAX_TU = 0xffff;

/**
 * The access category and EDCA parameter set a beacon is sent with: the
 * AP's AC_VO set. Our choice, stated: beacons go out through the AP's normal
 * channel access after TBTT (IEEE 802.11-2020 11.1.3.2, from memory), and
 * management frames use AC_VO when no management-frame QoS policy is in
 * force (10.2.3.2, from memory). The AP's AC_VO AIFSN of 1 makes its AIFS
 * equal to PIFS (SIFS + 1 slot).
 */
export const BEACON_ACCESS = "VO";
export const BEACON_MAC_OPTIONS = "AP";

/** One beacon's airtime and its parts, µs. */
export interface BeaconAirtime {
  /** AIFS[AC_VO] of the AP: SIFS + AIFSN × slot. */
  readonly aifsUs: Microseconds;
  /** Mean backoff: CWmin ÷ 2 slots (uniform over 0…CWmin, IEEE 802.11-2020 10.3.3). */
  readonly backoffUs: Microseconds;
  /** TXTIME of the beacon PPDU (the whole MPDU, FCS included, is the PSDU). */
  readonly txtimeUs: Microseconds;
  readonly totalUs: Microseconds;
}

/**
 * Airtime of one beacon on `beacon_link`: the AP's AIFS and mean backoff
 * before it, then its PPDU. No acknowledgement follows (group addressed).
 */
export function beaconAirtime(beaconLink: unknown, beaconBytes: Bytes): BeaconAirtime {
  const link = asLink(beaconLink);
  const edca = edcaParameters(BEACON_ACCESS, link, BEACON_MAC_OPTIONS);
  const backoffUs = (edca.cwMin / 2) * edca.slotUs;
  const ppduUs = txtimeUs(link, beaconBytes);
  return { aifsUs: edca.aifsUs, backoffUs, txtimeUs: ppduUs, totalUs: edca.aifsUs + backoffUs + ppduUs };
}

/**
 * BEACONLOAD: share of the channel's airtime spent on beacons, 0..1 (may
 * exceed 1 when beacons alone would need more than the channel; never clamped).
 *
 *   share = ssids × aps_heard × (AIFS + mean backoff + TXTIME(beacon_link, beacon_bytes)) ÷ (interval_tu × 1024 µs)
 *
 * Each SSID is its own BSS and sends its own beacon every interval; every AP
 * heard on the channel (the own AP included) costs the same. beacon_bytes is
 * the whole beacon MPDU, MAC header and FCS included (the PSDU). The beacon
 * link is the rate the AP sends beacons at — commonly its lowest basic rate.
 *
 * Example: beaconLoad(4, 3, 350, "HR-DSSS 1Mbps 2.4GHz") → 12 beacons × 3092 µs ÷ 102 400 µs = 0.362.
 */
export function beaconLoad(
  ssids: unknown,
  apsHeard?: unknown,
  beaconBytes?: unknown,
  beaconLink?: unknown,
  intervalTu?: unknown,
): Share {
  // Guards: more SSIDs per radio or more APs on one channel than any site has keep the share finite.
  const nSsids = atMost("ssids", wholeNonNegative("ssids", finiteNumber("ssids", ssids)), 1024, "");
  const nAps = atMost("aps_heard", wholeNonNegative("aps_heard", optionalNumber("aps_heard", apsHeard, 1)), 10000, "");
  const bytes = optionalNumber("beacon_bytes", beaconBytes, DEFAULT_BEACON_BYTES);
  if (!Number.isInteger(bytes) || bytes < 1) invalid(`beacon_bytes: must be a whole number of octets, 1 or more, got ${bytes}`);
  const interval = optionalNumber("interval_tu", intervalTu, DEFAULT_INTERVAL_TU);
  if (!Number.isInteger(interval) || interval < 1 || interval > BEACON_INTERVAL_MAX_TU) {
    invalid(`interval_tu: must be a whole number of TU from 1 to ${BEACON_INTERVAL_MAX_TU}, got ${interval}`);
  }
  const linkText = isMissing(beaconLink) ? DEFAULT_BEACON_LINK : beaconLink;
  const perBeacon = asBeaconArguments(() => beaconAirtime(linkText, bytes));
  return (nSsids * nAps * perBeacon.totalUs) / (interval * TU_us);
}

/** Errors from the PHY name its own arguments (link, psdu_bytes); say beacon_link and beacon_bytes instead. */
function asBeaconArguments<T>(fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (!(e instanceof AirtallyError)) throw e;
    const message = e.message.replace(/^link:/, "beacon_link:").replace(/^psdu_bytes:/, "beacon_bytes:");
    throw new AirtallyError(e.kind, message);
  }
}
