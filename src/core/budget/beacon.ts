/**
 * BEACONSHARE: the share of a channel's airtime that beacons take, with a
 * default beacon size built element by element for the AP.
 */
import { finiteNumber, isMissing } from "../args";
import { AirtallyError, invalid } from "../errors";
import type { BandGHz } from "../link";
import { edcaParameters } from "../mac/index";
import { asLink, txtimeUs } from "../phy/index";
import type { Bytes, Microseconds, Share } from "../units";
import { atMost, optionalNumber, wholeNonNegative } from "../rf/_lib";

/** TU, the time unit of beacon intervals: 1024 µs (IEEE 802.11-2020 3.1, definition of time unit). */
export const TU_us: Microseconds = 1024;

/** Catalog default beacon interval, 100 TU (DESIGN.md §2; dot11BeaconPeriod's usual value — common practice). */
export const DEFAULT_INTERVAL_TU = 100;

/** The Beacon Interval field is 2 octets, in TU (IEEE 802.11-2020 9.4.1.3). */
const BEACON_INTERVAL_MAX_TU = 0xffff;

/** The PHY families an AP may support, oldest first; an element applies from the family that defines it on. */
export type BeaconApFamily = "non-HT" | "HT" | "VHT" | "HE" | "EHT";
const AP_FAMILIES: readonly BeaconApFamily[] = ["non-HT", "HT", "VHT", "HE", "EHT"];

/** One part of a beacon MPDU: its size in octets (for an element, the 2-octet Element ID and Length included). */
export interface BeaconElement {
  readonly name: string;
  /** Where the standard defines it. */
  readonly clause: string;
  readonly octets: Bytes;
  /** The bands in which a typical AP sends it. */
  readonly bands: readonly BandGHz[];
  /** The first PHY family whose AP sends it. */
  readonly from: BeaconApFamily;
}

const ALL: readonly BandGHz[] = [2.4, 5, 6];
/** Element ID + Length, octets (IEEE 802.11-2020 9.4.2.1); an extension element adds its Element ID Extension octet. */
const ELEMENT_HEADER_octets = 2;
const EXTENSION_ID_octets = 1;

function element(name: string, clause: string, bodyOctets: Bytes, bands: readonly BandGHz[], from: BeaconApFamily): BeaconElement {
  return { name, clause, octets: ELEMENT_HEADER_octets + bodyOctets, bands, from };
}
function extension(name: string, clause: string, bodyOctets: Bytes, bands: readonly BandGHz[], from: BeaconApFamily): BeaconElement {
  return element(name, clause, EXTENSION_ID_octets + bodyOctets, bands, from);
}

/**
 * The beacon of a typical AP, part by part (vendor-neutral: only elements
 * the standard defines; no vendor-specific element is counted). Sizes are
 * the standard's field lengths; clause numbers of IEEE 802.11-2020 unless
 * an amendment is named; 802.11ax-2021 and 802.11be-2024 clause numbers and
 * the EHT field lengths are from memory. Where a size depends on the AP's
 * configuration, the choice is stated:
 * - SSID of 32 octets, the maximum (so short SSIDs only shorten the beacon);
 * - Supported Rates: eight rates (5/6 GHz: 6…54 Mb/s; 2.4 GHz: 1, 2, 5.5,
 *   11, 6, 9, 12, 18) and at 2.4 GHz the other four ERP rates in Extended
 *   Supported Rates; at 6 GHz one BSS membership selector (SAE hash-to-element
 *   only, which WPA3 in 6 GHz requires; from memory) in Extended Supported Rates;
 * - TIM with a 1-octet partial virtual bitmap (no buffered traffic);
 * - Country with one subband triplet;
 * - RSN: version, group and one pairwise cipher (CCMP-128), one AKM (SAE),
 *   RSN Capabilities — 20 octets of body;
 * - Extended Capabilities of 8 octets (the length APs commonly use — common practice);
 * - HE Capabilities without PPE Thresholds, with the 160 MHz HE-MCS map at
 *   5 and 6 GHz (8 octets) and the ≤ 80 MHz one at 2.4 GHz (4 octets);
 * - EHT Capabilities with one 3-octet EHT-MCS map per width class (≤ 80,
 *   160, 320 MHz) the band allows; EHT Operation with its EHT Operation
 *   Information (3 octets) only at 6 GHz, where a 320 MHz BSS needs it;
 * - one Basic Multi-Link element with the common info only (an EHT AP
 *   affiliated with an AP MLD — the usual EHT deployment; our choice).
 * - the AP is one of three affiliated with a tri-band AP MLD: a Reduced
 *   Neighbor Report lists the other two; it schedules uplink OFDMA (MU EDCA
 *   Parameter Set) and uses spatial reuse; it advertises radio measurement;
 *   at 5 GHz it sends Power Constraint (TPC), at 6 GHz two Transmit Power
 *   Envelope elements.
 * Not counted (configuration-dependent, add them to beacon_bytes): TPC
 * Report, Quiet, Channel Switch, BSS Load, Multiple BSSID, Mobility Domain,
 * PPE Thresholds, per-link Multi-Link profiles and every vendor-specific
 * element (APs commonly add several — a QoS parameter element of their
 * vendor among them — common practice): a beacon captured from the AP itself
 * is the better beacon_bytes.
 */
