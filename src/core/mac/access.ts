/**
 * ACCESS and BREAKDOWN: the airtime of one uncontended channel access, µs,
 * with each term (DESIGN.md §2):
 *
 *   AIFS (DIFS for DCF) + mean backoff (CWmin ÷ 2 × aSlotTime)
 *   + protection: RTS + SIFS + CTS + SIFS (RTS) or CTS-to-self + SIFS (CTS)
 *   + PPDU (TXTIME of the A-MPDU, S-MPDU or MPDU)
 *   + SIFS + Ack (one MPDU) or compressed BlockAck (A-MPDU of 2 or more)
 *
 * The backoff counter is drawn uniformly from 0..CW (10.23.2.2), so its mean
 * is CWmin ÷ 2 slots for a first attempt. Control frames go at the control
 * response rate in a non-HT PPDU (response.ts). A single MPDU on HT is sent
 * bare and answered by an Ack; on VHT/HE/EHT it is an S-MPDU (one delimiter),
 * also answered by an Ack; two or more MPDUs form an A-MPDU under an
 * immediate block ack agreement, answered by a BlockAck without BlockAckReq.
 *
 *   channelAccess("ERP-OFDM 54Mbps 2.4GHz", 1500).totalUs
 *     = 37 (AIFS 10 + 3 × 9) + 67.5 (7.5 × 9) + 258 (TXTIME of 1554 octets) + 10 (SIFS) + 34 (Ack at 24 Mb/s) = 406.5
 */
import { invalid } from "../errors";
import { isMissing, quoted } from "../args";
import type { Bytes, MbPerSecond, Microseconds } from "../units";
import type { EdcaParameters, Protection } from "./edca";
import { aggregationLimit } from "./aggregation";
import { blockAckReqFor, exchangeContext, ppduUsFor, psduBytesFor, responseUsFor, usesBlockAck, type BlockAckReqTiming, type ExchangeContext } from "./exchange";

export interface AccessTerm {
  readonly label: string;
  readonly us: Microseconds;
}

export interface ChannelAccess {
  /** BREAKDOWN rows in order of transmission; the total is not among them. */
  readonly terms: readonly AccessTerm[];
  /** ACCESS: the sum of the terms, µs. */
  readonly totalUs: Microseconds;
  readonly mpdus: number;
  readonly msdusPerMpdu: number;
  readonly packetBytes: Bytes;
  readonly psduBytes: Bytes;
  readonly ppduUs: Microseconds;
  readonly responseUs: Microseconds;
  readonly protectionUs: Microseconds;
  readonly backoffUs: Microseconds;
  readonly rtsUs: Microseconds;
  readonly ctsUs: Microseconds;
  readonly controlRateMbps: MbPerSecond;
  readonly edca: EdcaParameters;
  readonly protection: Protection;
  /** `BAR`: the BlockAckReq exchange that recovers a missed BlockAck (not part of the uncontended access); null otherwise. */
  readonly blockAckReq: BlockAckReqTiming | null;
}

/** mpdus: "auto"/empty → the aggregation limit; else a whole number from 1 to that limit. */
export function resolveMpdus(ctx: ExchangeContext, mpdus: unknown): number {
  const limit = aggregationLimit(ctx);
  if (isMissing(mpdus) || (typeof mpdus === "string" && mpdus.trim().toLowerCase() === "auto")) return limit.count;
  if (typeof mpdus !== "number" || !Number.isInteger(mpdus) || mpdus < 1) {
    invalid(`mpdus: expected "auto" or a whole number of MPDUs of 1 or more, got ${typeof mpdus === "string" ? quoted(mpdus) : String(mpdus)}`);
  }
  if (mpdus > limit.count) {
    if (!ctx.aggregates) invalid(`mpdus: ${mpdus} needs an A-MPDU, but ${limit.reason} sends one MPDU per PPDU; use 1 or "auto"`);
    invalid(`mpdus: ${mpdus} is more than fit in one A-MPDU here: at most ${limit.count}, set by ${limit.reason}; use "auto" or ${limit.count} or fewer`);
  }
  return mpdus;
}

/** Sum of terms, with binary noise from fractional µs rounded away (as the PHY's TXTIME does). */
function sumUs(terms: readonly AccessTerm[]): Microseconds {
  let total = 0;
  for (const t of terms) total += t.us;
  return Math.round(total * 1e9) / 1e9;
}

/** Mean first-attempt backoff: CWmin ÷ 2 slots. */
export function meanBackoffUs(edca: EdcaParameters): Microseconds {
  return (edca.cwMin / 2) * edca.slotUs;
}

/** One channel access for a context and MPDU count. */
export function accessFor(ctx: ExchangeContext, n: number): ChannelAccess {
  const { edca } = ctx;
  const backoffUs = meanBackoffUs(edca);
  const ppduUs = ppduUsFor(ctx, n);
  const responseUs = responseUsFor(ctx, n);
  const terms: AccessTerm[] = [
    { label: edca.access === "DCF" ? "DIFS" : `AIFS[${edca.access}] (AIFSN ${edca.aifsn})`, us: edca.aifsUs },
    { label: `mean backoff (CWmin ${edca.cwMin} ÷ 2 × ${edca.slotUs} µs slot)`, us: backoffUs },
  ];
  if (ctx.protection === "RTS") {
    terms.push({ label: `RTS (${ctx.controlRateMbps} Mb/s)`, us: ctx.rtsUs }, { label: "SIFS", us: edca.sifsUs });
  }
  if (ctx.protection !== "none") {
    const cts = ctx.protection === "RTS" ? "CTS" : "CTS-to-self";
    terms.push({ label: `${cts} (${ctx.controlRateMbps} Mb/s)`, us: ctx.ctsUs }, { label: "SIFS", us: edca.sifsUs });
  }
  const what = usesBlockAck(n) ? `A-MPDU of ${n} MPDUs` : psduBytesFor(ctx, 1) === ctx.mpduBytes ? "MPDU" : "S-MPDU";
  terms.push(
    { label: `PPDU (${what}, ${psduBytesFor(ctx, n)} octets)`, us: ppduUs },
    { label: "SIFS", us: edca.sifsUs },
    { label: `${usesBlockAck(n) ? "BlockAck" : "Ack"} (${ctx.controlRateMbps} Mb/s)`, us: responseUs },
  );
  return Object.freeze({
    terms: Object.freeze(terms.map((t) => Object.freeze(t))),
    totalUs: sumUs(terms),
    mpdus: n,
    msdusPerMpdu: ctx.msdusPerMpdu,
    packetBytes: ctx.packetBytes,
    psduBytes: psduBytesFor(ctx, n),
    ppduUs,
    responseUs,
    protectionUs: ctx.protectionUs,
    backoffUs,
    rtsUs: ctx.rtsUs,
    ctsUs: ctx.ctsUs,
    controlRateMbps: ctx.controlRateMbps,
    edca,
    protection: ctx.protection,
    blockAckReq: blockAckReqFor(ctx, n),
  });
}

/**
 * One uncontended channel access (ACCESS is `.totalUs`, BREAKDOWN is
 * `.terms` then the total). `mpdus` is "auto" (or empty) for AGGCOUNT, or a
 * whole number up to it.
 */
export function channelAccess(
  link: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): ChannelAccess {
  const ctx = exchangeContext(link, packetBytes, access, protection, macOptions);
  return accessFor(ctx, resolveMpdus(ctx, mpdus));
}
