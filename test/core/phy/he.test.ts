import { parseLink } from "../../../src/core/link";
import { AirtallyError } from "../../../src/core/errors";
import {
  maxPsduBytes,
  nonHtReferenceRateMbps,
  psduFit,
  rateMbps,
  sensitivityDbm,
  txtime,
  txtimeUs,
} from "../../../src/core/phy/index";
import { familyModule } from "../../../src/core/phy/registry";
import { durationSum } from "../../_lib/txtime";

// Data subcarriers per RU, 802.11ax-2021 27.3.2 RU tables / 27.3.8 (N_SD).
const N_SD: Record<string, number> = { RU26: 24, RU52: 48, RU106: 102, RU242: 234, RU484: 468, RU996: 980, RU2x996: 1960 };
const WHOLE: Record<number, string> = { 20: "RU242", 40: "RU484", 80: "RU996", 160: "RU2x996" };
// N_BPSCS and R = num/den per HE-MCS, 802.11ax-2021 27.5 (HE-MCS tables).
const MOD: [number, number, number][] = [
  [1, 1, 2], [2, 1, 2], [2, 3, 4], [4, 1, 2], [4, 3, 4], [6, 2, 3],
  [6, 3, 4], [6, 5, 6], [8, 3, 4], [8, 5, 6], [10, 3, 4], [10, 5, 6],
];
const T_SYM: Record<number, number> = { 0.8: 13.6, 1.6: 14.4, 3.2: 16 }; // 27.3.8: 12.8 µs + GI
/** The tables' integer N_DBPS = floor(N_SD × N_BPSCS × R × N_SS), in integer arithmetic (27.5). */
const nDbps = (nSd: number, m: number, ss: number) => Math.floor((nSd * MOD[m][0] * MOD[m][1] * ss) / MOD[m][2]);