export const BEACON_PARTS: readonly BeaconElement[] = [
  // MAC header of a management frame: Frame Control 2, Duration 2, Addresses 3 × 6, Sequence Control 2 (9.3.3.2).
  { name: "MAC header", clause: "9.3.3.2", octets: 2 + 2 + 3 * 6 + 2, bands: ALL, from: "non-HT" },
  // Fixed fields of the Beacon frame body: Timestamp 8 (9.4.1.10), Beacon Interval 2 (9.4.1.3), Capability Information 2 (9.4.1.4).
  { name: "Timestamp, Beacon Interval, Capability Information", clause: "9.3.3.2, 9.4.1.10, 9.4.1.3, 9.4.1.4", octets: 8 + 2 + 2, bands: ALL, from: "non-HT" },
  element("SSID (32 octets)", "9.4.2.2", 32, ALL, "non-HT"),
  element("Supported Rates and BSS Membership Selectors (8 rates)", "9.4.2.3", 8, ALL, "non-HT"),
  // DSSS Parameter Set: Current Channel, 1 octet; sent by DSSS/HR-DSSS/ERP BSSs (2.4 GHz).
  element("DSSS Parameter Set", "9.4.2.4", 1, [2.4], "non-HT"),
  // TIM: DTIM Count 1, DTIM Period 1, Bitmap Control 1, Partial Virtual Bitmap 1 (its shortest).
  element("TIM", "9.4.2.5", 1 + 1 + 1 + 1, ALL, "non-HT"),
  // Country: Country String 3 + one subband triplet 3 (even length, no pad).
  element("Country (one triplet)", "9.4.2.8", 3 + 3, ALL, "non-HT"),
  // ERP: one octet of ERP parameters (Clause 18 BSSs at 2.4 GHz).
  element("ERP", "9.4.2.11", 1, [2.4], "non-HT"),
  element("Extended Supported Rates (4 ERP rates)", "9.4.2.12", 4, [2.4], "non-HT"),
  element("Extended Supported Rates (SAE hash-to-element selector)", "9.4.2.12", 1, [6], "non-HT"),
  // RSN: Version 2, Group Data Cipher Suite 4, Pairwise Count 2 + 1 suite 4, AKM Count 2 + 1 suite 4, RSN Capabilities 2.
  element("RSN (CCMP-128, SAE)", "9.4.2.24", 2 + 4 + 2 + 4 + 2 + 4 + 2, ALL, "non-HT"),
  element("Extended Capabilities (8 octets)", "9.4.2.26", 8, ALL, "non-HT"),
  // EDCA Parameter Set: QoS Info 1, Update EDCA Info 1, four AC parameter records of 4 (9.4.2.28).
  element("EDCA Parameter Set", "9.4.2.28", 1 + 1 + 4 * 4, ALL, "HT"),
  // Power Constraint: Local Power Constraint 1 octet; sent where transmit power control applies in the 5 GHz band
  // (spectrum management, 11.8; dot11SpectrumManagementRequired in regulatory domains that ask for TPC — from memory).
  element("Power Constraint", "9.4.2.13", 1, [5], "non-HT"),
  // RM Enabled Capabilities: 5 octets of capability bits (radio measurement, 11.10), which enterprise APs advertise
  // for neighbor reports and beacon reports (common practice).
  element("RM Enabled Capabilities", "9.4.2.43", 5, ALL, "non-HT"),
  // Transmit Power Envelope, 6 GHz: an AP in the 6 GHz band sends it (802.11ax-2021 26.17.2, from memory). Two
  // elements: local maximum EIRP (Transmit Power Information 1 + one value per width 20/40/80/160 MHz = 4) and
  // local maximum EIRP PSD (Transmit Power Information 1 + eight 20 MHz subchannel values of a 160 MHz BSS = 8).
  element("Transmit Power Envelope (EIRP, 4 widths)", "9.4.2.161", 1 + 4, [6], "HE"),
  element("Transmit Power Envelope (PSD, 8 subchannels)", "9.4.2.161", 1 + 8, [6], "HE"),
  // HT Capabilities: HT Capability Information 2, A-MPDU Parameters 1, Supported MCS Set 16, HT Extended Capabilities 2,
  // Transmit Beamforming Capabilities 4, ASEL Capability 1 = 26. Not sent in the 6 GHz band (802.11ax-2021 26.17, from memory).
  element("HT Capabilities", "9.4.2.55", 2 + 1 + 16 + 2 + 4 + 1, [2.4, 5], "HT"),
  // HT Operation: Primary Channel 1, HT Operation Information 5, Basic HT-MCS Set 16 = 22.
  element("HT Operation", "9.4.2.56", 1 + 5 + 16, [2.4, 5], "HT"),
  // VHT Capabilities: VHT Capabilities Information 4, Supported VHT-MCS and NSS Set 8 = 12 (5 GHz only).
  element("VHT Capabilities", "9.4.2.157", 4 + 8, [5], "VHT"),
  // VHT Operation: VHT Operation Information 3, Basic VHT-MCS and NSS Set 2 = 5.
  element("VHT Operation", "9.4.2.158", 3 + 2, [5], "VHT"),
  // HE Capabilities: HE MAC Capabilities Information 6, HE PHY Capabilities Information 11, Supported HE-MCS And NSS Set
  // 4 (≤ 80 MHz) or 8 (with 160 MHz); no PPE Thresholds.
  extension("HE Capabilities (≤ 80 MHz MCS map)", "802.11ax-2021 9.4.2.248", 6 + 11 + 4, [2.4], "HE"),
  extension("HE Capabilities (with the 160 MHz MCS map)", "802.11ax-2021 9.4.2.248", 6 + 11 + 8, [5, 6], "HE"),
  // HE Operation: HE Operation Parameters 3, BSS Color Information 1, Basic HE-MCS And NSS Set 2; at 6 GHz also the
  // 6 GHz Operation Information 5 (Primary Channel, Control, CCFS0, CCFS1, Minimum Rate).
  extension("HE Operation", "802.11ax-2021 9.4.2.249", 3 + 1 + 2, [2.4, 5], "HE"),
  extension("HE Operation (with 6 GHz Operation Information)", "802.11ax-2021 9.4.2.249", 3 + 1 + 2 + 5, [6], "HE"),
  // HE 6 GHz Band Capabilities: Capabilities Information 2 (6 GHz only, in place of HT Capabilities).
  extension("HE 6 GHz Band Capabilities", "802.11ax-2021 9.4.2.263", 2, [6], "HE"),
  // EHT Capabilities: EHT MAC Capabilities Information 2, EHT PHY Capabilities Information 9, Supported EHT-MCS And NSS
  // Set 3 per width class (≤ 80 MHz; 160 MHz at 5 and 6 GHz; 320 MHz at 6 GHz); no EHT PPE Thresholds.
  extension("EHT Capabilities (≤ 80 MHz MCS map)", "802.11be-2024 9.4.2.313", 2 + 9 + 3, [2.4], "EHT"),
  extension("EHT Capabilities (≤ 80 and 160 MHz MCS maps)", "802.11be-2024 9.4.2.313", 2 + 9 + 3 + 3, [5], "EHT"),
  extension("EHT Capabilities (≤ 80, 160 and 320 MHz MCS maps)", "802.11be-2024 9.4.2.313", 2 + 9 + 3 + 3 + 3, [6], "EHT"),
  // EHT Operation: EHT Operation Parameters 1, Basic EHT-MCS And NSS Set 4; at 6 GHz also EHT Operation Information
  // 3 (Control, CCFS0, CCFS1) for a 320 MHz BSS.
  extension("EHT Operation", "802.11be-2024 9.4.2.311", 1 + 4, [2.4, 5], "EHT"),
  extension("EHT Operation (with EHT Operation Information)", "802.11be-2024 9.4.2.311", 1 + 4 + 3, [6], "EHT"),
  // Basic Multi-Link: Multi-Link Control 2, Common Info: Length 1, AP MLD MAC Address 6, Link ID Info 1,
  // BSS Parameters Change Count 1, MLD Capabilities and Operations 2.
  extension("Basic Multi-Link (common info)", "802.11be-2024 9.4.2.312", 2 + 1 + 6 + 1 + 1 + 2, ALL, "EHT"),
  // Reduced Neighbor Report: the other two APs of a tri-band AP MLD (2.4, 5 and 6 GHz links — our choice of the usual
  // EHT deployment). Per Neighbor AP Information field: TBTT Information Header 2, Operating Class 1, Channel
  // Number 1, one TBTT Information field of 16 (Neighbor AP TBTT Offset 1, BSSID 6, Short SSID 4, BSS Parameters 1,
  // 20 MHz PSD 1, MLD Parameters 3) = 20 octets (9.4.2.170; the MLD Parameters subfield 802.11be-2024, from memory).
  element("Reduced Neighbor Report (2 affiliated APs)", "9.4.2.170", 2 * (2 + 1 + 1 + 16), ALL, "EHT"),
  // MU EDCA Parameter Set: QoS Info 1 + four MU AC parameter records of 3 (ECWmin/ECWmax 1, AIFSN/ACI 1, MU EDCA
  // Timer 1); sent by an AP that schedules uplink OFDMA (802.11ax-2021 9.4.2.251, from memory).
  extension("MU EDCA Parameter Set", "802.11ax-2021 9.4.2.251", 1 + 4 * 3, ALL, "HE"),
  // Spatial Reuse Parameter Set: SR Control 1 and Non-SRG OBSS PD Max Offset 1 (802.11ax-2021 9.4.2.252, from memory).
  extension("Spatial Reuse Parameter Set", "802.11ax-2021 9.4.2.252", 1 + 1, ALL, "HE"),
  { name: "FCS", clause: "9.2.4.8", octets: 4, bands: ALL, from: "non-HT" },
];

