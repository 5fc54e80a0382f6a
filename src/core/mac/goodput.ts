/**
 * GOODPUT, EFFICIENCY and RETX: what one station alone on the channel
 * delivers at the packet layer, and how many transmissions a burst needs.
 *
 * Loss model (mpdu_loss = p): each MPDU is lost independently with
 * probability p; control frames (RTS, CTS, Ack, BlockAck) are never lost.
 *
 * - A-MPDU with block ack (2 or more MPDUs per access): lost MPDUs are
 *   retransmitted selectively in later A-MPDUs alongside new ones. In steady
 *   state every access carries N MPDUs, each delivered with probability
 *   1 − p, and a BlockAck that arrives ends the access as a success, so the
 *   contention window stays at CWmin. Goodput = (1 − p) × the lossless
 *   goodput. The retry limit drops nothing that counts: a dropped MPDU's
 *   slots were failures either way. The block ack window is assumed never
 *   to stall (the transmitter always has N MPDUs it may send); with N equal
 *   to the window and high loss this is an upper bound.
 * - One MPDU per access (non-HT PHYs, DCF, or mpdus = 1): a lost frame gets
 *   no Ack, the sender waits AckTimeout, doubles its contention window
 *   (CW_k = min(2^k × (CWmin + 1) − 1, CWmax) on attempt k = 0, 1, …) and
 *   sends the whole frame again, up to RETRY attempts in all (default 7),
 *   after which it is dropped. By renewal–reward, per frame:
 *     E[time]  = Σ_{k<R} p^k × (AIFS + CW_k ÷ 2 × slot + protection + PPDU + (1−p)(SIFS + Ack) + p × AckTimeout)
 *     E[bytes] = (1 − p^R) × packet bytes × MSDUs per MPDU
 *   goodput = 8 × E[bytes] ÷ E[time]. At p = 0 both models give the lossless
 *   packet bytes × MSDUs × MPDUs × 8 ÷ ACCESS.
 *
 * With `TCP` in mac_options the receiver's TCP acknowledgements take
 * accesses of their own on the reverse link (tcp.ts).
 */
import { invalid } from "../errors";
import { integerInRange, isMissing, describe } from "../args";
import type { MbPerSecond, Microseconds } from "../units";
import { rateMbps } from "../phy";
import { accessFor, resolveMpdus, type ChannelAccess } from "./access";
import { exchangeContext, usesBlockAck } from "./exchange";
import { withTcpAcks } from "./tcp";

/** mpdu_loss: a share in [0, 1); empty → 0. */
export function parseMpduLoss(value: unknown): number {
  if (isMissing(value)) return 0;
  if (typeof value !== "number" || !Number.isFinite(value) || value < 0 || value >= 1) {
    invalid(`mpdu_loss: must be a share of lost MPDUs from 0 up to (not including) 1, got ${describe(value)}`);
  }
  return value;
}

/** Lossless packet-layer goodput of one access, Mb/s (bits per µs). */
function losslessMbps(a: ChannelAccess): MbPerSecond {
  return (8 * a.packetBytes * a.msdusPerMpdu * a.mpdus) / a.totalUs;
}

/** Whole-frame retransmission with backoff doubling and a retry limit (model in the file comment). */
function wholeFrameMbps(a: ChannelAccess, p: number): MbPerSecond {
  const e = a.edca;
  const fixed: Microseconds = e.aifsUs + a.protectionUs + a.ppduUs;
  let expectedUs = 0;
  let reach = 1; // probability that attempt k happens, p^k
  for (let k = 0; k < e.retryLimit; k++) {
    const cw = Math.min(2 ** k * (e.cwMin + 1) - 1, e.cwMax);
    const attemptUs = fixed + (cw / 2) * e.slotUs + (1 - p) * (e.sifsUs + a.responseUs) + p * e.ackTimeoutUs;
    expectedUs += reach * attemptUs;
    reach *= p;
  }
  const expectedBits = 8 * a.packetBytes * a.msdusPerMpdu * (1 - reach);
  return expectedBits / expectedUs;
}

/**
 * `BAR`: when all N MPDUs of an A-MPDU are lost (probability p^N) no BlockAck
 * comes back; the originator then contends again with a doubled window
 * (CW_1 = min(2·(CWmin + 1) − 1, CWmax)) and sends a BlockAckReq, whose
 * BlockAck resets CW. Per access this adds
 *   p^N × (AIFS + CW_1 ÷ 2 × slot + BlockAckReq + SIFS + BlockAck)
 * (the BlockAck timeout that precedes it is taken as the SIFS + BlockAck it
 * replaces). Without BAR the MPDUs simply ride in the next A-MPDU.
 */
