/*
 * The analytic models (bianchi.ts, edca.ts) against the seeded Monte Carlo
 * (simulator.ts), which shares no code with them. Tolerances (issue 4):
 * aggregate goodput within 3 %, conditional collision probability within
 * 0.02, per-class airtime share within 0.01. With 30 000–60 000 busy slots a
 * run's own sampling error is about 0.5 % on goodput and 0.005 on p, well
 * inside them; the rest is the models' decoupling approximation.
 */
import { saturation } from "../../../src/core/contention/bianchi";
import { edcaSaturation } from "../../../src/core/contention/edca";
import { contentionChannel } from "../../../src/core/contention/adapter";
import { simulate } from "../../../src/core/contention/simulator";
import type { ContentionChannel } from "../../../src/core/contention/timing";

const STATIONS = [1, 2, 5, 10, 20, 50];
const BUSY_SLOTS = 30_000;

// Bianchi 2000 Table I (FHSS), as in bianchi.test.ts: times in µs at 1 Mb/s, without DIFS.
const H = 128 + 272;
const P = 8184;
const FHSS_BASIC = { successUs: H + P + 28 + 1 + 240 + 1, collisionUs: H + P + 1 };
const FHSS_RTS = { successUs: 288 + 28 + 1 + 240 + 28 + 1 + H + P + 28 + 1 + 240 + 1, collisionUs: 288 + 1 };

function fhss(stations: number, access: typeof FHSS_BASIC): ContentionChannel {
  // W = 32, m' = 3 (CWmax 255), dot11ShortRetryLimit 7 attempts
  return { slotUs: 50, sifsUs: 28, classes: [{ name: "DCF", stations, aifsn: 2, cwMin: 31, cwMax: 255, retryLimit: 7, payloadBits: P, ...access }] };
}

/** An HE A-MPDU link through the MAC layer (aggregation: long T_s, many packets per success). */
function he(stations: number, protection: string): ContentionChannel {
  return contentionChannel("HE MCS7 1SS 20MHz 5GHz", [{ access: "BE", stations }], 1500, "auto", protection);
}

function expectAgreement(channel: ContentionChannel, seed: number): void {
  const model = saturation(channel);
  const sim = simulate(channel, seed, { busySlots: BUSY_SLOTS });
  expect(Math.abs(sim.goodputMbps / model.goodputMbps - 1)).toBeLessThanOrEqual(0.03);
  expect(Math.abs(sim.classes[0].collisionProbability - model.p)).toBeLessThanOrEqual(0.02);
}

describe("Bianchi's model against the simulator", () => {
  for (const n of STATIONS) {
    it(`agrees for ${n} station(s), basic access, Bianchi's FHSS parameters`, () => expectAgreement(fhss(n, FHSS_BASIC), 100 + n));
    it(`agrees for ${n} station(s), RTS/CTS, Bianchi's FHSS parameters`, () => expectAgreement(fhss(n, FHSS_RTS), 200 + n));
    it(`agrees for ${n} station(s), HE A-MPDU, no protection`, () => expectAgreement(he(n, "none"), 300 + n));
    it(`agrees for ${n} station(s), HE A-MPDU, RTS/CTS`, () => expectAgreement(he(n, "RTS"), 400 + n));
  }
});

/** An OFDM-like class: 5 GHz aSlotTime 9 µs, aSIFSTime 16 µs (IEEE 802.11-2020 Table 17-21); illustrative exchange lengths. */
function ofdmMix(classes: [string, number, number, number, number][]): ContentionChannel {
  return {
    slotUs: 9,
    sifsUs: 16,
    classes: classes.map(([name, stations, aifsn, cwMin, cwMax]) => ({
      name, stations, aifsn, cwMin, cwMax, retryLimit: 7, successUs: 1500, collisionUs: 1450, payloadBits: 4 * 12000,
    })),
  };
}

function expectMixAgreement(channel: ContentionChannel, seed: number): void {
  const model = edcaSaturation(channel);
  const sim = simulate(channel, seed, { busySlots: 60_000 });
  const total = model.classes.reduce((s, c) => s + c.goodputMbps, 0);
  expect(Math.abs(sim.goodputMbps / total - 1)).toBeLessThanOrEqual(0.03);
  model.classes.forEach((c, i) => {
    expect(Math.abs(sim.classes[i].collisionProbability - c.p)).toBeLessThanOrEqual(0.02);
    expect(Math.abs(sim.classes[i].airtimeShare - c.airtimeShare)).toBeLessThanOrEqual(0.01);
  });
}

describe("the EDCA mix model against the simulator", () => {
  // Table 9-155 station defaults for an OFDM PHY (aCWmin 15, aCWmax 1023): VI AIFSN 2, CW 7…15; BE AIFSN 3, CW 15…1023; BK AIFSN 7.
  it("agrees for 2 VI and 8 BE stations", () => expectMixAgreement(ofdmMix([["VI", 2, 2, 7, 15], ["BE", 8, 3, 15, 1023]]), 11));

  it("agrees for 4 BE and 4 BK stations (four slots of AIFS apart)", () => expectMixAgreement(ofdmMix([["BE", 4, 3, 15, 1023], ["BK", 4, 7, 15, 1023]]), 12));

  it("agrees for 2 VI and 6 BE stations on an HE link with each class's own TXOP limit", () =>
    expectMixAgreement(contentionChannel("HE MCS7 1SS 20MHz 5GHz", [{ access: "VI", stations: 2 }, { access: "BE", stations: 6 }], 1500), 13));

  it("reduces to Bianchi's single-class model for one class", () => {
    const one = fhss(10, FHSS_BASIC);
    expect(edcaSaturation(one).classes[0].goodputMbps).toBeCloseTo(saturation(one).goodputMbps, 9);
  });
});
