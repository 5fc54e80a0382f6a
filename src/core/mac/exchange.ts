/**
 * The pieces of one frame exchange shared by AGGCOUNT, ACCESS and GOODPUT:
 * the data MPDU, what the PSDU holds for n MPDUs, the response frame, the
 * protection exchange and the link's A-MSDU/A-MPDU limits. Internal module;
 * the public functions are in aggregation.ts, access.ts and goodput.ts.
 */
import { invalid } from "../errors";
import type { Family, Link } from "../link";
import type { Bytes, MbPerSecond, Microseconds } from "../units";
import { asLink, maxPsduBytes, txtimeUs } from "../phy";
import { parseMacOptions, type MacOptions } from "./options";
import { edcaFor, parseAccess, parseProtection, type AccessCategory, type EdcaParameters, type Protection } from "./edca";
import {
  ACK_octets,
  AMPDU_DELIMITER_octets,
  BLOCK_ACK_REQ_octets,
  CTS_octets,
  RTS_octets,
  ampduLength,
  blockAckBytes,
  checkPacketBytes,
  dataMpduBytes,
  payloadBytes,
} from "./frames";
import { controlLinkText, controlRateMbps } from "./response";

/** Families that carry A-MPDUs and block ack (HT and later). */
const AGGREGATING: readonly Family[] = ["HT", "VHT", "HE", "EHT"];
/** Families whose PPDU always carries an A-MPDU, a lone MPDU as an S-MPDU with its delimiter (VHT 10.12.? , HE, EHT; from memory). */
const ALWAYS_AMPDU: readonly Family[] = ["VHT", "HE", "EHT"];

/** Default block ack window (DESIGN.md §2): 64 HT/VHT, 256 HE, 1024 EHT — also each family's largest. */
export function baWindowMax(family: Family): number {
  return family === "EHT" ? 1024 : family === "HE" ? 256 : 64;
}

/**
 * Largest A-MPDU length exponent e (length 2^(13+e) − 1), all from memory:
 * HT 3 (65 535, HT Capabilities 9.4.2.55.3); VHT 7 (1 048 575, 9.4.2.157.2);
 * HE adds a 2-bit extension to the HT (2.4 GHz) or VHT exponent
 * (802.11ax-2021 9.4.2.248.2): 2.4 GHz up to 2^19 − 1, 5/6 GHz up to
 * 2^23 − 1; EHT adds one more bit at 5/6 GHz (802.11be-2024), 2^24 − 1.
 * Every length is also capped by the PHY's largest PSDU (e.g. HE 6 500 631).
 */
export function ampduExponentMax(link: Link): number {
  switch (link.family) {
    case "HT":
      return 3;
    case "VHT":
      return 7;
    case "HE":
      return link.bandGHz === 2.4 ? 6 : 10;
    case "EHT":
      return link.bandGHz === 2.4 ? 6 : 11;
    default:
      return 0;
  }
}

/**
 * Largest A-MSDU (HT Capabilities Maximum A-MSDU Length 3839 or 7935 octets,
 * 9.4.2.55.2) for HT and for HE at 2.4 GHz (from memory), and the largest
 * MPDU (VHT Capabilities Maximum MPDU Length 3895, 7991 or 11 454 octets,
 * 9.4.2.157.2) for VHT and for HE/EHT at 5/6 GHz. The largest of each is
 * assumed advertised.
 */
const HT_AMSDU_MAX_octets: Bytes = 7935;
const VHT_MPDU_MAX_octets: Bytes = 11454;
/** An HT A-MPDU delimiter's MPDU Length field has 12 bits, so an MPDU inside an HT A-MPDU is at most 4095 octets (9.7.1). */
const HT_AMPDU_MPDU_MAX_octets: Bytes = 2 ** 12 - 1;

export interface ExchangeContext {
  readonly link: Link;
  readonly options: MacOptions;
  readonly access: AccessCategory;
  readonly protection: Protection;
  readonly edca: EdcaParameters;
  readonly packetBytes: Bytes;
  readonly mpduBytes: Bytes;
  readonly msdusPerMpdu: number;
  /** A-MPDU with block ack is possible (HT and later, under EDCA). */
  readonly aggregates: boolean;
  readonly baWindow: number;
  readonly maxAmpduBytes: Bytes;
  readonly controlRateMbps: MbPerSecond;
  readonly controlLink: string;
  readonly rtsUs: Microseconds;
  readonly ctsUs: Microseconds;
  readonly protectionUs: Microseconds;
}

