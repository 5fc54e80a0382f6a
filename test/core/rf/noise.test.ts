import { noiseFloorDbm } from "../../../src/core/rf/index";
import { AirtallyError } from "../../../src/core/errors";

// Thermal noise density kT₀ at T₀ = 290 K: 1.380649e-23 × 290 = 4.00e-21 W/Hz = −173.98 ≈ −174 dBm/Hz.
describe("NOISEFLOOR", () => {
  it("gives −93.99 dBm for 20 MHz with the default 7 dB noise figure", () => {
    // −174 + 10·log10(20e6) + 7 = −174 + 73.0103 + 7
    expect(noiseFloorDbm(20)).toBeCloseTo(-174 + 73.0103 + 7, 4);
  });

  it("gives −89.97 dBm for 80 MHz with a 5 dB noise figure", () => {
    // −174 + 10·log10(80e6) + 5 = −174 + 79.0309 + 5
    expect(noiseFloorDbm(80, 5)).toBeCloseTo(-174 + 79.0309 + 5, 4);
  });

  it("rises 3.01 dB per doubling of width", () => {
    expect(noiseFloorDbm(40, 0) - noiseFloorDbm(20, 0)).toBeCloseTo(10 * Math.log10(2), 9);
  });

  it("refuses a zero width", () => {
    expect(() => noiseFloorDbm(0)).toThrow(/^width_mhz:/);
  });

  it("refuses a negative noise figure", () => {
    expect(() => noiseFloorDbm(20, -1)).toThrow(AirtallyError);
  });
});
