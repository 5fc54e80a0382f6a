import { parseLink } from "../../../src/core/link";
import {
  rateMbps,
  txtime,
  txtimeUs,
  psduFit,
  sensitivityDbm,
  maxPsduBytes,
  nonHtReferenceRateMbps,
} from "../../../src/core/phy/index";
import {
  ofdm,
  erpOfdm,
  OFDM_RATES,
  codedBitsPerSymbol,
  ofdmDataBitsPerSymbol,
  T_SYM_us,
  N_SD,
  T_PREAMBLE_us,
  T_SIGNAL_us,
} from "../../../src/core/phy/ofdm";
import { expectValueError } from "../../_lib/expectError";
import { durationSum } from "../../_lib/txtime";

describe("OFDM numerology (IEEE 802.11-2020 Table 17-5)", () => {
  it("has a 4 µs symbol", () => {
    expect(T_SYM_us).toBe(0.8 + 3.2); // Table 17-5: T_SYM = T_GI + T_FFT
  });
  it("has 48 data subcarriers", () => {
    expect(N_SD).toBe(48); // Table 17-5: N_SD
  });
  it("has a 16 µs preamble", () => {
    expect(T_PREAMBLE_us).toBe(8 + 8); // Table 17-5: T_PREAMBLE = T_SHORT + T_LONG
  });
  it("has a 4 µs SIGNAL field", () => {
    expect(T_SIGNAL_us).toBe(4); // Table 17-5: T_SIGNAL = T_GI + T_FFT
  });
});

describe("OFDM rate-dependent parameters (IEEE 802.11-2020 Table 17-4)", () => {
  // [rate Mb/s, N_BPSC, R, N_CBPS, N_DBPS] as printed in Table 17-4
  const table17_4: Array<[number, number, string, number, number]> = [
    [6, 1, "1/2", 48, 24],
    [9, 1, "3/4", 48, 36],
    [12, 2, "1/2", 96, 48],
    [18, 2, "3/4", 96, 72],
    [24, 4, "1/2", 192, 96],
    [36, 4, "3/4", 192, 144],
    [48, 6, "2/3", 288, 192],
    [54, 6, "3/4", 288, 216],
  ];
  it("lists exactly the eight Table 17-4 rates", () => {
    expect(OFDM_RATES.map((r) => r.rateMbps)).toEqual([6, 9, 12, 18, 24, 36, 48, 54]);
  });
  it.each(table17_4)("%d Mb/s has N_BPSC %d and R %s", (rate, nBpsc, r) => {
    const row = OFDM_RATES.find((x) => x.rateMbps === rate)!;
    expect([row.nBpsc, `${row.codeRate[0]}/${row.codeRate[1]}`]).toEqual([nBpsc, r]);
  });
  it.each(table17_4)("%d Mb/s has N_CBPS %i and N_DBPS %i", (rate, _n, _r, nCbps, nDbps) => {
    const row = OFDM_RATES.find((x) => x.rateMbps === rate)!;
    expect([codedBitsPerSymbol(row), ofdmDataBitsPerSymbol(row)]).toEqual([nCbps, nDbps]);
  });
  it.each(table17_4)("RATE of OFDM %d Mb/s is the Table 17-4 data rate", (rate) => {
    expect(rateMbps(`OFDM ${rate}Mbps 5GHz`)).toBeCloseTo(rate, 12);
  });
  it.each(table17_4)("RATE of ERP-OFDM %d Mb/s is the Table 17-4 data rate", (rate) => {
    expect(rateMbps(`ERP-OFDM ${rate}Mbps 2.4GHz`)).toBeCloseTo(rate, 12);
  });
  it("offers the eight rates as mcsValues for both families", () => {
    expect([ofdm.mcsValues, erpOfdm.mcsValues]).toEqual([
      [6, 9, 12, 18, 24, 36, 48, 54],
      [6, 9, 12, 18, 24, 36, 48, 54],
    ]);
  });
  it("uses the data rate as the non-HT reference rate", () => {
    expect(nonHtReferenceRateMbps("ERP-OFDM 36Mbps 2.4GHz")).toBe(36);
  });
});