function checkAmsdu(link: Link, options: MacOptions, packet: Bytes, mpdu: Bytes, access: AccessCategory): void {
  if (options.amsdu === 1) return;
  if (!AGGREGATING.includes(link.family)) {
    invalid(`mac_options: AMSDU=${options.amsdu} needs HT or later (A-MSDU limits are set by HT/VHT capabilities); ${link.family} carries one MSDU per MPDU — drop AMSDU=`);
  }
  if (access === "DCF") invalid(`mac_options: AMSDU=${options.amsdu} needs QoS Data frames (the A-MSDU Present bit is in QoS Control); DCF sends non-QoS data — drop AMSDU= or choose BK, BE, VI or VO`);
  const htLimits = link.family === "HT" || (link.family === "HE" && link.bandGHz === 2.4);
  if (htLimits) {
    const amsdu = payloadBytes(packet, options);
    if (amsdu > HT_AMSDU_MAX_octets) {
      invalid(`mac_options: AMSDU=${options.amsdu} of ${packet}-octet packets makes a ${amsdu}-octet A-MSDU, over the ${link.family}${link.family === "HE" ? " 2.4 GHz" : ""} maximum of ${HT_AMSDU_MAX_octets} octets; use fewer MSDUs`);
    }
  } else if (mpdu > VHT_MPDU_MAX_octets) {
    invalid(`mac_options: AMSDU=${options.amsdu} of ${packet}-octet packets makes a ${mpdu}-octet MPDU, over the ${link.family} maximum MPDU of ${VHT_MPDU_MAX_octets} octets; use fewer MSDUs`);
  }
}

function checkFamilyOptions(link: Link, options: MacOptions, access: AccessCategory): void {
  const aggregating = AGGREGATING.includes(link.family);
  if (options.htc && (!aggregating || access === "DCF")) {
    invalid(`mac_options: HTC (HT Control field) needs HT or later and QoS Data frames; drop HTC for ${access === "DCF" ? "DCF" : link.family}`);
  }
  if (options.blockAckReq) {
    if (!aggregating) invalid(`mac_options: BAR (BlockAckReq recovery) needs block ack, HT or later; ${link.family} has none — drop BAR`);
    if (access === "DCF") invalid(`mac_options: BAR (BlockAckReq recovery) needs a block ack agreement, which DCF (non-QoS data) has not; drop BAR or choose BK, BE, VI or VO`);
  }
  if (options.baWindow !== null) {
    if (!aggregating) invalid(`mac_options: BA= needs HT or later; ${link.family} has no block ack agreement here — drop BA=`);
    const max = baWindowMax(link.family);
    if (options.baWindow > max) invalid(`mac_options: BA=${options.baWindow} is over the ${link.family} block ack window of at most ${max} MPDUs`);
  }
  if (options.ampduExponent !== null) {
    if (!aggregating) invalid(`mac_options: AMPDU= needs HT or later; ${link.family} has no A-MPDU — drop AMPDU=`);
    const max = ampduExponentMax(link);
    if (options.ampduExponent > max) invalid(`mac_options: AMPDU=${options.ampduExponent} is over the ${link.family} maximum A-MPDU length exponent ${max} at ${link.bandGHz} GHz; use 0…${max}`);
  }
}

