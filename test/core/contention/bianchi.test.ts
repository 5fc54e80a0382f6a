import { attemptProbability, fixedPoint } from "../../../src/core/contention/bianchi";
import { saturation } from "../../../src/core/contention/saturation";
import type { ContentionChannel } from "../../../src/core/contention/parameters";

/*
 * G. Bianchi, IEEE JSAC 18(3), 2000, Table I — FHSS system parameters:
 * payload 8184 bits, MAC header 272 bits, PHY header 128 bits, ACK 112 bits +
 * PHY header, RTS 160 bits + PHY header, CTS 112 bits + PHY header, channel
 * 1 Mb/s (so 1 bit = 1 µs), propagation delay δ = 1 µs, slot 50 µs, SIFS 28 µs,
 * DIFS 128 µs (= SIFS + 2 slots, AIFSN 2).
 * His §IV times: T_s^bas = H + P + SIFS + δ + ACK + DIFS + δ, T_c^bas = H + P + DIFS + δ,
 * T_s^rts = RTS + SIFS + δ + CTS + SIFS + δ + H + P + SIFS + δ + ACK + DIFS + δ,
 * T_c^rts = RTS + DIFS + δ. Our struct holds them without the DIFS, the
 * collision as the PPDU (or RTS) plus δ for the response timeout; his model
 * lets everybody wait DIFS after a collision, so EIFS − DIFS is δ as well.
 */
const H = 128 + 272; // PHY + MAC header, µs at 1 Mb/s
const P = 8184;
const ACK = 112 + 128;
const RTS = 160 + 128;
const CTS = 112 + 128;
const SIFS = 28;
const delta = 1;
const SLOT = 50;
const DIFS = SIFS + 2 * SLOT; // 128 µs, Bianchi Table I
const BASIC = { successUs: H + P + SIFS + delta + ACK + delta, collisionPpduUs: H + P, responseTimeoutUs: delta };
const RTSCTS = {
  successUs: RTS + SIFS + delta + CTS + SIFS + delta + H + P + SIFS + delta + ACK + delta,
  collisionPpduUs: RTS,
  responseTimeoutUs: delta,
};
// Bianchi's model has no retry limit; 200 attempts leave p^200 < 1e-44 for p ≤ 0.6.
const UNLIMITED = 200;
/** m' = 3 doubling stages (Bianchi's Fig. 6 setting). */
const UNLIMITED_STAGES = 3;

function fhss(stations: number, w: number, m: number, access: typeof BASIC): ContentionChannel {
  return {
    slotUs: SLOT,
    sifsUs: SIFS,
    eifsExtraUs: delta,
    classes: [
      { name: "DCF", stations, aifsn: 2, cwMin: w - 1, cwMax: w * 2 ** m - 1, retryLimit: UNLIMITED, countdown: "EDCA", payloadBits: P, blockAckReq: null, ...access },
    ],
  };
}

/** Bianchi eq. (7) (no retry limit), written out independently of the code under test. */
function bianchiTau(p: number, w: number, m: number): number {
  return (2 * (1 - 2 * p)) / ((1 - 2 * p) * (w + 1) + p * w * (1 - Math.pow(2 * p, m)));
}

/** Solve eqs. (7) and (9) by bisection on τ (the code under test bisects on p instead). */
function bianchiFixedPoint(n: number, w: number, m: number): { tau: number; p: number } {
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < 200; i++) {
    const tau = (lo + hi) / 2;
    const p = 1 - Math.pow(1 - tau, n - 1);
    if (tau < bianchiTau(p, w, m)) lo = tau;
    else hi = tau;
  }
  const tau = (lo + hi) / 2;
  return { tau, p: 1 - Math.pow(1 - tau, n - 1) };
}

/** Wu et al., IEEE INFOCOM 2002: τ with retry limit m and m' doubling stages. */
function wuTau(p: number, w: number, mPrime: number, m: number): number {
  const num = 2 * (1 - 2 * p) * (1 - Math.pow(p, m + 1));
  if (m <= mPrime) {
    return num / (w * (1 - Math.pow(2 * p, m + 1)) * (1 - p) + (1 - 2 * p) * (1 - Math.pow(p, m + 1)));
  }
  return (
    num /
    (w * (1 - Math.pow(2 * p, mPrime + 1)) * (1 - p) +
      (1 - 2 * p) * (1 - Math.pow(p, m + 1)) +
      w * 2 ** mPrime * Math.pow(p, mPrime + 1) * (1 - 2 * p) * (1 - Math.pow(p, m - mPrime)))
  );
}

describe("attempt probability τ(p)", () => {
  it("is 2/(W+1) when nothing collides", () => {
    expect(attemptProbability(0, 15, 1023, 7)).toBeCloseTo(2 / (15 + 1 + 1), 15); // Bianchi eq. (7) at p = 0
  });

  it("matches Wu et al.'s closed form with retransmissions beyond the doubling stages (8 attempts: m = 7 > m' = 6)", () => {
    expect(attemptProbability(0.3, 15, 1023, 8)).toBeCloseTo(wuTau(0.3, 16, 6, 7), 14);
  });

  it("matches Wu et al.'s closed form with retransmissions within the doubling stages (4 attempts: m = 3 ≤ m' = 5)", () => {
    expect(attemptProbability(0.2, 31, 1023, 4)).toBeCloseTo(wuTau(0.2, 32, 5, 3), 14);
  });

  it("tends to Bianchi's eq. (7) as the retry limit grows", () => {
    expect(attemptProbability(0.35, 31, 255, UNLIMITED)).toBeCloseTo(bianchiTau(0.35, 32, 3), 14);
  });

  it("stays finite at p = ½, where the closed forms read 0/0", () => {
    // Σ p^i ÷ Σ p^i·(W_i+1)/2 at p = ½ over 7 attempts, W_i = 16, 32 … 1024 (CWmin 15, CWmax 1023)
    const windows = [16, 32, 64, 128, 256, 512, 1024];
    const attempts = windows.reduce((sum, _w, i) => sum + 0.5 ** i, 0);
    const slots = windows.reduce((sum, w, i) => sum + (0.5 ** i * (w + 1)) / 2, 0);
    expect(attemptProbability(0.5, 15, 1023, 7)).toBeCloseTo(attempts / slots, 14);
  });
});

