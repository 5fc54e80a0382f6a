/**
 * The raw timing and backoff terms the contention models work on, as the
 * standard's rules name them. The analytic models (saturation.ts,
 * aifsZones.ts) and, by a structurally identical type of its own, the
 * simulator (simulator.ts) take this shape, so each can be tested with a
 * paper's parameters alone, without link text or the MAC layer (fromLink.ts
 * builds it from a link). Neither side pre-combines the terms for the other:
 * the collision as the colliders see it, the EIFS the others wait and the
 * countdown rule are each a field.
 *
 * Times are in µs, payload in bits, so that payload ÷ time is Mb/s.
 */
import type { Microseconds } from "../units";

/**
 * How a backoff counter is counted down (the one place DCF and EDCA differ):
 * - "EDCA" (IEEE 802.11-2020 10.23.2.4): at every slot boundary from the end
 *   of AIFS on, the counter is decremented or, at 0, the frame is sent; the
 *   boundary at which another station starts its transmission still counts.
 * - "DCF" (10.3.4.3): the counter is frozen while the medium is busy and
 *   decremented only at the end of each idle slot after DIFS, so after a busy
 *   period only a counter freshly drawn as 0 can send at the DIFS boundary.
 */
export type Countdown = "EDCA" | "DCF";

/** The BlockAckReq recovery after a missed BlockAck (mac_options `BAR`). */
export interface BlockAckRequestExchange {
  /** BlockAckReq + SIFS + BlockAck at the control rate, µs (a success, without the AIFS after it). */
  readonly successUs: Microseconds;
  /** The BlockAckReq PPDU alone: what a collider has on air when two BARs (or a BAR and data) collide, µs. */
  readonly collisionPpduUs: Microseconds;
}

/** One class of identical saturated stations (one access category). */
export interface ContentionClass {
  /** A label for the rows of EDCAMIX (e.g. "VO"). */
  readonly name: string;
  /** Saturated stations of this class, 1…1000. */
  readonly stations: number;
  /** AIFSN: AIFS[AC] = aSIFSTime + AIFSN[AC] × aSlotTime (10.3.2.3.6, 10.23.2; from memory). DCF's DIFS is AIFSN = 2. */
  readonly aifsn: number;
  /** CWmin: the first backoff window holds CWmin + 1 slots. */
  readonly cwMin: number;
  /** CWmax: the window doubles, CW ← min(2·(CW + 1) − 1, CWmax), up to CWmax + 1 slots. */
  readonly cwMax: number;
  /** Transmission attempts before the frame is dropped (dot11ShortRetryLimit), 1…255. BlockAckReq attempts count too. */
  readonly retryLimit: number;
  readonly countdown: Countdown;
  /** Busy time of a success, without the AIFS that follows: protection + PPDU + SIFS + response. */
  readonly successUs: Microseconds;
  /** What a collider has on air: the RTS (RTS/CTS), else protection + PPDU. */
  readonly collisionPpduUs: Microseconds;
  /** The response timeout a collider waits after its PPDU: AckTimeout, or CTSTimeout after an RTS (10.3.2.9). */
  readonly responseTimeoutUs: Microseconds;
  /** Payload delivered by one success, bits (packet bytes × MSDUs × MPDUs × 8). */
  readonly payloadBits: number;
  /** null: a missed BlockAck is recovered by the next A-MPDU (default); else the BlockAckReq exchange. */
  readonly blockAckReq: BlockAckRequestExchange | null;
}

/** A channel shared by one or more classes. */
export interface ContentionChannel {
  /** aSlotTime σ, µs. */
  readonly slotUs: Microseconds;
  /** aSIFSTime, µs (enters every AIFS). */
  readonly sifsUs: Microseconds;
  /**
   * EIFS − DIFS = aSIFSTime + AckTxTime (10.3.2.3.7): what a station that
   * received a frame it could not decode (a collision) waits beyond its AIFS
   * after that frame, instead of AIFS alone (10.23.2.4: EIFS − DIFS + AIFS[AC]).
   */
  readonly eifsExtraUs: Microseconds;
  readonly classes: readonly ContentionClass[];
}

/** AIFS of a class, µs: aSIFSTime + AIFSN × aSlotTime. */
export function aifsUs(channel: ContentionChannel, cls: ContentionClass): Microseconds {
  return channel.sifsUs + cls.aifsn * channel.slotUs;
}