/** Build the exchange context from the spreadsheet arguments (each checked, errors name the argument). */
export function exchangeContext(link: unknown, packetBytes: unknown, access: unknown, protection: unknown, macOptions: unknown): ExchangeContext {
  const l = asLink(link);
  const packet = checkPacketBytes(packetBytes);
  const ac = parseAccess(access);
  const prot = parseProtection(protection);
  const options = parseMacOptions(macOptions);
  checkFamilyOptions(l, options, ac);
  const edca = edcaFor(ac, l, options);
  const mpdu = dataMpduBytes(packet, options, ac !== "DCF");
  checkAmsdu(l, options, packet, mpdu, ac);
  const rate = controlRateMbps(l, options);
  const control = controlLinkText(l, rate);
  const rtsUs = prot === "RTS" ? txtimeUs(control, RTS_octets) : 0;
  const ctsUs = prot === "none" ? 0 : txtimeUs(control, CTS_octets);
  // RTS: RTS, SIFS, CTS, SIFS. CTS-to-self: CTS, SIFS. Either exchange also
  // wakes a receiver in dynamic SM power save before a multi-stream PPDU (11.2.6, from memory).
  const protectionUs = prot === "RTS" ? rtsUs + ctsUs + 2 * edca.sifsUs : prot === "CTS" ? ctsUs + edca.sifsUs : 0;
  const exponent = options.ampduExponent ?? ampduExponentMax(l);
  return {
    link: l,
    options,
    access: ac,
    protection: prot,
    edca,
    packetBytes: packet,
    mpduBytes: mpdu,
    msdusPerMpdu: options.amsdu,
    aggregates: AGGREGATING.includes(l.family) && ac !== "DCF",
    baWindow: options.baWindow ?? baWindowMax(l.family),
    maxAmpduBytes: Math.min(2 ** (13 + exponent) - 1, maxPsduBytes(l)),
    controlRateMbps: rate,
    controlLink: control,
    rtsUs,
    ctsUs,
    protectionUs,
  };
}

/** True when n MPDUs go as an A-MPDU answered by a BlockAck (n ≥ 2). */
export function usesBlockAck(n: number): boolean {
  return n >= 2;
}

/**
 * PSDU octets for n MPDUs: an A-MPDU for n ≥ 2; for n = 1 an S-MPDU (one
 * delimiter) on VHT/HE/EHT, whose PPDUs always carry an A-MPDU, and a bare
 * MPDU otherwise.
 */
export function psduBytesFor(ctx: ExchangeContext, n: number): Bytes {
  if (n >= 2) return ampduLength(ctx.mpduBytes, n);
  return ALWAYS_AMPDU.includes(ctx.link.family) ? ctx.mpduBytes + AMPDU_DELIMITER_octets : ctx.mpduBytes;
}

/** The largest MPDU the A-MPDU format admits here (HT's 12-bit delimiter length), octets. */
export function ampduMpduMax(ctx: ExchangeContext): Bytes {
  return ctx.link.family === "HT" ? HT_AMPDU_MPDU_MAX_octets : VHT_MPDU_MAX_octets;
}

export function ppduUsFor(ctx: ExchangeContext, n: number): Microseconds {
  return txtimeUs(ctx.link, psduBytesFor(ctx, n));
}

/** The response: a compressed BlockAck after an A-MPDU of 2 or more, else an Ack (also after an S-MPDU). */
export function responseBytesFor(ctx: ExchangeContext, n: number): Bytes {
  return usesBlockAck(n) ? blockAckBytes(ctx.baWindow) : ACK_octets;
}

export function responseUsFor(ctx: ExchangeContext, n: number): Microseconds {
  return txtimeUs(ctx.controlLink, responseBytesFor(ctx, n));
}

/** What the TXOP limit bounds: protection + PPDU + SIFS + response (everything after the backoff). */
export function exchangeUsFor(ctx: ExchangeContext, n: number): Microseconds {
  return ctx.protectionUs + ppduUsFor(ctx, n) + ctx.edca.sifsUs + responseUsFor(ctx, n);
}

/** The BlockAckReq recovery of `BAR` (mac_options) for n MPDUs, µs; null when not asked for or n < 2 (an Ack has no BlockAckReq). */
export interface BlockAckReqTiming {
  /** The BlockAckReq PPDU at the control rate. */
  readonly ppduUs: Microseconds;
  /** BlockAckReq + SIFS + BlockAck: the exchange once it gets the channel. */
  readonly exchangeUs: Microseconds;
}

export function blockAckReqFor(ctx: ExchangeContext, n: number): BlockAckReqTiming | null {
  if (!ctx.options.blockAckReq || !usesBlockAck(n)) return null;
  const ppduUs = txtimeUs(ctx.controlLink, BLOCK_ACK_REQ_octets);
  return { ppduUs, exchangeUs: ppduUs + ctx.edca.sifsUs + responseUsFor(ctx, n) };
}
