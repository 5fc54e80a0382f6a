import { resolvedDefault, resultChain } from "../../src/core/index";
import { aggCount } from "../../src/core/mac/index";

describe("resolvedDefault (the value an omitted argument takes)", () => {
  it("resolves mpdus auto to AGGCOUNT for the same link and packet", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    expect(resolvedDefault("GOODPUT", "mpdus", { link, packet_bytes: 1500 })).toBe(`auto = ${aggCount(link, 1500)} (AGGCOUNT)`);
  });

  it("resolves the office floor factor from ITU-R P.1238-7 Table 3: 1.9 GHz, 3 floors = 15 + 4 × 2 = 23 dB (from memory)", () => {
    expect(resolvedDefault("INDOORLOSS", "floor_loss_db", { freq_mhz: 1900, floors: 3 })).toMatch(/^L_f\(3\) = 23 dB/);
  });

  it("resolves the common-practice wall loss, and says it is unused without walls", () => {
    expect(resolvedDefault("INDOORLOSS", "wall_loss_db", { freq_mhz: 5500, walls: 2 })).toMatch(/^4 dB per wall/);
    expect(resolvedDefault("INDOORLOSS", "wall_loss_db", { freq_mhz: 5500 })).toBe("not used (no walls)");
  });

  it("gives constants from the catalog and null where nothing can be resolved", () => {
    expect(resolvedDefault("INDOORLOSS", "distance_power", {})).toBe(30);
    expect(resolvedDefault("GOODPUT", "mpdus", { link: "OFDM 55Mbps" })).toBeNull();
    expect(resolvedDefault("RATE", "link", {})).toBeNull();
  });
});

describe("resultChain", () => {
  it("is null for a function without a chain", () => {
    expect(resultChain("RATE", { link: "OFDM 54Mbps 5GHz" })).toBeNull();
  });

  it("ends EFFICIENCY with goodput ÷ rate: (8 × 1500 ÷ 406.5) ÷ 54 (IEEE 802.11-2020 eq. (17-29) access, by hand)", () => {
    const rows = resultChain("EFFICIENCY", { link: "OFDM 54Mbps 5GHz", packet_bytes: 1500 })!;
    expect(rows[rows.length - 1][1]).toBeCloseTo((8 * 1500) / 406.5 / 54, 12);
  });
});