describe("OFDM TXTIME (IEEE 802.11-2020 17.4.3 eq. (17-29))", () => {
  it("takes 244 µs for 1500 octets at 54 Mb/s", () => {
    // T_PREAMBLE + T_SIGNAL + T_SYM × N_SYM, N_SYM = ceil((16 + 8·1500 + 6) / 216) = ceil(55.66) = 56
    expect(txtimeUs("OFDM 54Mbps 5GHz", 1500)).toBe(16 + 4 + 4 * 56);
  });
  it("takes 160 µs for 100 octets at 6 Mb/s", () => {
    // N_SYM = ceil((16 + 8·100 + 6) / 24) = ceil(34.25) = 35
    expect(txtimeUs("OFDM 6Mbps 5GHz", 100)).toBe(16 + 4 + 4 * 35);
  });
  it("takes 28 µs for a 14-octet ACK at 24 Mb/s", () => {
    // N_SYM = ceil((16 + 112 + 6) / 96) = 2
    expect(txtimeUs("OFDM 24Mbps 5GHz", 14)).toBe(16 + 4 + 4 * 2);
  });
  it("takes one data symbol for an empty PSDU", () => {
    // N_SYM = ceil((16 + 0 + 6) / 24) = 1 (SERVICE + tail still go out)
    expect(txtimeUs("OFDM 6Mbps 6GHz", 0)).toBe(16 + 4 + 4 * 1);
  });
  it("takes 5484 µs for the largest PSDU at 6 Mb/s", () => {
    // N_SYM = ceil((16 + 8·4095 + 6) / 24) = ceil(1365.92) = 1366
    expect(txtimeUs("OFDM 6Mbps 5GHz", 4095)).toBe(16 + 4 + 4 * 1366);
  });
  it("reports the pad bits of 17.3.5.4", () => {
    // N_PAD = N_SYM × N_DBPS − (16 + 8·LENGTH + 6) = 56·216 − 12022 = 74
    const pad = txtime("OFDM 54Mbps 5GHz", 1500).terms.find((t) => t.label === "pad bits")!;
    expect(pad.value).toBe(56 * 216 - (16 + 8 * 1500 + 6));
  });
  it("lists L-STF, L-LTF, L-SIG and the data field as the duration terms", () => {
    const adds = txtime("OFDM 54Mbps 5GHz", 1500).terms.filter((t) => t.adds);
    expect(adds.map((t) => [t.label, t.value])).toEqual([
      ["L-STF (µs)", 8],
      ["L-LTF (µs)", 8],
      ["L-SIG (µs)", 4],
      ["data field (µs)", 4 * 56],
    ]);
  });
  it("lists N_SYM, T_SYM and N_DBPS as factor terms", () => {
    const factors = txtime("OFDM 54Mbps 5GHz", 1500).terms.filter((t) => !t.adds);
    const byLabel = Object.fromEntries(factors.map((t) => [t.label, t.value]));
    expect(byLabel).toMatchObject({ N_SYM: 56, "T_SYM (µs)": 4, "N_DBPS (bits)": 216 });
  });
});

describe("ERP-OFDM TXTIME (IEEE 802.11-2020 Clause 18, aSignalExtension of Table 18-5)", () => {
  it("adds the 6 µs signal extension: 250 µs for 1500 octets at 54 Mb/s", () => {
    // 17-29 plus aSignalExtension: 16 + 4 + 4·56 + 6
    expect(txtimeUs("ERP-OFDM 54Mbps 2.4GHz", 1500)).toBe(16 + 4 + 4 * 56 + 6);
  });
  it("takes 50 µs for a 14-octet ACK at 6 Mb/s", () => {
    // N_SYM = ceil((16 + 112 + 6) / 24) = 6; + 6 µs signal extension
    expect(txtimeUs("ERP-OFDM 6Mbps 2.4GHz", 14)).toBe(16 + 4 + 4 * 6 + 6);
  });
  it("shows the signal extension as the last duration term", () => {
    const adds = txtime("ERP-OFDM 6Mbps 2.4GHz", 14).terms.filter((t) => t.adds);
    expect(adds[adds.length - 1]).toEqual({ label: "signal extension (µs)", value: 6, adds: true });
  });
  it("has no signal extension term for OFDM at 5 GHz", () => {
    const labels = txtime("OFDM 6Mbps 5GHz", 14).terms.map((t) => t.label);
    expect(labels).not.toContain("signal extension (µs)");
  });
});

describe("OFDM TXTIME terms invariant", () => {
  const links = [
    ...OFDM_RATES.map((r) => `OFDM ${r.rateMbps}Mbps 5GHz`),
    ...OFDM_RATES.map((r) => `ERP-OFDM ${r.rateMbps}Mbps 2.4GHz`),
  ];
  it("has duration terms that sum to the total for every rate and sample size", () => {
    for (const link of links) {
      for (const n of [0, 1, 14, 100, 1500, 2304, 4095]) {
        const t = txtime(link, n);
        const sum = durationSum(t);
        expect(sum).toBe(t.totalUs);
      }
    }
  });
});

