import { channelAccess, goodputMbps, efficiency, expectedTransmissions } from "../../../src/core/mac";
import { expectValueError } from "../../_lib/expectError";

const ERP = "ERP-OFDM 54Mbps 2.4GHz";
const OFDM5 = "OFDM 54Mbps 5GHz";
const HT7 = "HT MCS7 20MHz 5GHz";
const VHT9 = "VHT MCS9 2SS 80MHz 5GHz";

/** mulberry32: a small seeded PRNG, uniform in [0, 1). Written here so the Monte Carlo shares nothing with the code under test. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Rounds until a burst of n MPDUs is delivered, each lost with probability p per try. */
function simulateBurst(rand: () => number, n: number, p: number, selective: boolean): number {
  let outstanding = n;
  let rounds = 0;
  while (outstanding > 0) {
    rounds++;
    let lost = 0;
    for (let i = 0; i < outstanding; i++) if (rand() < p) lost++;
    if (selective) outstanding = lost;
    else if (lost === 0) outstanding = 0;
  }
  return rounds;
}

function meanOf(trials: number, f: () => number): number {
  let s = 0;
  for (let i = 0; i < trials; i++) s += f();
  return s / trials;
}

describe("GOODPUT and EFFICIENCY, one station alone, no loss", () => {
  it("OFDM 54 Mb/s, 1500 octets, BE: 8 × 1500 bits per 406.5 µs access", () => {
    // ACCESS = 43 + 67.5 + 252 + 16 + 28 (test/core/mac/access.test.ts breakdown)
    expect(goodputMbps(OFDM5, 1500)).toBeCloseTo((8 * 1500) / (43 + 67.5 + 252 + 16 + 28), 12);
  });
  it("a lone 54 Mb/s ERP-OFDM station moves roughly 25–31 Mb/s of 1500-byte packets (common practice)", () => {
    const g = goodputMbps(ERP, 1500);
    expect(g).toBeGreaterThan(25);
    expect(g).toBeLessThan(31);
  });
  it("HT MCS7 20 MHz, auto: 28 × 1500 octets per 5574.5 µs access", () => {
    expect(goodputMbps(HT7, 1500)).toBeCloseTo((28 * 8 * 1500) / (43 + 67.5 + 5416 + 16 + 32), 12);
  });
  it("without aggregation, 1500-octet frames at a high VHT rate use well under half the PHY rate (common practice)", () => {
    expect(efficiency(VHT9, 1500, 1)).toBeLessThan(0.4);
  });
  it("with aggregation, the same frames use over three quarters of the PHY rate (common practice)", () => {
    expect(efficiency(VHT9, 1500)).toBeGreaterThan(0.75);
  });
  it("efficiency is goodput over the PHY rate: 29.52… ÷ 54 for OFDM 54 Mb/s", () => {
    expect(efficiency(OFDM5, 1500)).toBeCloseTo(goodputMbps(OFDM5, 1500) / 54, 12);
  });
});

