import { parseLink } from "../../../src/core/link";
import { AirtallyError } from "../../../src/core/errors";
import { maxPsduBytes, psduFit, rateMbps, sensitivityDbm, txtime, txtimeUs } from "../../../src/core/phy/index";
import { familyModule } from "../../../src/core/phy/registry";
import { largestPsduInPpduMaxTime } from "../../../src/core/phy/he";
import { durationSum } from "../../_lib/txtime";

// Data subcarriers of the whole channel, 802.11be-2024 36.3.2 / 36.3.8 (N_SD): 20→234 … 320→3920.
const N_SD: Record<number, number> = { 20: 234, 40: 468, 80: 980, 160: 1960, 320: 3920 };
// N_BPSCS and R = num/den per EHT-MCS 0–13, 802.11be-2024 36.5 (EHT-MCS tables).
const MOD: [number, number, number][] = [
  [1, 1, 2], [2, 1, 2], [2, 3, 4], [4, 1, 2], [4, 3, 4], [6, 2, 3], [6, 3, 4],
  [6, 5, 6], [8, 3, 4], [8, 5, 6], [10, 3, 4], [10, 5, 6], [12, 3, 4], [12, 5, 6],
];
/** The tables' integer N_DBPS = floor(N_SD × N_BPSCS × R × N_SS), in integer arithmetic (36.5). */
const nDbps = (nSd: number, m: number, ss: number) => Math.floor((nSd * MOD[m][0] * MOD[m][1] * ss) / MOD[m][2]);
const T_SYM: Record<number, number> = { 0.8: 13.6, 1.6: 14.4, 3.2: 16 };

describe("EHT data rate (802.11be-2024 36.5 rate tables: integer N_DBPS ÷ T_SYM)", () => {
  it("prints 600.4 Mb/s for 80 MHz, 1 stream, MCS11, GI 0.8 µs, as HE does (N_DBPS 8166)", () => {
    expect(rateMbps("EHT MCS11 80MHz")).toBeCloseTo(600.4, 1); // floor(980 × 10 × 5/6) = 8166 ÷ 13.6 = 600.44 (36.5, from memory)
  });
  it("prints 2882.4 Mb/s for 320 MHz, 1 stream, MCS13, GI 0.8 µs", () => {
    expect(rateMbps("EHT MCS13 320MHz 6GHz")).toBeCloseTo(2882.4, 1); // 3920 × 12 × 5/6 ÷ 13.6
  });
  it("prints 23 058.8 Mb/s for 320 MHz, 8 streams, MCS13, GI 0.8 µs", () => {
    expect(rateMbps("EHT MCS13 8SS 320MHz 6GHz")).toBeCloseTo(23058.8, 1); // 3920 × 12 × 5/6 × 8 ÷ 13.6
  });
  it("prints 172.1 Mb/s for 20 MHz, 1 stream, MCS13, GI 0.8 µs", () => {
    expect(rateMbps("EHT MCS13 20MHz")).toBeCloseTo(172.1, 1); // 234 × 12 × 5/6 ÷ 13.6
  });

  const grid: [number, number, number, number][] = [];
  for (const w of [20, 40, 80, 160, 320]) for (const gi of [0.8, 1.6, 3.2]) for (let ss = 1; ss <= 8; ss++) for (let m = 0; m <= 13; m++) grid.push([w, gi, ss, m]);
  it.each(grid)("rate table: %i MHz GI%s %iSS MCS%i", (w, gi, ss, m) => {
    expect(rateMbps(`EHT MCS${m} ${ss}SS ${w}MHz GI${gi} 6GHz`)).toBeCloseTo(nDbps(N_SD[w], m, ss) / T_SYM[gi], 9);
  });
});

