/**
 * Airtally's spreadsheet functions (namespace AIRTALLY). Each wrapper only
 * coerces its arguments, calls `src/core` and maps errors (DESIGN.md §1);
 * no arithmetic lives here. The JSDoc tags generate `functions.json` at build
 * time and the registration calls are appended by the metadata plugin.
 *
 * Function ids are stored in users' workbooks: never rename one; new
 * arguments go at the end.
 */
import * as core from "../core/index";
import * as mac from "../core/mac/index";
import * as contention from "../core/contention/index";
import * as rf from "../core/rf/index";
import * as budget from "../core/budget/index";
import * as mu from "../core/mu/index";
import { breakdownTable, edcaMixTable } from "../core/audit";
import { arrayCell, numberCell, textCell } from "./errors";

/**
 * IEEE 802.11 PHY families by their clause names.
 * @customenum {string}
 */
enum PhyFamily {
  /** Clause 15 direct sequence spread spectrum, 1–2 Mb/s */
  DSSS = "DSSS",
  /** Clause 16 high rate DSSS (CCK), 1–11 Mb/s */
  HR_DSSS = "HR-DSSS",
  /** Clause 17 OFDM, 5 and 6 GHz, 6–54 Mb/s */
  OFDM = "OFDM",
  /** Clause 18 ERP-OFDM, 2.4 GHz, 6–54 Mb/s */
  ERP_OFDM = "ERP-OFDM",
  /** Clause 19 HT (802.11n) */
  HT = "HT",
  /** Clause 21 VHT (802.11ac) */
  VHT = "VHT",
  /** HE (802.11ax) */
  HE = "HE",
  /** EHT (802.11be) */
  EHT = "EHT",
}

/**
 * EDCA access categories (IEEE 802.11-2020 10.2.3) and legacy DCF access.
 * @customenum {string}
 */
enum AccessCategory {
  /** Background */
  BK = "BK",
  /** Best effort (default) */
  BE = "BE",
  /** Video */
  VI = "VI",
  /** Voice */
  VO = "VO",
  /** Legacy DCF: DIFS, the PHY's CWmin/CWmax, no TXOP */
  DCF = "DCF",
}

/**
 * Protection before the data frame.
 * @customenum {string}
 */
enum ProtectionMode {
  /** No protection */
  none = "none",
  /** RTS/CTS exchange */
  RTS = "RTS",
  /** CTS-to-self */
  CTS = "CTS",
}

/**
 * How lost MPDUs of a burst are sent again.
 * @customenum {string}
 */
enum RetransmissionMode {
  /** Block ack: only the lost MPDUs go again */
  selective = "selective",
  /** No block ack: the whole burst goes again */
  whole = "whole",
}

/**
 * Canonical link text for a PHY configuration, to keep in one cell and point other formulas at.
 * @customfunction LINK
 * @param family PHY family: DSSS, HR-DSSS, OFDM, ERP-OFDM, HT, VHT, HE or EHT
 * @param mcs MCS index (HT: 0–76; VHT 0–9; HE 0–11; EHT 0–13), or the data rate in Mb/s for DSSS, HR-DSSS, OFDM and ERP-OFDM
 * @param [streams] Spatial streams (count), default 1; implied by the MCS index for HT
 * @param [width_mhz] Channel width (MHz): 20, 40, 80, 160 or 320, default 20
 * @param [gi_us] Guard interval (µs): 0.4, 0.8, 1.6 or 3.2, default 0.8
 * @param [band_ghz] Band (GHz): 2.4, 5 or 6, default 5 (2.4 for DSSS, HR-DSSS and ERP-OFDM)
 * @param [phy_options] Options text: LDPC, BCC, STBC, GF, 1xLTF/2xLTF/4xLTF, PE0/PE8/PE16, ER, RU26…RU2x996, DCM, short/long
 * @returns Link text in canonical form (text)
 * @helpurl https://localhost:3000/help/link.html
 */
export function link(
  family: PhyFamily,
  mcs: number,
  streams?: number,
  width_mhz?: number,
  gi_us?: number,
  band_ghz?: number,
  phy_options?: string,
): string {
  return textCell(() => core.buildLink(family, mcs, streams, width_mhz, gi_us, band_ghz, phy_options).text);
}

/**
 * PHY data rate of a link.
 * @customfunction RATE
 * @param link Link text, e.g. "HE MCS9 2SS 80MHz 5GHz" (text)
 * @returns PHY data rate (Mb/s)
 * @example =AIRTALLY.RATE("OFDM 54Mbps 5GHz")
 * @example =AIRTALLY.RATE("HE MCS11 1SS 80MHz GI0.8 5GHz")
 * @remarks N_SD × N_BPSCS × R × N_SS ÷ T_SYM for OFDM-based PHYs (IEEE Std 802.11-2020 Clauses 17–21; IEEE Std 802.11ax-2021; IEEE Std 802.11be-2024 MCS tables).
 * @helpurl https://localhost:3000/help/rate.html
 */
export function rate(link: string): number {
  return numberCell(() => core.rateMbps(link));
}

/**
 * PPDU duration for a PSDU, per the standard's TXTIME equation for the link's PHY.
 * @customfunction TXTIME
 * @param link Link text, e.g. "VHT MCS7 2SS 80MHz 5GHz" (text)
 * @param psdu_bytes PSDU length (bytes), 0 to the family's maximum PSDU length
 * @returns PPDU duration including preamble, padding, packet extension and 2.4 GHz signal extension (µs)
 * @helpurl https://localhost:3000/help/txtime.html
 */
export function txtime(link: string, psdu_bytes: number): number {
  return numberCell(() => core.txtimeUs(link, psdu_bytes));
}

/**
 * Largest PSDU whose TXTIME fits in a duration.
 * @customfunction PSDUFIT
 * @param link Link text (text)
 * @param duration_us Available time (µs)
 * @returns Largest PSDU length that fits (bytes); 0 if none fits
 * @helpurl https://localhost:3000/help/psdufit.html
 */
export function psdufit(link: string, duration_us: number): number {
  return numberCell(() => core.psduFit(link, duration_us));
}

/**
 * The standard's minimum input sensitivity for the link's MCS and width.
 * @customfunction SENSITIVITY
 * @param link Link text (text)
 * @returns Minimum input sensitivity (dBm)
 * @helpurl https://localhost:3000/help/sensitivity.html
 */
