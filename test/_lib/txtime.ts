/**
 * The audit invariant of every TXTIME: its duration terms (those that add)
 * sum to the total, so TXTIMEPARTS explains exactly the number TXTIME gives.
 */
import type { TxTime } from "../../src/core/phy/types";

/** Sum of the terms of a TXTIME that are durations, µs. */
export function durationSum(t: TxTime): number {
  return t.terms.filter((x) => x.adds).reduce((s, x) => s + x.value, 0);
}
