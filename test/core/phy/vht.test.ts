/**
 * VHT PHY (IEEE 802.11-2020 Clause 21). Expected values are the standard's
 * printed table values or hand derivations written out beside each check.
 */
import { parseLink } from "../../../src/core/link";
import { AirtallyError } from "../../../src/core/errors";
import { maxPsduBytes, nonHtReferenceRateMbps, psduFit, rateMbps, sensitivityDbm, txtime, txtimeUs } from "../../../src/core/phy/index";
import { vhtSymbolParams, N_VHT_LTF } from "../../../src/core/phy/vht";
import { durationSum } from "../../_lib/txtime";

/** The combinations Tables 21-30…21-61 leave out, written out here independently of the module. */
function omittedFromTables(w: number, nss: number, mcs: number): boolean {
  if (w === 20 && mcs === 9) return nss !== 3 && nss !== 6;
  if (w === 80 && mcs === 6) return nss === 3 || nss === 7;
  if (w === 80 && mcs === 9) return nss === 6;
  if (w === 160 && mcs === 9) return nss === 3;
  return false;
}

/**
 * Independent rate formula for the full grid: N_SD (21.3.7) × N_BPSCS × R × N_SS ÷ T_SYM.
 * Spot-checked against printed table values in the next block.
 */
const N_SD: Record<number, number> = { 20: 52, 40: 108, 80: 234, 160: 468 };
const BITS_TIMES_R = [1 / 2, 1, 3 / 2, 2, 3, 4, 4.5, 5, 6, 20 / 3]; // N_BPSCS × R for MCS 0–9
function expectedRate(w: number, nss: number, mcs: number, gi: number): number {
  return (N_SD[w] * BITS_TIMES_R[mcs] * nss) / (gi === 0.4 ? 3.6 : 4);
}

describe("VHT rates, every width × N_SS × MCS × GI (IEEE 802.11-2020 Tables 21-30…21-61)", () => {
  for (const w of [20, 40, 80, 160])
    for (let nss = 1; nss <= 8; nss++)
      for (const gi of [0.8, 0.4])
        it(`matches N_SD × N_BPSCS × R × N_SS ÷ T_SYM at ${w} MHz, ${nss} SS, GI${gi}`, () => {
          for (let mcs = 0; mcs <= 9; mcs++) {
            if (omittedFromTables(w, nss, mcs)) continue;
            expect(rateMbps(`VHT MCS${mcs} ${nss}SS ${w}MHz GI${gi}`)).toBeCloseTo(expectedRate(w, nss, mcs, gi), 9);
          }
        });
});

describe("VHT rates printed in the tables (spot checks)", () => {
  const printed: [string, number][] = [
    ["VHT MCS8 1SS 20MHz GI0.8", 78], // Table 21-30
    ["VHT MCS8 1SS 20MHz GI0.4", 86.7], // Table 21-30
    ["VHT MCS9 3SS 20MHz GI0.8", 260], // Table 21-32
    ["VHT MCS9 3SS 20MHz GI0.4", 288.9], // Table 21-32
    ["VHT MCS9 1SS 40MHz GI0.8", 180], // Table 21-38
    ["VHT MCS9 1SS 40MHz GI0.4", 200], // Table 21-38
    ["VHT MCS7 1SS 80MHz GI0.8", 292.5], // Table 21-46
    ["VHT MCS9 1SS 80MHz GI0.4", 433.3], // Table 21-46
    ["VHT MCS9 4SS 80MHz GI0.4", 1733.3], // Table 21-49
    ["VHT MCS9 1SS 160MHz GI0.8", 780], // Table 21-54
    ["VHT MCS9 2SS 160MHz GI0.4", 1733.3], // Table 21-55
    ["VHT MCS9 8SS 160MHz GI0.8", 6240], // Table 21-61
    ["VHT MCS9 8SS 160MHz GI0.4", 6933.3], // Table 21-61
  ];
  for (const [link, mbps] of printed) {
    it(`gives ${mbps} Mb/s for ${link}`, () => expect(rateMbps(link)).toBeCloseTo(mbps, 1));
  }
});