export function sensitivity(link: string): number {
  return numberCell(() => core.sensitivityDbm(link));
}

/**
 * The terms that make up a TXTIME, for auditing; spills two columns, total last.
 * @customfunction TXTIMEPARTS
 * @param link Link text (text)
 * @param psdu_bytes PSDU length (bytes)
 * @returns Two columns: term (with its unit) and value; the last row is TXTIME (µs)
 * @helpurl https://localhost:3000/help/txtimeparts.html
 */
export function txtimeparts(link: string, psdu_bytes: number): any[][] {
  return arrayCell(() => core.txtimeTable(link, psdu_bytes));
}

// ---------------------------------------------------------------- MAC

/**
 * MPDU length for one network-layer packet: QoS data header, LLC/SNAP, security header and MIC, FCS; A-MSDU subframes with AMSDU=n.
 * @customfunction MPDU
 * @param packet_bytes Network-layer packet, e.g. a 1500-byte IP datagram (bytes)
 * @param [mac_options] MAC settings text: CCMP-128 (default), CCMP-256, GCMP-128, GCMP-256, open; AMSDU=n; HTC; DCF (non-QoS header)
 * @returns MPDU length (bytes)
 * @example =AIRTALLY.MPDU(1500)
 * @example =AIRTALLY.MPDU(1500, "AMSDU=2 GCMP-256")
 * @remarks IEEE Std 802.11-2020 9.2 (MAC header, FCS), 9.3.2 (QoS Data), 12.5 (CCMP/GCMP header and MIC), 9.3.2.2 (A-MSDU subframes); LLC/SNAP per IEEE Std 802.2.
 * @helpurl https://localhost:3000/help/mpdu.html
 */
export function mpdu(packet_bytes: number, mac_options?: string): number {
  return numberCell(() => mac.mpduBytes(packet_bytes, mac_options));
}

/**
 * A-MPDU length: MPDU delimiters and padding to 4-byte boundaries.
 * @customfunction AMPDU
 * @param mpdu_bytes Length of each MPDU (bytes)
 * @param count MPDUs in the A-MPDU (count)
 * @returns A-MPDU length (bytes)
 * @example =AIRTALLY.AMPDU(1550, 64)
 * @remarks IEEE Std 802.11-2020 9.7 (A-MPDU format: 4-octet delimiter, subframes padded to a multiple of 4 octets except the last).
 * @helpurl https://localhost:3000/help/ampdu.html
 */
export function ampdu(mpdu_bytes: number, count: number): number {
  return numberCell(() => mac.ampduBytes(mpdu_bytes, count));
}

/**
 * MPDUs in one A-MPDU under every limit at once: block ack window, maximum A-MPDU length, maximum PPDU time and TXOP limit.
 * @customfunction AGGCOUNT
 * @param link Link text (text)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [mac_options] MAC settings text (BA=n, AMPDU=n, TXOP=n, AMSDU=n, cipher…)
 * @returns MPDUs per A-MPDU (count); 1 for families without A-MPDU
 * @example =AIRTALLY.AGGCOUNT("VHT MCS9 2SS 80MHz", 1500)
 * @example =AIRTALLY.AGGCOUNT("HT MCS7 20MHz", 1500, "VO")
 * @remarks aPPDUMaxTime 5484 µs (IEEE Std 802.11-2020 Tables 19-25 and 21-28), maximum A-MPDU length from the exponent (9.4.2.55, 9.4.2.157), TXOP limits of Table 9-155.
 * @helpurl https://localhost:3000/help/aggcount.html
 */
export function aggcount(link: string, packet_bytes: number, access?: AccessCategory, mac_options?: string): number {
  return numberCell(() => mac.aggCount(link, packet_bytes, access, mac_options));
}

/**
 * AIFS of an access category on a PHY and band: SIFS + AIFSN × slot time.
 * @customfunction AIFS
 * @param access Access category BK, BE, VI, VO or DCF
 * @param [link] Link text fixing PHY and band; default an OFDM link at 5 GHz
 * @param [mac_options] MAC settings text (AP, AIFSN=n, SLOT=9|20)
 * @returns AIFS (µs)
 * @example =AIRTALLY.AIFS("BE")
 * @example =AIRTALLY.AIFS("VO", "ERP-OFDM 54Mbps 2.4GHz")
 * @remarks AIFS[AC] = AIFSN[AC] × aSlotTime + aSIFSTime (IEEE Std 802.11-2020 10.2.3.2; default AIFSN from Table 9-155).
 * @helpurl https://localhost:3000/help/aifs.html
 */
export function aifs(access: AccessCategory, link?: string, mac_options?: string): number {
  return numberCell(() => mac.aifsUs(access, link, mac_options));
}

/**
 * Airtime of one uncontended channel access: AIFS, mean backoff, protection, PPDU, SIFS and Ack or BlockAck.
 * @customfunction ACCESS
 * @param link Link text (text)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default: AGGCOUNT)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [protection] none (default), RTS or CTS (CTS-to-self)
 * @param [mac_options] MAC settings text
 * @returns Airtime of one channel access (µs)
 * @example =AIRTALLY.ACCESS("ERP-OFDM 54Mbps 2.4GHz", 1500)
 * @example =AIRTALLY.ACCESS("HE MCS11 2SS 80MHz", 1500, "auto", "BE", "RTS")
 * @remarks Mean initial backoff CWmin ÷ 2 slots (IEEE Std 802.11-2020 10.23.2); control responses at the highest basic rate not above the data's (non-HT reference) rate (10.6.6.5). An RTS/CTS or CTS-to-self exchange in a non-HT PPDU is also what a receiver in dynamic SM power save needs to wake its extra chains (11.2.6). mac_options BAR (BlockAckReq recovery) is accepted but changes nothing here: an uncontended, lossless access misses no BlockAck; GOODPUT with loss, SATURATE, CONTENTION and EDCAMIX show the recovery.
 * @helpurl https://localhost:3000/help/access.html
 */
export function access(
  link: string,
  packet_bytes: number,
  mpdus?: any,
  access?: AccessCategory,
  protection?: ProtectionMode,
  mac_options?: string,
): number {
  return numberCell(() => mac.channelAccess(link, packet_bytes, mpdus, access, protection, mac_options).totalUs);
}

