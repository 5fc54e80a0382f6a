/**
 * HT PHY (IEEE 802.11-2020 Clause 19). Expected values are the standard's
 * printed table values or hand derivations written out beside each check.
 */
import { parseLink } from "../../../src/core/link";
import { AirtallyError } from "../../../src/core/errors";
import { maxPsduBytes, nonHtReferenceRateMbps, psduFit, rateMbps, sensitivityDbm, txtime, txtimeUs } from "../../../src/core/phy/index";
import { htSymbolParams, ldpcCodewords } from "../../../src/core/phy/ht";
import { durationSum } from "../../_lib/txtime";

/** The stream count implied by an HT MCS index, written out from the stream columns of Tables 19-27…19-41. */
function streamsOf(mcs: number): number {
  if (mcs <= 31) return Math.floor(mcs / 8) + 1;
  if (mcs === 32) return 1;
  if (mcs <= 38) return 2;
  if (mcs <= 52) return 3;
  return 4;
}

describe("HT rates, MCS 0–31 (IEEE 802.11-2020 Tables 19-27…19-34, printed to 0.1 Mb/s)", () => {
  // Data rate per MCS 0–7 row for 1 stream; MCS 8·k + i prints (k+1) × these where the table's rounding allows.
  const printed: Record<string, number[]> = {
    // Tables 19-27…19-30, 20 MHz, 800 ns GI
    "20 0.8": [6.5, 13, 19.5, 26, 39, 52, 58.5, 65, 13, 26, 39, 52, 78, 104, 117, 130, 19.5, 39, 58.5, 78, 117, 156, 175.5, 195, 26, 52, 78, 104, 156, 208, 234, 260],
    // Tables 19-27…19-30, 20 MHz, 400 ns GI
    "20 0.4": [7.2, 14.4, 21.7, 28.9, 43.3, 57.8, 65, 72.2, 14.4, 28.9, 43.3, 57.8, 86.7, 115.6, 130, 144.4, 21.7, 43.3, 65, 86.7, 130, 173.3, 195, 216.7, 28.9, 57.8, 86.7, 115.6, 173.3, 231.1, 260, 288.9],
    // Tables 19-31…19-34, 40 MHz, 800 ns GI
    "40 0.8": [13.5, 27, 40.5, 54, 81, 108, 121.5, 135, 27, 54, 81, 108, 162, 216, 243, 270, 40.5, 81, 121.5, 162, 243, 324, 364.5, 405, 54, 108, 162, 216, 324, 432, 486, 540],
    // Tables 19-31…19-34, 40 MHz, 400 ns GI
    "40 0.4": [15, 30, 45, 60, 90, 120, 135, 150, 30, 60, 90, 120, 180, 240, 270, 300, 45, 90, 135, 180, 270, 360, 405, 450, 60, 120, 180, 240, 360, 480, 540, 600],
  };
  for (const [key, rates] of Object.entries(printed)) {
    const [w, gi] = key.split(" ");
    rates.forEach((expected, mcs) => {
      it(`gives ${expected} Mb/s for MCS${mcs} at ${w} MHz GI${gi}`, () => {
        expect(rateMbps(`HT MCS${mcs} ${w}MHz GI${gi} 5GHz`)).toBeCloseTo(expected, 1);
      });
    });
  }
  it("gives 72.2 Mb/s for MCS7 at 20 MHz short GI (Table 19-27)", () => {
    expect(rateMbps("HT MCS7 20MHz SGI")).toBeCloseTo(72.2, 1);
  });
  it("gives 300 Mb/s for MCS15 at 40 MHz short GI (Table 19-32)", () => {
    expect(rateMbps("HT MCS15 40MHz SGI")).toBeCloseTo(300, 9);
  });
});

describe("HT MCS32, the 40 MHz duplicate format (IEEE 802.11-2020 MCS 32 table)", () => {
  it("gives 6 Mb/s with the long GI", () => {
    expect(rateMbps("HT MCS32 40MHz GI0.8")).toBeCloseTo(6, 9); // N_SD 48 × 1 × 1/2 ÷ 4 µs
  });
  it("gives 6.7 Mb/s with the short GI", () => {
    expect(rateMbps("HT MCS32 40MHz GI0.4")).toBeCloseTo(6.7, 1); // 24 bits ÷ 3.6 µs
  });
  it("is refused at 20 MHz with a message naming 40 MHz", () => {
    expect(() => parseLink("HT MCS32 20MHz")).toThrow(/MCS32 .*only at 40MHz/);
  });
});