describe("HE data rate (802.11ax-2021 27.5 rate tables: integer N_DBPS ÷ T_SYM)", () => {
  // Published rate-table entries (802.11ax-2021 27.5, one decimal; from memory), checked to their printed precision.
  it("prints 600.4 Mb/s for 80 MHz, 1 stream, MCS11, GI 0.8 µs (N_DBPS 8166, not 8166.7)", () => {
    expect(rateMbps("HE MCS11 1SS 80MHz GI0.8")).toBeCloseTo(600.4, 1); // 8166 ÷ 13.6 = 600.44
  });
  it("prints 1201.0 Mb/s for 160 MHz, 1 stream, MCS11, GI 0.8 µs (N_DBPS 16 333)", () => {
    expect(rateMbps("HE MCS11 1SS 160MHz GI0.8")).toBeCloseTo(1201.0, 1); // floor(1960 × 10 × 5/6) = 16333 ÷ 13.6 = 1200.96
  });
  it("prints 9607.8 Mb/s for 160 MHz, 8 streams, MCS11, GI 0.8 µs", () => {
    expect(rateMbps("HE MCS11 8SS 160MHz")).toBeCloseTo(9607.8, 1); // floor(1960 × 10 × 5/6 × 8) = 130666 ÷ 13.6
  });
  it("prints 7.3 Mb/s for 20 MHz, 1 stream, MCS0, GI 3.2 µs", () => {
    expect(rateMbps("HE MCS0 20MHz GI3.2")).toBeCloseTo(7.3, 1); // 234 × 1 × 1/2 = 117 ÷ 16
  });
  it("prints 143.4 Mb/s for 20 MHz, 1 stream, MCS11, GI 0.8 µs", () => {
    expect(rateMbps("HE MCS11 20MHz")).toBeCloseTo(143.4, 1); // 234 × 10 × 5/6 = 1950 ÷ 13.6
  });
  it("prints 14.7 Mb/s for a 26-tone RU at MCS11, GI 0.8 µs", () => {
    expect(rateMbps("HE MCS11 20MHz RU26")).toBeCloseTo(14.7, 1); // 24 × 10 × 5/6 = 200 ÷ 13.6
  });
  it("halves the data subcarriers with DCM (MCS0 on 242 tones: N_DBPS 58, 4.3 Mb/s)", () => {
    expect(rateMbps("HE MCS0 20MHz DCM")).toBeCloseTo(4.3, 1); // floor((234/2) × 1 × 1/2) = 58 ÷ 13.6, 27.3.12.9
  });
  // Independent of any table memory: the rate is a whole number of data bits per symbol ÷ T_SYM, and never above the exact product.
  it("gives a whole number of data bits per symbol, within one bit of N_SD × N_BPSCS × R × N_SS", () => {
    for (const text of ["HE MCS11 1SS 80MHz", "HE MCS9 3SS 160MHz GI1.6", "HE MCS0 20MHz RU106 DCM", "HE MCS11 8SS 160MHz GI3.2"]) {
      const link = parseLink(text);
      const bits = rateMbps(text) * T_SYM[link.giUs!];
      expect(Math.abs(bits - Math.round(bits))).toBeLessThan(1e-9);
    }
  });

  // Every width, GI, stream count and MCS of the whole-channel SU tables: floor(N_SD × N_BPSCS × R × N_SS) ÷ T_SYM.
  const grid: [number, number, number, number][] = [];
  for (const w of [20, 40, 80, 160]) for (const gi of [0.8, 1.6, 3.2]) for (let ss = 1; ss <= 8; ss++) for (let m = 0; m <= 11; m++) grid.push([w, gi, ss, m]);
  it.each(grid)("rate table: %i MHz GI%s %iSS MCS%i", (w, gi, ss, m) => {
    expect(rateMbps(`HE MCS${m} ${ss}SS ${w}MHz GI${gi}`)).toBeCloseTo(nDbps(N_SD[WHOLE[w]], m, ss) / T_SYM[gi], 9);
  });

  // Every RU size (27.5 RU rate tables), 1 stream, GI 0.8 µs, in the smallest channel that holds it.
  const ruGrid: [string, number, number][] = [];
  const home: Record<string, number> = { RU26: 20, RU52: 20, RU106: 20, RU242: 20, RU484: 40, RU996: 80, RU2x996: 160 };
  for (const ru of Object.keys(N_SD)) for (let m = 0; m <= 11; m++) ruGrid.push([ru, home[ru], m]);
  it.each(ruGrid)("RU rate table: %s in %i MHz MCS%i", (ru, w, m) => {
    expect(rateMbps(`HE MCS${m} ${w}MHz ${ru}`)).toBeCloseTo(nDbps(N_SD[ru], m, 1) / 13.6, 9);
  });
});