/**
 * Packet-layer goodput of one station alone on the channel, with selective retransmission of lost MPDUs.
 * @customfunction GOODPUT
 * @param link Link text (text)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [protection] none (default), RTS or CTS
 * @param [mpdu_loss] Probability that an MPDU is lost (0 to below 1), default 0
 * @param [mac_options] MAC settings text
 * @returns Goodput of packet bytes (Mb/s)
 * @example =AIRTALLY.GOODPUT("OFDM 54Mbps 5GHz", 1500)
 * @example =AIRTALLY.GOODPUT("VHT MCS9 2SS 80MHz", 1500, "auto", "BE", "none", 0.1)
 * @remarks Packet bits per access ÷ ACCESS. With block ack, lost MPDUs ride in later A-MPDUs, so (1 − p) of the MPDU slots carry new data; without A-MPDU the whole frame is sent again until acknowledged. With mac_options BAR, an A-MPDU whose MPDUs are all lost (no BlockAck, probability p^N) costs one more contended access with the doubled window carrying a BlockAckReq and its BlockAck; without BAR (default) the MPDUs go again in the next A-MPDU. Which recovery a transmitter uses is an implementation choice: a BlockAckReq after a missed BlockAck is common in many drivers, others simply resend in the next A-MPDU (common practice, from memory).
 * @remarks TCP in mac_options: the receiver's TCP acknowledgements (40-byte IP packets, one per TCPACK=n segments, default 2 — delayed ACKs, RFC 1122 4.2.3.2 and RFC 5681 4.2) each take a channel access of their own on the reverse link (same link and access category, no protection, one MPDU): goodput = 1 ÷ (1 ÷ G + ACCESS(ACK) ÷ (8 × packet_bytes × n)), G the goodput without them.
 * @helpurl https://localhost:3000/help/goodput.html
 */
export function goodput(
  link: string,
  packet_bytes: number,
  mpdus?: any,
  access?: AccessCategory,
  protection?: ProtectionMode,
  mpdu_loss?: number,
  mac_options?: string,
): number {
  return numberCell(() => mac.goodputMbps(link, packet_bytes, mpdus, access, protection, mpdu_loss, mac_options));
}

/**
 * GOODPUT as a share of the PHY data rate.
 * @customfunction EFFICIENCY
 * @param link Link text (text)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [protection] none (default), RTS or CTS
 * @param [mpdu_loss] Probability that an MPDU is lost (0 to below 1), default 0
 * @param [mac_options] MAC settings text
 * @returns GOODPUT ÷ RATE (share 0..1)
 * @example =AIRTALLY.EFFICIENCY("HT MCS7 20MHz", 1500, 1)
 * @example =AIRTALLY.EFFICIENCY("HT MCS7 20MHz", 1500)
 * @remarks Same model as GOODPUT.
 * @helpurl https://localhost:3000/help/efficiency.html
 */
export function efficiency(
  link: string,
  packet_bytes: number,
  mpdus?: any,
  access?: AccessCategory,
  protection?: ProtectionMode,
  mpdu_loss?: number,
  mac_options?: string,
): number {
  return numberCell(() => mac.efficiency(link, packet_bytes, mpdus, access, protection, mpdu_loss, mac_options));
}

/**
 * Expected PPDUs until every MPDU of a burst is delivered.
 * @customfunction RETX
 * @param mpdus MPDUs in the burst (count)
 * @param mpdu_loss Probability that an MPDU is lost (0 to below 1)
 * @param [mode] selective (block ack, default) or whole (the whole burst again)
 * @returns Expected number of PPDUs (count)
 * @example =AIRTALLY.RETX(64, 0.1)
 * @example =AIRTALLY.RETX(64, 0.1, "whole")
 * @remarks selective: E[max of N geometric counts] = Σ_{k≥0} (1 − (1 − p^k)^N); whole: 1 ÷ (1 − p)^N. Losses independent.
 * @helpurl https://localhost:3000/help/retx.html
 */
export function retx(mpdus: number, mpdu_loss: number, mode?: RetransmissionMode): number {
  return numberCell(() => mac.expectedTransmissions(mpdus, mpdu_loss, mode));
}

// ---------------------------------------------------------------- Contention

/**
 * Conditional collision probability p of Bianchi's saturation model with a finite retry limit.
 * @customfunction COLLIDE
 * @param stations Saturated stations sharing the channel (count, 1–1000)
 * @param [cwmin] CWmin (slots), default 15
 * @param [cwmax] CWmax (slots), default 1023
 * @param [retry_limit] Retry limit (count), default 7
 * @returns Collision probability of a transmission attempt (share 0..1)
 * @example =AIRTALLY.COLLIDE(10)
 * @example =AIRTALLY.COLLIDE(50, 31, 1023, 7)
 * @remarks G. Bianchi, "Performance analysis of the IEEE 802.11 distributed coordination function", IEEE JSAC 18(3), 2000, with the finite retry limit of H. Wu, Y. Peng, K. Long, S. Cheng and J. Ma, "Performance of reliable transport protocol over IEEE 802.11 wireless LAN: analysis and enhancement", IEEE INFOCOM 2002; the retry limit counts attempts, so their m is retry_limit − 1. Bianchi's count (one decrement per slot, busy or idle) is exactly the EDCA countdown of IEEE Std 802.11-2020 10.23.2.4, which also counts the slot boundary at which another station starts; SATURATE adds the DCF frozen counter and EIFS where a link gives them. Bianchi's countdown is memoryless, which small windows are not: for CWmin 3 (VO) it gives 2 stations p 0.32 where a simulation of the rules gives 0.35, as SATURATE's counter tables do; from CWmin 15 up it agrees within 0.02.
 * @helpurl https://localhost:3000/help/collide.html
 */
export function collide(stations: number, cwmin?: number, cwmax?: number, retry_limit?: number): number {
  return numberCell(() => contention.collisionProbability(stations, cwmin, cwmax, retry_limit));
}