function blockAckReqMbps(a: ChannelAccess, p: number): MbPerSecond {
  const e = a.edca;
  const bar = a.blockAckReq;
  if (bar === null) return (1 - p) * losslessMbps(a);
  const cw1 = Math.min(2 * (e.cwMin + 1) - 1, e.cwMax);
  const missed = Math.pow(p, a.mpdus);
  const recoveryUs = e.aifsUs + (cw1 / 2) * e.slotUs + bar.exchangeUs;
  return ((1 - p) * 8 * a.packetBytes * a.msdusPerMpdu * a.mpdus) / (a.totalUs + missed * recoveryUs);
}

/** Goodput of a resolved channel access with MPDU loss p, Mb/s. */
export function goodputFor(a: ChannelAccess, p: number): MbPerSecond {
  if (p === 0) return losslessMbps(a);
  return usesBlockAck(a.mpdus) ? blockAckReqMbps(a, p) : wholeFrameMbps(a, p);
}

/**
 * GOODPUT (catalog): packet-layer goodput of one station alone on the
 * channel, Mb/s. Example (OFDM 54 Mb/s, 1500-octet packets, BE, CCMP-128):
 * 8 × 1500 ÷ ACCESS µs.
 */
export function goodputMbps(
  link: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  mpduLoss?: unknown,
  macOptions?: unknown,
): MbPerSecond {
  const ctx = exchangeContext(link, packetBytes, access, protection, macOptions);
  const n = resolveMpdus(ctx, mpdus);
  const p = parseMpduLoss(mpduLoss);
  return withTcpAcks(ctx, goodputFor(accessFor(ctx, n), p));
}

/** EFFICIENCY (catalog): GOODPUT ÷ RATE, a share 0..1. */
export function efficiency(
  link: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  mpduLoss?: unknown,
  macOptions?: unknown,
): number {
  const g = goodputMbps(link, packetBytes, mpdus, access, protection, mpduLoss, macOptions);
  return g / rateMbps(link);
}

/** Largest burst RETX takes: the largest block ack window (EHT, 1024). */
const RETX_MPDUS_MAX = 1024;
/** Series terms summed before RETX gives up (p too close to 1 for the burst). */
const RETX_MAX_TERMS = 1_000_000;
const RETX_TERM_EPSILON = 1e-15;

/**
 * E[max of N i.i.d. geometric(1 − p) transmission counts]
 *   = Σ_{k≥0} P(max > k) = Σ_{k≥0} (1 − (1 − p^k)^N),
 * each term as −expm1(N × log1p(−p^k)) so small p^k keep their digits.
 */
function selectiveTransmissions(n: number, p: number): number {
  if (p === 0) return 1;
  // Terms fall like N p^k; refuse when they would need more than RETX_MAX_TERMS to drop below epsilon.
  const needed = Math.log(RETX_TERM_EPSILON / n) / Math.log(p);
  if (needed > RETX_MAX_TERMS) {
    invalid(`mpdu_loss: ${p} is too close to 1 for a burst of ${n} MPDUs (the expected count needs over ${RETX_MAX_TERMS} terms); use a smaller loss`);
  }
  let sum = 1; // k = 0: P(max > 0) = 1
  let pk = 1;
  for (let k = 1; k <= RETX_MAX_TERMS; k++) {
    pk *= p;
    const term = -Math.expm1(n * Math.log1p(-pk));
    sum += term;
    if (term < RETX_TERM_EPSILON) break;
  }
  return sum;
}

/**
 * RETX (catalog): expected PPDUs until every MPDU of a burst of `mpdus` is
 * delivered, each lost independently with probability `mpdu_loss`.
 * - `selective` (block ack: only the lost MPDUs go again): E[max of N
 *   geometric counts] = Σ_{k≥0} (1 − (1 − p^k)^N).
 * - `whole` (no block ack: the whole burst again until one try delivers
 *   all): 1 ÷ (1 − p)^N.
 *
 *   expectedTransmissions(1, 0.1) → 1 ÷ 0.9 ≈ 1.111 (either mode)
 */
export function expectedTransmissions(mpdus: unknown, mpduLoss: unknown, mode?: unknown): number {
  const n = integerInRange("mpdus", mpdus, 1, RETX_MPDUS_MAX, "MPDUs");
  const p = parseMpduLoss(mpduLoss);
  const m = isMissing(mode) ? "selective" : typeof mode === "string" ? mode.trim().toLowerCase() : "";
  if (m === "selective") return selectiveTransmissions(n, p);
  if (m !== "whole") invalid(`mode: expected selective or whole, got ${describe(mode)}`);
  const whole = Math.exp(-n * Math.log1p(-p));
  if (!Number.isFinite(whole)) {
    invalid(`mpdu_loss: with ${n} MPDUs and loss ${p} the expected count of whole-burst transmissions is beyond 1e308; use a smaller loss or burst`);
  }
  return whole;
}