describe("VHT N_ES, BCC encoders (IEEE 802.11-2020 Tables 21-30…21-61, N_ES column)", () => {
  const cases: [string, number][] = [
    ["VHT MCS9 3SS 80MHz", 3], // Table 21-48: N_DBPS 4680
    ["VHT MCS9 8SS 160MHz", 12], // Table 21-61: N_DBPS 24960
    ["VHT MCS2 7SS 80MHz", 3], // Table 21-52 exception: N_DBPS 2457
    ["VHT MCS7 7SS 80MHz", 6], // Table 21-52 exception: N_DBPS 8190
    ["VHT MCS7 8SS 80MHz", 6], // Table 21-53 exception: N_DBPS 9360
    ["VHT MCS7 4SS 160MHz", 6], // Table 21-57 exception: N_DBPS 9360
    ["VHT MCS5 5SS 160MHz", 5], // Table 21-58: N_DBPS 9360 follows the rule
    ["VHT MCS8 7SS 160MHz", 12], // Table 21-60 exception: N_DBPS 19656
    ["VHT MCS9 7SS 160MHz", 12], // Table 21-60 exception: N_DBPS 21840
  ];
  for (const [link, nEs] of cases) {
    it(`uses ${nEs} encoders for ${link}`, () => expect(vhtSymbolParams(parseLink(link)).nEs).toBe(nEs));
  }
  it("uses one encoder with LDPC", () => {
    expect(vhtSymbolParams(parseLink("VHT MCS9 8SS 160MHz LDPC")).nEs).toBe(1);
  });
  it("splits N_DBPS and N_CBPS evenly over N_ES for every defined combination (21.3.10.5.2 encoder parser)", () => {
    for (const w of [20, 40, 80, 160])
      for (let nss = 1; nss <= 8; nss++)
        for (let mcs = 0; mcs <= 9; mcs++) {
          if (omittedFromTables(w, nss, mcs)) continue;
          const p = vhtSymbolParams(parseLink(`VHT MCS${mcs} ${nss}SS ${w}MHz`));
          expect([w, nss, mcs, Number.isInteger(p.nDbps / p.nEs) && Number.isInteger(p.nCbps / p.nEs)]).toEqual([w, nss, mcs, true]);
          expect(p.nEs).toBeGreaterThanOrEqual(Math.ceil(p.nDbps / 2160)); // at most 600 Mb/s per encoder at 3.6 µs
        }
  });
});

