import { p1238Coefficients } from "../../../src/core/rf/index";
import { AirtallyError } from "../../../src/core/errors";

// Values below are ITU-R P.1238-7 (02/2012) Table 2 (N) and Table 3 (L_f(n)),
// written from memory of the recommendation, as in the source table.
describe("P.1238-7 coefficient lookup", () => {
  it("gives the office N at 1.8–2 GHz", () => {
    expect(p1238Coefficients("office", "1.8-2GHz").distancePower).toBe(30); // Table 2
  });

  it("forms the office L_f(n) = 15 + 4(n − 1) for two floors", () => {
    expect(p1238Coefficients("office", "1.8-2GHz", 2).floorLossDb).toBe(15 + 4 * (2 - 1)); // Table 3
  });

  it("forms the residential L_f(n) = 4n for three floors", () => {
    expect(p1238Coefficients("residential", "1.8-2GHz", 3).floorLossDb).toBe(4 * 3); // Table 3
  });

  it("gives no floor loss on the same floor", () => {
    expect(p1238Coefficients("commercial", "1.8-2GHz", 0).floorLossDb).toBe(0);
  });

  it("gives the office values at 5.2 GHz, one floor", () => {
    const c = p1238Coefficients("Office", "5.2 GHz", 1);
    expect([c.distancePower, c.floorLossDb]).toEqual([31, 16]); // Table 2 / Table 3
  });

  it("refuses an environment the band's row does not have", () => {
    expect(() => p1238Coefficients("residential", "5.8GHz")).toThrow(AirtallyError);
  });

  it("refuses more floors than the table lists", () => {
    // Table 3, office 900 MHz: 1, 2 and 3 floors only
    expect(() => p1238Coefficients("office", "900MHz", 4)).toThrow(/^floors:/);
  });

  it("refuses an unknown band", () => {
    expect(() => p1238Coefficients("office", "6GHz")).toThrow(/^band:/);
  });
});