describe("HE TXTIME (802.11ax-2021 27.4.3, pre-FEC padding 27.3.12, PE 27.3.13)", () => {
  // Preamble of an HE SU PPDU: L-STF 8 + L-LTF 8 + L-SIG 4 + RL-SIG 4 + HE-SIG-A 8 + HE-STF 4 = 36 µs.
  const SU_PRE = 8 + 8 + 4 + 4 + 8 + 4;

  it("times 1500 octets at MCS7, 2 streams, 80 MHz (no extra symbol, a = 1)", () => {
    // N_DBPS = 980·6·5/6·2 = 9800, N_DBPS,short = 240·6·5/6·2 = 2400, N_CBPS = 11760, N_CBPS,short = 2880.
    // 8·1500 + 16 = 12016 bits → N_SYM,init = 2, N_excess = 2216, a_init = ceil(2216/2400) = 1.
    // LDPC: N_pld = 9800 + 2400 = 12200, N_avbits = 11760 + 2880 = 14640 → N_CW = ceil(12200/1620) = 8,
    // N_shrt = 12960 − 12200 = 760, N_punc = 15552 − 14640 − 760 = 152 ≤ 0.1·2592 → no extra symbol.
    // N_HE-LTF = 2 (N_STS 2), T_HE-LTF-SYM = 6.4 + 0.8; T_PE (PE16, a = 1) = 4.
    expect(txtimeUs("HE MCS7 2SS 80MHz", 1500)).toBeCloseTo(SU_PRE + 2 * 7.2 + 2 * 13.6 + 4, 9);
  });

  it("adds the LDPC extra symbol and raises a from a_init = 2 to 3 (MCS11, 80 MHz, 249 octets)", () => {
    // N_DBPS = floor(980·10·5/6) = 8166, N_DBPS,short = 240·10·5/6 = 2000, N_CBPS,short = 2400.
    // 8·249 + 16 = 2008 → N_SYM,init = 1, a_init = ceil(2008/2000) = 2.
    // N_pld = 2·2000 = 4000, N_avbits = 2·2400 = 4800 → N_CW = ceil(4000/1620) = 3, N_shrt = 4860 − 4000 = 860,
    // N_punc = 5832 − 4800 − 860 = 172 > 0.1·972 and 860 < 1.2·172·5 → extra segment: a = 3, N_SYM = 1.
    // T_PE (PE16, a = 3) = 12.
    expect(txtimeUs("HE MCS11 80MHz", 249)).toBeCloseTo(SU_PRE + 7.2 + 13.6 + 12, 9);
  });

  it("gives T_PE = 4 µs for PE8 when a = 3", () => {
    // Same data field as above (a = 3); nominal padding 8 µs → T_PE = 4 (27.3.13).
    expect(txtimeUs("HE MCS11 80MHz PE8", 249)).toBeCloseTo(SU_PRE + 7.2 + 13.6 + 4, 9);
  });

  it("gives T_PE = 0 for PE0 whatever a is", () => {
    expect(txtimeUs("HE MCS11 80MHz PE0", 249)).toBeCloseTo(SU_PRE + 7.2 + 13.6 + 0, 9);
  });

  it("gives T_PE = 0 for PE8 when a = 1", () => {
    // The 1500-octet, 2-stream case above has a = 1: PE8 → 0 µs.
    expect(txtimeUs("HE MCS7 2SS 80MHz PE8", 1500)).toBeCloseTo(SU_PRE + 2 * 7.2 + 2 * 13.6 + 0, 9);
  });

  it("adds a whole symbol when the extra segment falls on a_init = 4 (ER SU, MCS0, 100 octets)", () => {
    // HE ER SU: HE-SIG-A repeated, 16 µs. N_DBPS = 234·1/2 = 117, N_DBPS,short = 30, N_CBPS = 234.
    // 8·100 + 16 = 816 → N_SYM,init = 7, N_excess = 816 − 702 = 114, a_init = min(ceil(114/30), 4) = 4.
    // N_pld = 7·117 = 819, N_avbits = 7·234 = 1638 → N_CW = 1, L_LDPC = 1944, N_shrt = 972 − 819 = 153,
    // N_punc = 1944 − 1638 − 153 = 153 > 97.2 and 153 < 1.2·153 → extra: N_SYM = 8, a = 1, T_PE = 4.
    expect(txtimeUs("HE MCS0 20MHz ER", 100)).toBeCloseTo(8 + 8 + 4 + 4 + 16 + 4 + 7.2 + 8 * 13.6 + 4, 9);
  });

  it("uses 4x HE-LTF and 16 µs symbols with GI 3.2 µs", () => {
    // Same data bits as the ER case (N_SYM = 8, a = 1); T_SYM = 16, T_HE-LTF-SYM = 12.8 + 3.2.
    expect(txtimeUs("HE MCS0 20MHz GI3.2", 100)).toBeCloseTo(SU_PRE + 16 + 8 * 16 + 4, 9);
  });

  it("uses a 4 µs HE-LTF symbol with 1x HE-LTF", () => {
    // 1 octet: 8 + 16 = 24 bits → N_SYM,init 1, N_excess 24, a_init = ceil(24/300) = 1; N_pld = 300, N_avbits = 360
    // → N_CW 1, L_LDPC 648 (360 < 300 + 912/6), N_shrt = 540 − 300 = 240, N_punc = 648 − 360 − 240 = 48
    // > 0.1·108 and 240 < 1.2·48·5 → extra segment: a = 2, T_PE (PE16) = 8. 1x HE-LTF symbol: 3.2 + 0.8 µs.
    expect(txtimeUs("HE MCS7 20MHz 1xLTF", 1)).toBeCloseTo(SU_PRE + (3.2 + 0.8) + 13.6 + 8, 9);
  });

  it("adds the 6 µs signal extension at 2.4 GHz (BCC, MCS7, 1000 octets)", () => {
    // BCC: N_tail = 6. 8·1000 + 16 + 6 = 8022, N_DBPS = 1170 → N_SYM = 7, N_excess = 1002,
    // a = ceil(1002/300) = 4 → T_PE (PE16) = 16; signal extension 6 µs (27.4.3).
    expect(txtimeUs("HE MCS7 20MHz BCC 2.4GHz", 1000)).toBeCloseTo(SU_PRE + 7.2 + 7 * 13.6 + 16 + 6, 9);
  });

  it("times one user's 484-tone RU as an HE MU PPDU with HE-SIG-B", () => {
    // HE-SIG-B at 80 MHz, MCS0 (26 bits/symbol): common 2·8 + 1 + 4 + 6 = 27, user block 21 + 4 + 6 = 31
    // → ceil(58/26) = 3 symbols = 12 µs. N_DBPS = 468·6·5/6·2 = 4680, N_DBPS,short = 1200.
    // 12016 bits → N_SYM,init = 3, N_excess = 2656, a_init = 3; N_pld = 9360 + 3600 = 12960,
    // N_avbits = 11232 + 4320 = 15552 → N_CW 8, N_shrt 0, N_punc 0 → no extra; T_PE (a = 3) = 12.
    expect(txtimeUs("HE MCS7 2SS 80MHz RU484", 1500)).toBeCloseTo(8 + 8 + 4 + 4 + 8 + 12 + 4 + 2 * 7.2 + 3 * 13.6 + 12, 9);
  });

  it("uses 2 HE-SIG-B symbols for an RU in a 20 MHz channel", () => {
    // Common 8 + 4 + 6 = 18, user block 31 → ceil(49/26) = 2 symbols. RU26 MCS5: N_DBPS = 24·6·2/3 = 96,
    // N_DBPS,short = 6·6·2/3 = 24; 8·100 + 16 = 816 → N_SYM,init 9, N_excess 48, a_init 2;
    // N_pld = 8·96 + 48 = 816, N_avbits = 8·144 + 72 = 1224 → L_LDPC 1296 (1224 < 816 + 488), N_shrt = 864 − 816 = 48,
    // N_punc = 1296 − 1224 − 48 = 24 ≤ 0.1·432 → no extra; a = 2 → T_PE = 8.
    expect(txtimeUs("HE MCS5 20MHz RU26", 100)).toBeCloseTo(8 + 8 + 4 + 4 + 8 + 2 * 4 + 4 + 7.2 + 9 * 13.6 + 8, 9);
  });

  const links = ["HE MCS7 2SS 80MHz", "HE MCS0 20MHz ER", "HE MCS5 20MHz RU26", "HE MCS7 20MHz BCC 2.4GHz", "HE MCS11 8SS 160MHz GI3.2"];
  it.each(links)("sums its duration terms to the total (%s)", (l) => {
    const t = txtime(l, 4000);
    const sum = durationSum(t);
    expect(t.totalUs).toBeCloseTo(sum, 9);
  });

  it.each(links)("finds back the PSDU size through PSDUFIT (%s)", (l) => {
    const d = txtimeUs(l, 3000);
    const fit = psduFit(l, d);
    expect(fit).toBeGreaterThanOrEqual(3000);
    expect(txtimeUs(l, fit)).toBeLessThanOrEqual(d);
    expect(txtimeUs(l, fit + 1)).toBeGreaterThan(d);
  });

  it("never shortens as the PSDU grows", () => {
    let last = 0;
    for (let b = 0; b <= 3000; b += 7) {
      const t = txtimeUs("HE MCS9 2SS 40MHz", b);
      expect(t).toBeGreaterThanOrEqual(last);
      last = t;
    }
  });

  it("refuses a PSDU beyond aPSDUMaxLength (6 500 631 octets, from memory)", () => {
    expect(maxPsduBytes("HE MCS0")).toBe(6_500_631);
    expect(() => txtime("HE MCS0", 6_500_632)).toThrow(/psdu_bytes/);
  });

  it("refuses a negative, fractional or non-numeric PSDU size", () => {
    expect(() => txtime("HE MCS0", -1)).toThrow(/psdu_bytes/);
    expect(() => txtime("HE MCS0", 1.5)).toThrow(/psdu_bytes/);
    expect(() => txtime("HE MCS0", NaN)).toThrow(/psdu_bytes/);
  });

  it("does not mutate the link it is given", () => {
    const l = parseLink("HE MCS7 2SS 80MHz");
    const before = JSON.stringify(l);
    txtime(l, 1500);
    expect(JSON.stringify(l)).toBe(before);
  });
});