describe("HT unequal modulation MCS 33–76 (IEEE 802.11-2020 Tables 19-36…19-41)", () => {
  // 20 MHz, 800 ns GI, Mb/s, as printed in Tables 19-36…19-38 (values from memory; each equals 52 × Σ N_BPSCS × R ÷ 4 µs)
  const rate20: Record<number, number> = {
    33: 39, 34: 52, 35: 65, 36: 58.5, 37: 78, 38: 97.5,
    39: 52, 40: 65, 41: 65, 42: 78, 43: 91, 44: 91, 45: 104, 46: 78, 47: 97.5, 48: 97.5, 49: 117, 50: 136.5, 51: 136.5, 52: 156,
    53: 65, 54: 78, 55: 91, 56: 78, 57: 91, 58: 104, 59: 117, 60: 104, 61: 117, 62: 130, 63: 130, 64: 143,
    65: 97.5, 66: 117, 67: 136.5, 68: 117, 69: 136.5, 70: 156, 71: 175.5, 72: 156, 73: 175.5, 74: 195, 75: 195, 76: 214.5,
  };
  for (const [mcs, expected] of Object.entries(rate20)) {
    it(`gives ${expected} Mb/s for MCS${mcs} at 20 MHz long GI`, () => {
      expect(rateMbps(`HT MCS${mcs} 20MHz`)).toBeCloseTo(expected, 9);
    });
  }
  it("gives 81 Mb/s for MCS33 at 40 MHz long GI (Table 19-39, from memory; 108 × (4 + 2) × 1/2 ÷ 4)", () => {
    expect(rateMbps("HT MCS33 40MHz")).toBeCloseTo(81, 9);
  });
  it("gives 495 Mb/s for MCS76 at 40 MHz short GI (Table 19-41, from memory; 108 × (6+6+6+4) × 3/4 ÷ 3.6)", () => {
    expect(rateMbps("HT MCS76 40MHz SGI")).toBeCloseTo(495, 9);
  });
  it("implies the stream count of each table", () => {
    for (let mcs = 0; mcs <= 76; mcs++) {
      expect(parseLink(`HT MCS${mcs} 40MHz`).streams).toBe(streamsOf(mcs));
    }
  });
  it("has no minimum sensitivity in Table 19-23, so SENSITIVITY answers #N/A", () => {
    expect(() => sensitivityDbm("HT MCS33 20MHz")).toThrow(/Table 19-23/);
    try {
      sensitivityDbm("HT MCS33 20MHz");
    } catch (e) {
      expect((e as AirtallyError).kind).toBe("na");
    }
  });
});

describe("HT N_ES, BCC encoders (IEEE 802.11-2020 Tables 19-27…19-41, N_ES column)", () => {
  it("uses one encoder for MCS15 at 40 MHz (Table 19-32)", () => {
    expect(htSymbolParams(parseLink("HT MCS15 40MHz")).nEs).toBe(1);
  });
  it("uses one encoder for MCS20 at 40 MHz (Table 19-33)", () => {
    expect(htSymbolParams(parseLink("HT MCS20 40MHz")).nEs).toBe(1);
  });
  it("uses two encoders for MCS21 at 40 MHz (Table 19-33)", () => {
    expect(htSymbolParams(parseLink("HT MCS21 40MHz")).nEs).toBe(2);
  });
  it("uses two encoders for MCS28 at 40 MHz (Table 19-34)", () => {
    expect(htSymbolParams(parseLink("HT MCS28 40MHz")).nEs).toBe(2);
  });
  it("uses one encoder for MCS31 at 20 MHz (Table 19-30)", () => {
    expect(htSymbolParams(parseLink("HT MCS31 20MHz")).nEs).toBe(1);
  });
  it("uses one encoder with LDPC (19.3.11.7)", () => {
    expect(htSymbolParams(parseLink("HT MCS31 40MHz LDPC")).nEs).toBe(1);
  });
});

