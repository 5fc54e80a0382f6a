import { channelAccess, aggCount, goodputMbps } from "../../../src/core/mac";
import { txtimeUs } from "../../../src/core/phy";
import { expectNaError, expectValueError } from "../../_lib/expectError";

const ERP = "ERP-OFDM 54Mbps 2.4GHz";
const OFDM5 = "OFDM 54Mbps 5GHz";
const HT7 = "HT MCS7 20MHz 5GHz";
const VHT9 = "VHT MCS9 2SS 80MHz 5GHz";

// Hand-derived TXTIMEs (IEEE 802.11-2020 17.4.3 eq. (17-29), N_SYM = ceil((16 + 8·LENGTH + 6) / N_DBPS)):
// 1554-octet MPDU at 54 Mb/s (N_DBPS 216): ceil(12454 / 216) = 58 symbols → 20 + 58 × 4 = 252 µs (+ 6 µs signal extension at 2.4 GHz, Table 18-5)
// 14-octet Ack/CTS at 24 Mb/s (N_DBPS 96): ceil(134 / 96) = 2 symbols → 20 + 8 = 28 µs (+ 6 at 2.4 GHz)
// 20-octet RTS at 24 Mb/s: ceil(182 / 96) = 2 symbols → 28 µs
// 32-octet BlockAck at 24 Mb/s: ceil(278 / 96) = 3 symbols → 32 µs
describe("ACCESS and BREAKDOWN: one uncontended channel access", () => {
  it("ERP-OFDM 54 Mb/s, 1500 octets, BE: AIFS + mean backoff + PPDU + SIFS + Ack at 24 Mb/s", () => {
    const a = channelAccess(ERP, 1500);
    // AIFS 10 + 3 × 9 (SIFS + AIFSN × slot); backoff 15/2 × 9; PPDU 252 + 6; SIFS 10; Ack 28 + 6 (24 Mb/s: highest basic rate ≤ 54, 10.6.6.5)
    expect(a.terms.map((t) => t.us)).toEqual([10 + 3 * 9, 7.5 * 9, 252 + 6, 10, 28 + 6]);
  });
  it("ERP-OFDM 54 Mb/s, 1500 octets, BE: ACCESS is 406.5 µs", () => {
    expect(channelAccess(ERP, 1500).totalUs).toBe(37 + 67.5 + 258 + 10 + 34);
  });
  it("OFDM 54 Mb/s at 5 GHz with RTS/CTS: RTS, SIFS, CTS, SIFS before the data", () => {
    const a = channelAccess(OFDM5, 1500, null, "BE", "RTS");
    expect(a.terms.map((t) => t.us)).toEqual([16 + 3 * 9, 7.5 * 9, 28, 16, 28, 16, 252, 16, 28]);
  });
  it("OFDM 54 Mb/s at 5 GHz with CTS-to-self: CTS, SIFS before the data", () => {
    const a = channelAccess(OFDM5, 1500, "auto", "BE", "CTS");
    expect(a.terms.map((t) => t.us)).toEqual([43, 67.5, 28, 16, 252, 16, 28]);
  });
  it("OFDM 54 Mb/s VO: AIFSN 2 and CWmin 3", () => {
    expect(channelAccess(OFDM5, 1500, 1, "VO").totalUs).toBe(16 + 2 * 9 + 1.5 * 9 + 252 + 16 + 28);
  });
  it("HR-DSSS 11 Mb/s, 1500 octets, BE: slot 20, CWmin 31, Ack at 2 Mb/s", () => {
    // AIFS 10 + 3 × 20; backoff 31/2 × 20; PPDU 192 + ceil(1554 × 8 / 11) (Clause 16 TXTIME);
    // Ack at 2 Mb/s (highest of the default basic rates 1, 2): 192 + 14 × 8 / 2
    expect(channelAccess("HR-DSSS 11Mbps 2.4GHz", 1500).totalUs).toBe(70 + 310 + (192 + 1131) + 10 + (192 + 56));
  });
  it("DCF waits DIFS and sends a non-QoS MPDU (24-octet header)", () => {
    const a = channelAccess(OFDM5, 1500, null, "DCF");
    expect([a.terms[0].label, a.terms[0].us, a.psduBytes]).toEqual(["DIFS", 16 + 2 * 9, 24 + 8 + 1508 + 8 + 4]);
  });
  it("answers an HT MCS0 frame at 6 Mb/s, its non-HT reference rate (10.6.6.5)", () => {
    expect(channelAccess("HT MCS0 20MHz 5GHz", 1500, 1).controlRateMbps).toBe(6);
  });
  it("answers at the highest rate of BASIC= not above the data rate", () => {
    expect(channelAccess(OFDM5, 1500, 1, "BE", null, "BASIC=6,12").controlRateMbps).toBe(12);
  });
  it("keeps OFDM responses for ERP data when the basic set holds only DSSS rates (same modulation class)", () => {
    expect(channelAccess(ERP, 1500, 1, "BE", null, "BASIC=1,2,5.5,11").controlRateMbps).toBe(24); // highest mandatory OFDM rate ≤ 54
  });
  it("refuses DSSS basic rates at 5 GHz", () => {
    expectValueError(() => channelAccess(OFDM5, 1500, 1, "BE", null, "BASIC=1,2"), /^mac_options: BASIC= holds 1, 2 Mb\/s/);
  });
  it("sends one HT MPDU bare, answered by an Ack", () => {
    const a = channelAccess(HT7, 1500, 1);
    expect([a.psduBytes, a.terms[a.terms.length - 1].label]).toEqual([1554, "Ack (24 Mb/s)"]);
  });
  it("sends one VHT MPDU as an S-MPDU with its 4-octet delimiter, answered by an Ack", () => {
    const a = channelAccess(VHT9, 1500, 1);
    expect([a.psduBytes, a.terms[a.terms.length - 1].label]).toEqual([4 + 1554, "Ack (24 Mb/s)"]);
  });
  it("HT MCS7 20 MHz, 1500 octets, auto: 28 MPDUs and a 64-bit BlockAck", () => {
    // A-MPDU 27 × 1560 + 1558 = 43 678 octets; HT-mixed TXTIME 36 µs preamble + 4 × ceil((16 + 8 × 43678 + 6) / 260) = 36 + 4 × 1345
    // (IEEE 802.11-2020 19.4.3: L-STF 8, L-LTF 8, L-SIG 4, HT-SIG 8, HT-STF 4, one HT-LTF 4; N_DBPS 260 at MCS7, Table 19-27)
    expect(channelAccess(HT7, 1500).terms.map((t) => t.us)).toEqual([43, 67.5, 36 + 4 * 1345, 16, 32]);
  });
  it("BREAKDOWN terms add up to ACCESS exactly", () => {
    const cases: [string, number, unknown, unknown, unknown, unknown][] = [
      [ERP, 1500, null, "BE", "none", null],
      [HT7, 1500, null, "VO", "RTS", null],
      [VHT9, 700, 10, "VI", "CTS", "GCMP-256 AMSDU=3"],
      ["HE MCS11 2SS 80MHz 5GHz", 1500, null, "BE", "RTS", "HTC"],
      ["EHT MCS13 2SS 320MHz 6GHz", 1500, null, "BK", "none", null],
      ["HE MCS5 1SS 20MHz 2.4GHz", 1200, null, "BE", "RTS", "SLOT=20"],
    ];
    for (const [link, p, n, ac, prot, opt] of cases) {
      const a = channelAccess(link, p, n, ac, prot, opt);
      expect(a.terms.reduce((s, t) => s + t.us, 0)).toBeCloseTo(a.totalUs, 9);
    }
  });
  it("uses the response PPDU's own TXTIME for the BlockAck (256-bit bitmap on HE, 56 octets)", () => {
    const a = channelAccess("HE MCS11 2SS 80MHz 5GHz", 1500);
    expect(a.responseUs).toBe(txtimeUs("OFDM 24Mbps 5GHz", 56));
  });
  it("refuses more than one MPDU on a PHY without A-MPDU", () => {
    expectValueError(() => channelAccess(OFDM5, 1500, 2), /^mpdus: 2 needs an A-MPDU/);
  });
  it("refuses more MPDUs than fit, naming the limit", () => {
    expectValueError(() => channelAccess(HT7, 1500, 29), /^mpdus: 29 .*at most 28, set by aPPDUMaxTime/);
  });
  it("refuses a non-whole MPDU count", () => {
    expectValueError(() => channelAccess(HT7, 1500, 2.5), /^mpdus:/);
  });
  it("refuses an A-MSDU over the HT maximum of 7935 octets", () => {
    // 5 × (14 + 1508 + 2 pad) + (14 + 1508) = 9142 octets
    expectValueError(() => channelAccess(HT7, 1500, null, "BE", null, "AMSDU=6"), /^mac_options: AMSDU=6 .*9142-octet A-MSDU, over the HT maximum of 7935/);
  });
  it("refuses an MPDU over the VHT maximum of 11 454 octets", () => {
    expectValueError(() => channelAccess(VHT9, 1500, null, "BE", null, "AMSDU=8"), /^mac_options: AMSDU=8 .*over the VHT maximum MPDU of 11454/);
  });
  it("refuses A-MSDU on a non-HT PHY", () => {
    expectValueError(() => channelAccess(OFDM5, 1500, null, "BE", null, "AMSDU=2"), /^mac_options: AMSDU=2 needs HT or later/);
  });
  it("answers #N/A when a single PPDU is longer than aPPDUMaxTime (valid inputs, no A-MPDU exists)", () => {
    // 4 × 1524 + 1522 = 7618-octet A-MSDU at 6.5 Mb/s lasts about 9.4 ms > 5484 µs
    expectNaError(() => channelAccess("HT MCS0 20MHz 5GHz", 1500, null, "BE", null, "AMSDU=5"), /^packet_bytes: .*aPPDUMaxTime/);
    expectNaError(() => aggCount("HT MCS0 20MHz 5GHz", 1500, "BE", "AMSDU=5"), /^packet_bytes: .*aPPDUMaxTime/);
  });
  it("refuses a BA window over the family's", () => {
    expectValueError(() => channelAccess(HT7, 1500, null, "BE", null, "BA=256"), /^mac_options: BA=256 .*at most 64/);
  });
  it("refuses a bad link, naming link", () => {
    expectValueError(() => channelAccess("XX", 1500), /^link:/);
  });
});

