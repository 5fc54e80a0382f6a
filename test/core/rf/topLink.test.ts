import { topLink } from "../../../src/core/rf/index";
import { AirtallyError } from "../../../src/core/errors";

/**
 * IEEE 802.11-2020 Table 17-18, receiver performance requirements, 20 MHz
 * channel spacing: minimum sensitivity per data rate.
 */
const TABLE_17_18: ReadonlyArray<readonly [rateMbps: number, sensitivityDbm: number]> = [
  [6, -82], [9, -81], [12, -79], [18, -77], [24, -74], [36, -70], [48, -66], [54, -65],
];

describe("TOPLINK for OFDM (IEEE 802.11-2020 Table 17-18)", () => {
  TABLE_17_18.forEach(([rate, sensitivity], i) => {
    it(`picks ${rate} Mb/s at exactly its minimum sensitivity ${sensitivity} dBm`, () => {
      expect(topLink("OFDM", sensitivity)).toBe(`OFDM ${rate}Mbps 5GHz`);
    });

    if (i > 0) {
      const [lowerRate] = TABLE_17_18[i - 1];
      it(`falls back to ${lowerRate} Mb/s 0.5 dB below the ${rate} Mb/s threshold (${sensitivity - 0.5} dBm)`, () => {
        expect(topLink("OFDM", sensitivity - 0.5)).toBe(`OFDM ${lowerRate}Mbps 5GHz`);
      });
    }
  });

  it("keeps 54 Mb/s above its threshold", () => {
    expect(topLink("OFDM", -40)).toBe("OFDM 54Mbps 5GHz");
  });

  it("adds the margin to each threshold: −70 dBm with 5 dB margin needs the −75 dBm row, 18 Mb/s", () => {
    // 24 Mb/s: −74 + 5 = −69 > −70; 18 Mb/s: −77 + 5 = −72 ≤ −70
    expect(topLink("OFDM", -70, null, null, 5)).toBe("OFDM 18Mbps 5GHz");
  });

  it("answers #N/A just below the 6 Mb/s threshold", () => {
    try {
      topLink("OFDM", -82.5);
      throw new Error("expected #N/A");
    } catch (e) {
      expect(e).toBeInstanceOf(AirtallyError);
      expect((e as AirtallyError).kind).toBe("na");
      expect((e as AirtallyError).message).toMatch(/^rssi_dbm:.*-82 dBm/);
    }
  });

  it("uses the band the user gives: 6 GHz", () => {
    expect(topLink("OFDM", -70, 1, 20, 0, 6)).toBe("OFDM 36Mbps 6GHz");
  });

  it("refuses a stream count the family does not have", () => {
    try {
      topLink("OFDM", -60, 2);
      throw new Error("expected #VALUE!");
    } catch (e) {
      expect((e as AirtallyError).kind).toBe("value");
      expect((e as AirtallyError).message).toMatch(/^family: no OFDM link/);
    }
  });
});

describe("TOPLINK for ERP-OFDM (Clause 18 takes the Clause 17 Table 17-18 sensitivities — clause reference from memory)", () => {
  it("defaults to the 2.4 GHz band, where ERP-OFDM exists", () => {
    expect(topLink("ERP-OFDM", -70)).toBe("ERP-OFDM 36Mbps 2.4GHz");
  });
});

describe("TOPLINK for HR-DSSS (Clause 15 −80 dBm at 2 Mb/s, Clause 16 −76 dBm at 11 Mb/s)", () => {
  it("picks 11 Mb/s at −76 dBm", () => {
    expect(topLink("HR-DSSS", -76)).toBe("HR-DSSS 11Mbps 2.4GHz");
  });

  it("falls back to 2 Mb/s at −77 dBm", () => {
    expect(topLink("HR-DSSS", -77)).toBe("HR-DSSS 2Mbps 2.4GHz");
  });

  it("answers #N/A at −81 dBm", () => {
    expect(() => topLink("HR-DSSS", -81)).toThrow(/^rssi_dbm:/);
  });
});

describe("TOPLINK bad input", () => {
  it("refuses an unknown family", () => {
    expect(() => topLink("HX", -60)).toThrow(/^family: expected one of/);
  });

  it("refuses text for the signal level", () => {
    expect(() => topLink("OFDM", "strong")).toThrow(/^rssi_dbm:/);
  });

  it("refuses a width that no family has", () => {
    expect(() => topLink("OFDM", -60, 1, 30)).toThrow(/^width_mhz:/);
  });

  it("refuses a band that does not exist", () => {
    expect(() => topLink("OFDM", -60, 1, 20, 0, 3)).toThrow(/^band_ghz:/);
  });
});

