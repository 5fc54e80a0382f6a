/**
 * `TCP` in mac_options: the goodput of a TCP flow counts the receiver's
 * acknowledgements, which travel the other way as channel accesses of their
 * own (DESIGN.md §2).
 *
 * Assumptions, written down because the standards leave them to the hosts:
 * - Delayed ACKs: the receiver acknowledges every second full-sized segment
 *   (RFC 1122 4.2.3.2: "an ACK SHOULD be generated for at least every second
 *   full-sized segment"; RFC 5681 4.2 repeats it), so one ACK per 2 segments
 *   by default; `TCPACK=n` sets n (1 = an ACK per segment, larger n = ACK
 *   thinning by the receiver or the AP).
 * - One ACK is a 40-octet IP packet (IPv4 20 + TCP 20, no options; from
 *   memory of RFC 791 and RFC 9293's header sizes), sent alone in one
 *   channel access: AIFS + mean backoff + one MPDU + SIFS + Ack.
 * - The reverse link is the same link text and the same access category as
 *   the data (a symmetric link; the receiver's own rate may differ — give it
 *   its own GOODPUT if it does), no protection (an RTS threshold above a
 *   94-octet MPDU; common practice), the same cipher and MAC settings, one
 *   MSDU per MPDU.
 * - ACK accesses are never lost and never delayed by the data; each segment
 *   of packet_bytes (× AMSDU MSDUs per MPDU) that is delivered asks for 1/n
 *   of an ACK access.
 *
 * Then, per delivered bit, the airtime is the data's (1 ÷ its goodput) plus
 * the ACK access ÷ (8 × packet_bytes × n):
 *   TCP goodput = 1 ÷ (1 ÷ G + T_ACK ÷ (8 × packet_bytes × n))
 * with G the goodput without acknowledgements (GOODPUT, or SATURATE with
 * several stations). With one MPDU per access and no loss this is the plain
 *   n × 8 × packet_bytes ÷ (n × ACCESS(data) + ACCESS(ACK)).
 */
import type { Bytes, MbPerSecond, Microseconds } from "../units";
import { accessFor } from "./access";
import { exchangeContext, type ExchangeContext } from "./exchange";
import type { MacOptions } from "./options";

/** A TCP acknowledgement without options: IPv4 header 20 + TCP header 20 octets (from memory). */
export const TCP_ACK_PACKET_octets: Bytes = 40;
/** Delayed ACKs: one per two full-sized segments (RFC 1122 4.2.3.2, RFC 5681 4.2). */
export const DEFAULT_TCP_ACK_SEGMENTS = 2;

/** Segments per TCP acknowledgement under these options. */
export function tcpAckSegments(options: MacOptions): number {
  return options.tcpAckSegments ?? DEFAULT_TCP_ACK_SEGMENTS;
}

/** The ACK's own channel access on the reverse link: same link, access category and cipher; one MSDU, no protection. */
export function tcpAckAccessUs(ctx: ExchangeContext): Microseconds {
  const ackOptions: MacOptions = Object.freeze({ ...ctx.options, amsdu: 1, tcp: false, tcpAckSegments: null });
  const ack = exchangeContext(ctx.link, TCP_ACK_PACKET_octets, ctx.access, "none", ackOptions);
  return accessFor(ack, 1).totalUs;
}

/** TCP goodput from the goodput without acknowledgements (model in the file comment); unchanged without `TCP`. */
export function withTcpAcks(ctx: ExchangeContext, goodputMbps: MbPerSecond): MbPerSecond {
  if (!ctx.options.tcp) return goodputMbps;
  const ackUsPerBit = tcpAckAccessUs(ctx) / (8 * ctx.packetBytes * tcpAckSegments(ctx.options));
  return 1 / (1 / goodputMbps + ackUsPerBit);
}

/** mac_options text without its TCP settings, for models that take the data's accesses alone (SATURATE's wrapper). */
export function withoutTcpText(macOptions: unknown): unknown {
  if (typeof macOptions !== "string") return macOptions;
  return macOptions
    .split(/([\s,;]+)/)
    .filter((t) => !/^(TCP|TCPACK=.*)$/i.test(t))
    .join("")
    .trim();
}