describe("the (τ, p) fixed point", () => {
  it("gives one station p = 0 exactly", () => {
    expect(fixedPoint(1, 15, 1023, 7).p).toBe(0);
  });

  it("agrees with Bianchi's eqs. (7) and (9) for 10 stations, W = 32, m = 3", () => {
    expect(fixedPoint(10, 31, 255, UNLIMITED).p).toBeCloseTo(bianchiFixedPoint(10, 32, 3).p, 10);
  });

  it("agrees with Bianchi's eqs. (7) and (9) for 50 stations, W = 128, m = 3", () => {
    expect(fixedPoint(50, 127, 1023, UNLIMITED).tau).toBeCloseTo(bianchiFixedPoint(50, 128, 3).tau, 10);
  });

  it("raises p as stations are added", () => {
    const ps = [1, 2, 5, 10, 20, 50, 100, 1000].map((n) => fixedPoint(n, 15, 1023, 7).p);
    for (let i = 1; i < ps.length; i++) expect(ps[i]).toBeGreaterThan(ps[i - 1]);
  });

  it("stays a probability for 1000 stations with the smallest window", () => {
    const { p, tau } = fixedPoint(1000, 0, 1, 1);
    expect(p).toBeGreaterThan(0.99);
    expect(p).toBeLessThanOrEqual(1);
    expect(tau).toBeGreaterThan(0);
  });
});

describe("saturation throughput with Bianchi's FHSS parameters", () => {
  it("reduces to payload ÷ (T_s + σ·(W−1)/2) for one station", () => {
    // p = 0, τ = 2/(W+1): E[slot]/τ = T_s + σ(1−τ)/τ = T_s + σ(W−1)/2
    const ts = H + P + SIFS + delta + ACK + DIFS + delta; // 8982 µs
    expect(saturation(fhss(1, 32, 3, BASIC)).goodputMbps).toBeCloseTo(P / (ts + (SLOT * (32 - 1)) / 2), 12);
  });

  it("counts the DIFS in T_s and T_c as Bianchi does (his eq. (13), written out here)", () => {
    // S = P_s·P_tr·E[P] ÷ [(1 − P_tr)σ + P_tr·P_s·T_s + P_tr(1 − P_s)·T_c], τ and p from his eqs. (7) and (9)
    const n = 10;
    const { tau } = bianchiFixedPoint(n, 32, 3);
    const ptr = 1 - Math.pow(1 - tau, n);
    const ps = (n * tau * Math.pow(1 - tau, n - 1)) / ptr;
    const ts = H + P + SIFS + delta + ACK + DIFS + delta;
    const tc = H + P + DIFS + delta;
    const s = (ps * ptr * P) / ((1 - ptr) * SLOT + ptr * ps * ts + ptr * (1 - ps) * tc);
    expect(saturation(fhss(n, 32, UNLIMITED_STAGES, BASIC)).goodputMbps).toBeCloseTo(s, 6);
  });

  // Bianchi 2000 Fig. 6 (analysis vs simulation, W = 32, m = 3), values read
  // from the plot from memory: basic access ≈ 0.81 at n = 5 and ≈ 0.6 at
  // n = 50; RTS/CTS ≈ 0.83–0.84 over the whole range.
  it("carries about 0.81 of the 1 Mb/s channel with 5 stations, basic access (from memory)", () => {
    expect(saturation(fhss(5, 32, 3, BASIC)).goodputMbps).toBeCloseTo(0.81, 1);
  });

  it("falls to about 0.6 with 50 stations, basic access (from memory)", () => {
    const s = saturation(fhss(50, 32, 3, BASIC)).goodputMbps;
    expect(s).toBeGreaterThan(0.5);
    expect(s).toBeLessThan(0.65);
  });

  it("holds about 0.83 with 50 stations under RTS/CTS (from memory)", () => {
    expect(saturation(fhss(50, 32, 3, RTSCTS)).goodputMbps).toBeCloseTo(0.835, 1);
  });

  // Bianchi 2000 §VI (basic vs RTS/CTS; section number from memory): with
  // long frames and many stations RTS/CTS wins, because a collision then
  // costs only an RTS.
  it("lets RTS/CTS beat basic access for long frames and 20 stations", () => {
    expect(saturation(fhss(20, 32, 3, RTSCTS)).goodputMbps).toBeGreaterThan(saturation(fhss(20, 32, 3, BASIC)).goodputMbps);
  });

  it("lets basic access beat RTS/CTS for one station, which never collides", () => {
    expect(saturation(fhss(1, 32, 3, BASIC)).goodputMbps).toBeGreaterThan(saturation(fhss(1, 32, 3, RTSCTS)).goodputMbps);
  });

  it("spends the rest of the airtime on successes", () => {
    const s = saturation(fhss(20, 32, 3, BASIC));
    const ts = H + P + SIFS + delta + ACK + DIFS + delta;
    const successShare = (s.goodputMbps / P) * ts; // successes per µs × T_s
    expect(s.contentionShare + successShare).toBeCloseTo(1, 12);
  });
});