describe("EHT TXTIME (802.11be-2024 36.4.3; padding as 36.3.13)", () => {
  // EHT MU PPDU pre-EHT part: L-STF 8 + L-LTF 8 + L-SIG 4 + RL-SIG 4 + U-SIG 8 = 32 µs, then EHT-SIG, EHT-STF 4.
  const PRE = 8 + 8 + 4 + 4 + 8;

  it("times 1500 octets at MCS13, 2 streams, 320 MHz", () => {
    // EHT-SIG non-OFDMA at MCS0: 17 + 3 + 22 + 4 + 6 = 52 bits / 26 = 2 symbols = 8 µs.
    // N_DBPS = 3920·12·5/6·2 = 78400, N_DBPS,short = 984·12·5/6·2 = 19680, N_CBPS,short = 23616.
    // 12016 bits → N_SYM,init 1, a_init = ceil(12016/19680) = 1; N_pld 19680, N_avbits 23616 → N_CW = ceil(19680/1620) = 13,
    // N_shrt = 21060 − 19680 = 1380, N_punc = 25272 − 23616 − 1380 = 276 ≤ 0.1·4212 → no extra; T_PE (a = 1) = 4.
    expect(txtimeUs("EHT MCS13 2SS 320MHz 6GHz", 1500)).toBeCloseTo(PRE + 8 + 4 + 2 * 7.2 + 13.6 + 4, 9);
  });

  it("times one user's 242-tone RU in 80 MHz as an OFDMA EHT MU PPDU", () => {
    // EHT-SIG OFDMA at 80 MHz: common 17 + 2·9 + 10 = 45, user 22 + 10 = 32 → ceil(77/26) = 3 symbols = 12 µs.
    // N_DBPS = 1170, N_DBPS,short = 300. 12016 bits → N_SYM,init 11, N_excess 316, a_init 2;
    // N_pld = 11700 + 600 = 12300, N_avbits = 14040 + 720 = 14760 → N_CW 8, N_shrt 660, N_punc 132 ≤ 259.2 → no extra.
    // T_PE (a = 2) = 8.
    expect(txtimeUs("EHT MCS7 80MHz RU242", 1500)).toBeCloseTo(PRE + 12 + 4 + 7.2 + 11 * 13.6 + 8, 9);
  });

  it("adds the 6 µs signal extension at 2.4 GHz", () => {
    // Same data field as HE MCS7 20 MHz BCC 1000 octets: N_SYM 7, a 4 → T_PE 16; EHT-SIG 2 symbols.
    expect(txtimeUs("EHT MCS7 20MHz BCC 2.4GHz", 1000)).toBeCloseTo(PRE + 8 + 4 + 7.2 + 7 * 13.6 + 16 + 6, 9);
  });

  const links = ["EHT MCS13 2SS 320MHz 6GHz", "EHT MCS7 80MHz RU242", "EHT MCS0 20MHz GI3.2", "EHT MCS12 4SS 160MHz PE8"];
  it.each(links)("sums its duration terms to the total (%s)", (l) => {
    const t = txtime(l, 5000);
    const sum = durationSum(t);
    expect(t.totalUs).toBeCloseTo(sum, 9);
  });

  it.each(links)("finds back the PSDU size through PSDUFIT (%s)", (l) => {
    const d = txtimeUs(l, 20000);
    const fit = psduFit(l, d);
    expect(fit).toBeGreaterThanOrEqual(20000);
    expect(txtimeUs(l, fit)).toBeLessThanOrEqual(d);
    expect(txtimeUs(l, fit + 1)).toBeGreaterThan(d);
  });

  // Derived as HE's 6 500 631 (802.11ax-2021 27.4.4, from memory) is: the shortest EHT MU preamble
  // 8 + 8 + 4 + 4 + 8 (U-SIG) + 4 (one EHT-SIG symbol) + 4 (EHT-STF) + 8 × 7.2 (2x EHT-LTF + 0.8 µs) = 97.6 µs,
  // floor((5484 − 97.6) ÷ 13.6) = 396 symbols of 3920 × 12 × 5/6 × 8 = 313 600 bits, less the 16 SERVICE bits.
  it("caps the PSDU at 15 523 198 octets, floor((396 × 313 600 − 16) ÷ 8)", () => {
    expect(maxPsduBytes("EHT MCS0")).toBe(Math.floor((396 * 313_600 - 16) / 8));
    expect(() => txtime("EHT MCS0", 15_523_199)).toThrow(/psdu_bytes/);
  });
  it("derives HE's published 6 500 631 octets by the same rule (the independent check of the rule)", () => {
    // 802.11ax-2021 27.4.4 aPSDUMaxLength (from memory); preamble 36 µs + 8 × 4 µs (1x HE-LTF + 0.8 µs) = 68 µs,
    // floor(5416 ÷ 13.6) = 398 symbols of floor(1960 × 10 × 5/6 × 8) = 130 666 bits.
    expect(largestPsduInPpduMaxTime(130_666, 68, 13.6)).toBe(6_500_631);
    expect(maxPsduBytes("HE MCS0")).toBe(6_500_631);
  });
});

