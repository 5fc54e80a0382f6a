import { mulberry32, simulate, type SimulationParams } from "../../../src/core/contention/simulator";
import { AirtallyError } from "../../../src/core/errors";

// 5 GHz OFDM timing: aSlotTime 9 µs, aSIFSTime 16 µs (IEEE 802.11-2020 Table 17-21); BE AIFSN 3, CW 15…1023 (Table 9-155);
// AckTimeout 16 + 9 + 25 = 50 µs (10.3.2.9); EIFS − DIFS = 16 + 44 µs (an Ack at 6 Mb/s, 10.3.2.3.7).
function be(stations: number, countdown = "EDCA"): SimulationParams {
  return {
    slotUs: 9,
    sifsUs: 16,
    eifsExtraUs: 60,
    classes: [{ name: "BE", stations, aifsn: 3, cwMin: 15, cwMax: 1023, retryLimit: 7, countdown, successUs: 300, collisionPpduUs: 250, responseTimeoutUs: 50, payloadBits: 12000, blockAckReq: null }],
  };
}

describe("the contention simulator", () => {
  it("repeats a run exactly for the same seed", () => {
    expect(simulate(be(10), 42, { busySlots: 2000 })).toEqual(simulate(be(10), 42, { busySlots: 2000 }));
  });

  it("gives another run for another seed", () => {
    expect(simulate(be(10), 1, { busySlots: 2000 }).durationUs).not.toBe(simulate(be(10), 2, { busySlots: 2000 }).durationUs);
  });

  it("never collides with one station", () => {
    expect(simulate(be(1), 3, { busySlots: 5000 }).classes[0].collisions).toBe(0);
  });

  it("gives one station payload ÷ (AIFS + mean backoff + exchange), within 1 %", () => {
    // mean of a counter uniform on 0…15 is 7.5 slots; AIFS = 16 + 3 × 9 = 43 µs
    const expected = 12000 / (43 + 7.5 * 9 + 300);
    expect(simulate(be(1), 4, { busySlots: 40_000 }).goodputMbps / expected).toBeCloseTo(1, 2);
  });

  it("gives one DCF station the same mean backoff as one EDCA station (CW ÷ 2 slots either way)", () => {
    const expected = 12000 / (43 + 7.5 * 9 + 300);
    expect(simulate(be(1, "DCF"), 4, { busySlots: 40_000 }).goodputMbps / expected).toBeCloseTo(1, 2);
  });

  // The DCF counter is frozen while the medium is busy (10.3.4.3), the EDCA one counts the boundary at which
  // another station starts (10.23.2.4): EDCA stations reach 0 sooner after a busy period, so they collide more.
  it("collides less under the DCF countdown than under the EDCA countdown, other things equal", () => {
    const dcf = simulate(be(20, "DCF"), 9, { busySlots: 30_000 }).classes[0].collisionProbability;
    const edca = simulate(be(20, "EDCA"), 9, { busySlots: 30_000 }).classes[0].collisionProbability;
    expect(dcf).toBeLessThan(edca - 0.005);
  });

  it("lets only the colliders count down while the others wait EIFS: a longer EIFS costs goodput", () => {
    const p = be(20);
    const longEifs = { ...p, eifsExtraUs: 600 };
    expect(simulate(longEifs, 10, { busySlots: 30_000 }).goodputMbps).toBeLessThan(simulate(p, 10, { busySlots: 30_000 }).goodputMbps);
  });

  it("sends a BlockAckReq after each collided A-MPDU when asked to, and delivers nothing by it", () => {
    const p = be(10);
    const bar = { ...p, classes: [{ ...p.classes[0], blockAckReq: { successUs: 100, collisionPpduUs: 40 } }] };
    const r = simulate(bar, 11, { busySlots: 20_000 }).classes[0];
    expect(r.blockAckReqs).toBeGreaterThan(0);
    expect(r.blockAckReqs).toBeLessThanOrEqual(r.collisions);
    expect(r.successes + r.blockAckReqs + r.collisions).toBe(r.attempts);
  });

  it("drops every collided frame when the retry limit is 1 attempt", () => {
    const p = be(20);
    const once = { ...p, classes: [{ ...p.classes[0], retryLimit: 1 }] };
    const r = simulate(once, 5, { busySlots: 5000 }).classes[0];
    expect(r.drops).toBe(r.collisions);
  });

  it("stops at the requested duration", () => {
    const r = simulate(be(5), 6, { durationUs: 1e6 });
    expect(r.durationUs).toBeGreaterThanOrEqual(1e6);
    expect(r.durationUs).toBeLessThan(1e6 + 400); // overshoots by at most one busy period (300 + 43 µs, or 250 + 60 + 43)
  });

  it("reports progress up to 1", () => {
    const seen: number[] = [];
    simulate(be(5), 7, { busySlots: 1000, progressEvery: 250, onProgress: (f) => seen.push(f) });
    expect(seen).toEqual([0.25, 0.5, 0.75, 1]);
  });

  it("does not change its parameters", () => {
    const p = be(3);
    const copy = JSON.parse(JSON.stringify(p));
    simulate(p, 8, { busySlots: 100 });
    expect(p).toEqual(copy);
  });

  it("refuses a class without stations, naming it", () => {
    const p = be(1);
    const none = { ...p, classes: [{ ...p.classes[0], stations: 0 }] };
    expect(() => simulate(none, 1)).toThrow(/BE\.stations/);
  });

  it("refuses CWmin above CWmax", () => {
    const p = be(1);
    const bad = { ...p, classes: [{ ...p.classes[0], cwMin: 31, cwMax: 15 }] };
    expect(() => simulate(bad, 1)).toThrow(AirtallyError);
  });

  it("refuses an unknown countdown rule", () => {
    expect(() => simulate(be(2, "ALOHA"), 1)).toThrow(/countdown/);
  });

  it("refuses a fractional seed", () => {
    expect(() => simulate(be(1), 1.5)).toThrow(/seed/);
  });
});

describe("mulberry32", () => {
  it("draws uniformly on [0, 1): mean ½ within 0.01 over 10 000 draws", () => {
    const r = mulberry32(9);
    let sum = 0;
    for (let i = 0; i < 10_000; i++) sum += r();
    expect(sum / 10_000).toBeCloseTo(0.5, 2);
  });
});