/** The parts of a typical beacon of an AP of `family` in `band`. */
export function beaconParts(bandGHz: BandGHz, family: BeaconApFamily = "EHT"): BeaconElement[] {
  const newest = AP_FAMILIES.indexOf(family);
  return BEACON_PARTS.filter((p) => p.bands.includes(bandGHz) && AP_FAMILIES.indexOf(p.from) <= newest);
}

/**
 * The default beacon, octets: the whole MPDU (header to FCS) of a typical
 * AP of the band's newest family (EHT in every band, DESIGN.md §2), summed
 * part by part from BEACON_PARTS.
 *
 * Example: defaultBeaconBytes(5) → 24 + 12 + 34 + 10 + 6 + 8 + 22 + 10 + 20 + 3 + 7 + 28 + 24 + 14 + 7 + 28 + 9 + 20 + 8 + 16 + 42 + 16 + 5 + 4 = 377
 * (2.4 GHz: 358, 6 GHz: 338 — no HT or VHT elements there).
 */
export function defaultBeaconBytes(bandGHz: BandGHz, family: BeaconApFamily = "EHT"): Bytes {
  let sum = 0;
  for (const p of beaconParts(bandGHz, family)) sum += p.octets;
  return sum;
}

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
 * BEACONSHARE: share of the channel's airtime spent on beacons, 0..1 (may
 * exceed 1 when beacons alone would need more than the channel; never clamped).
 *
 *   share = ssids × aps_heard × (AIFS + mean backoff + TXTIME(beacon_link, beacon_bytes)) ÷ (interval_tu × 1024 µs)
 *
 * `beacon_link` is the link the AP sends beacons on — commonly its lowest
 * basic rate (e.g. "OFDM 6Mbps 5GHz"); its band picks the default beacon
 * (defaultBeaconBytes). Each SSID is its own BSS and sends its own beacon
 * every interval; every AP heard on the channel (the own AP included) costs
 * the same. `beacon_bytes` is the whole beacon MPDU, MAC header and FCS
 * included (the PSDU).
 *
 * Example: beaconShare("OFDM 6Mbps 5GHz", 4, 3) → 12 beacons × (25 + 13.5 + TXTIME of 377 octets) ÷ 102 400 µs.
 */