describe("EHT validity (802.11be-2024 Clause 36)", () => {
  const refused: [string, RegExp][] = [
    ["EHT MCS14", /MCS must be 0–13 .*not modelled/],
    ["EHT MCS0 9SS", /1–8 spatial streams/],
    ["EHT MCS0 320MHz 5GHz", /320 MHz is allowed only at 6 GHz/],
    ["EHT MCS0 80MHz 2.4GHz", /2.4 GHz allows 20 or 40 MHz/],
    ["EHT MCS0 STBC", /does not use STBC/],
    ["EHT MCS0 DCM", /EHT-MCS 15/],
    ["EHT MCS0 ER", /no extended range/],
    ["EHT MCS0 1xLTF", /MU PPDU does not allow 1xLTF/],
    ["EHT MCS0 GI0.4", /GI0.8, GI1.6 or GI3.2/],
    ["EHT MCS12 BCC", /BCC is limited to MCS 0–9/],
    ["EHT MCS0 40MHz BCC", /BCC is limited to RUs of 242 tones/],
    ["EHT MCS0 5SS BCC", /1–4 spatial streams/],
    ["EHT MCS0 40MHz RU996", /RU996 needs a channel of 80 MHz/],
  ];
  it.each(refused)("refuses %s with a message saying what is valid", (text, message) => {
    expect(() => parseLink(text)).toThrow(AirtallyError);
    expect(() => parseLink(text)).toThrow(message);
  });

  it("accepts every width, band, MCS, stream count and GI/LTF pair the standard allows", () => {
    const pairs = ["2xLTF GI0.8", "2xLTF GI1.6", "4xLTF GI0.8", "4xLTF GI3.2"];
    for (const band of [2.4, 5, 6]) {
      const widths = band === 2.4 ? [20, 40] : band === 5 ? [20, 40, 80, 160] : [20, 40, 80, 160, 320];
      for (const w of widths) for (let m = 0; m <= 13; m++) for (let ss = 1; ss <= 8; ss++) for (const p of pairs) {
        expect(() => parseLink(`EHT MCS${m} ${ss}SS ${w}MHz ${p} ${band}GHz`)).not.toThrow();
      }
    }
  });

  it("accepts the RU2x996 in a 320 MHz channel", () => {
    expect(() => parseLink("EHT MCS13 320MHz RU2x996 6GHz")).not.toThrow();
  });

  it("prints the canonical link text", () => {
    expect(parseLink("eht mcs13 320mhz 6ghz gi3.2").text).toBe("EHT MCS13 1SS 320MHz GI3.2 6GHz");
  });

  it("gives −46 + 12 dB for MCS13 at 320 MHz (802.11be-2024 36.3.21.4 minimum input sensitivity, from memory; four doublings)", () => {
    expect(sensitivityDbm("EHT MCS13 320MHz 6GHz")).toBe(-46 + 4 * 3);
  });

  it("gives −49 dBm for MCS12 at 20 MHz (802.11be-2024 36.3.21.4 minimum input sensitivity, from memory)", () => {
    expect(sensitivityDbm("EHT MCS12")).toBe(-49);
  });

  // Checks that do not rest on our memory of the EHT table: MCS 0–11 are HE's (whose 0–9 he.test.ts compares with
  // VHT's Table 21-25), and each higher MCS needs a stronger signal (a denser constellation or a higher code rate).
  it("equals HE's sensitivity for MCS 0–11 at 20–160 MHz and rises strictly with the MCS up to 13", () => {
    for (const w of [20, 40, 80, 160]) for (let m = 0; m <= 11; m++) expect(sensitivityDbm(`EHT MCS${m} ${w}MHz`)).toBe(sensitivityDbm(`HE MCS${m} ${w}MHz`));
    for (let m = 1; m <= 13; m++) expect(sensitivityDbm(`EHT MCS${m} 320MHz 6GHz`)).toBeGreaterThan(sensitivityDbm(`EHT MCS${m - 1} 320MHz 6GHz`));
  });

  it("lists MCS 0–13", () => {
    expect(familyModule("EHT").mcsValues).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13]);
  });
});
