/**
 * COVERAGEAPS: access points to cover a floor area with hexagonal cells.
 */
import { finiteNumber } from "../args";
import { invalid } from "../errors";
import type { Meters, Share } from "../units";
import { atLeast, atMost, ceilRatio, nonNegative, optionalNumber } from "../rf/_lib";

/** Catalog default cell overlap (DESIGN.md §2; common practice: 10–20 % overlap between neighbouring cells for roaming). */
export const DEFAULT_OVERLAP_SHARE: Share = 0.15;

/** Six equilateral triangles of side r: 6 × (√3/4)·r² = (3√3/2)·r². */
const HEXAGON_AREA_PER_R2 = (3 * Math.sqrt(3)) / 2;

/** Area of a regular hexagon inscribed in a circle of radius r: (3√3/2)·r². */
export function hexagonAreaM2(circumradiusM: Meters): number {
  return HEXAGON_AREA_PER_R2 * circumradiusM * circumradiusM;
}

/**
 * COVERAGEAPS: ceil(area_m2 ÷ cell area), at least 1 for any area > 0.
 *
 * Geometry (our choice, stated so it can be recomputed): access points on a
 * hexagonal grid; each serves the regular hexagon inscribed in its coverage
 * circle. With no overlap the hexagon's corners sit on the circle of radius
 * reach_m, so neighbouring circles overlap only in the lens beyond each
 * shared edge. `overlap_share` shrinks the hexagon's circumradius to
 * r = reach_m × (1 − overlap_share): each coverage circle then reaches that
 * share of its radius past its neighbours' corners. Cell area =
 * (3√3/2)·r². Walls, shape and furniture are ignored: a planning estimate,
 * not a replacement for a site survey.
 *
 * Example: coverageAps(1000, 10) → r = 8.5 m, cell = 187.7 m², ceil(5.33) = 6.
 */
export function coverageAps(areaM2: unknown, reachM: unknown, overlapShare?: unknown): number {
  // 100 km² of floor and a 0.1 m cell are beyond any site; the bounds keep the count finite.
  const area = atMost("area_m2", nonNegative("area_m2", finiteNumber("area_m2", areaM2), "m²"), 1e8, "m²");
  const reach = atMost("reach_m", atLeast("reach_m", finiteNumber("reach_m", reachM), 0.1, "m"), 1e6, "m");
  const overlap = optionalNumber("overlap_share", overlapShare, DEFAULT_OVERLAP_SHARE);
  if (!(overlap >= 0 && overlap < 1)) badOverlap(overlap);
  if (area === 0) return 0;
  return Math.max(1, ceilRatio(area / hexagonAreaM2(reach * (1 - overlap))));
}

/** Out of line, so the checks above stay small enough to inline (src/core/args.ts). */
function badOverlap(overlap: number): never {
  invalid(`overlap_share: must be from 0 up to (not including) 1, got ${overlap}`);
}