describe("VHT TXTIME (IEEE 802.11-2020 21.4.3)", () => {
  // L-STF 8 + L-LTF 8 + L-SIG 4 + VHT-SIG-A 8 + VHT-STF 4, then N_VHT-LTF × 4, then VHT-SIG-B 4 (21.3.6)
  const pre = (nLtf: number) => 8 + 8 + 4 + 8 + 4 + 4 * nLtf + 4;

  it("adds the VHT preamble to N_SYM × T_SYM with one stream", () => {
    // MCS0 20 MHz: N_DBPS 26; N_SYM = ceil((800 + 16 + 6) ÷ 26) = 32
    expect(txtimeUs("VHT MCS0 1SS 20MHz", 100)).toBe(pre(1) + 4 * 32);
  });
  it("rounds the short-GI data field to 4 µs with two streams at 80 MHz", () => {
    // MCS9 2SS 80 MHz: N_DBPS = 234 × 8 × 5/6 × 2 = 3120, N_ES 2; N_SYM = ceil(12028 ÷ 3120) = 4; 4 × ceil(3.6 × 4 ÷ 4) = 16
    expect(txtimeUs("VHT MCS9 2SS 80MHz GI0.4", 1500)).toBe(pre(2) + 16);
  });
  it("trains four VHT-LTFs for three streams", () => {
    // MCS4 3SS 40 MHz: N_DBPS = 108 × 4 × 3/4 × 3 = 972; N_SYM = ceil(8022 ÷ 972) = 9
    expect(txtimeUs("VHT MCS4 3SS 40MHz", 1000)).toBe(pre(4) + 4 * 9);
  });
  it("trains six VHT-LTFs for five streams and counts three tails", () => {
    // MCS7 5SS 80 MHz: N_DBPS = 234 × 5 × 5 = 5850, N_ES = ceil(5850 ÷ 2160) = 3; N_SYM = ceil((32000 + 16 + 18) ÷ 5850) = 6
    expect(txtimeUs("VHT MCS7 5SS 80MHz", 4000)).toBe(pre(6) + 4 * 6);
  });
  it("trains eight VHT-LTFs for eight streams at 160 MHz", () => {
    // MCS9 8SS 160 MHz: N_DBPS 24960, N_ES 12; N_SYM = ceil((80000 + 16 + 72) ÷ 24960) = 4; SGI: 4 × ceil(14.4 ÷ 4) = 16
    expect(txtimeUs("VHT MCS9 8SS 160MHz GI0.4", 10000)).toBe(pre(8) + 16);
  });
  it("counts the six tails of the N_ES exception at 80 MHz with seven streams", () => {
    // MCS7 7SS 80 MHz: N_DBPS 8190, N_ES 6; 1018 octets: 8144 + 16 + 36 = 8196 > 8190 → 2 symbols (4 tails would fit in 1)
    expect(txtimeUs("VHT MCS7 7SS 80MHz", 1018)).toBe(pre(8) + 4 * 2);
  });
  it("sends STBC symbols in pairs and trains N_STS = 4", () => {
    // MCS0 2SS STBC: N_DBPS 52, N_STS 4 → 4 VHT-LTFs; N_SYM = 2 × ceil((880 + 22) ÷ 104) = 18
    expect(txtimeUs("VHT MCS0 2SS 20MHz STBC", 110)).toBe(pre(4) + 4 * 18);
  });
  it("adds the LDPC extra symbol when puncturing would be excessive", () => {
    // 21.3.10.5.4, MCS0 LDPC 98 octets: N_SYM,init = ceil(800 ÷ 26) = 31; N_pld = 806, N_avbits = 1612 → N_CW 1, L_LDPC 1944;
    // N_shrt = 972 − 806 = 166, N_punc = 1944 − 1612 − 166 = 166 > 97.2 and 166 < 1.2 × 166 → N_SYM = 32
    expect(txtimeUs("VHT MCS0 1SS 20MHz LDPC", 98)).toBe(pre(1) + 4 * 32);
  });
  it("sends no Data field for an NDP", () => {
    expect(txtimeUs("VHT MCS0 2SS 80MHz", 0)).toBe(pre(2));
  });
  it("refuses a PSDU longer than aPSDUMaxLength", () => {
    expect(() => txtimeUs("VHT MCS9 2SS 80MHz", 4_692_481)).toThrow(/psdu_bytes/);
  });
  it("reports aPSDUMaxLength 4 692 480 octets (Table 21-29)", () => {
    expect(maxPsduBytes("VHT MCS9 2SS 80MHz")).toBe(4_692_480);
  });
  it("uses the N_VHT-LTF count 1, 2, 4, 4, 6, 6, 8, 8 for N_STS 1–8", () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8].map((n) => N_VHT_LTF[n])).toEqual([1, 2, 4, 4, 6, 6, 8, 8]);
  });
});

describe("VHT TXTIME terms", () => {
  for (const link of ["VHT MCS9 2SS 80MHz GI0.4", "VHT MCS0 1SS 20MHz LDPC", "VHT MCS7 7SS 80MHz", "VHT MCS3 4SS 160MHz STBC"]) {
    it(`sums its duration terms to the total for ${link}`, () => {
      for (const n of [0, 1, 98, 1500, 1_000_000]) {
        const t = txtime(link, n);
        const sum = durationSum(t);
        expect(sum).toBeCloseTo(t.totalUs, 9);
      }
    });
  }
});

describe("VHT PSDUFIT", () => {
  it("finds the largest PSDU in a hand-derived duration", () => {
    // 168 µs on MCS0 20 MHz: N_SYM ≤ (168 − 40) ÷ 4 = 32 → 8L + 22 ≤ 832 → L ≤ 101
    expect(psduFit("VHT MCS0 1SS 20MHz", 168)).toBe(101);
  });
  for (const link of ["VHT MCS9 2SS 80MHz GI0.4", "VHT MCS0 1SS 20MHz LDPC", "VHT MCS7 7SS 80MHz", "VHT MCS5 3SS 40MHz STBC"]) {
    it(`round-trips TXTIME for ${link}`, () => {
      for (const n of [1, 1500, 65535, 300000]) {
        const d = txtimeUs(link, n);
        const fit = psduFit(link, d);
        expect(fit).toBeGreaterThanOrEqual(n);
        expect(txtimeUs(link, fit)).toBeLessThanOrEqual(d);
        expect(txtimeUs(link, fit + 1)).toBeGreaterThan(d);
      }
    });
  }
});