/**
 * IEEE 802.11-2020 Table 21-25, VHT receiver minimum input sensitivity, dBm,
 * per MCS for 20, 40, 80 and 160 MHz (each doubling of width costs 3 dB).
 */
const TABLE_21_25: ReadonlyArray<readonly [mcs: number, w20: number, w40: number, w80: number, w160: number]> = [
  [0, -82, -79, -76, -73],
  [1, -79, -76, -73, -70],
  [2, -77, -74, -71, -68],
  [3, -74, -71, -68, -65],
  [4, -70, -67, -64, -61],
  [5, -66, -63, -60, -57],
  [6, -65, -62, -59, -56],
  [7, -64, -61, -58, -55],
  [8, -59, -56, -53, -50],
  [9, -57, -54, -51, -48],
];

describe("TOPLINK for VHT at 80 MHz, 1 stream (IEEE 802.11-2020 Table 21-25)", () => {
  TABLE_21_25.forEach(([mcs, , , w80], i) => {
    it(`picks MCS${mcs} at exactly its minimum sensitivity ${w80} dBm`, () => {
      expect(topLink("VHT", w80, 1, 80)).toBe(`VHT MCS${mcs} 1SS 80MHz GI0.8 5GHz`);
    });

    if (i > 0) {
      it(`falls back to MCS${mcs - 1} 0.5 dB below the MCS${mcs} threshold (${w80 - 0.5} dBm)`, () => {
        expect(topLink("VHT", w80 - 0.5, 1, 80)).toBe(`VHT MCS${mcs - 1} 1SS 80MHz GI0.8 5GHz`);
      });
    }
  });

  it("answers #N/A 0.5 dB below the MCS0 threshold", () => {
    expect(() => topLink("VHT", -76.5, 1, 80)).toThrow(/^rssi_dbm:/);
  });
});

describe("TOPLINK for VHT: the standard's excluded combinations are never offered", () => {
  it("stops at MCS8 at 20 MHz with 1 stream, where MCS9 is not defined (Table 21-30), even above MCS9's −57 dBm", () => {
    expect(topLink("VHT", -50, 1, 20)).toBe("VHT MCS8 1SS 20MHz GI0.8 5GHz");
  });

  it("skips MCS6 at 80 MHz with 3 streams (not defined, Table 21-50): −59 dBm gives MCS5", () => {
    // Table 21-25 80 MHz: MCS6 −59, MCS5 −60; MCS6 3SS 80 MHz is excluded
    expect(topLink("VHT", -59, 3, 80)).toBe("VHT MCS5 3SS 80MHz GI0.8 5GHz");
  });

  it("uses the 160 MHz column: MCS7 at −55 dBm", () => {
    expect(topLink("VHT", -55, 2, 160)).toBe("VHT MCS7 2SS 160MHz GI0.8 5GHz");
  });
});

/** IEEE 802.11-2020 Table 19-23, HT minimum sensitivity at 20 MHz for MCS 0–7 (and 8–15, 16–23, 24–31 by modulation). */
describe("TOPLINK for HT (IEEE 802.11-2020 Table 19-23)", () => {
  it("picks MCS7 at −64 dBm with one stream", () => {
    expect(topLink("HT", -64)).toBe("HT MCS7 1SS 20MHz GI0.8 5GHz");
  });

  it("picks MCS6 at −65 dBm with one stream (MCS7 needs −64)", () => {
    expect(topLink("HT", -65)).toBe("HT MCS6 1SS 20MHz GI0.8 5GHz");
  });

  it("enumerates the two-stream indices: MCS15 at −64 dBm", () => {
    expect(topLink("HT", -64, 2)).toBe("HT MCS15 2SS 20MHz GI0.8 5GHz");
  });

  it("enumerates the two-stream indices: MCS12 at −70 dBm (16-QAM 3/4, like MCS4)", () => {
    expect(topLink("HT", -70, 2)).toBe("HT MCS12 2SS 20MHz GI0.8 5GHz");
  });

  it("uses the 40 MHz column: MCS7 at −61 dBm", () => {
    expect(topLink("HT", -61, 1, 40)).toBe("HT MCS7 1SS 40MHz GI0.8 5GHz");
  });
});
