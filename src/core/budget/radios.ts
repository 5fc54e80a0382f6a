/**
 * RADIOS: radios (channels) needed for a total airtime share.
 */
import { finiteNumber } from "../args";
import { invalid } from "../errors";
import type { Share } from "../units";
import { atMost, ceilRatio, nonNegative, optionalNumber } from "../rf/_lib";

/** Catalog default utilization ceiling (DESIGN.md §2; common practice: plan a channel to about 70 % busy). */
export const DEFAULT_MAX_UTILIZATION: Share = 0.7;

/**
 * RADIOS: ceil(total_share ÷ (max_utilization − overhead_share)).
 * Each radio's channel may be busy up to max_utilization, of which
 * overhead_share (beacons, management, neighbours — e.g. BEACONSHARE) is
 * already spent, so each radio carries max_utilization − overhead_share of
 * client airtime. total_share 0 needs 0 radios.
 *
 * #VALUE! when max_utilization is not in (0, 1) (a channel planned 100 % busy
 * leaves no room for contention — bad input), when overhead_share is negative
 * or at or above max_utilization (no room left), or total_share is negative.
 *
 * Example: radios(2.1, 0.7, 0.1) → ceil(2.1 ÷ 0.6) = ceil(3.5) = 4.
 */
export function radios(totalShare: unknown, maxUtilization?: unknown, overheadShare?: unknown): number {
  // A million channels' worth of airtime is far beyond any site; the bound keeps the count finite.
  const total = atMost("total_share", nonNegative("total_share", finiteNumber("total_share", totalShare), ""), 1e6, "");
  const ceiling = optionalNumber("max_utilization", maxUtilization, DEFAULT_MAX_UTILIZATION);
  if (!(ceiling > 0 && ceiling < 1)) badCeiling(ceiling);
  const overhead = nonNegative("overhead_share", optionalNumber("overhead_share", overheadShare, 0), "");
  if (overhead >= ceiling) noRoom(overhead, ceiling);
  return ceilRatio(total / (ceiling - overhead));
}

// Refusals out of line, so the checks above stay small enough to inline (src/core/args.ts).
function badCeiling(ceiling: number): never {
  invalid(`max_utilization: must be above 0 and below 1 (a share of the channel's time), got ${ceiling}`);
}
function noRoom(overhead: number, ceiling: number): never {
  invalid(`overhead_share: ${overhead} leaves no room under max_utilization ${ceiling}; it must be below max_utilization`);
}