describe("HE validity (802.11ax-2021 Clause 27)", () => {
  const refused: [string, RegExp][] = [
    ["HE MCS12", /MCS must be 0–11/],
    ["HE MCS0 9SS", /1–8 spatial streams/],
    ["HE MCS0 320MHz 6GHz", /20, 40, 80, 160 MHz/],
    ["HE MCS0 GI0.4", /GI0.8, GI1.6 or GI3.2/],
    ["HE MCS0 80MHz 2.4GHz", /2.4 GHz allows 20 or 40 MHz/],
    ["HE MCS0 20MHz RU484", /RU484 needs a channel of 40 MHz/],
    ["HE MCS0 40MHz RU2x996", /RU2x996 needs a channel of 160 MHz/],
    ["HE MCS0 40MHz ER", /ER SU PPDUs are 20 MHz only/],
    ["HE MCS0 20MHz ER RU52", /whole 20 MHz .* or RU106/],
    ["HE MCS3 20MHz ER", /ER SU allows MCS 0–2/],
    ["HE MCS1 20MHz ER RU106", /MCS0 only\) on RU106/],
    ["HE MCS0 3SS 20MHz ER", /at most 2 space-time streams/],
    ["HE MCS2 20MHz DCM", /DCM applies to MCS 0, 1, 3 and 4/],
    ["HE MCS0 3SS DCM", /DCM allows 1 or 2 spatial streams/],
    ["HE MCS0 DCM STBC", /DCM cannot be combined with STBC/],
    ["HE MCS0 2SS STBC", /STBC maps 1 spatial stream onto 2/],
    ["HE MCS0 40MHz BCC", /BCC is limited to RUs of 242 tones/],
    ["HE MCS0 80MHz RU484 BCC", /BCC is limited to RUs of 242 tones/],
    ["HE MCS10 BCC", /BCC is limited to MCS 0–9/],
    ["HE MCS0 5SS BCC", /BCC is limited to 1–4 spatial streams/],
    ["HE MCS0 1xLTF GI1.6", /SU PPDU does not allow 1xLTF with GI1.6/],
    ["HE MCS0 2xLTF GI3.2", /does not allow 2xLTF with GI3.2/],
    ["HE MCS0 4xLTF GI1.6", /does not allow 4xLTF with GI1.6/],
    ["HE MCS0 RU106 1xLTF", /MU PPDU \(RU\) does not allow 1xLTF/],
    // 802.11ax-2021 27.3.11.7: GI+LTF Size 3 means 4x + 0.8 µs only with HE-SIG-A's STBC and DCM bits both 1, which then apply neither.
    ["HE MCS0 4xLTF GI0.8 STBC", /SU 4xLTF with GI0.8 cannot carry STBC/],
    ["HE MCS0 4xLTF GI0.8 DCM", /SU 4xLTF with GI0.8 cannot carry DCM/],
    ["HE MCS0 20MHz ER 4xLTF GI0.8 DCM", /ER SU 4xLTF with GI0.8 cannot carry DCM/],
    ["HE MCS9 PE8 PE0", /"PE0" repeats the packet extension \(PE0\/PE8\/PE16\); give each setting once/],
  ];
  it.each(refused)("refuses %s with a message saying what is valid", (text, message) => {
    expect(() => parseLink(text)).toThrow(AirtallyError);
    expect(() => parseLink(text)).toThrow(message);
  });

  it("accepts every width, band, MCS, stream count and SU GI/LTF pair the standard allows", () => {
    const pairs = ["1xLTF GI0.8", "2xLTF GI0.8", "2xLTF GI1.6", "4xLTF GI0.8", "4xLTF GI3.2"];
    for (const band of [2.4, 5, 6]) for (const w of band === 2.4 ? [20, 40] : [20, 40, 80, 160])
      for (let m = 0; m <= 11; m++) for (let ss = 1; ss <= 8; ss++) for (const p of pairs) {
        expect(() => parseLink(`HE MCS${m} ${ss}SS ${w}MHz ${p} ${band}GHz`)).not.toThrow();
      }
  });

  it("accepts every RU that fits, with the MU GI/LTF pairs", () => {
    const pairs = ["2xLTF GI0.8", "2xLTF GI1.6", "4xLTF GI0.8", "4xLTF GI3.2"];
    const fits: Record<number, string[]> = {
      20: ["RU26", "RU52", "RU106", "RU242"],
      40: ["RU26", "RU52", "RU106", "RU242", "RU484"],
      80: ["RU26", "RU52", "RU106", "RU242", "RU484", "RU996"],
      160: ["RU26", "RU52", "RU106", "RU242", "RU484", "RU996", "RU2x996"],
    };
    for (const w of [20, 40, 80, 160]) for (const ru of fits[w]) for (const p of pairs)
      expect(() => parseLink(`HE MCS11 2SS ${w}MHz ${ru} ${p}`)).not.toThrow();
  });

  it("accepts the ER SU, DCM, STBC and BCC combinations the standard allows", () => {
    const ok = [
      "HE MCS0 20MHz ER", "HE MCS2 20MHz ER", "HE MCS0 20MHz ER RU106", "HE MCS0 2SS 20MHz ER", "HE MCS0 20MHz ER STBC",
      "HE MCS1 20MHz ER DCM", "HE MCS0 20MHz ER RU106 DCM", "HE MCS0 20MHz ER 1xLTF",
      "HE MCS0 DCM", "HE MCS1 DCM", "HE MCS3 2SS DCM", "HE MCS4 2SS 160MHz DCM", "HE MCS4 40MHz RU26 DCM",
      "HE MCS7 STBC", "HE MCS11 160MHz STBC", "HE MCS9 4SS 20MHz BCC", "HE MCS9 4SS 80MHz RU242 BCC", "HE MCS9 40MHz RU106 BCC",
      // The HE MU PPDU signals 4x + 0.8 µs by its own GI+LTF value (27.3.11.7), so STBC may go with it there; SU with 4x + 3.2 µs too.
      "HE MCS0 RU106 4xLTF GI0.8 STBC", "HE MCS0 4xLTF GI3.2 STBC", "HE MCS0 4xLTF GI3.2 DCM",
    ];
    for (const text of ok) expect(() => parseLink(text)).not.toThrow();
  });

  it("prints the canonical link text", () => {
    expect(parseLink("he mcs9 2ss 80mhz").text).toBe("HE MCS9 2SS 80MHz GI0.8 5GHz");
    expect(parseLink("HE MCS0 GI3.2 ER RU106 PE8 dcm").text).toBe("HE MCS0 1SS 20MHz GI3.2 ER RU106 PE8 DCM 5GHz");
    expect(parseLink("HE MCS5 GI0.8 4xLTF BCC 2.4GHz").text).toBe("HE MCS5 1SS 20MHz GI0.8 4xLTF BCC 2.4GHz");
    expect(parseLink("HE MCS5 GI1.6 BCC STBC 2.4GHz").text).toBe("HE MCS5 1SS 20MHz GI1.6 BCC STBC 2.4GHz");
  });
});

