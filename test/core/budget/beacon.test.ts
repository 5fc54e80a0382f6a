import * as fs from "fs";
import * as path from "path";
import { beaconShare, beaconAirtime, beaconParts, defaultBeaconBytes } from "../../../src/core/budget/index";
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

/**
 * The default beacons, octet by octet from the standard's field lengths (IEEE 802.11-2020 clause 9; 802.11ax-2021
 * and 802.11be-2024 clause 9 for HE/EHT elements — those lengths from memory), written here independently of BEACON_PARTS.
 * Element = Element ID 1 + Length 1 + body; extension elements + Element ID Extension 1.
 */
const COMMON = 24 /* MAC header */ + 12 /* Timestamp 8, Beacon Interval 2, Capability 2 */ + (2 + 32) /* SSID, 32 octets */ +
  (2 + 8) /* Supported Rates, 8 */ + (2 + 4) /* TIM, 1-octet bitmap */ + (2 + 6) /* Country, 1 triplet */ +
  (2 + 20) /* RSN: 2 + 4 + 2 + 4 + 2 + 4 + 2 */ + (2 + 8) /* Extended Capabilities */ + (2 + 18) /* EDCA Parameter Set */ +
  (3 + 13) /* Basic Multi-Link: control 2 + common info 11 */ + (2 + 5) /* RM Enabled Capabilities */ +
  (2 + 2 * (2 + 1 + 1 + 16)) /* Reduced Neighbor Report, 2 neighbours with one 16-octet TBTT Information each */ +
  (3 + 1 + 4 * 3) /* MU EDCA Parameter Set */ + (3 + 2) /* Spatial Reuse Parameter Set */ + 4; /* FCS */
const HT = (2 + 26) + (2 + 22); // HT Capabilities, HT Operation (9.4.2.55, 9.4.2.56)
const BEACON_2_4 = COMMON + (2 + 1) /* DSSS Parameter Set */ + (2 + 1) /* ERP */ + (2 + 4) /* Ext Supported Rates */ + HT +
  (3 + 6 + 11 + 4) /* HE Caps ≤ 80 */ + (3 + 6) /* HE Op */ + (3 + 2 + 9 + 3) /* EHT Caps ≤ 80 */ + (3 + 5) /* EHT Op */;
const BEACON_5 = COMMON + (2 + 1) /* Power Constraint */ + HT + (2 + 12) /* VHT Caps */ + (2 + 5) /* VHT Op */ + (3 + 6 + 11 + 8) /* HE Caps 160 */ + (3 + 6) +
  (3 + 2 + 9 + 6) /* EHT Caps ≤ 80, 160 */ + (3 + 5);
const BEACON_6 = COMMON + (2 + 1) /* Ext Supported Rates: SAE H2E selector */ + (3 + 6 + 11 + 8) + (3 + 6 + 5) /* HE Op + 6 GHz info */ +
  (3 + 2) /* HE 6 GHz Band Caps */ + (3 + 2 + 9 + 9) /* EHT Caps ≤ 80, 160, 320 */ + (3 + 5 + 3) /* EHT Op + info */ +
  (2 + 1 + 4) + (2 + 1 + 8); /* Transmit Power Envelope: EIRP at 4 widths, PSD of 8 subchannels */

describe("the default beacon, element by element", () => {
  it("is 358 octets at 2.4 GHz, 377 at 5 GHz and 338 at 6 GHz for a typical EHT AP", () => {
    expect([BEACON_2_4, BEACON_5, BEACON_6]).toEqual([358, 377, 338]);
    expect(defaultBeaconBytes(2.4)).toBe(BEACON_2_4);
    expect(defaultBeaconBytes(5)).toBe(BEACON_5);
    expect(defaultBeaconBytes(6)).toBe(BEACON_6);
  });
  it("sends no HT or VHT elements in the 6 GHz band and no VHT elements at 2.4 GHz", () => {
    expect(beaconParts(6).some((p) => /^(HT|VHT) /.test(p.name))).toBe(false);
    expect(beaconParts(2.4).some((p) => /^VHT /.test(p.name))).toBe(false);
  });
  it("shrinks for an older AP: an HE AP at 5 GHz drops the EHT, Multi-Link and Reduced Neighbor Report elements (20 + 8 + 16 + 42 octets)", () => {
    expect(defaultBeaconBytes(5, "HE")).toBe(BEACON_5 - 20 - 8 - 16 - 42);
  });
  it("names a clause for every part", () => {
    for (const band of [2.4, 5, 6] as const) for (const p of beaconParts(band)) expect(p.clause).toMatch(/\d+\.\d/);
  });
  it("states the same totals in the function's help text", () => {
    const source = fs.readFileSync(path.join(__dirname, "../../../src/functions/functions.ts"), "utf8");
    expect(source).toContain(`Totals ${BEACON_2_4} octets at 2.4 GHz, ${BEACON_5} at 5 GHz, ${BEACON_6} at 6 GHz`);
  });
});

