/**
 * MU and TB PPDU durations, hand-derived from IEEE Std 802.11ax-2021 27.4.3
 * (TXTIME), 27.3.12 (pre-FEC padding, BCC: N_SYM = ceil((8·L + 16 + 6) ÷ N_DBPS),
 * a = min(ceil(N_excess ÷ N_DBPS,short), 4)), 27.3.13 (PE: nominal 16 µs →
 * 4, 8, 12, 16 µs for a = 1…4; from memory), 27.3.8 (T_HE-STF-T 8 µs) and
 * 27.3.11.5 (L-SIG LENGTH = ceil((TXTIME − 20) ÷ 4) × 3 − 3 − m, m = 2 for
 * an HE TB PPDU; from memory).
 *
 * RU26, HE-MCS7, 1 SS: N_SD 24, N_SD,short 6, 64-QAM R 5/6 → N_DBPS 120,
 * N_DBPS,short 30; GI 1.6 µs → T_SYM 14.4 µs; 2x HE-LTF 6.4 + 1.6 = 8 µs, one LTF.
 * TB preamble: L-STF 8 + L-LTF 8 + L-SIG 4 + RL-SIG 4 + HE-SIG-A 8 + HE-STF 8 = 40 µs.
 */
import { tbPpdu, muPpdu, heSigBSymbolsFor, ehtSigSymbolsFor, ackTbLink } from "../../../src/core/mu";
import { heSigBSymbols } from "../../../src/core/phy/he";
import { ehtSigSymbols } from "../../../src/core/phy/eht";
import { parseLink } from "../../../src/core/link";
import { txtimeUs } from "../../../src/core/phy";
import { durationSum } from "../../_lib/txtime";

const RU26_TB = parseLink("HE MCS7 1SS 20MHz RU26 GI1.6 BCC 5GHz");

describe("HE TB PPDU TXTIME (27.4.3) and its UL Length (27.3.11.5)", () => {
  // [PSDU octets, TXTIME by the equation, UL Length, duration the UL Length signals]
  const cases: [number, number, number, number][] = [
    // 40: 342 bits → N_SYM 3, N_excess 102 → a 4 → PE 16; 40 + 8 + 3 × 14.4 + 16 = 107.2; ceil(87.2 / 4) = 22 → 22·3 − 5 = 61; 20 + 88
    [40, 40 + 8 + 3 * 14.4 + 16, 22 * 3 - 5, 20 + 22 * 4],
    // 100: 822 bits → N_SYM 7, N_excess 102 → a 4 → PE 16; 164.8; ceil(144.8 / 4) = 37 → 106; 168
    [100, 40 + 8 + 7 * 14.4 + 16, 37 * 3 - 5, 20 + 37 * 4],
    // 1003: 8046 bits → N_SYM 68, N_excess 6 → a 1 → PE 4; 40 + 8 + 979.2 + 4 = 1031.2; ceil(1011.2 / 4) = 253 → 754; 1032
    [1003, 40 + 8 + 68 * 14.4 + 4, 253 * 3 - 5, 20 + 253 * 4],
  ];
  it.each(cases)("RU26 HE-MCS7 GI1.6 BCC, %i octets", (psdu, equation, ulLength, duration) => {
    const tb = tbPpdu(RU26_TB, psdu);
    expect(tb.equationUs).toBeCloseTo(equation, 9);
    expect(tb.ulLength).toBe(ulLength);
    expect(tb.totalUs).toBe(duration);
  });
  it("its duration terms add up to the duration (the audit explains the number)", () => {
    const tb = tbPpdu(RU26_TB, 100);
    expect(durationSum(tb)).toBeCloseTo(tb.totalUs, 9);
  });
  it("has an 8 µs HE-STF and no HE-SIG-B", () => {
    const labels = tbPpdu(RU26_TB, 100).terms.map((t) => `${t.label}=${t.value}`);
    expect(labels).toContain("HE-STF (TB PPDU, T_HE-STF-T) (µs)=8");
    expect(labels.some((l) => l.includes("HE-SIG-B"))).toBe(false);
  });
  it("EHT TB PPDU, RU242 EHT-MCS7 GI1.6 BCC, 100 octets: U-SIG instead of HE-SIG-A, LENGTH a multiple of 3 (36.3.12.5, from memory)", () => {
    // N_DBPS 234 × 6 × 5/6 = 1170, N_DBPS,short 60 × 5 = 300; 822 bits → 1 symbol, N_excess 822 → a = ceil(822/300) = 3 → PE 12
    // 20 + 4 + 8 + 8 + 8 + 14.4 + 12 = 74.4; ceil(54.4 / 4) = 14 → LENGTH 14·3 − 3 = 39; 20 + 56 = 76
    const tb = tbPpdu(parseLink("EHT MCS7 1SS 20MHz RU242 GI1.6 BCC 5GHz"), 100);
    expect(tb.equationUs).toBeCloseTo(74.4, 9);
    expect(tb.ulLength).toBe(39);
    expect(tb.totalUs).toBe(76);
  });
  it("the acknowledgement TB PPDU keeps the RU, takes one stream and the HE-MCS of the control rate, and a TB GI/LTF pair", () => {
    const ack = ackTbLink(parseLink("HE MCS9 2SS 80MHz RU106 5GHz"), 24);
    expect([ack.ruTones, ack.streams, ack.mcs, ack.ltf, ack.giUs]).toEqual([106, 1, 3, 2, 1.6]);
  });
});

describe("HE-SIG-B and EHT-SIG with one user field per user (27.3.11.8; 36.3.12.8)", () => {
  it.each([20, 40, 80, 160])("one user at %i MHz is the PHY's one-user count", (w) => {
    expect(heSigBSymbolsFor(w, 1)).toBe(heSigBSymbols(w));
    expect(ehtSigSymbolsFor(w, 1)).toBe(ehtSigSymbols(w, true));
  });
  it("9 users in 20 MHz: common 8 + 10, four user blocks of 2 × 21 + 10 and one of 21 + 10 → ceil(257 / 26) = 10 symbols", () => {
    expect(heSigBSymbolsFor(20, 9)).toBe(Math.ceil((8 + 10 + 4 * 52 + 31) / 26));
  });
  it("37 users in 80 MHz: two content channels, 19 users in the busier → ceil((16 + 1 + 10 + 9 × 52 + 31) / 26) = 21 symbols", () => {
    expect(heSigBSymbolsFor(80, 37)).toBe(21);
  });
  it("a MU PPDU of 9 users on RU26 is the one-user PPDU plus the extra HE-SIG-B symbols (4 µs each)", () => {
    const link = parseLink("HE MCS7 1SS 20MHz RU26 5GHz");
    // one user: ceil((18 + 31) / 26) = 2 symbols; nine users: 10 symbols
    expect(muPpdu(link, 9, 158).totalUs).toBeCloseTo(txtimeUs(link, 158) + (10 - 2) * 4, 9);
  });
  it("one user on the whole channel is the link's own PPDU (HE SU)", () => {
    const link = parseLink("HE MCS7 2SS 80MHz 5GHz");
    expect(muPpdu(link, 1, 1558).totalUs).toBe(txtimeUs(link, 1558));
  });
});