describe("HT TXTIME (IEEE 802.11-2020 19.4.3)", () => {
  const MF_1LTF = 8 + 8 + 4 + 8 + 4 + 4; // L-STF + L-LTF + L-SIG + HT-SIG + HT-STF + HT-LTF1 (19.3.6)

  it("adds the mixed-format preamble to N_SYM × T_SYM with the long GI", () => {
    // N_DBPS = 52 × 6 × 5/6 = 260; N_SYM = ceil((8·1500 + 16 + 6) ÷ 260) = ceil(46.24) = 47
    expect(txtimeUs("HT MCS7 20MHz GI0.8 5GHz", 1500)).toBe(MF_1LTF + 4 * 47);
  });
  it("rounds the short-GI data field up to a 4 µs boundary in mixed format", () => {
    // N_SYM = 47; T_SYM × ceil(3.6 × 47 ÷ 4) = 4 × ceil(42.3) = 172
    expect(txtimeUs("HT MCS7 20MHz GI0.4 5GHz", 1500)).toBe(MF_1LTF + 4 * 43);
  });
  it("does not round the short-GI data field in greenfield", () => {
    // HT-GF-STF 8 + HT-LTF1 8 + HT-SIG 8; data T_SYMS × N_SYM = 3.6 × 47 = 169.2
    expect(txtimeUs("HT MCS7 20MHz GI0.4 GF 5GHz", 1500)).toBeCloseTo(8 + 8 + 8 + 169.2, 9);
  });
  it("adds one 4 µs HT-LTF per extra stream in greenfield", () => {
    // MCS15 40 MHz: N_DBPS = 108 × 6 × 5/6 × 2 = 1080, N_ES 1; N_SYM = ceil(12022 ÷ 1080) = 12; N_LTF = 2
    expect(txtimeUs("HT MCS15 40MHz GI0.8 GF 5GHz", 1500)).toBe(8 + 8 + 8 + 4 + 4 * 12);
  });
  it("adds the 6 µs signal extension at 2.4 GHz", () => {
    // MCS0: N_DBPS 26; N_SYM = ceil((800 + 22) ÷ 26) = 32; + aSignalExtension 6 µs
    expect(txtimeUs("HT MCS0 20MHz 2.4GHz", 100)).toBe(MF_1LTF + 4 * 32 + 6);
  });
  it("adds the signal extension to greenfield at 2.4 GHz too", () => {
    // same N_SYM = 32; GF preamble 24 µs
    expect(txtimeUs("HT MCS0 20MHz GF 2.4GHz", 100)).toBe(24 + 4 * 32 + 6);
  });
  it("sends STBC symbols in pairs and trains N_STS = 2 streams", () => {
    // MCS0 STBC: N_STS 2 → N_LTF 2; N_SYM = 2 × ceil((880 + 22) ÷ (2 × 26)) = 2 × ceil(17.35) = 36
    expect(txtimeUs("HT MCS0 20MHz STBC", 110)).toBe(MF_1LTF + 4 + 4 * 36);
  });
  it("trains four HT-LTFs for two streams with STBC", () => {
    // MCS8 STBC: N_STS 4 → N_LTF 4; N_DBPS 52; N_SYM = 2 × ceil((880 + 22) ÷ 104) = 2 × 9 = 18
    expect(txtimeUs("HT MCS8 20MHz STBC", 110)).toBe(8 + 8 + 4 + 8 + 4 + 4 * 4 + 4 * 18);
  });
  it("trains four HT-LTFs for three streams (N_LTF table of 19.3.9.4.6)", () => {
    // MCS16 20 MHz: N_DBPS 78; N_SYM = ceil(822 ÷ 78) = 11
    expect(txtimeUs("HT MCS16 20MHz", 100)).toBe(8 + 8 + 4 + 8 + 4 + 4 * 4 + 4 * 11);
  });
  it("counts two BCC tail sequences when N_ES = 2", () => {
    // MCS23 40 MHz: N_DBPS 1620, N_ES 2; 402 octets: (3216 + 16 + 12) ÷ 1620 = 2.002 → 3 symbols (one encoder would need 2)
    expect(txtimeUs("HT MCS23 40MHz", 402)).toBe(8 + 8 + 4 + 8 + 4 + 4 * 4 + 4 * 3);
  });
  it("adds an LDPC symbol when puncturing would be excessive", () => {
    // 19.3.11.7.5, MCS0 LDPC, 98 octets: N_pld = 800; N_avbits = 52 × ceil(800 ÷ 26) = 1612 → N_CW 1, L_LDPC 1944;
    // N_shrt = 972 − 800 = 172; N_punc = 1944 − 1612 − 172 = 160 > 0.1 × 972 = 97.2 and 172 < 1.2 × 160 = 192
    // → N_avbits = 1664, N_SYM = 32 (BCC would need ceil(806 ÷ 26) = 31)
    expect(txtimeUs("HT MCS0 20MHz LDPC", 98)).toBe(MF_1LTF + 4 * 32);
  });
  it("needs no extra LDPC symbol when the codewords fit", () => {
    // MCS0 LDPC, 100 octets: N_pld 816; N_avbits = 52 × 32 = 1664; N_shrt = 156; N_punc = 124 > 97.2 but 156 ≥ 148.8 → N_SYM 32
    expect(txtimeUs("HT MCS0 20MHz LDPC", 100)).toBe(MF_1LTF + 4 * 32);
  });
  it("splits a long PSDU into 1944-bit codewords", () => {
    // MCS7 LDPC 1500 octets: N_pld 12016 > 2592 → N_CW = ceil(12016 ÷ 1620) = 8; N_shrt = 944; N_punc = 0
    const l = ldpcCodewords(12016, 312 * 47, [5, 6]);
    expect([l.nCw, l.lLdpc, l.nShrt, l.nPunc, l.extraSymbol]).toEqual([8, 1944, 944, 0, false]);
  });
  it("sends no Data field for an NDP (LENGTH 0, 19.3.13)", () => {
    expect(txtimeUs("HT MCS0 20MHz", 0)).toBe(MF_1LTF);
  });
  it("refuses a PSDU longer than 65 535 octets", () => {
    expect(() => txtimeUs("HT MCS7 20MHz", 65536)).toThrow(/psdu_bytes/);
  });
  it("refuses a negative PSDU", () => {
    expect(() => txtimeUs("HT MCS7 20MHz", -1)).toThrow(/psdu_bytes/);
  });
  it("refuses NaN as a PSDU length", () => {
    expect(() => txtimeUs("HT MCS7 20MHz", NaN)).toThrow(/psdu_bytes/);
  });
  it("reports aPSDUMaxLength 65 535 octets (16-bit LENGTH)", () => {
    expect(maxPsduBytes("HT MCS7 20MHz")).toBe(2 ** 16 - 1);
  });
});