/**
 * Aggregate goodput of identical saturated stations sharing one channel.
 * @customfunction SATURATE
 * @param link Link text (text)
 * @param stations Saturated stations (count, 1–1000)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [protection] none (default), RTS or CTS
 * @param [mac_options] MAC settings text
 * @returns Aggregate goodput of packet bytes (Mb/s)
 * @example =AIRTALLY.SATURATE("OFDM 54Mbps 5GHz", 10, 1500)
 * @example =AIRTALLY.SATURATE("HE MCS7 1SS 20MHz", 20, 1500, "auto", "BE", "RTS")
 * @example =AIRTALLY.SATURATE("HE MCS7 1SS 20MHz", 10, 1500, "auto", "BE", "none", "BAR")
 * @remarks Bianchi's backoff chain (IEEE JSAC 18(3), 2000; retry limit after Wu et al., INFOCOM 2002) on a renewal chain of the slots after each busy period, after I. Tinnirello, G. Bianchi and Y. Xiao, IEEE Trans. Vehicular Technology 59(3), 2010 (from memory): the DCF counter frozen while the medium is busy (IEEE Std 802.11-2020 10.3.4.3), the EDCA countdown that counts the boundary slot (10.23.2.4), colliders waiting their AckTimeout or CTSTimeout and the others EIFS (10.3.2.3.7). Success and collision times come from ACCESS. mac_options BAR: after a collided A-MPDU the originator sends a BlockAckReq in a channel access of its own (it can collide too; its BlockAck resets CW); the default resends the MPDUs in the next A-MPDU. Which one a transmitter uses is an implementation choice: a BlockAckReq is common in many drivers, others resend at once (common practice, from memory). After a collision every collider, not a pair, may take the slots before the others' EIFS ends. Small windows (a first window of up to 8 slots or a last of up to 16: VO and VI) are solved on the counters' own laws (the EDCAMIX model with one class), since a memoryless countdown reads them 3–12 % high. Checked against a seeded simulation of the standard's rules: within 4 % (mostly 2 %) in every case measured where it answers, 1–50 stations and beyond (contributor guide). #N/A where the model no longer holds: p above 0.95 (0.9 for VO and VI), with BAR above p 0.72 when the A-MPDU itself collides (no RTS) or above 0.5 with VO or VI windows.
 * @remarks TCP in mac_options: the receivers' TCP acknowledgements (one 40-byte packet per TCPACK=n segments, default 2) add their own uncontended channel accesses after the saturated data (as in GOODPUT); the collisions they would add are not counted, so the result is an upper bound.
 * @helpurl https://localhost:3000/help/saturate.html
 */
export function saturate(
  link: string,
  stations: number,
  packet_bytes: number,
  mpdus?: any,
  access?: AccessCategory,
  protection?: ProtectionMode,
  mac_options?: string,
): number {
  return numberCell(() => budget.saturationGoodputTcpMbps(link, stations, packet_bytes, mpdus, access, protection, mac_options));
}

/**
 * Share of airtime spent on idle backoff slots and collisions when identical stations contend.
 * @customfunction CONTENTION
 * @param link Link text (text)
 * @param stations Saturated stations (count, 1–1000)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [protection] none (default), RTS or CTS
 * @param [mac_options] MAC settings text
 * @returns Share of airtime in backoff and collisions (share 0..1)
 * @example =AIRTALLY.CONTENTION("OFDM 54Mbps 5GHz", 10, 1500)
 * @remarks Same model as SATURATE: 1 − the share of airtime in successful data exchanges (each with the AIFS after it), so idle slots, collisions with their timeouts and EIFS, and BlockAckReq exchanges (mac_options BAR) count as contention.
 * @helpurl https://localhost:3000/help/contention.html
 */
export function contentionshare(
  link: string,
  stations: number,
  packet_bytes: number,
  mpdus?: any,
  access?: AccessCategory,
  protection?: ProtectionMode,
  mac_options?: string,
): number {
  return numberCell(() => contention.contentionShare(link, stations, packet_bytes, mpdus, access, protection, budget.dataOnlyMacOptions("CONTENTION", mac_options)));
}

/**
 * Saturated stations of several access categories sharing one channel; spills one row per class.
 * @customfunction EDCAMIX
 * @param link Link text (text)
 * @param access_list Access categories, one per class: a range or text such as "VO, BE"
 * @param counts Stations per class (count), a range the same size as access_list
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default)
 * @param [protection] none (default), RTS or CTS
 * @param [mac_options] MAC settings text
 * @returns One row per class: access category, stations, aggregate goodput (Mb/s), goodput per station (Mb/s), share of airtime (0..1)
 * @example =AIRTALLY.EDCAMIX("HE MCS7 1SS 20MHz", {"VO";"BE"}, {2;8}, 1500)
 * @remarks AIFS zones after the EDCA countdown rule (IEEE Std 802.11-2020 10.23.2.4: a class counts down only from its own AIFS on, the boundary slot included), as in the zone models of J. W. Robinson and T. S. Randhawa, IEEE JSAC 22(5), 2004 (from memory), but solved over each class's counter law and the number of colliders of each class rather than with a constant attempt probability, which overstates best effort beside voice; in a mix of two classes VO and VI listeners are followed by the state before the current one (after a collision they sit higher), without which best effort beside them reads 5–14 % low. Each class keeps its own TXOP limit and aggregation; colliders wait their timeout, the others EIFS; mac_options BAR as in SATURATE. Checked against a seeded simulation of the standard's rules (limits listed in the contributor guide); answers settle to about four significant digits. #N/A where a class collides on more than 97 % of its attempts, where a class with a longer AIFS collides on more than 80 % and still carries 1.4 Mb/s or more (the model reads it up to 7 % low there; with three or more classes beyond 75 % at 0.5 Mb/s or more, 8–14 % low), with BAR and 2 or more VO (3 or more VI) stations beside other classes, or where the solution does not settle within its work limit. With one class, as SATURATE.
 * @helpurl https://localhost:3000/help/edcamix.html
 */
export function edcamix(
  link: string,
  access_list: any[][],
  counts: any[][],
  packet_bytes: number,
  mpdus?: any,
  protection?: ProtectionMode,
  mac_options?: string,
): any[][] {
  return arrayCell(() => edcaMixTable(link, access_list, counts, packet_bytes, mpdus, protection, budget.dataOnlyMacOptions("EDCAMIX", mac_options)));
}

// ---------------------------------------------------------------- RF

/**
 * Free-space path loss (Friis).
 * @customfunction FSPL
 * @param distance_m Distance, at least two wavelengths (m)
 * @param freq_mhz Frequency (MHz)
 * @returns Path loss (dB)
 * @example =AIRTALLY.FSPL(10, 5500)
 * @remarks 20 log10(4π d f ÷ c), the Friis transmission equation in free space. It holds in the antennas' far field (r ≫ λ; Balanis, Antenna Theory, §2.2.4), so distances under two wavelengths (2c ÷ f: 0.25 m at 2.4 GHz, 0.12 m at 5 GHz) are refused rather than answered with a loss near or below 0 dB.
 * @caution Planning estimate only: real paths add walls, people and multipath. A site survey, local regulations and licensed practice decide.
 * @helpurl https://localhost:3000/help/fspl.html
 */