describe("OFDM PSDUFIT (largest PSDU within a duration)", () => {
  it("fits 1509 octets into 244 µs at 54 Mb/s", () => {
    // 56 symbols carry 56·216 = 12096 bits ≥ 16 + 8·L + 6 → L ≤ floor(12074 / 8) = 1509
    expect(psduFit("OFDM 54Mbps 5GHz", 16 + 4 + 4 * 56)).toBe(Math.floor((56 * 216 - 22) / 8));
  });
  it("fits nothing when the duration is shorter than an empty PPDU", () => {
    // empty PSDU: 16 + 4 + 4·1 = 24 µs
    expect(psduFit("OFDM 6Mbps 5GHz", 23)).toBe(0);
  });
  it("fits the largest PSDU when the duration allows it", () => {
    expect(psduFit("OFDM 54Mbps 5GHz", 10000)).toBe(4095); // Table 17-21 aPSDUMaxLength
  });
  it("round-trips: the fitted PSDU fits and one more octet does not (ERP-OFDM)", () => {
    for (const rate of [6, 9, 12, 18, 24, 36, 48, 54]) {
      const link = `ERP-OFDM ${rate}Mbps 2.4GHz`;
      for (const d of [50, 250, 777, 3000]) {
        const n = psduFit(link, d);
        expect(txtimeUs(link, n)).toBeLessThanOrEqual(d);
        if (n < 4095) expect(txtimeUs(link, n + 1)).toBeGreaterThan(d); // at the maximum PSDU there is no +1
      }
    }
  });
});

describe("OFDM minimum input sensitivity (IEEE 802.11-2020 Table 17-18, 20 MHz)", () => {
  const table17_18: Array<[number, number]> = [
    [6, -82], [9, -81], [12, -79], [18, -77], [24, -74], [36, -70], [48, -66], [54, -65],
  ];
  it.each(table17_18)("OFDM %d Mb/s needs %d dBm", (rate, dbm) => {
    expect(sensitivityDbm(`OFDM ${rate}Mbps 5GHz`)).toBe(dbm);
  });
  it.each(table17_18)("ERP-OFDM %d Mb/s needs %d dBm (Clause 18 uses the Clause 17 table)", (rate, dbm) => {
    expect(sensitivityDbm(`ERP-OFDM ${rate}Mbps 2.4GHz`)).toBe(dbm);
  });
});

describe("OFDM maximum PSDU", () => {
  it("is 4095 octets (12-bit LENGTH field, aPSDUMaxLength)", () => {
    expect(maxPsduBytes("OFDM 54Mbps 5GHz")).toBe(2 ** 12 - 1);
  });
});

describe("OFDM / ERP-OFDM refusals", () => {
  it("refuses OFDM at 2.4 GHz: that is ERP-OFDM", () => {
    expectValueError(() => parseLink("OFDM 54Mbps 2.4GHz"), /that is ERP-OFDM/);
  });
  it("refuses ERP-OFDM at 5 GHz and points to OFDM", () => {
    expectValueError(() => parseLink("ERP-OFDM 54Mbps 5GHz"), /use OFDM/);
  });
  it("refuses ERP-OFDM at 6 GHz and points to OFDM", () => {
    expectValueError(() => parseLink("ERP-OFDM 6Mbps 6GHz"), /use OFDM/);
  });
  it("refuses an unknown rate and lists the valid ones", () => {
    expectValueError(() => parseLink("ERP-OFDM 50Mbps 2.4GHz"), "link: ERP-OFDM has no 50 Mb/s rate; use 6, 9, 12, 18, 24, 36, 48 or 54");
  });
  it("refuses a DSSS rate for OFDM and says where it belongs", () => {
    expectValueError(() => parseLink("OFDM 11Mbps 5GHz"), /no 11 Mb\/s rate.*HR-DSSS/);
  });
  it("refuses a 40 MHz width", () => {
    expectValueError(() => parseLink("OFDM 54Mbps 40MHz 5GHz"), /20 MHz/);
  });
  it("refuses 10 MHz channel spacing as not modelled (module check)", () => {
    const link = { ...parseLink("OFDM 6Mbps 5GHz"), widthMHz: 10 };
    expectValueError(() => ofdm.validate(link), /10 MHz channel spacing.*not modelled; use 20MHz/);
  });
  it("refuses 5 MHz channel spacing as not modelled (module check)", () => {
    const link = { ...parseLink("OFDM 6Mbps 5GHz"), widthMHz: 5 };
    expectValueError(() => ofdm.validate(link), /5 MHz channel spacing.*not modelled/);
  });
  it("refuses two spatial streams", () => {
    expectValueError(() => parseLink("OFDM 54Mbps 2SS 5GHz"), /one spatial stream/);
  });
  it("refuses a short preamble", () => {
    expectValueError(() => parseLink("ERP-OFDM 54Mbps short 2.4GHz"), /DSSS and HR-DSSS/);
  });
  it("refuses an MCS token", () => {
    expectValueError(() => parseLink("OFDM MCS7 5GHz"), /Mbps/);
  });
});

describe("OFDM TXTIME bad psdu_bytes", () => {
  const bad: Array<[string, unknown]> = [
    ["negative", -1],
    ["fractional", 100.5],
    ["above 4095", 4096],
    ["NaN", NaN],
    ["Infinity", Infinity],
    ["text", "1500"],
    ["empty", null],
  ];
  it.each(bad)("refuses %s psdu_bytes with a #VALUE! naming psdu_bytes", (_name, value) => {
    expectValueError(() => txtime("ERP-OFDM 54Mbps 2.4GHz", value), /^psdu_bytes: /);
  });
});