/** OFDM 6 Mb/s at 5 GHz, the default 377-octet beacon: N_SYM = ceil((16 + 8·377 + 6) ÷ 24) = ceil(126.58) = 127 → 20 + 508 µs. */
const OFDM6_DEFAULT_BEACON_us = 25 + 13.5 + (16 + 4 + 4 * 127);

describe("BEACONSHARE", () => {
  it("costs one 350-octet beacon at OFDM 6 Mb/s as AIFS + mean backoff + TXTIME", () => {
    expect(beaconAirtime("OFDM 6Mbps 5GHz", 350).totalUs).toBe(OFDM6_BEACON_us);
  });

  it("takes 0.55 % of a 5 GHz channel for one SSID with the default beacon", () => {
    // 566.5 µs per 102 400 µs
    expect(beaconShare("OFDM 6Mbps 5GHz", 1)).toBeCloseTo(OFDM6_DEFAULT_BEACON_us / (100 * 1024), 12);
  });

  it("costs one 350-octet beacon at DSSS 1 Mb/s as 3092 µs", () => {
    expect(beaconAirtime("DSSS 1Mbps 2.4GHz", 350).totalUs).toBe(DSSS1_BEACON_us);
  });

  it("eats over a third of a 2.4 GHz channel with 4 SSIDs from 3 APs at 1 Mb/s (common practice: low basic rates and many SSIDs are costly)", () => {
    // 4 × 3 = 12 beacons × 3092 µs = 37 104 µs per 102 400 µs = 36.2 %
    expect(beaconShare("DSSS 1Mbps 2.4GHz", 4, 3, 350)).toBeCloseTo((12 * DSSS1_BEACON_us) / 102400, 12);
  });

  it("uses the 2.4 GHz default beacon for a 2.4 GHz link: 358 octets at 1 Mb/s", () => {
    // 30 + 70 + 144 + 48 + 8 × 358 = 3156 µs
    expect(beaconShare("DSSS 1Mbps 2.4GHz", 1)).toBeCloseTo((30 + 70 + 144 + 48 + 8 * 358) / 102400, 12);
  });

  it("scales with the interval: 200 TU halves the share", () => {
    expect(beaconShare("OFDM 6Mbps 5GHz", 2, 1, 350, 200)).toBeCloseTo((2 * OFDM6_BEACON_us) / (200 * 1024), 12);
  });

  it("is zero with no SSIDs", () => {
    expect(beaconShare("OFDM 6Mbps 5GHz", 0)).toBe(0);
  });

  it("keeps a share above 1 instead of clamping it", () => {
    // 16 SSIDs × 3 APs × 3092 µs = 148 416 µs > 102 400 µs
    expect(beaconShare("DSSS 1Mbps 2.4GHz", 16, 3, 350)).toBeCloseTo((48 * DSSS1_BEACON_us) / 102400, 12);
  });

  it("refuses a fractional SSID count", () => {
    expect(() => beaconShare("OFDM 6Mbps 5GHz", 1.5)).toThrow(/^ssids:/);
  });

  it("refuses a zero beacon interval", () => {
    expect(() => beaconShare("OFDM 6Mbps 5GHz", 1, 1, 350, 0)).toThrow(/^interval_tu:/);
  });

  it("names beacon_link when the link text is bad or missing", () => {
    for (const bad of ["OFDM 7Mbps", null]) {
      try {
        beaconShare(bad, 1);
        throw new Error("expected #VALUE!");
      } catch (e) {
        expect((e as AirtallyError).kind).toBe("value");
        expect((e as AirtallyError).message).toMatch(/^beacon_link:/);
      }
    }
  });

  it("names beacon_bytes when the beacon is longer than the PHY carries", () => {
    expect(() => beaconShare("DSSS 1Mbps 2.4GHz", 1, 1, 5000)).toThrow(/^beacon_bytes:/);
  });
});