export function fspl(distance_m: number, freq_mhz: number): number {
  return numberCell(() => rf.fsplDb(distance_m, freq_mhz));
}

/**
 * ITU-R P.1238 site-general indoor path loss.
 * @customfunction INDOORLOSS
 * @param distance_m Distance, 1 m or more (m)
 * @param freq_mhz Frequency (MHz)
 * @param [distance_power] Distance power loss coefficient N, 17 to 40 (ITU-R P.1238-7 Table 2 gives 17–33), default 30
 * @param [floors] Floors between transmitter and receiver (count), default 0
 * @param [floor_loss_db] Loss per floor (dB); omitted: the office floor penetration factor L_f(n) of ITU-R P.1238-7 Table 3 for the band
 * @param [walls] Walls between transmitter and receiver (count), default 0
 * @param [wall_loss_db] Loss per wall (dB); omitted: 3 dB up to 3 GHz, 4 dB at 5 and 6 GHz (common practice for an interior plasterboard wall)
 * @returns Path loss (dB)
 * @example =AIRTALLY.INDOORLOSS(20, 5500)
 * @example =AIRTALLY.INDOORLOSS(20, 1900, 30, 3)
 * @example =AIRTALLY.INDOORLOSS(20, 2437, 28, 1, 15)
 * @example =AIRTALLY.INDOORLOSS(20, 5500, 30, 0, , 3)
 * @example =AIRTALLY.INDOORLOSS(20, 5500, 30, 0, , 2, 10)
 * @remarks L = 20 log10 f − 28 + N log10 d + L_f(n) + walls × wall_loss_db, Recommendation ITU-R P.1238-7 (02/2012) §3.1 plus a wall term. With floor_loss_db omitted, L_f(n) is Table 3's office factor for the band (from memory of the recommendation): 1.8–2 GHz 15 + 4(n − 1) dB, 2.4 GHz 14 dB (1 floor), 5.2 GHz 16 dB (1 floor), 5.8 GHz 22 / 28 dB (1 / 2 floors; also used for 5.35–5.725 GHz, the larger loss); more floors than the table gives, or a band it lacks (6 GHz), need floor_loss_db. Given, floor_loss_db counts once per floor.
 * @remarks Walls: P.1238's N already averages the walls of a typical building, so counting walls gives a more pessimistic, wall-by-wall estimate. Loss per wall, common practice (not a standard's value), at 2.4 / 5 GHz: clear glass 2 / 3 dB, wooden door 3 / 4 dB, plasterboard 3 / 4 dB (the default), brick 6 / 10 dB, concrete block 10 / 15 dB, poured concrete 15 / 20 dB or more, metal or coated glass 20 dB or more. Real walls vary widely: a site survey decides. Above 7.125 GHz give wall_loss_db.
 * @caution Planning estimate only; a site survey, local regulations and licensed practice decide.
 * @helpurl https://localhost:3000/help/indoorloss.html
 */
export function indoorloss(
  distance_m: number,
  freq_mhz: number,
  distance_power?: number,
  floors?: number,
  floor_loss_db?: number,
  walls?: number,
  wall_loss_db?: number,
): number {
  return numberCell(() => rf.indoorLossDb(distance_m, freq_mhz, distance_power, floors, floor_loss_db, walls, wall_loss_db));
}

/**
 * Receiver noise floor: thermal noise in the channel width plus the noise figure.
 * @customfunction NOISEFLOOR
 * @param width_mhz Channel width (MHz)
 * @param [noise_figure_db] Receiver noise figure (dB), default 7
 * @returns Noise floor (dBm)
 * @example =AIRTALLY.NOISEFLOOR(20)
 * @example =AIRTALLY.NOISEFLOOR(80, 5)
 * @remarks −174 dBm/Hz (kT at 290 K) + 10 log10(width in Hz) + noise figure.
 * @helpurl https://localhost:3000/help/noisefloor.html
 */
export function noisefloor(width_mhz: number, noise_figure_db?: number): number {
  return numberCell(() => rf.noiseFloorDbm(width_mhz, noise_figure_db));
}

/**
 * Link text of the highest MCS whose minimum sensitivity plus margin is at or below a signal level.
 * @customfunction TOPLINK
 * @param family PHY family: DSSS, HR-DSSS, OFDM, ERP-OFDM, HT, VHT, HE or EHT
 * @param rssi_dbm Received signal level (dBm)
 * @param [streams] Spatial streams (count), default 1
 * @param [width_mhz] Channel width (MHz), default 20
 * @param [margin_db] Margin above the minimum sensitivity (dB), default 0
 * @param [band_ghz] Band (GHz), default the family's (5, or 2.4 for DSSS, HR-DSSS and ERP-OFDM)
 * @returns Canonical link text (text); #N/A when no MCS is reachable
 * @example =AIRTALLY.TOPLINK("VHT", -60, 2, 80)
 * @example =AIRTALLY.TOPLINK("OFDM", -75, 1, 20, 3)
 * @remarks Minimum input sensitivity tables of IEEE Std 802.11-2020 (Tables 17-18, 19-23, 21-25), 802.11ax-2021 and 802.11be-2024; real receivers are often better than these minimums.
 * @caution Planning estimate only; a site survey, local regulations and licensed practice decide.
 * @helpurl https://localhost:3000/help/toplink.html
 */
export function toplink(
  family: PhyFamily,
  rssi_dbm: number,
  streams?: number,
  width_mhz?: number,
  margin_db?: number,
  band_ghz?: number,
): string {
  return textCell(() => rf.topLink(family, rssi_dbm, streams, width_mhz, margin_db, band_ghz));
}

