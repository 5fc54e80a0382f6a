import { edcaParameters, aifsUs, parseAccess, parseProtection } from "../../../src/core/mac";
import { expectValueError } from "../../_lib/expectError";

const OFDM5 = "OFDM 54Mbps 5GHz";
const DSSS = "HR-DSSS 11Mbps 2.4GHz";
const ERP = "ERP-OFDM 54Mbps 2.4GHz";

// OFDM-based PHYs: aCWmin 15, aCWmax 1023 (IEEE 802.11-2020 Table 17-21); DSSS/HR-DSSS: aCWmin 31, aCWmax 1023 (Clause 15/16).
describe("default EDCA parameters of a non-AP station (IEEE 802.11-2020 Table 9-155)", () => {
  it("AC_BK: AIFSN 7, CWmin aCWmin, CWmax aCWmax, no TXOP limit", () => {
    const e = edcaParameters("BK", OFDM5);
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([7, 15, 1023, 0]);
  });
  it("AC_BE: AIFSN 3, CWmin aCWmin, CWmax aCWmax, no TXOP limit", () => {
    const e = edcaParameters("BE", OFDM5);
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([3, 15, 1023, 0]);
  });
  it("AC_VI on OFDM: AIFSN 2, CWmin (15+1)/2−1, CWmax aCWmin, TXOP 4.096 ms", () => {
    const e = edcaParameters("VI", OFDM5);
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([2, (15 + 1) / 2 - 1, 15, 4096]);
  });
  it("AC_VO on OFDM: AIFSN 2, CWmin (15+1)/4−1, CWmax (15+1)/2−1, TXOP 2.080 ms", () => {
    const e = edcaParameters("VO", OFDM5);
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([2, (15 + 1) / 4 - 1, (15 + 1) / 2 - 1, 2080]);
  });
  it("AC_VI on DSSS/HR-DSSS: CWmin (31+1)/2−1, CWmax 31, TXOP 6.016 ms (the DSSS column)", () => {
    const e = edcaParameters("VI", DSSS);
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([2, 15, 31, 6016]);
  });
  it("AC_VO on DSSS/HR-DSSS: CWmin (31+1)/4−1, CWmax (31+1)/2−1, TXOP 3.264 ms", () => {
    const e = edcaParameters("VO", DSSS);
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([2, 7, 15, 3264]);
  });
  it("uses the OFDM column for HE", () => {
    expect(edcaParameters("VO", "HE MCS7 1SS 20MHz 5GHz").txopLimitUs).toBe(2080);
  });
  it("retries up to dot11ShortRetryLimit 7 by default (Annex C, from memory)", () => {
    expect(edcaParameters("BE", OFDM5).retryLimit).toBe(7);
  });
});

describe("the AP's EDCA defaults (dot11QAPEDCATable, from memory)", () => {
  it("AP VO: AIFSN 1", () => {
    expect(edcaParameters("VO", OFDM5, "AP").aifsn).toBe(1);
  });
  it("AP VI: AIFSN 1", () => {
    expect(edcaParameters("VI", OFDM5, "AP").aifsn).toBe(1);
  });
  it("AP BE: AIFSN 3, CWmax 4 × (aCWmin + 1) − 1 = 63", () => {
    const e = edcaParameters("BE", OFDM5, "AP");
    expect([e.aifsn, e.cwMin, e.cwMax]).toEqual([3, 15, 4 * (15 + 1) - 1]);
  });
});