describe("HT TXTIME terms", () => {
  const links = ["HT MCS7 20MHz", "HT MCS15 40MHz SGI", "HT MCS7 20MHz SGI GF", "HT MCS0 2.4GHz LDPC", "HT MCS9 STBC 40MHz", "HT MCS76 40MHz SGI"];
  for (const link of links) {
    it(`sums its duration terms to the total for ${link}`, () => {
      for (const n of [0, 1, 98, 1500, 65535]) {
        const t = txtime(link, n);
        const sum = durationSum(t);
        expect(sum).toBeCloseTo(t.totalUs, 9);
      }
    });
  }
});

describe("HT PSDUFIT", () => {
  it("finds the largest PSDU in a hand-derived duration", () => {
    // 224 µs on MCS7 20 MHz: N_SYM ≤ 47 → 8L + 22 ≤ 47 × 260 = 12220 → L ≤ 1524
    expect(psduFit("HT MCS7 20MHz", 224)).toBe(1524);
  });
  for (const link of ["HT MCS7 20MHz SGI", "HT MCS15 40MHz GF SGI", "HT MCS0 LDPC 2.4GHz", "HT MCS23 40MHz"]) {
    it(`round-trips TXTIME for ${link}`, () => {
      for (const n of [1, 100, 1500, 8000]) {
        const d = txtimeUs(link, n);
        const fit = psduFit(link, d);
        expect(fit).toBeGreaterThanOrEqual(n);
        expect(txtimeUs(link, fit)).toBeLessThanOrEqual(d);
        if (fit < 65535) expect(txtimeUs(link, fit + 1)).toBeGreaterThan(d);
      }
    });
  }
});

