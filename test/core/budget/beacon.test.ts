import { beaconLoad, beaconAirtime } from "../../../src/core/budget/index";
import { AirtallyError } from "../../../src/core/errors";

// One TU = 1024 µs (IEEE 802.11-2020 3.1); 100 TU = 102 400 µs.
// The AP's AC_VO parameters (Table 9-155 with the AP's AIFSN 1): AIFS = SIFS + 1 × slot,
// CWmin = (aCWmin + 1)/4 − 1, mean backoff CWmin/2 slots.

/** OFDM 6 Mb/s at 5 GHz, 350-octet beacon, by hand:
 *  TXTIME = 16 (preamble) + 4 (SIGNAL) + 4 × N_SYM, N_SYM = ceil((16 + 8·350 + 6) ÷ 24) = ceil(117.58) = 118
 *         (IEEE 802.11-2020 17.4.3 eq. (17-29), N_DBPS = 24 at 6 Mb/s, Table 17-4) = 492 µs
 *  AIFS = 16 (aSIFSTime, 5 GHz OFDM) + 1 × 9 (aSlotTime) = 25 µs
 *  mean backoff = ((15 + 1)/4 − 1) ÷ 2 × 9 = 1.5 × 9 = 13.5 µs (aCWmin 15 for OFDM)
 */
const OFDM6_BEACON_us = 25 + 13.5 + (16 + 4 + 4 * 118);

/** DSSS 1 Mb/s at 2.4 GHz, 350-octet beacon, by hand:
 *  TXTIME = 144 (long PLCP preamble) + 48 (PLCP header) + 8 × 350 ÷ 1 = 2992 µs (Clause 15 TXTIME)
 *  AIFS = 10 (aSIFSTime, DSSS) + 1 × 20 (aSlotTime, DSSS) = 30 µs
 *  mean backoff = ((31 + 1)/4 − 1) ÷ 2 × 20 = 3.5 × 20 = 70 µs (aCWmin 31 for DSSS)
 */
const DSSS1_BEACON_us = 30 + 70 + (144 + 48 + 8 * 350);

describe("BEACONLOAD", () => {
  it("costs one 350-octet beacon at OFDM 6 Mb/s as AIFS + mean backoff + TXTIME", () => {
    expect(beaconAirtime("OFDM 6Mbps 5GHz", 350).totalUs).toBe(OFDM6_BEACON_us);
  });

  it("takes 0.52 % of a 5 GHz channel for one SSID at the defaults", () => {
    // 530.5 µs per 102 400 µs
    expect(beaconLoad(1)).toBeCloseTo(OFDM6_BEACON_us / (100 * 1024), 12);
  });

  it("costs one 350-octet beacon at DSSS 1 Mb/s as 3092 µs", () => {
    expect(beaconAirtime("DSSS 1Mbps 2.4GHz", 350).totalUs).toBe(DSSS1_BEACON_us);
  });

  it("eats over a third of a 2.4 GHz channel with 4 SSIDs from 3 APs at 1 Mb/s (common practice: low basic rates and many SSIDs are costly)", () => {
    // 4 × 3 = 12 beacons × 3092 µs = 37 104 µs per 102 400 µs = 36.2 %
    expect(beaconLoad(4, 3, 350, "DSSS 1Mbps 2.4GHz")).toBeCloseTo((12 * DSSS1_BEACON_us) / 102400, 12);
  });

  it("scales with the interval: 200 TU halves the load", () => {
    expect(beaconLoad(2, 1, 350, "OFDM 6Mbps 5GHz", 200)).toBeCloseTo((2 * OFDM6_BEACON_us) / (200 * 1024), 12);
  });

  it("is zero with no SSIDs", () => {
    expect(beaconLoad(0)).toBe(0);
  });

  it("keeps a share above 1 instead of clamping it", () => {
    // 16 SSIDs × 3 APs × 3092 µs = 148 416 µs > 102 400 µs
    expect(beaconLoad(16, 3, 350, "DSSS 1Mbps 2.4GHz")).toBeCloseTo((48 * DSSS1_BEACON_us) / 102400, 12);
  });

  it("refuses a fractional SSID count", () => {
    expect(() => beaconLoad(1.5)).toThrow(/^ssids:/);
  });

  it("refuses a zero beacon interval", () => {
    expect(() => beaconLoad(1, 1, 350, null, 0)).toThrow(/^interval_tu:/);
  });

  it("names beacon_link when the link text is bad", () => {
    try {
      beaconLoad(1, 1, 350, "OFDM 7Mbps");
      throw new Error("expected #VALUE!");
    } catch (e) {
      expect((e as AirtallyError).kind).toBe("value");
      expect((e as AirtallyError).message).toMatch(/^beacon_link:/);
    }
  });

  it("names beacon_bytes when the beacon is longer than the PHY carries", () => {
    expect(() => beaconLoad(1, 1, 5000, "DSSS 1Mbps 2.4GHz")).toThrow(/^beacon_bytes:/);
  });
});
