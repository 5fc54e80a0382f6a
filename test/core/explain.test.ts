import { resolvedDefault, resultChain } from "../../src/core/index";
import { aggCount } from "../../src/core/mac/index";
import { clientShare, saturationGoodputTcpMbps } from "../../src/core/budget/index";

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

  it("reaches SATURATE with TCP through its own steps: the TCP row equals the result", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    const rows = resultChain("SATURATE", { link, stations: 10, packet_bytes: 1500, mac_options: "TCP" })!;
    const result = saturationGoodputTcpMbps(link, 10, 1500, null, null, null, "TCP");
    expect(rows[rows.length - 1][1]).toBe(result);
    expect(rows[rows.length - 2][1]).toBeCloseTo(result, 9); // 1 ÷ (1 ÷ S + T_ACK ÷ (8 × 1500 × 2))
  });

  it("reaches CLIENTSHARE of voice on a contended channel: demand ÷ SATURATE with one MPDU per access", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    const rows = resultChain("CLIENTSHARE", { link, demand_mbps: 0.08, packet_bytes: 200, stations: 4, access: "VO", mpdus: 1 })!;
    expect(rows[rows.length - 1][1]).toBe(clientShare(link, 0.08, 200, 4, "VO", null, 1));
    // the step before is SATURATE's capacity: share × capacity = demand
    expect(rows[rows.length - 2][0]).toBe("SATURATE (Mb/s)");
    expect((rows[rows.length - 1][1] as number) * (rows[rows.length - 2][1] as number)).toBeCloseTo(0.08, 12);
  });
});