describe("HT minimum sensitivity (IEEE 802.11-2020 Table 19-23)", () => {
  const col20 = [-82, -79, -77, -74, -70, -66, -65, -64];
  const col40 = [-79, -76, -74, -71, -67, -63, -62, -61];
  col20.forEach((dbm, i) => {
    it(`is ${dbm} dBm for MCS${i} at 20 MHz`, () => expect(sensitivityDbm(`HT MCS${i} 20MHz`)).toBeCloseTo(dbm, 9));
  });
  col40.forEach((dbm, i) => {
    it(`is ${dbm} dBm for MCS${i + 24} at 40 MHz (per its modulation and rate)`, () => expect(sensitivityDbm(`HT MCS${i + 24} 40MHz`)).toBeCloseTo(dbm, 9));
  });
  it("is −79 dBm for MCS32 (BPSK 1/2 in the 40 MHz column)", () => {
    expect(sensitivityDbm("HT MCS32 40MHz")).toBeCloseTo(-79, 9);
  });
});

describe("HT non-HT reference rate (IEEE 802.11-2020 10.6.6.5.2, from memory)", () => {
  it("maps MCS0 (BPSK 1/2) to 6 Mb/s", () => expect(nonHtReferenceRateMbps("HT MCS0")).toBe(6));
  it("maps MCS11 (16-QAM 1/2) to 24 Mb/s", () => expect(nonHtReferenceRateMbps("HT MCS11")).toBe(24));
  it("maps MCS13 (64-QAM 2/3) to 48 Mb/s", () => expect(nonHtReferenceRateMbps("HT MCS13")).toBe(48));
  it("maps MCS15 (64-QAM 5/6) to 54 Mb/s", () => expect(nonHtReferenceRateMbps("HT MCS15")).toBe(54));
});

describe("HT validity", () => {
  const refused: [string, RegExp][] = [
    ["HT MCS7 6GHz", /2.4GHz and 5GHz/],
    ["HT MCS7 80MHz", /20MHz or 40MHz/],
    ["HT MCS7 GI1.6", /GI0.8 .* or GI0.4/],
    ["HT MCS16 STBC", /1 or 2 spatial streams/],
    ["HT MCS77", /0–76/],
    ["HT MCS15 3SS", /2 spatial stream/],
    ["HT MCS32 20MHz", /40MHz/],
  ];
  for (const [text, message] of refused) {
    it(`refuses "${text}" and says what is valid`, () => {
      expect(() => parseLink(text)).toThrow(AirtallyError);
      expect(() => parseLink(text)).toThrow(message);
    });
  }
  it("accepts every MCS at every width, GI, band, format and coding the standard allows", () => {
    for (let mcs = 0; mcs <= 76; mcs++)
      for (const w of [20, 40])
        for (const gi of ["0.4", "0.8"])
          for (const band of ["2.4", "5"])
            for (const opts of ["", "GF", "LDPC", "STBC", "GF LDPC STBC"]) {
              const text = `HT MCS${mcs} ${w}MHz GI${gi} ${opts} ${band}GHz`;
              const forbidden = (mcs === 32 && w === 20) || (opts.includes("STBC") && streamsOf(mcs) > 2);
              if (forbidden) expect(() => parseLink(text)).toThrow(AirtallyError);
              else expect(parseLink(text).family).toBe("HT");
            }
  });
  it("accepts greenfield with the short GI (19.4.3 gives its TXTIME with T_SYMS)", () => {
    expect(parseLink("HT MCS7 GF SGI").greenfield).toBe(true);
  });
});

describe("HT link text", () => {
  it("prints the canonical form of a greenfield link", () => {
    expect(parseLink("ht gf mcs15 40mhz").text).toBe("HT MCS15 2SS 40MHz GI0.8 GF 5GHz");
  });
  it("keeps a canonical link unchanged", () => {
    expect(parseLink("HT MCS15 2SS 40MHz GI0.8 GF 5GHz").text).toBe("HT MCS15 2SS 40MHz GI0.8 GF 5GHz");
  });
  it("prints the options after the format", () => {
    expect(parseLink("HT MCS1 SGI STBC LDPC 2.4GHz").text).toBe("HT MCS1 1SS 20MHz GI0.4 LDPC STBC 2.4GHz");
  });
});