describe("advertised overrides and DCF", () => {
  it("takes AIFSN, CWmin, CWmax and TXOP from mac_options", () => {
    const e = edcaParameters("BE", OFDM5, "AIFSN=5 CWMIN=31 CWMAX=511 TXOP=3008");
    expect([e.aifsn, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([5, 31, 511, 3008]);
  });
  it("DCF waits DIFS with the PHY's aCWmin/aCWmax and no TXOP", () => {
    const e = edcaParameters("DCF", OFDM5);
    expect([e.aifsUs, e.cwMin, e.cwMax, e.txopLimitUs]).toEqual([16 + 2 * 9, 15, 1023, 0]); // DIFS = SIFS + 2 × slot
  });
  it("refuses AIFSN= under DCF", () => {
    expectValueError(() => edcaParameters("DCF", OFDM5, "AIFSN=3"), /^mac_options: AIFSN= is an EDCA setting/);
  });
  it("refuses an override that puts CWmin above the default CWmax", () => {
    expectValueError(() => edcaParameters("VO", OFDM5, "CWMIN=31"), /^mac_options: CWmin 31 would be above CWmax 7/);
  });
});

describe("interframe spaces (IEEE 802.11-2020 10.3.2.3)", () => {
  it("5 GHz OFDM: SIFS 16 µs, slot 9 µs (Table 17-21)", () => {
    const e = edcaParameters("BE", OFDM5);
    expect([e.sifsUs, e.slotUs]).toEqual([16, 9]);
  });
  it("DIFS = SIFS + 2 × slot at 5 GHz", () => {
    expect(edcaParameters("BE", OFDM5).difsUs).toBe(16 + 2 * 9);
  });
  it("DSSS: SIFS 10 µs, slot 20 µs, DIFS 50 µs", () => {
    const e = edcaParameters("BE", DSSS);
    expect([e.sifsUs, e.slotUs, e.difsUs]).toEqual([10, 20, 10 + 2 * 20]);
  });
  it("ERP at 2.4 GHz: SIFS 10 µs, short slot 9 µs by default (Table 18-5)", () => {
    const e = edcaParameters("BE", ERP);
    expect([e.sifsUs, e.slotUs]).toEqual([10, 9]);
  });
  it("ERP at 2.4 GHz with SLOT=20: the long slot", () => {
    expect(edcaParameters("BE", ERP, "SLOT=20").slotUs).toBe(20);
  });
  it("HT at 2.4 GHz keeps the 10 µs SIFS (Table 19-25)", () => {
    expect(edcaParameters("BE", "HT MCS7 20MHz 2.4GHz").sifsUs).toBe(10);
  });
  it("EIFS on 5 GHz OFDM = SIFS + DIFS + an Ack at 6 Mb/s", () => {
    // 10.3.2.3.7; Ack TXTIME at 6 Mb/s: 20 + 4 × ceil((16 + 8 × 14 + 6) / 24) = 20 + 4 × 6 (17.4.3 eq. (17-29))
    expect(edcaParameters("BE", OFDM5).eifsUs).toBe(16 + 34 + (20 + 4 * 6));
  });
  it("EIFS on HR-DSSS = SIFS + DIFS + an Ack at 1 Mb/s, long preamble", () => {
    // Ack at 1 Mb/s: 144 µs preamble + 48 µs header + 14 × 8 µs (Clause 16 TXTIME)
    expect(edcaParameters("BE", DSSS).eifsUs).toBe(10 + 50 + (144 + 48 + 112));
  });
  it("AckTimeout on 5 GHz OFDM = SIFS + slot + aRxPHYStartDelay 25 µs (10.3.2.9, Table 17-21)", () => {
    expect(edcaParameters("BE", OFDM5).ackTimeoutUs).toBe(16 + 9 + 25);
  });
  it("refuses SLOT=20 at 5 GHz", () => {
    expectValueError(() => edcaParameters("BE", OFDM5, "SLOT=20"), /^mac_options: SLOT=20 is the 2.4 GHz long slot/);
  });
});

describe("AIFS (catalog)", () => {
  it("BE on the default 5 GHz OFDM link: SIFS 16 + 3 × 9", () => {
    expect(aifsUs("BE")).toBe(16 + 3 * 9);
  });
  it("BK: SIFS 16 + 7 × 9", () => {
    expect(aifsUs("BK", OFDM5)).toBe(16 + 7 * 9);
  });
  it("VO: SIFS 16 + 2 × 9", () => {
    expect(aifsUs("VO")).toBe(16 + 2 * 9);
  });
  it("BE at 2.4 GHz with the long slot: 10 + 3 × 20", () => {
    expect(aifsUs("BE", ERP, "SLOT=20")).toBe(10 + 3 * 20);
  });
  it("DCF is DIFS", () => {
    expect(aifsUs("dcf", DSSS)).toBe(10 + 2 * 20);
  });
  it("reads AC_VI and lower case", () => {
    expect(aifsUs("ac_vi")).toBe(16 + 2 * 9);
  });
  it("refuses an unknown access category, naming access", () => {
    expectValueError(() => aifsUs("XX"), /^access: expected BK, BE, VI, VO or DCF/);
    expectValueError(() => parseAccess(3), /^access:/);
  });
  it("defaults access to BE and protection to none", () => {
    expect([parseAccess(null), parseProtection(null), parseProtection("cts-to-self")]).toEqual(["BE", "none", "CTS"]);
  });
  it("refuses an unknown protection, naming protection", () => {
    expectValueError(() => parseProtection("foo"), /^protection: expected none, RTS/);
  });
});
