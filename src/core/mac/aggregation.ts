/**
 * AGGCOUNT: how many MPDUs one A-MPDU carries under every limit at once
 * (DESIGN.md §2):
 * - the block ack window (BA=, default 64 HT/VHT, 256 HE, 1024 EHT);
 * - the receiver's maximum A-MPDU length, 2^(13+e) − 1 octets (AMPDU=e),
 *   capped by the PHY's largest PSDU;
 * - aPPDUMaxTime, 5484 µs, for the whole PPDU including its preamble;
 * - the TXOP limit, when not 0: the exchange after the backoff — protection
 *   (RTS/CTS or CTS-to-self with their SIFS) + PPDU + SIFS + BlockAck — must
 *   fit in it. A TXOP limit of 0 allows one exchange of one PPDU
 *   (IEEE 802.11-2020 10.23.2.9, from memory), bounded by aPPDUMaxTime only.
 *   When even one MPDU overruns a nonzero limit the count is still 1: the
 *   standard's remedy (fragmentation) is not modelled. When one MPDU alone
 *   overruns aPPDUMaxTime there is no count: #N/A with a message.
 * Families without A-MPDU (DSSS, HR-DSSS, OFDM, ERP-OFDM) and DCF access
 * (no QoS, no block ack agreement) give 1.
 */
import { noAnswer } from "../errors";
import type { Microseconds } from "../units";
import { aPPDUMaxTime_us } from "./timing";
import { ampduLength, AMPDU_DELIMITER_octets } from "./frames";
import { ampduMpduMax, exchangeContext, exchangeUsFor, ppduUsFor, type ExchangeContext } from "./exchange";

export interface AggregationLimit {
  /** Largest number of MPDUs in one PPDU. */
  readonly count: number;
  /** Which limit binds, for messages and the audit. */
  readonly reason: string;
}

/** Largest n in [lo, hi] with ok(n), given ok(lo); ok must be monotone (true then false). */
export function largestWhere(lo: number, hi: number, ok: (n: number) => boolean): number {
  if (ok(hi)) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (ok(mid)) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * A single MPDU whose PPDU already overruns aPPDUMaxTime (HT and later): the
 * arguments are valid but no A-MPDU of any length exists, so #N/A
 * (DESIGN.md §4), not #VALUE!.
 */
function checkSinglePpdu(ctx: ExchangeContext): void {
  const us = ppduUsFor(ctx, 1);
  if (us > aPPDUMaxTime_us) {
    noAnswer(
      `packet_bytes: one ${ctx.mpduBytes}-octet MPDU lasts ${us} µs on ${ctx.link.text}, over aPPDUMaxTime (${aPPDUMaxTime_us} µs); ` +
        `use smaller packets, fewer MSDUs per A-MSDU (mac_options AMSDU=) or a faster MCS`,
    );
  }
}

/** The binding aggregation limit for this exchange (protection counted against the TXOP). */
export function aggregationLimit(ctx: ExchangeContext): AggregationLimit {
  if (!ctx.aggregates) {
    checkNonAggregated(ctx);
    return { count: 1, reason: ctx.access === "DCF" ? "DCF (no block ack)" : `${ctx.link.family} (no A-MPDU)` };
  }
  checkSinglePpdu(ctx);
  if (ctx.mpduBytes > ampduMpduMax(ctx)) {
    return { count: 1, reason: `the ${ampduMpduMax(ctx)}-octet MPDU limit inside an ${ctx.link.family} A-MPDU` };
  }
  let count = ctx.baWindow;
  let reason = `the block ack window (${ctx.baWindow} MPDUs)`;
  // Length: n subframes of ceil4(4 + MPDU), the last unpadded, within maxAmpduBytes.
  const byLength = largestWhere(1, count, (n) => ampduLength(ctx.mpduBytes, n) <= ctx.maxAmpduBytes);
  if (ctx.mpduBytes + AMPDU_DELIMITER_octets <= ctx.maxAmpduBytes && byLength < count) {
    count = byLength;
    reason = `the maximum A-MPDU length (${ctx.maxAmpduBytes} octets)`;
  }
  const byTime = largestWhere(1, count, (n) => ppduUsFor(ctx, n) <= aPPDUMaxTime_us);
  if (byTime < count) {
    count = byTime;
    reason = `aPPDUMaxTime (${aPPDUMaxTime_us} µs)`;
  }
  const txop: Microseconds = ctx.edca.txopLimitUs;
  if (txop > 0) {
    const byTxop = largestWhere(1, count, (n) => exchangeUsFor(ctx, n) <= txop);
    if (byTxop < count) {
      count = byTxop;
      reason = `the TXOP limit (${txop} µs)`;
    }
  }
  return { count, reason };
}

/** A non-aggregated PPDU must still fit the PHY's largest PSDU (DSSS/OFDM 4095 octets). */
function checkNonAggregated(ctx: ExchangeContext): void {
  ppduUsFor(ctx, 1); // txtime refuses a PSDU over the PHY's maximum, naming psdu_bytes
}

/**
 * AGGCOUNT (catalog): MPDUs in one A-MPDU under every limit at once.
 * `protection` (not in the catalog; default none) counts the RTS/CTS or
 * CTS-to-self exchange against a nonzero TXOP limit, as ACCESS does.
 *
 *   aggCount("OFDM 54Mbps 5GHz", 1500) → 1
 */
export function aggCount(link: unknown, packetBytes: unknown, access?: unknown, macOptions?: unknown, protection?: unknown): number {
  return aggregationLimit(exchangeContext(link, packetBytes, access, protection, macOptions)).count;
}