/**
 * Distance at which the received signal falls to a target level (inverse of INDOORLOSS).
 * @customfunction REACH
 * @param eirp_dbm EIRP of the access point as you configure it (dBm)
 * @param target_dbm Design signal level at the client (dBm)
 * @param freq_mhz Frequency (MHz)
 * @param [distance_power] Distance power loss coefficient N, 17 to 40 (ITU-R P.1238-7 Table 2 gives 17–33), default 30
 * @param [floors] Floors crossed (count), default 0
 * @param [floor_loss_db] Loss per floor (dB); omitted: the office floor penetration factor L_f(n) of ITU-R P.1238-7 Table 3 for the band
 * @param [rx_gain_dbi] Client antenna gain (dBi), default 0
 * @param [walls] Walls between transmitter and receiver (count), default 0
 * @param [wall_loss_db] Loss per wall (dB); omitted: 3 dB up to 3 GHz, 4 dB at 5 and 6 GHz (common practice for an interior plasterboard wall)
 * @returns Distance (m)
 * @example =AIRTALLY.REACH(20, -67, 5500)
 * @example =AIRTALLY.REACH(20, -67, 5200, 31, 1)
 * @example =AIRTALLY.REACH(20, -67, 5500, 30, 0, , 0, 2)
 * @remarks Solves the ITU-R P.1238-7 site-general model for d, with the same floor and wall rules as INDOORLOSS (Table 3's office L_f(n) when floor_loss_db is omitted, from memory; floors × floor_loss_db when given; walls × wall_loss_db, common-practice plasterboard loss when omitted — see INDOORLOSS for values by material; a site survey decides).
 * @caution The EIRP is the value you give; legal EIRP and channel use differ by country and RF exposure limits protect people. Planning estimate only; a site survey, local regulations and licensed practice decide.
 * @helpurl https://localhost:3000/help/reach.html
 */
export function reach(
  eirp_dbm: number,
  target_dbm: number,
  freq_mhz: number,
  distance_power?: number,
  floors?: number,
  floor_loss_db?: number,
  rx_gain_dbi?: number,
  walls?: number,
  wall_loss_db?: number,
): number {
  return numberCell(() => rf.reachM(eirp_dbm, target_dbm, freq_mhz, distance_power, floors, floor_loss_db, rx_gain_dbi, walls, wall_loss_db));
}

// ---------------------------------------------------------------- Site budget

/**
 * Access points needed to cover an area with hexagonal cells and overlap.
 * @customfunction COVERAGEAPS
 * @param area_m2 Floor area (m²)
 * @param reach_m Cell radius (m), e.g. from REACH
 * @param [overlap_share] Share of the radius given to overlap between cells, default 0.15
 * @returns Access points (count)
 * @example =AIRTALLY.COVERAGEAPS(5000, 25)
 * @remarks Access points on a hexagonal grid, each serving the regular hexagon inscribed in its circle of radius r = reach_m × (1 − overlap_share): cell area (3√3/2)·r², count ceil(area_m2 ÷ cell area), at least 1 — the hexagonal cell layout of T. S. Rappaport, "Wireless Communications: Principles and Practice", 2nd ed., 2002, §3.2 (from memory).
 * @caution Planning estimate only; walls, ceilings and furniture change coverage — a site survey decides.
 * @helpurl https://localhost:3000/help/coverageaps.html
 */
export function coverageaps(area_m2: number, reach_m: number, overlap_share?: number): number {
  return numberCell(() => budget.coverageAps(area_m2, reach_m, overlap_share));
}

/**
 * Share of a channel's airtime spent on beacons, with a default beacon built element by element.
 * @customfunction BEACONSHARE
 * @param beacon_link Link text of the beacon PPDU, commonly the lowest basic rate, e.g. "OFDM 6Mbps 5GHz"; its band picks the default beacon
 * @param ssids SSIDs per access point (count)
 * @param [aps_heard] Access points heard on the channel, the own one included (count), default 1
 * @param [beacon_bytes] Beacon MPDU length including MAC header and FCS (bytes); default: a typical EHT AP's beacon for the band (358 at 2.4 GHz, 377 at 5 GHz, 338 at 6 GHz)
 * @param [interval_tu] Beacon interval (TU of 1024 µs), default 100
 * @returns Share of airtime (share; above 1 means the beacons alone need more than the channel)
 * @example =AIRTALLY.BEACONSHARE("OFDM 6Mbps 5GHz", 4, 3)
 * @example =AIRTALLY.BEACONSHARE("ERP-OFDM 6Mbps 2.4GHz", 2, 3)
 * @example =AIRTALLY.BEACONSHARE("DSSS 1Mbps 2.4GHz", 4, 3, 350)
 * @remarks Each beacon costs the AP's AC_VO access (AIFS with the AP's AIFSN 1, i.e. PIFS, plus the mean backoff) and its TXTIME on beacon_link; no Ack follows; TU = 1024 µs (IEEE Std 802.11-2020 3.1). Share = ssids × aps_heard × airtime per beacon ÷ (interval_tu × 1024 µs).
 * @remarks Default beacon_bytes: a typical AP of the band's newest family (EHT), vendor-neutral, summed element by element; each element counts its 2-octet Element ID and Length (an extension element 1 more). MAC header 24 (IEEE Std 802.11-2020 9.3.3.2); Timestamp 8, Beacon Interval 2, Capability Information 2 (9.4.1.10, 9.4.1.3, 9.4.1.4); SSID 34, a 32-octet SSID, the maximum (9.4.2.2); Supported Rates 10, eight rates (9.4.2.3); DSSS Parameter Set 3, 2.4 GHz (9.4.2.4); TIM 6 (9.4.2.5); Country 8, one triplet (9.4.2.8); ERP 3 and Extended Supported Rates 6, 2.4 GHz (9.4.2.11, 9.4.2.12); Extended Supported Rates 3 with the SAE hash-to-element selector, 6 GHz; RSN 22 with CCMP-128 and SAE (9.4.2.24); Extended Capabilities 10 (9.4.2.26); EDCA Parameter Set 20 (9.4.2.28); Power Constraint 3, 5 GHz (9.4.2.13); RM Enabled Capabilities 7 (9.4.2.43); Transmit Power Envelope 7 + 11, 6 GHz (9.4.2.161); HT Capabilities 28 and HT Operation 24, 2.4 and 5 GHz (9.4.2.55, 9.4.2.56); VHT Capabilities 14 and VHT Operation 7, 5 GHz (9.4.2.157, 9.4.2.158); HE Capabilities 24 at 2.4 GHz, 28 at 5 and 6 GHz, no PPE Thresholds (IEEE Std 802.11ax-2021 9.4.2.248); HE Operation 9, 14 at 6 GHz (9.4.2.249); HE 6 GHz Band Capabilities 5, 6 GHz (9.4.2.263); EHT Capabilities 17, 20, 23 at 2.4, 5, 6 GHz (IEEE Std 802.11be-2024 9.4.2.313); EHT Operation 8, 11 at 6 GHz (9.4.2.311); Basic Multi-Link 16, common info only (9.4.2.312); Reduced Neighbor Report 42 for the two other APs of a tri-band AP MLD (9.4.2.170); MU EDCA Parameter Set 16 and Spatial Reuse Parameter Set 5 (IEEE Std 802.11ax-2021 9.4.2.251, 9.4.2.252); FCS 4. Totals 358 octets at 2.4 GHz, 377 at 5 GHz, 338 at 6 GHz. Vendor-specific elements are not counted (APs commonly add several): a beacon captured from the AP itself is the better beacon_bytes. The amendments' clause numbers and the EHT field lengths are from memory.
 * @remarks Not counted, because they depend on the configuration (add them to beacon_bytes): vendor-specific elements, Power Constraint, TPC Report, BSS Load, Multiple BSSID, Reduced Neighbor Report, Transmit Power Envelope, MU EDCA and Spatial Reuse Parameter Sets, PPE Thresholds and per-link multi-link profiles.
 * @helpurl https://localhost:3000/help/beaconshare.html
 */
