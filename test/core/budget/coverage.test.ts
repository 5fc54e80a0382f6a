import { coverageAps } from "../../../src/core/budget/index";
import { AirtallyError } from "../../../src/core/errors";

// Regular hexagon inscribed in a circle of radius r: 6 equilateral triangles of side r, area 6 · (√3/4)·r² = 2.598·r².
describe("COVERAGEAPS", () => {
  it("covers 1000 m² with 10 m reach and the default 15 % overlap with 6 APs", () => {
    // r = 10 × (1 − 0.15) = 8.5 m; cell = 2.598 × 72.25 = 187.71 m²; 1000 ÷ 187.71 = 5.33 → 6
    expect(coverageAps(1000, 10)).toBe(Math.ceil(1000 / (6 * (Math.sqrt(3) / 4) * 8.5 * 8.5)));
  });

  it("needs exactly k APs when the area is k whole cells (no overlap)", () => {
    // 4 cells of r = 10 m: 4 × 2.598 × 100 = 1039.23 m²
    expect(coverageAps(4 * 6 * (Math.sqrt(3) / 4) * 100, 10, 0)).toBe(4);
  });

  it("needs at least one AP for a small area", () => {
    expect(coverageAps(5, 30)).toBe(1);
  });

  it("needs none for no area", () => {
    expect(coverageAps(0, 30)).toBe(0);
  });

  it("refuses a zero reach", () => {
    expect(() => coverageAps(100, 0)).toThrow(/^reach_m:/);
  });

  it("refuses an overlap of 1 (cells of zero size)", () => {
    expect(() => coverageAps(100, 10, 1)).toThrow(/^overlap_share:/);
  });

  it("refuses a negative area", () => {
    expect(() => coverageAps(-100, 10)).toThrow(AirtallyError);
  });
});
