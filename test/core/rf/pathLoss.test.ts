import { fsplDb, indoorLossDb, reachM } from "../../../src/core/rf/index";
import { AirtallyError } from "../../../src/core/errors";
import { expectValueError } from "../../_lib/expectError";

/** Expect an AirtallyError of `kind` whose message starts with the argument name. */
function expectRefusal(fn: () => unknown, kind: "value" | "na", argument: string): void {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(AirtallyError);
    expect((e as AirtallyError).kind).toBe(kind);
    expect((e as AirtallyError).message.startsWith(`${argument}:`)).toBe(true);
    return;
  }
  throw new Error("expected a refusal");
}

describe("FSPL (Friis)", () => {
  it("gives 40.05 dB at 1 m and 2400 MHz", () => {
    // Friis: FSPL = 20·log10(4π·d ÷ λ), λ = c ÷ f = 299 792 458 ÷ 2.4e9 = 0.124913524 m
    expect(fsplDb(1, 2400)).toBeCloseTo(20 * Math.log10((4 * Math.PI * 1) / 0.124913524), 6);
  });

  it("agrees with the textbook form 20·log10(d) + 20·log10(f_MHz) − 27.55 within its rounding", () => {
    // 30 m at 5180 MHz: 29.54 + 74.29 − 27.55 = 76.28 dB (Friis in dB with d in m, f in MHz)
    expect(fsplDb(30, 5180)).toBeCloseTo(20 * Math.log10(30) + 20 * Math.log10(5180) - 27.55, 2);
  });

  it("adds 6.02 dB per doubling of distance", () => {
    // inverse-square law: 20·log10(2) = 6.0206 dB
    expect(fsplDb(20, 5500) - fsplDb(10, 5500)).toBeCloseTo(6.0206, 4);
  });

  it("refuses a negative distance", () => {
    expectRefusal(() => fsplDb(-1, 2400), "value", "distance_m");
  });

  it("refuses a zero frequency", () => {
    expectRefusal(() => fsplDb(10, 0), "value", "freq_mhz");
  });

  it("refuses text for the distance", () => {
    expectRefusal(() => fsplDb("ten", 2400), "value", "distance_m");
  });

  describe("far field only (issue 16; Balanis §2.2.4 / Rappaport §4.3: r ≫ λ; our bound 2λ)", () => {
    // λ at 5180 MHz = 299 792 458 ÷ 5.18e9 = 0.057875 m, so 2λ = 0.115750 m (speed of light exact by the SI).
    const twoWavelengthsAt5180 = (2 * 299_792_458) / 5.18e9;

    it("gives 20·log10(8π) = 28.00 dB at exactly two wavelengths, the nearest distance it accepts", () => {
      // Friis at d = 2λ: 20·log10(4π·2λ ÷ λ) = 20·log10(25.1327) = 20 × 1.400240 = 28.0048 dB, whatever the frequency
      expect(fsplDb(twoWavelengthsAt5180, 5180)).toBeCloseTo(28.0048, 3);
    });

    it("refuses FSPL(0.001, 5180), which the equation would make −13.3 dB, naming distance_m and the range", () => {
      // 20·log10(4π·0.001 ÷ 0.057875) = −13.27 dB: a gain, no path loss
      expectValueError(() => fsplDb(0.001, 5180), /^distance_m: the Friis free-space equation holds in the far field only; at 5180 MHz use at least 2 wavelengths \(0\.116 m\), got 0\.001$/);
    });

    it("refuses just inside two wavelengths", () => {
      expectRefusal(() => fsplDb(twoWavelengthsAt5180 * 0.999, 5180), "value", "distance_m");
    });

    it("scales the bound with the wavelength: 0.2 m is refused at 2412 MHz (2λ = 0.249 m) and accepted at 5500 MHz (2λ = 0.109 m)", () => {
      expectRefusal(() => fsplDb(0.2, 2412), "value", "distance_m");
      // 20·log10(4π·0.2·5.5e9 ÷ c) = 33.29 dB
      expect(fsplDb(0.2, 5500)).toBeCloseTo(20 * Math.log10((4 * Math.PI * 0.2 * 5.5e9) / 299_792_458), 9);
    });
  });
});