export function beaconshare(beacon_link: string, ssids: number, aps_heard?: number, beacon_bytes?: number, interval_tu?: number): number {
  return numberCell(() => budget.beaconShare(beacon_link, ssids, aps_heard, beacon_bytes, interval_tu));
}

/**
 * Share of airtime one client needs to carry its demand.
 * @customfunction CLIENTSHARE
 * @param link Link text of the client (text)
 * @param demand_mbps Client demand (Mb/s)
 * @param [packet_bytes] Network-layer packet (bytes), default 1500
 * @param [stations] Contending stations (count), default 1
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [mac_options] MAC settings text
 * @param [mpdus] MPDUs per channel access (count) or "auto" (default, the aggregation limit); 1 for traffic sent one packet per access, e.g. voice
 * @returns Share of airtime (share; above 1 means more than one channel)
 * @example =AIRTALLY.CLIENTSHARE("HE MCS7 2SS 40MHz", 5)
 * @example =AIRTALLY.CLIENTSHARE("HE MCS7 2SS 40MHz", 5, 1500, 20)
 * @example =AIRTALLY.CLIENTSHARE("HE MCS7 2SS 40MHz", 0.1, 200, 1, "VO", "", 1)
 * @remarks demand ÷ GOODPUT(link, packet_bytes, mpdus, access) for one station, demand ÷ SATURATE for several (the channel's capacity in that link under contention). With mpdus = 1 every packet pays a whole channel access (AIFS, backoff, preamble, Ack), as voice does: far more airtime than the same demand in full A-MPDUs.
 * @helpurl https://localhost:3000/help/clientshare.html
 */
export function clientshare(
  link: string,
  demand_mbps: number,
  packet_bytes?: number,
  stations?: number,
  access?: AccessCategory,
  mac_options?: string,
  mpdus?: any,
): number {
  return numberCell(() => budget.clientShare(link, demand_mbps, packet_bytes, stations, access, mac_options, mpdus));
}

/**
 * Total airtime share of a client mix given as three ranges of the same size.
 * @customfunction MIXSHARE
 * @param links Link text per client class (range)
 * @param counts Clients per class (count, range)
 * @param demands_mbps Demand per client (Mb/s, range)
 * @param [packet_bytes] Network-layer packet (bytes), default 1500
 * @param [stations] Contending stations (count), default 1
 * @param [accesses] Access category per class, BK, BE, VI, VO or DCF, optionally followed by that class's MAC settings such as "BE TCP" (range the size of links; blank or omitted: BE)
 * @param [mpdus] MPDUs per channel access per class, a count or "auto" (range the size of links; blank or omitted: "auto"); 1 for voice
 * @returns Total share of airtime (share; above 1 means more than one channel)
 * @example =AIRTALLY.MIXSHARE({"HE MCS7 2SS 40MHz";"HT MCS4 20MHz 5GHz"}, {20;5}, {2;1})
 * @example =AIRTALLY.MIXSHARE({"HE MCS7 2SS 40MHz";"HE MCS7 2SS 40MHz"}, {20;10}, {2;0.1}, 1500, 1, {"BE";"VO"}, {"auto";1})
 * @remarks Σ count × CLIENTSHARE(link, demand, packet_bytes, stations, access, , mpdus) with each class's access and mpdus; blank rows are ignored.
 * @helpurl https://localhost:3000/help/mixshare.html
 */
export function mixshare(
  links: any[][],
  counts: any[][],
  demands_mbps: any[][],
  packet_bytes?: number,
  stations?: number,
  accesses?: any[][],
  mpdus?: any[][],
): number {
  return numberCell(() => budget.mixShare(links, counts, demands_mbps, packet_bytes, stations, accesses, mpdus));
}

/**
 * Radios (channels) needed to carry a total airtime share.
 * @customfunction RADIOS
 * @param total_share Total airtime share, e.g. from MIXSHARE (share)
 * @param [max_utilization] Highest planned utilization of a channel, default 0.7
 * @param [overhead_share] Share already taken by overhead such as beacons, default 0
 * @returns Radios (count)
 * @example =AIRTALLY.RADIOS(2.3)
 * @example =AIRTALLY.RADIOS(2.3, 0.7, 0.05)
 * @remarks ceil(total_share ÷ (max_utilization − overhead_share)).
 * @helpurl https://localhost:3000/help/radios.html
 */
export function radios(total_share: number, max_utilization?: number, overhead_share?: number): number {
  return numberCell(() => budget.radios(total_share, max_utilization, overhead_share));
}

// ---------------------------------------------------------------- Audit

/**
 * The components of one channel access and their airtime, for auditing; spills two columns, total last.
 * @customfunction BREAKDOWN
 * @param link Link text (text)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [mpdus] MPDUs per PPDU (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI, VO or DCF; default BE
 * @param [protection] none (default), RTS or CTS
 * @param [mac_options] MAC settings text
 * @returns Two columns: component and its airtime (µs); the last row is the total, equal to ACCESS
 * @example =AIRTALLY.BREAKDOWN("ERP-OFDM 54Mbps 2.4GHz", 1500)
 * @remarks Same terms as ACCESS (an uncontended access, so mac_options BAR adds no row: the BlockAckReq recovery appears in GOODPUT with loss, SATURATE, CONTENTION and EDCAMIX).
 * @helpurl https://localhost:3000/help/breakdown.html
 */
