/**
 * From a link and the MAC settings to the contention models' timing struct:
 * one uncontended channel access of the MAC layer (ACCESS) gives the success
 * exchange, its EDCA parameters give the backoff and AIFS.
 *
 *   T_s (without AIFS) = protection + PPDU + SIFS + Ack/BlockAck
 *       protection: RTS + SIFS + CTS + SIFS (RTS) or CTS-to-self + SIFS (CTS)
 *   T_c (without AIFS):
 *       none  PPDU + AckTimeout             (the longest colliding PPDU; the
 *                                            senders learn of it at the timeout)
 *       RTS   RTS + CTSTimeout              (CTSTimeout has AckTimeout's value,
 *                                            aSIFSTime + aSlotTime + aRxPHYStartDelay,
 *                                            IEEE 802.11-2020 10.3.2.9; clause from memory)
 *       CTS   CTS-to-self + SIFS + PPDU + AckTimeout (CTS-to-self protects
 *                                            nothing among the contenders)
 *   payload = packet bytes × MSDUs per MPDU × MPDUs × 8 bits
 *
 * The collision ends, for the colliding stations, at their response timeout
 * (as in the MAC layer's retransmission model). The stations that only
 * listened defer EIFS − DIFS + AIFS instead (10.3.2.3.7), longer by
 * AckTxTime − aSlotTime − aRxPHYStartDelay (≈ 10 µs on OFDM at 5 GHz); that
 * difference is left out.
 */
import { channelAccess, type ChannelAccess } from "../mac";
import type { ContentionChannel, ContentionClass } from "./timing";

/** The busy times and payload of one class from its uncontended channel access. */
export function classFromAccess(a: ChannelAccess, stations: number, name: string = a.edca.access): ContentionClass {
  const e = a.edca;
  return {
    name,
    stations,
    aifsn: e.aifsn,
    cwMin: e.cwMin,
    cwMax: e.cwMax,
    retryLimit: e.retryLimit,
    successUs: a.protectionUs + a.ppduUs + e.sifsUs + a.responseUs,
    collisionUs: collisionBusyUs(a),
    payloadBits: 8 * a.packetBytes * a.msdusPerMpdu * a.mpdus,
  };
}

function collisionBusyUs(a: ChannelAccess): number {
  const timeout = a.edca.ackTimeoutUs;
  if (a.protection === "RTS") return a.rtsUs + timeout;
  return a.protectionUs + a.ppduUs + timeout; // protectionUs is 0 without protection
}

export interface ClassSpec {
  /** Access category (text; empty → BE), as the MAC layer parses it. */
  readonly access: unknown;
  readonly stations: number;
}

/**
 * The channel for classes of stations on one link. Every class uses the
 * same link, packet size, MPDU count ("auto" resolves per access category,
 * whose TXOP limit may differ), protection and MAC options.
 */
export function contentionChannel(
  link: unknown,
  classes: readonly ClassSpec[],
  packetBytes: unknown,
  mpdus?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): ContentionChannel {
  const built = classes.map((c) => {
    const a = channelAccess(link, packetBytes, mpdus, c.access, protection, macOptions);
    return { a, cls: classFromAccess(a, c.stations) };
  });
  const first = built[0].a.edca;
  return { slotUs: first.slotUs, sifsUs: first.sifsUs, classes: built.map((b) => b.cls) };
}