describe("HE sensitivity, reference rate, MCS list", () => {
  // Bases: the 20 MHz column of 802.11ax-2021 27.3.19.4's receiver minimum input sensitivity table (from memory:
  // MCS0 −82, MCS7 −64, MCS11 −52 dBm), +3 dB per doubling of the width (the table's 40/80/160 MHz columns).
  it("gives −82 dBm for MCS0 at 20 MHz (27.3.19.4, from memory)", () => {
    expect(sensitivityDbm("HE MCS0")).toBe(-82);
  });
  it("gives −52 + 6 dB for MCS11 at 80 MHz (27.3.19.4: −52 dBm at 20 MHz, from memory; two doublings)", () => {
    expect(sensitivityDbm("HE MCS11 80MHz")).toBe(-52 + 3 + 3);
  });
  it("uses the 20 MHz value for RUs smaller than 242 tones (27.3.19.4: MCS7 −64 dBm at 20 MHz, from memory)", () => {
    expect(sensitivityDbm("HE MCS7 160MHz RU26")).toBe(-64);
  });
  it("uses the RU's own width for a 484-tone RU in 160 MHz (27.3.19.4: MCS7 −64 dBm at 20 MHz, from memory; one doubling)", () => {
    expect(sensitivityDbm("HE MCS7 160MHz RU484")).toBe(-64 + 3);
  });
  // A second check independent of our memory of the HE table: for MCS 0–9 the HE minimum sensitivities are VHT's
  // (IEEE 802.11-2020 Table 21-25, which vht.test.ts checks value by value), at 20, 40, 80 and 160 MHz.
  it("equals VHT's minimum sensitivity for MCS 0–8 at every width (and MCS9 where VHT defines it)", () => {
    for (const w of [20, 40, 80, 160]) for (let m = 0; m <= 9; m++) {
      if (m === 9 && w === 20) continue; // VHT MCS9 1SS is not defined at 20 MHz
      expect(sensitivityDbm(`HE MCS${m} ${w}MHz`)).toBe(sensitivityDbm(`VHT MCS${m} ${w}MHz`));
    }
  });
  it("maps MCS7 (64-QAM 5/6) to the 54 Mb/s non-HT reference rate", () => {
    expect(nonHtReferenceRateMbps("HE MCS7")).toBe(54); // IEEE 802.11-2020 10.6.6.5.2
  });
  it("maps MCS3 (16-QAM 1/2) to 24 Mb/s", () => {
    expect(nonHtReferenceRateMbps("HE MCS3")).toBe(24);
  });
  it("maps MCS3 with DCM to QPSK 1/2, 12 Mb/s (our conservative choice)", () => {
    expect(nonHtReferenceRateMbps("HE MCS3 DCM")).toBe(12);
  });
  it("lists MCS 0–11", () => {
    expect(familyModule("HE").mcsValues).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
  });
});