export function breakdown(
  link: string,
  packet_bytes: number,
  mpdus?: any,
  access?: AccessCategory,
  protection?: ProtectionMode,
  mac_options?: string,
): any[][] {
  return arrayCell(() => breakdownTable(link, packet_bytes, mpdus, access, protection, mac_options));
}

// ---------------------------------------------------------------- Multi-user (HE/EHT OFDMA)

/**
 * Direction of a multi-user exchange.
 * @customenum {string}
 */
enum MuDirection {
  /** AP to stations: MU PPDU, acknowledgements in a TB PPDU */
  down = "down",
  /** Stations to AP: Trigger, TB PPDU, Multi-STA BlockAck */
  up = "up",
}

/**
 * Airtime of one HE/EHT multi-user OFDMA exchange serving several stations at once, each on the link's resource unit.
 * @customfunction MUACCESS
 * @param link Link text of every user, with its RU, e.g. "HE MCS7 1SS 20MHz RU26 5GHz"; no RU = the whole channel, one user (text)
 * @param users Stations served in the exchange (count), 1 to the RUs of that size in the channel (9 × RU26 in 20 MHz, 37 in 80 MHz)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [direction] down (AP to stations, default) or up (stations to AP)
 * @param [mpdus] MPDUs per user (count) or "auto" (default: as many as every limit allows)
 * @param [access] Access category BK, BE, VI or VO; default BE
 * @param [mac_options] MAC settings text; MUBAR asks the downlink acknowledgements with a MU-BAR trigger
 * @returns Airtime of one multi-user exchange (µs)
 * @example =AIRTALLY.MUACCESS("HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", 1)
 * @example =AIRTALLY.MUACCESS("HE MCS7 1SS 20MHz RU26 GI1.6 5GHz", 9, 100, "up", 1)
 * @remarks down: AIFS + mean backoff + HE/EHT MU PPDU carrying each user's A-MPDU with a Basic Trigger (HE-SIG-B/EHT-SIG with one user field per user) + SIFS + the users' BlockAcks in a TB PPDU; with MUBAR, a MU-BAR trigger at the control rate and SIFS before that TB PPDU. up: AIFS + mean backoff + Basic Trigger at the control rate + SIFS + TB PPDU (HE-STF 8 µs, no HE-SIG-B, length from the trigger's UL Length) + SIFS + Multi-STA BlockAck. IEEE Std 802.11ax-2021 27.4.3 (TXTIME), 27.3.11.5 (L-SIG length), 9.3.1.22 (Trigger frame), 9.3.1.8 (BlockAck variants); IEEE Std 802.11be-2024 Clause 36. Scheduling assumptions: every user has data; equal users on equal RUs; no MU-MIMO; no random access (UORA); the AP wins the channel under its own EDCA parameters. Up needs a TB PPDU guard interval: GI1.6 (2x LTF) or GI3.2 (4x LTF).
 * @caution Planning estimate only: real schedulers differ from these assumptions; measurements and a site survey decide.
 * @helpurl https://localhost:3000/help/muaccess.html
 */
export function muaccess(
  link: string,
  users: number,
  packet_bytes: number,
  direction?: MuDirection,
  mpdus?: any,
  access?: AccessCategory,
  mac_options?: string,
): number {
  return numberCell(() => mu.muAccessUs(link, users, packet_bytes, direction, mpdus, access, mac_options));
}

/**
 * Packet-layer goodput of all the stations of one multi-user OFDMA exchange together, alone on the channel.
 * @customfunction MUGOODPUT
 * @param link Link text of every user, with its RU (text)
 * @param users Stations served in the exchange (count)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [direction] down (AP to stations, default) or up (stations to AP)
 * @param [mpdus] MPDUs per user (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI or VO; default BE
 * @param [mac_options] MAC settings text (MUBAR, BA=n, cipher…)
 * @returns Goodput of the packet bytes of all users together (Mb/s)
 * @example =AIRTALLY.MUGOODPUT("HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", 1)
 * @remarks users × MPDUs per user × packet bits ÷ MUACCESS, no loss. Compare with the same stations served one by one: GOODPUT of the whole-channel link is their aggregate then. Same scheduling assumptions as MUACCESS (every user has data; equal RUs; no MU-MIMO; no UORA).
 * @caution Planning estimate only: real schedulers differ from these assumptions; measurements and a site survey decide.
 * @helpurl https://localhost:3000/help/mugoodput.html
 */
export function mugoodput(
  link: string,
  users: number,
  packet_bytes: number,
  direction?: MuDirection,
  mpdus?: any,
  access?: AccessCategory,
  mac_options?: string,
): number {
  return numberCell(() => mu.muGoodputMbps(link, users, packet_bytes, direction, mpdus, access, mac_options));
}

/**
 * The terms of one multi-user OFDMA exchange and their airtime, for auditing; spills two columns, total last.
 * @customfunction MUBREAKDOWN
 * @param link Link text of every user, with its RU (text)
 * @param users Stations served in the exchange (count)
 * @param packet_bytes Network-layer packet (bytes)
 * @param [direction] down (AP to stations, default) or up (stations to AP)
 * @param [mpdus] MPDUs per user (count) or "auto" (default)
 * @param [access] Access category BK, BE, VI or VO; default BE
 * @param [mac_options] MAC settings text (MUBAR, BA=n, cipher…)
 * @returns Two columns: term and its airtime (µs); the last row is the total, equal to MUACCESS
 * @example =AIRTALLY.MUBREAKDOWN("HE MCS7 1SS 20MHz RU26 GI1.6 5GHz", 9, 100, "up", 1)
 * @remarks Same terms as MUACCESS, with each frame's size and rate in its label. Scheduling assumptions: every user has data; equal RUs; no MU-MIMO; no UORA.
 * @caution Planning estimate only: real schedulers differ from these assumptions; measurements and a site survey decide.
 * @helpurl https://localhost:3000/help/mubreakdown.html
 */
export function mubreakdown(
  link: string,
  users: number,
  packet_bytes: number,
  direction?: MuDirection,
  mpdus?: any,
  access?: AccessCategory,
  mac_options?: string,
): any[][] {
  return arrayCell(() => mu.muBreakdownTable(link, users, packet_bytes, direction, mpdus, access, mac_options));
}