describe("AGGCOUNT: MPDUs per A-MPDU under every limit", () => {
  it("is 1 for a non-HT PHY", () => {
    expect(aggCount(OFDM5, 1500)).toBe(1);
  });
  it("is 1 under DCF (no block ack agreement)", () => {
    expect(aggCount(HT7, 1500, "DCF")).toBe(1);
  });
  it("HT MCS7 20 MHz, 1500 octets: 28, where 29 would overrun aPPDUMaxTime", () => {
    // 29 MPDUs: 28 × 1560 + 1558 = 45 238 octets → 36 + 4 × ceil(361 926 / 260) = 36 + 4 × 1393 = 5608 µs > 5484 (Table 21-28)
    expect(aggCount(HT7, 1500)).toBe(28);
  });
  it("stops at the block ack window BA=", () => {
    expect(aggCount(VHT9, 1500, "BE", "BA=16")).toBe(16);
  });
  it("stops at the maximum A-MPDU length 2^(13+0) − 1 = 8191 octets with AMPDU=0", () => {
    expect(aggCount(VHT9, 1500, "BE", "AMPDU=0")).toBe(1 + Math.floor((8191 - 1558) / 1560)); // (n−1) × 1560 + 1558 ≤ 8191
  });
  it("stops at the VO TXOP limit of 2080 µs: PPDU + SIFS + BlockAck must fit", () => {
    // 36 + 4·N_SYM + 16 + 32 ≤ 2080 → N_SYM ≤ 499 → 16 + 8L + 6 ≤ 499 × 260 → L ≤ 16214 → (n−1) × 1560 + 1558 ≤ 16214 → n ≤ 10
    expect(aggCount(HT7, 1500, "VO")).toBe(10);
  });
  it("counts RTS/CTS against the TXOP limit when protection is given", () => {
    // + 28 + 16 + 28 + 16 = 88 µs → N_SYM ≤ 477 → L ≤ 15 494 → n ≤ 9
    expect(aggCount(HT7, 1500, "VO", null, "RTS")).toBe(9);
  });
  it("HE at 5 GHz reaches its 256-MPDU default window at MCS11 2SS 80 MHz", () => {
    expect(aggCount("HE MCS11 2SS 80MHz 5GHz", 1500)).toBe(256);
  });
  it("gives 1 when an HT A-MSDU MPDU exceeds the 4095-octet MPDU limit of an HT A-MPDU (9.7.1)", () => {
    expect(aggCount(HT7, 1500, "BE", "AMSDU=3")).toBe(1); // 26 + 8 + (2 × 1524 + 1522) + 8 + 4 = 4616 > 4095
  });
});

describe("TXOP limit and goodput", () => {
  it("a longer TXOP limit never lowers goodput (monotonicity)", () => {
    let last = 0;
    for (let txop = 500; txop <= 8000; txop += 250) {
      const g = goodputMbps(VHT9, 1500, null, "BE", null, null, `TXOP=${txop}`);
      expect(g).toBeGreaterThanOrEqual(last);
      last = g;
    }
  });
});
