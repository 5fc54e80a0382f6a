/**
 * The interface every PHY family module implements (DESIGN.md §1: "Per-family
 * PHY files share one interface, so adding a family is adding a file").
 */
import type { Link, Family } from "../link";
import type { Bytes, Dbm, MbPerSecond, Microseconds } from "../units";

/**
 * One term of a TXTIME audit. `adds` terms are durations in µs whose sum is
 * the TXTIME exactly; the others (N_SYM, T_SYM, N_DBPS, padding bits…)
 * explain how a duration was reached. The unit is part of the label.
 */
export interface TxTimeTerm {
  readonly label: string;
  readonly value: number;
  readonly adds: boolean;
}

export interface TxTime {
  /** PPDU duration per the standard's TXTIME equation, µs. */
  readonly totalUs: Microseconds;
  /** Terms in order of transmission; the `adds` terms sum to `totalUs`. */
  readonly terms: readonly TxTimeTerm[];
}

export interface PhyFamily {
  readonly family: Family;
  /**
   * Throws AirtallyError("value") when the standard forbids this link, with a
   * message that says what is valid (DESIGN.md §4). Called once at parse.
   */
  validate(link: Link): void;
  /** PHY data rate, Mb/s: N_SD × N_BPSCS × R × N_SS ÷ T_SYM for OFDM-based PHYs. */
  rateMbps(link: Link): MbPerSecond;
  /** TXTIME for a PSDU of `psduBytes` (0..maxPsduBytes, already checked). */
  txtime(link: Link, psduBytes: Bytes): TxTime;
  /** Largest PSDU the PHY can carry (aPSDUMaxLength / the LENGTH field's range), octets. */
  maxPsduBytes(link: Link): Bytes;
  /** Minimum input sensitivity from the standard's table, with the width adjustment, dBm. */
  sensitivityDbm(link: Link): Dbm;
  /**
   * Rate used to pick the control response rate (IEEE 802.11-2020 10.6.6.5):
   * the data rate itself for non-HT PHYs, the non-HT reference rate of the
   * MCS's modulation and coding for HT and later.
   */
  nonHtReferenceRateMbps(link: Link): MbPerSecond;
  /**
   * MCS indices (HT and later) or data rates in Mb/s (non-HT) that exist for
   * this family, ascending; the validity of each at a given width/streams is
   * still decided by `validate`. Used to search for the best MCS (TOPLINK).
   */
  readonly mcsValues: readonly number[];
  /** HT only: the stream count an MCS index implies (IEEE 802.11-2020 19.3.5). */
  impliedStreams?(mcs: number): number;
}