describe("VHT minimum sensitivity (IEEE 802.11-2020 Table 21-25)", () => {
  const col20 = [-82, -79, -77, -74, -70, -66, -65, -64, -59, -57];
  const col160 = [-73, -70, -68, -65, -61, -57, -56, -55, -50, -48];
  col20.forEach((dbm, mcs) => {
    it(`is ${dbm} dBm for MCS${mcs} at 20 MHz`, () => expect(sensitivityDbm(`VHT MCS${mcs} 3SS 20MHz`)).toBeCloseTo(dbm, 9));
  });
  col160.forEach((dbm, mcs) => {
    it(`is ${dbm} dBm for MCS${mcs} at 160 MHz`, () => expect(sensitivityDbm(`VHT MCS${mcs} 1SS 160MHz`)).toBeCloseTo(dbm, 9));
  });
  it("is −54 dBm for MCS9 at 40 MHz", () => expect(sensitivityDbm("VHT MCS9 1SS 40MHz")).toBeCloseTo(-54, 9));
  it("is −51 dBm for MCS9 at 80 MHz", () => expect(sensitivityDbm("VHT MCS9 1SS 80MHz")).toBeCloseTo(-51, 9));
});

describe("VHT non-HT reference rate (IEEE 802.11-2020 10.6.6.5.2, from memory)", () => {
  it("maps MCS2 (QPSK 3/4) to 18 Mb/s", () => expect(nonHtReferenceRateMbps("VHT MCS2 1SS")).toBe(18));
  it("maps MCS9 (256-QAM 5/6) to 54 Mb/s", () => expect(nonHtReferenceRateMbps("VHT MCS9 2SS 80MHz")).toBe(54));
});

describe("VHT validity", () => {
  it("refuses MCS9 at 20 MHz with one stream with the DESIGN.md §4 message", () => {
    expect(() => parseLink("VHT MCS9 1SS 20MHz")).toThrow("link: VHT MCS9 is not defined at 20 MHz with 1 spatial stream");
  });
  it("says at which stream counts MCS9 exists at 20 MHz", () => {
    expect(() => parseLink("VHT MCS9 2SS 20MHz")).toThrow(/3 or 6 spatial streams/);
  });
  it("refuses or accepts every width × N_SS × MCS × GI as the tables do", () => {
    for (const w of [20, 40, 80, 160])
      for (let nss = 1; nss <= 8; nss++)
        for (let mcs = 0; mcs <= 9; mcs++)
          for (const gi of ["0.4", "0.8"]) {
            const text = `VHT MCS${mcs} ${nss}SS ${w}MHz GI${gi} 5GHz`;
            if (omittedFromTables(w, nss, mcs)) {
              expect(() => parseLink(text)).toThrow(`link: VHT MCS${mcs} is not defined at ${w} MHz with ${nss} spatial stream`);
            } else {
              expect(parseLink(text).text).toBe(text);
            }
          }
  });
  const refused: [string, RegExp][] = [
    ["VHT MCS7 1SS 2.4GHz", /5GHz band only/],
    ["VHT MCS7 1SS 6GHz", /5GHz band only/],
    ["VHT MCS10 1SS", /0–9/],
    ["VHT MCS7 9SS", /1–8 spatial streams/],
    ["VHT MCS7 1SS 320MHz", /20MHz, 40MHz, 80MHz or 160MHz/],
    ["VHT MCS7 1SS GI3.2", /GI0.8 .* or GI0.4/],
    ["VHT MCS7 5SS STBC", /at most 4 spatial streams/],
    ["VHT MCS7 1SS GF", /it is for HT/],
  ];
  for (const [text, message] of refused) {
    it(`refuses "${text}" and says what is valid`, () => {
      expect(() => parseLink(text)).toThrow(AirtallyError);
      expect(() => parseLink(text)).toThrow(message);
    });
  }
  it("accepts STBC with four streams and LDPC", () => {
    expect(parseLink("VHT MCS7 4SS 160MHz STBC LDPC").text).toBe("VHT MCS7 4SS 160MHz GI0.8 LDPC STBC 5GHz");
  });
});

describe("VHT link text", () => {
  it("keeps a canonical link unchanged", () => {
    expect(parseLink("VHT MCS9 2SS 80MHz GI0.4 5GHz").text).toBe("VHT MCS9 2SS 80MHz GI0.4 5GHz");
  });
  it("fills the defaults and orders the tokens", () => {
    expect(parseLink("sgi 80mhz vht 2ss mcs9").text).toBe("VHT MCS9 2SS 80MHz GI0.4 5GHz");
  });
});
