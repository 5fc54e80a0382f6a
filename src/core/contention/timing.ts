/**
 * The timing and backoff parameters the contention models work on. Both the
 * analytic model (bianchi.ts, edca.ts) and, by a structurally identical type
 * of its own, the simulator (simulator.ts) take this shape, so each can be
 * tested with a paper's parameters alone, without link text or the MAC layer
 * (adapter.ts builds it from a link).
 *
 * Times are in µs, payload in bits, so that payload ÷ time is Mb/s.
 */
import type { Microseconds } from "../units";

/** One class of identical saturated stations (one access category). */
export interface ContentionClass {
  /** A label for the rows of EDCAMIX (e.g. "VO"). */
  readonly name: string;
  /** Saturated stations of this class, 1…1000. */
  readonly stations: number;
  /** AIFSN: AIFS[AC] = aSIFSTime + AIFSN[AC] × aSlotTime (IEEE 802.11-2020 10.3.2.3.6 and 10.23.2; clause numbers from memory). DCF's DIFS is AIFSN = 2. */
  readonly aifsn: number;
  /** CWmin: the first backoff window holds CWmin + 1 slots. */
  readonly cwMin: number;
  /** CWmax: the window doubles, CW ← min(2·(CW + 1) − 1, CWmax), up to CWmax + 1 slots. */
  readonly cwMax: number;
  /** Transmission attempts before the frame is dropped (dot11ShortRetryLimit; Wu et al. 2002's m + 1), 1…255. */
  readonly retryLimit: number;
  /** Busy time of a success, without the AIFS that follows: protection + PPDU + SIFS + response (+ propagation where a paper counts it). */
  readonly successUs: Microseconds;
  /** Busy time of a collision this class takes part in, without the AIFS that follows: the PPDU (or RTS) + the response timeout. */
  readonly collisionUs: Microseconds;
  /** Payload delivered by one success, bits (packet bytes × MSDUs × MPDUs × 8). */
  readonly payloadBits: number;
}

/** A channel shared by one or more classes. */
export interface ContentionChannel {
  /** aSlotTime σ, µs. */
  readonly slotUs: Microseconds;
  /** aSIFSTime, µs (enters every AIFS). */
  readonly sifsUs: Microseconds;
  readonly classes: readonly ContentionClass[];
}

/** AIFS of a class, µs: aSIFSTime + AIFSN × aSlotTime. */
export function aifsUs(channel: ContentionChannel, cls: ContentionClass): Microseconds {
  return channel.sifsUs + cls.aifsn * channel.slotUs;
}