export function beaconShare(
  beaconLink: unknown,
  ssids: unknown,
  apsHeard?: unknown,
  beaconBytes?: unknown,
  intervalTu?: unknown,
): Share {
  const link = asBeaconArguments(() => asLink(beaconLink));
  // Guards: more SSIDs per radio or more APs on one channel than any site has keep the share finite.
  const nSsids = atMost("ssids", wholeNonNegative("ssids", finiteNumber("ssids", ssids)), 1024, "");
  const nAps = atMost("aps_heard", wholeNonNegative("aps_heard", optionalNumber("aps_heard", apsHeard, 1)), 10000, "");
  const bytes = isMissing(beaconBytes) ? defaultBeaconBytes(link.bandGHz) : finiteNumber("beacon_bytes", beaconBytes);
  if (!Number.isInteger(bytes) || bytes < 1) invalid(`beacon_bytes: must be a whole number of octets, 1 or more, got ${bytes}`);
  const interval = optionalNumber("interval_tu", intervalTu, DEFAULT_INTERVAL_TU);
  if (!Number.isInteger(interval) || interval < 1 || interval > BEACON_INTERVAL_MAX_TU) {
    invalid(`interval_tu: must be a whole number of TU from 1 to ${BEACON_INTERVAL_MAX_TU}, got ${interval}`);
  }
  const perBeacon = asBeaconArguments(() => beaconAirtime(link, bytes));
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
