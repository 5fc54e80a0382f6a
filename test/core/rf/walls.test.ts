import { indoorLossDb, reachM, wallsLossDb, commonWallLossDb } from "../../../src/core/rf/index";
import { expectValueErrorNaming } from "../../_lib/expectError";

describe("INDOORLOSS with walls", () => {
  it("adds walls × wall_loss_db to the floor-only loss (issue 15 acceptance)", () => {
    // INDOORLOSS(d, f, N, floors, fl, walls, wl) = INDOORLOSS(d, f, N, floors, fl) + walls × wl
    for (const [d, f, n, floors, fl, walls, wl] of [
      [20, 5200, 31, 1, 16, 3, 4],
      [10, 2437, 28, 0, null, 2, 10],
      [35, 5955, 30, 2, 15, 5, 6.5],
    ] as const) {
      expect(indoorLossDb(d, f, n, floors, fl, walls, wl)).toBeCloseTo(indoorLossDb(d, f, n, floors, fl) + walls * wl, 10);
    }
  });

  it("matches a hand value: 5.2 GHz, 20 m, N = 31, one 16 dB floor and two 10 dB walls", () => {
    // L = 20·log10(5200) + 31·log10(20) + 16 − 28 + 2 × 10 = 74.3201 + 40.3319 + 16 − 28 + 20 = 122.652 dB
    expect(indoorLossDb(20, 5200, 31, 1, 16, 2, 10)).toBeCloseTo(74.3201 + 40.3319 + 16 - 28 + 20, 3);
  });

  it("takes the common-practice plasterboard loss when wall_loss_db is omitted: 3 dB at 2.4 GHz, 4 dB at 5 and 6 GHz", () => {
    // common practice (not a standard's value): interior plasterboard partition
    expect(indoorLossDb(10, 2437, null, 0, null, 2)).toBeCloseTo(indoorLossDb(10, 2437) + 2 * 3, 10);
    expect(indoorLossDb(10, 5500, null, 0, null, 3)).toBeCloseTo(indoorLossDb(10, 5500) + 3 * 4, 10);
    expect(indoorLossDb(10, 6415, null, 0, null, 1)).toBeCloseTo(indoorLossDb(10, 6415) + 4, 10);
  });

  it("is the floor-only loss with no walls, omitted or 0, at any frequency", () => {
    expect(indoorLossDb(10, 5500, null, null, null, null, null)).toBe(indoorLossDb(10, 5500));
    expect(indoorLossDb(10, 60000, 22, 0, null, 0)).toBe(indoorLossDb(10, 60000, 22));
  });

  it("asks for wall_loss_db above 7.125 GHz, where no common-practice value is given", () => {
    expectValueErrorNaming(() => indoorLossDb(10, 60000, 22, 0, null, 1), "wall_loss_db");
    expect(indoorLossDb(10, 60000, 22, 0, null, 1, 12)).toBeCloseTo(indoorLossDb(10, 60000, 22) + 12, 10);
  });

  it("refuses a fractional, negative or textual wall count", () => {
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, 1.5), "walls");
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, -1), "walls");
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, "two"), "walls");
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, 201), "walls");
  });

  it("refuses a negative, non-finite or absurd wall loss", () => {
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, 1, -3), "wall_loss_db");
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, 1, Number.NaN), "wall_loss_db");
    expectValueErrorNaming(() => indoorLossDb(10, 5500, null, 0, null, 1, 1000), "wall_loss_db");
  });
});

describe("REACH with walls (the inverse of INDOORLOSS)", () => {
  it("matches the hand inversion with walls", () => {
    // d = 10^((eirp + rx_gain − target − 20·log10 f + 28 − L_f − walls × wl) ÷ N)
    //   = 10^((20 + 0 + 67 − 74.3201 + 28 − 0 − 2 × 4) ÷ 30) = 10^(32.6799 ÷ 30) = 12.293 m
    expect(reachM(20, -67, 5200, 30, 0, null, 0, 2, 4)).toBeCloseTo(Math.pow(10, (20 + 67 - 20 * Math.log10(5200) + 28 - 8) / 30), 9);
  });

  it("round-trips: INDOORLOSS at the reach is eirp + rx_gain − target", () => {
    const d = reachM(20, -70, 5500, 31, 1, 16, 2, 3, 6);
    expect(indoorLossDb(d, 5500, 31, 1, 16, 3, 6)).toBeCloseTo(20 + 2 + 70, 9);
  });

  it("uses the same common-practice default as INDOORLOSS", () => {
    const d = reachM(20, -67, 2437, null, 0, null, 0, 3);
    expect(indoorLossDb(d, 2437, null, 0, null, 3)).toBeCloseTo(87, 9);
  });

  it("shrinks as walls are added", () => {
    expect(reachM(20, -67, 5500, null, 0, null, 0, 2)).toBeLessThan(reachM(20, -67, 5500));
  });
});

describe("wallsLossDb", () => {
  it("is walls × loss per wall", () => {
    expect(wallsLossDb(5200, 3, null)).toBe(3 * 4); // 3 plasterboard walls × 4 dB (common practice)
    expect(wallsLossDb(2437, 2, 6)).toBe(12);
    expect(commonWallLossDb(2437)).toBe(3);
  });
});