describe("HE SU TXTIME, a second independent hand derivation (802.11ax-2021 27.3.12 and 27.4.3)", () => {
  // HE MCS0 1SS 20 MHz GI0.8 2xLTF PE16, 100 octets, LDPC:
  // N_DBPS = 234 × 1 × 1/2 = 117; N_DBPS,short = 60 × 1 × 1/2 = 30 (N_SD,short 60 for a 242-tone RU).
  // Payload 8·100 + 16 (SERVICE) = 816 bits; N_excess = 816 mod 117 = 114; N_SYM,init = ceil(816/117) = 7;
  // a_init = min(ceil(114/30), 4) = 4. LDPC (IEEE 802.11-2020 19.3.11.7.5): N_pld = 7·117 = 819,
  // N_avbits = 7·234 = 1638 → one 1944-bit codeword; N_shrt = 972 − 819 = 153, N_punc = 1944 − 1638 − 153 = 153;
  // 153 > 0.1·1944·½ and 153 < 1.2·153·1 → extra symbol segment: a_init = 4 → N_SYM = 8, a = 1 → T_PE = 4 µs (PE16).
  it("is 156 µs for 100 octets at MCS0 with LDPC, extra symbol included", () => {
    expect(txtimeUs("HE MCS0 1SS 20MHz", 100)).toBeCloseTo(8 + 8 + 4 + 4 + 8 + 4 + 7.2 + 8 * 13.6 + 4, 9);
  });
  // The same with BCC: 816 + 6 tail = 822 bits; N_excess = 822 − 7·117 = 3 → N_SYM = 8, a = ceil(3/30) = 1 → T_PE = 4 µs.
  it("is 156 µs for 100 octets at MCS0 with BCC, by padding alone", () => {
    expect(txtimeUs("HE MCS0 1SS 20MHz BCC", 100)).toBeCloseTo(8 + 8 + 4 + 4 + 8 + 4 + 7.2 + 8 * 13.6 + 4, 9);
  });
});