describe("GOODPUT with MPDU loss", () => {
  it("selective retransmission in A-MPDUs matches a seeded Monte Carlo of the same process", () => {
    // Process: every access carries 28 MPDUs (retransmissions first, then new ones), each delivered with
    // probability 1 − p; an access lasts ACCESS = 43 + 67.5 + 5416 + 16 + 32 µs (hand breakdown above).
    const rand = mulberry32(12345);
    const p = 0.2;
    const accesses = 20000;
    let delivered = 0;
    for (let a = 0; a < accesses; a++) for (let i = 0; i < 28; i++) if (rand() >= p) delivered++;
    const mc = (8 * 1500 * delivered) / (accesses * (43 + 67.5 + 5416 + 16 + 32));
    expect(goodputMbps(HT7, 1500, null, "BE", null, p) / mc).toBeCloseTo(1, 2);
  });
  it("whole-frame retransmission with backoff doubling matches a seeded Monte Carlo", () => {
    // OFDM 54 Mb/s 5 GHz, BE: AIFS 43, slot 9, PPDU 252, SIFS 16, Ack 28, AckTimeout 16 + 9 + 25 = 50 (10.3.2.9);
    // backoff drawn uniformly from 0..CW, CW = min(2^k × 16 − 1, 1023), at most 7 attempts (dot11ShortRetryLimit).
    const rand = mulberry32(2024);
    const p = 0.3;
    let time = 0;
    let bytes = 0;
    for (let f = 0; f < 200000; f++) {
      for (let k = 0; k < 7; k++) {
        const cw = Math.min(2 ** k * 16 - 1, 1023);
        time += 43 + Math.floor(rand() * (cw + 1)) * 9 + 252;
        if (rand() < p) time += 50;
        else {
          time += 16 + 28;
          bytes += 1500;
          break;
        }
      }
    }
    expect(goodputMbps(OFDM5, 1500, 1, "BE", null, p) / ((8 * bytes) / time)).toBeCloseTo(1, 2);
  });
  it("BAR: a missed BlockAck (every MPDU lost) costs a BlockAckReq access, as a seeded Monte Carlo of it gives", () => {
    // HT MCS7 5 GHz, 2 MPDUs, BE. Recovery: AIFS 43 + backoff uniform on 0..31 slots of 9 µs (the doubled window)
    // + BlockAckReq (24 octets at 24 Mb/s: 20 + 4 × ⌈(16 + 192 + 6)/96⌉ = 32 µs) + SIFS 16 + compressed BlockAck
    // (32 octets: 20 + 4 × ⌈(16 + 256 + 6)/96⌉ = 32 µs) (IEEE 802.11-2020 17.4.3 TXTIME, 9.3.1.8/9.3.1.9 frame sizes).
    const rand = mulberry32(77);
    const p = 0.5;
    const accessUs = channelAccess(HT7, 1500, 2).totalUs;
    let time = 0;
    let delivered = 0;
    for (let a = 0; a < 200000; a++) {
      time += accessUs;
      let got = 0;
      for (let i = 0; i < 2; i++) if (rand() >= p) got++;
      delivered += got;
      if (got === 0) time += 43 + Math.floor(rand() * 32) * 9 + 32 + 16 + 32;
    }
    expect(goodputMbps(HT7, 1500, 2, "BE", null, p, "BAR") / ((8 * 1500 * delivered) / time)).toBeCloseTo(1, 2);
  });
  it("BAR never raises GOODPUT, and changes nothing without loss", () => {
    expect(goodputMbps(HT7, 1500, 8, "BE", null, 0.3, "BAR")).toBeLessThan(goodputMbps(HT7, 1500, 8, "BE", null, 0.3));
    expect(goodputMbps(HT7, 1500, 8, "BE", null, 0, "BAR")).toBe(goodputMbps(HT7, 1500, 8, "BE", null, 0));
  });
  it("refuses BAR on OFDM (no block ack) and with DCF, naming mac_options", () => {
    expectValueError(() => goodputMbps(OFDM5, 1500, 1, "BE", null, 0.1, "BAR"), /^mac_options: BAR .*block ack/);
    expectValueError(() => goodputMbps(HT7, 1500, 1, "DCF", null, 0.1, "BAR"), /^mac_options: BAR .*DCF/);
  });
  it("more loss never gives more goodput (monotonicity)", () => {
    for (const link of [OFDM5, HT7]) {
      let last = Infinity;
      for (let p = 0; p < 0.95; p += 0.05) {
        const g = goodputMbps(link, 1500, null, "BE", null, p);
        expect(g).toBeLessThanOrEqual(last);
        last = g;
      }
    }
  });
  it("refuses a negative loss, naming mpdu_loss", () => {
    expectValueError(() => goodputMbps(OFDM5, 1500, null, null, null, -0.1), /^mpdu_loss: /);
  });
  it("refuses a loss of 1 or more", () => {
    expectValueError(() => goodputMbps(OFDM5, 1500, null, null, null, 1), /^mpdu_loss: .*not including\) 1/);
  });
  it("refuses a loss that is not a number", () => {
    expectValueError(() => efficiency(OFDM5, 1500, null, null, null, "10%"), /^mpdu_loss: /);
  });
});

describe("RETX: expected transmissions of a burst", () => {
  it("one MPDU needs 1 ÷ (1 − p) transmissions in either mode (geometric mean)", () => {
    expect(expectedTransmissions(1, 0.1)).toBeCloseTo(1 / 0.9, 12);
  });
  it("whole: 1 ÷ (1 − p)^N — two MPDUs at p = 0.5 need 4", () => {
    expect(expectedTransmissions(2, 0.5, "whole")).toBeCloseTo(1 / 0.5 ** 2, 12);
  });
  it("selective: two MPDUs at p = 0.5 need 8/3 (Σ_k 1 − (1 − 0.5^k)² = 1 + 2 − 1/3)", () => {
    expect(expectedTransmissions(2, 0.5, "selective")).toBeCloseTo(8 / 3, 12);
  });
  it("is exactly 1 without loss", () => {
    expect(expectedTransmissions(64, 0)).toBe(1);
  });
  it("selective: 64 MPDUs at p = 0.1 match a seeded Monte Carlo", () => {
    const rand = mulberry32(7);
    const mc = meanOf(20000, () => simulateBurst(rand, 64, 0.1, true));
    expect(expectedTransmissions(64, 0.1) / mc).toBeCloseTo(1, 2);
  });
  it("whole: 8 MPDUs at p = 0.1 match a seeded Monte Carlo", () => {
    const rand = mulberry32(99);
    const mc = meanOf(50000, () => simulateBurst(rand, 8, 0.1, false));
    expect(expectedTransmissions(8, 0.1, "whole") / mc).toBeCloseTo(1, 2);
  });
  it("selective never needs more than whole", () => {
    expect(expectedTransmissions(16, 0.2, "selective")).toBeLessThan(expectedTransmissions(16, 0.2, "whole"));
  });
  it("refuses a loss too close to 1 for the series", () => {
    expectValueError(() => expectedTransmissions(64, 0.9999999), /^mpdu_loss: .*too close to 1/);
  });
  it("refuses a whole-burst count beyond floating point", () => {
    expectValueError(() => expectedTransmissions(1024, 0.9, "whole"), /^mpdu_loss: .*beyond 1e308/);
  });
  it("refuses a burst of 0 MPDUs, naming mpdus", () => {
    expectValueError(() => expectedTransmissions(0, 0.1), /^mpdus: /);
  });
  it("refuses an unknown mode", () => {
    expectValueError(() => expectedTransmissions(4, 0.1, "partial"), /^mode: expected selective or whole/);
  });
});