describe("INDOORLOSS (ITU-R P.1238-7 site-general model, eq. (1))", () => {
  it("uses the catalog defaults N = 30 and no floors: 2400 MHz, 10 m", () => {
    // L = 20·log10(2400) + 30·log10(10) + 0 − 28 = 67.604 + 30 − 28 = 69.604 dB
    expect(indoorLossDb(10, 2400)).toBeCloseTo(67.604 + 30 - 28, 3);
  });

  it("matches a hand value with the office coefficients at 5.2 GHz, one floor", () => {
    // P.1238-7 Table 2 office 5.2 GHz N = 31, Table 3 office 5.2 GHz L_f = 16 dB (1 floor) — table values from memory
    // L = 20·log10(5200) + 31·log10(20) + 16 − 28 = 74.3201 + 40.3319 + 16 − 28 = 102.652 dB
    expect(indoorLossDb(20, 5200, 31, 1, 16)).toBeCloseTo(74.3201 + 40.3319 + 16 - 28, 3);
  });

  it("counts a given floor_loss_db once per floor", () => {
    // L_f(n) = n × floor_loss_db when the user gives it (DESIGN.md §2): 2 floors × 15 dB on top of 69.604 dB
    expect(indoorLossDb(10, 2400, null, 2, 15)).toBeCloseTo(67.604 + 30 - 28 + 2 * 15, 3);
  });

  // Omitted floor_loss_db: P.1238-7 Table 3, office column (values from memory of the recommendation).
  it("uses Table 3's office L_f(n) = 15 + 4(n − 1) at 1.8–2 GHz: 3 floors cost 23 dB, not 3 × 15", () => {
    // 20·log10(1900) + 30·log10(10) − 28 = 65.575 + 30 − 28; + 15 + 4 × 2
    expect(indoorLossDb(10, 1900, null, 3)).toBeCloseTo(20 * Math.log10(1900) + 30 - 28 + 23, 9);
  });
  it("uses Table 3's office 14 dB for one floor at 2.4 GHz", () => {
    expect(indoorLossDb(10, 2437, null, 1) - indoorLossDb(10, 2437)).toBeCloseTo(14, 9);
  });
  it("uses Table 3's office 16 dB for one floor at 5.2 GHz and 22 / 28 dB for one / two floors at 5.8 GHz", () => {
    expect(indoorLossDb(10, 5200, null, 1) - indoorLossDb(10, 5200)).toBeCloseTo(16, 9);
    expect(indoorLossDb(10, 5785, null, 1) - indoorLossDb(10, 5785)).toBeCloseTo(22, 9);
    expect(indoorLossDb(10, 5785, null, 2) - indoorLossDb(10, 5785)).toBeCloseTo(28, 9);
  });
  it("takes the larger 5.8 GHz row between the 5.2 and 5.8 GHz rows (U-NII-2C, our documented choice)", () => {
    expect(indoorLossDb(10, 5500, null, 1) - indoorLossDb(10, 5500)).toBeCloseTo(22, 9);
  });
  it("never lowers the loss when a floor is added (any tabulated office row)", () => {
    for (const [f, maxFloors] of [[950, 3], [1900, 10], [3500, 2], [5785, 2]] as const) {
      for (let n = 1; n <= maxFloors; n++) expect(indoorLossDb(10, f, null, n)).toBeGreaterThan(indoorLossDb(10, f, null, n - 1));
    }
  });
  it("refuses more floors than Table 3 gives, asking for floor_loss_db", () => {
    expectRefusal(() => indoorLossDb(10, 2437, null, 2), "value", "floors");
    expect(() => indoorLossDb(10, 2437, null, 2)).toThrow(/floor_loss_db/);
  });
  it("refuses floors in the 6 GHz band, which Table 3 does not cover, unless floor_loss_db is given", () => {
    expectRefusal(() => indoorLossDb(10, 6105, null, 1), "value", "floor_loss_db");
    expect(indoorLossDb(10, 6105, null, 1, 18) - indoorLossDb(10, 6105)).toBeCloseTo(18, 9);
    expect(indoorLossDb(10, 6105, null, 0)).toBe(indoorLossDb(10, 6105));
  });

  it("treats empty optional arguments as the defaults", () => {
    expect(indoorLossDb(10, 2400, "", "", "")).toBe(indoorLossDb(10, 2400));
  });

  it("equals the frequency term at 1 m, where the distance term vanishes", () => {
    // 20·log10(2400) − 28 = 39.604 dB
    expect(indoorLossDb(1, 2400)).toBeCloseTo(67.604 - 28, 3);
  });

  it("refuses a distance below 1 m, where the model does not hold", () => {
    expectRefusal(() => indoorLossDb(0.5, 2400), "value", "distance_m");
  });

  it("refuses a negative distance", () => {
    expectRefusal(() => indoorLossDb(-5, 2400), "value", "distance_m");
  });

  it("refuses a frequency outside the edition's 900 MHz–100 GHz", () => {
    expectRefusal(() => indoorLossDb(10, 433), "value", "freq_mhz");
  });

  it("refuses a fractional floor count", () => {
    expectRefusal(() => indoorLossDb(10, 2400, 30, 1.5), "value", "floors");
  });

  it("refuses a zero distance power coefficient", () => {
    expectRefusal(() => indoorLossDb(10, 2400, 0), "value", "distance_power");
  });

  describe("distance power coefficient N within 17–40 (P.1238-7 Table 2: 17–33, from memory; 40 a fourth-power decay)", () => {
    it.each([17, 40])("accepts N = %p: 20·log10(5200) − 28 + N·log10(20)", (n) => {
      expect(indoorLossDb(20, 5200, n)).toBeCloseTo(20 * Math.log10(5200) - 28 + n * Math.log10(20), 9);
    });

    it.each([16.9, 40.1, 100, -30])("refuses N = %p naming distance_power and the range", (n) => {
      expectValueError(() => indoorLossDb(20, 5200, n), /^distance_power: the coefficient N must be from 17 to 40 \(ITU-R P\.1238-7 Table 2 gives 17–33/);
    });

    it("says a value under 10 looks like the exponent n, with N = 10·n", () => {
      expectValueError(() => indoorLossDb(20, 5200, 3), /got 3; 3 looks like the path loss exponent n, and N = 10·n \(30\)$/);
    });
  });
});

describe("REACH (INDOORLOSS solved for distance)", () => {
  it("matches the hand inversion of eq. (1)", () => {
    // d = 10^((eirp + rx_gain − target − 20·log10 f + 28 − L_f) ÷ N)
    //   = 10^((20 + 2 + 65 − 74.3201 + 28 − 16) ÷ 31) = 10^0.79613 = 6.2536 m
    expect(reachM(20, -65, 5200, 31, 1, 16, 2)).toBeCloseTo(6.2536, 3);
  });

  it("round-trips with INDOORLOSS: the loss at the reach is eirp + rx_gain − target", () => {
    const d = reachM(20, -65, 5200, 31, 1, 16, 2);
    expect(indoorLossDb(d, 5200, 31, 1, 16)).toBeCloseTo(20 + 2 - -65, 9);
  });

  it("round-trips with the defaults at 2.4 GHz", () => {
    const d = reachM(17, -70, 2437);
    expect(indoorLossDb(d, 2437)).toBeCloseTo(17 - -70, 9);
  });

  it("uses the same Table 3 floor rule as INDOORLOSS when floor_loss_db is omitted", () => {
    // 1900 MHz, 2 floors: L_f = 15 + 4 = 19 dB (P.1238-7 Table 3 office, from memory)
    const d = reachM(20, -70, 1900, null, 2);
    expect(d).toBeCloseTo(Math.pow(10, (20 + 70 - 20 * Math.log10(1900) + 28 - 19) / 30), 9);
    expect(indoorLossDb(d, 1900, null, 2)).toBeCloseTo(90, 9);
  });

  it("returns 1 m when the target is exactly the signal at 1 m", () => {
    // at 1 m the loss is 20·log10(f) − 28; 2400 MHz: 39.604 dB
    expect(reachM(10, 10 - (20 * Math.log10(2400) - 28), 2400)).toBeCloseTo(1, 9);
  });

  it("refuses distance_power 3 (an exponent where N is meant), which would answer 372 507 426 107 660 m", () => {
    // 10^((20 + 70 − 20·log10(5180) + 28) ÷ 3) = 10^14.57: the issue 16 case
    expectValueError(() => reachM(20, -70, 5180, 3), /^distance_power: the coefficient N must be from 17 to 40 .*N = 10·n \(30\)$/);
  });

  it("refuses a target above the EIRP", () => {
    expectRefusal(() => reachM(20, 25, 5200), "value", "target_dbm");
  });

  it("refuses a target above the signal at 1 m", () => {
    // signal at 1 m: 20 − (74.32 − 28) = −26.32 dBm
    expectRefusal(() => reachM(20, -26, 5200), "value", "target_dbm");
  });

  it("refuses text for the EIRP", () => {
    expectRefusal(() => reachM("20 dBm", -65, 5200), "value", "eirp_dbm");
  });
});
