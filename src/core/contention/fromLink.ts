/**
 * From a link and the MAC settings to the contention terms of parameters.ts:
 * one uncontended channel access of the MAC layer (ACCESS) gives the success
 * exchange, its EDCA parameters give the backoff, AIFS, timeouts and EIFS.
 *
 *   success (without AIFS)   protection + PPDU + SIFS + Ack/BlockAck
 *       protection: RTS + SIFS + CTS + SIFS (RTS) or CTS-to-self + SIFS (CTS)
 *   on air in a collision    none  the PPDU
 *                            RTS   the RTS
 *                            CTS   CTS-to-self + SIFS + PPDU (CTS-to-self protects nothing among contenders)
 *   response timeout         AckTimeout = aSIFSTime + aSlotTime + aRxPHYStartDelay (10.3.2.9);
 *                            CTSTimeout after an RTS has the same value
 *   EIFS − DIFS              aSIFSTime + AckTxTime at the lowest mandatory rate (10.3.2.3.7)
 *   countdown                DCF for access DCF (10.3.4.3), EDCA for BK/BE/VI/VO (10.23.2.4)
 *   BlockAckReq (BAR)        BlockAckReq + SIFS + BlockAck at the control rate, when the access
 *                            sends an A-MPDU (2 or more MPDUs) and mac_options asks for BAR
 *   payload                  packet bytes × MSDUs per MPDU × MPDUs × 8 bits
 */
import { channelAccess, type ChannelAccess } from "../mac";
import type { ContentionChannel, ContentionClass } from "./parameters";

/** The contention terms of one class from its uncontended channel access. */
export function classFromAccess(a: ChannelAccess, stations: number, name: string = a.edca.access): ContentionClass {
  const e = a.edca;
  const bar = a.blockAckReq;
  return {
    name,
    stations,
    aifsn: e.aifsn,
    cwMin: e.cwMin,
    cwMax: e.cwMax,
    retryLimit: e.retryLimit,
    countdown: e.access === "DCF" ? "DCF" : "EDCA",
    successUs: a.protectionUs + a.ppduUs + e.sifsUs + a.responseUs,
    collisionPpduUs: a.protection === "RTS" ? a.rtsUs : a.protectionUs + a.ppduUs, // protectionUs is 0 without protection
    responseTimeoutUs: e.ackTimeoutUs,
    payloadBits: 8 * a.packetBytes * a.msdusPerMpdu * a.mpdus,
    blockAckReq: bar === null ? null : { successUs: bar.exchangeUs, collisionPpduUs: bar.ppduUs },
  };
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
  return { slotUs: first.slotUs, sifsUs: first.sifsUs, eifsExtraUs: first.eifsUs - first.difsUs, classes: built.map((b) => b.cls) };
}
