/*
 * The analytic models (saturation.ts, aifsZones.ts) against the seeded
 * simulator (simulator.ts), which shares no code or algebra with them and is
 * written from the standard's rules (frozen counters, EIFS, response
 * timeouts, BlockAckReq recovery). A moderate grid with two seeds per case;
 * `npx tsx scripts/contention-sweep.ts` runs the wide sweep whose results
 * DEVELOPERS.md reports.
 *
 * Tolerances (issue 11): SATURATE within 3 % of the simulator's mean and
 * p within 0.02; CONTENTION within 0.02. With 20 000 busy periods per seed a
 * run's own sampling error is about 0.5 % on goodput and 0.005 on p.
 * EDCAMIX per class within 5 % (0.1 Mb/s below 2 Mb/s) and p within 0.02,
 * plus the reference's own sampling error, on the mixes it answers
 * (DEVELOPERS.md lists where it refuses and where it is known to read low).
 */
import { saturation } from "../../../src/core/contention/saturation";
import { edcaSaturation } from "../../../src/core/contention/aifsZones";
import { contentionChannel } from "../../../src/core/contention/fromLink";
import { simulate, type SimulationResult } from "../../../src/core/contention/simulator";
import type { ContentionChannel } from "../../../src/core/contention/parameters";
import { collisionProbability, contentionShare, saturationGoodputMbps } from "../../../src/core/contention/catalog";

const SEEDS = [11, 12];

function simulated(channel: ContentionChannel, busySlots: number): { goodput: number; p: number[]; share: number; classes: number[] } {
  const runs: SimulationResult[] = SEEDS.map((seed) => simulate(channel, seed, { busySlots }));
  const mean = (f: (r: SimulationResult) => number): number => runs.reduce((a, r) => a + f(r), 0) / runs.length;
  return {
    goodput: mean((r) => r.goodputMbps),
    share: mean((r) => r.contentionShare),
    p: channel.classes.map((_, i) => mean((r) => r.classes[i].collisionProbability)),
    classes: channel.classes.map((_, i) => mean((r) => r.classes[i].goodputMbps)),
  };
}

const SATURATE_CASES: [string, string, string | number, string, string][] = [
  // link, access, mpdus, protection, mac_options
  ["OFDM 54Mbps 5GHz", "DCF", 1, "none", ""],
  ["OFDM 54Mbps 5GHz", "DCF", 1, "RTS", ""],
  ["ERP-OFDM 54Mbps 2.4GHz", "DCF", 1, "none", ""],
  ["OFDM 54Mbps 5GHz", "BE", 1, "none", ""],
  ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "none", ""],
  ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "RTS", ""],
  ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "none", "BAR"],
  ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "RTS", "BAR"],
  ["HT MCS7 1SS 20MHz 2.4GHz", "BE", 16, "none", "BAR"],
  ["HR-DSSS 11Mbps 2.4GHz", "DCF", 1, "none", ""],
  ["HE MCS11 2SS 80MHz 5GHz", "BK", "auto", "none", "BAR"],
  ["VHT MCS9 2SS 80MHz 5GHz", "BE", "auto", "CTS", ""],
];

describe("SATURATE's model against the simulator", () => {
  for (const [link, access, mpdus, protection, options] of SATURATE_CASES) {
    for (const n of [2, 10, 50]) {
      it(`agrees for ${n} stations: ${link}, ${access}, ${mpdus} MPDUs, ${protection}${options ? ", " + options : ""}`, () => {
        const channel = contentionChannel(link, [{ access, stations: n }], 1500, mpdus, protection, options);
        const model = saturation(channel);
        const sim = simulated(channel, 20_000);
        expect(Math.abs(model.goodputMbps / sim.goodput - 1)).toBeLessThanOrEqual(0.03);
        expect(Math.abs(model.p - sim.p[0])).toBeLessThanOrEqual(0.02);
        expect(Math.abs(model.contentionShare - sim.share)).toBeLessThanOrEqual(0.02);
      });
    }
  }
});

/**
 * SATURATE as the catalog answers it, where the one-class model's two refinements matter: small windows
 * (VO CW 3…7, VI 7…15), solved on counter tables (aifsZones.ts countersMatter), and many stations, where a
 * collision has more than two colliders to take the slots before the others' EIFS ends (saturation.ts).
 * Before them, 5 VO stations on OFDM read 6 % high and 300 DCF stations 8 % low.
 */
const SATURATE_EDGE_CASES: [string, string, string | number, string, string, number][] = [
  ["OFDM 54Mbps 5GHz", "VO", 1, "none", "", 2],
  ["OFDM 54Mbps 5GHz", "VO", 1, "none", "", 5],
  ["OFDM 54Mbps 5GHz", "VO", 1, "none", "", 10],
  ["ERP-OFDM 54Mbps 2.4GHz", "VO", 1, "none", "", 15],
  ["VHT MCS8 1SS 20MHz 5GHz", "VO", "auto", "none", "", 2],
  ["VHT MCS8 1SS 20MHz 5GHz", "VO", "auto", "none", "", 8],
  ["VHT MCS8 1SS 20MHz 5GHz", "VO", "auto", "none", "BAR", 2],
  ["HT MCS7 1SS 20MHz 2.4GHz", "VO", 8, "none", "", 5],
  ["HE MCS7 1SS 20MHz 5GHz", "VI", "auto", "none", "", 5],
  ["HE MCS7 1SS 20MHz 5GHz", "VI", "auto", "RTS", "BAR", 5],
  ["OFDM 54Mbps 5GHz", "VI", 1, "RTS", "", 20],
  ["OFDM 54Mbps 5GHz", "DCF", 1, "none", "", 300],
  ["ERP-OFDM 54Mbps 2.4GHz", "DCF", 1, "none", "", 250],
  ["OFDM 54Mbps 5GHz", "BE", 1, "none", "", 400],
  ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "none", "BAR", 80],
];

describe("SATURATE (as the catalog answers) against the simulator: small windows and many stations", () => {
  for (const [link, access, mpdus, protection, options, n] of SATURATE_EDGE_CASES) {
    it(`agrees within 3 % for ${n} stations: ${link}, ${access}, ${mpdus} MPDUs, ${protection}${options ? ", " + options : ""}`, () => {
      const channel = contentionChannel(link, [{ access, stations: n }], 1500, mpdus, protection, options);
      const sim = simulated(channel, 20_000);
      expect(Math.abs(saturationGoodputMbps(link, n, 1500, mpdus, access, protection, options) / sim.goodput - 1)).toBeLessThanOrEqual(0.03);
      expect(Math.abs(contentionShare(link, n, 1500, mpdus, access, protection, options) - sim.share)).toBeLessThanOrEqual(0.02);
    });
  }

  // Why small windows leave Bianchi's chain: a fresh counter on 0…3 has sent within four slots for sure.
  it("reads 5 VO stations on OFDM more than 4 % high with Bianchi's memoryless countdown (saturation.ts)", () => {
    const channel = contentionChannel("OFDM 54Mbps 5GHz", [{ access: "VO", stations: 5 }], 1500, 1);
    expect(saturation(channel).goodputMbps / simulated(channel, 20_000).goodput - 1).toBeGreaterThan(0.04);
  });
});

describe("SATURATE's counter tables for one class", () => {
  // The fixed point of one class depends on its counters' dynamics alone, so a solved one is kept and the
  // next channel with the same backoff (another packet size) starts from it: the answer must not change.
  it("gives the same answer from a kept fixed point as from a fresh solve", () => {
    const channel = (bytes: number, options: string) => contentionChannel("HE MCS7 1SS 20MHz 5GHz", [{ access: "VO", stations: 3 }], bytes, "auto", "none", options);
    for (const options of ["", "BAR"]) {
      edcaSaturation(channel(700, options));
      const kept = edcaSaturation(channel(1500, options));
      const fresh = edcaSaturation(channel(1500, options), { tableStart: 8 }); // a study option: never kept or read
      expect(kept.sweeps).toBe(1);
      expect(kept.classes[0].goodputMbps).toBe(fresh.classes[0].goodputMbps);
      expect(kept.classes[0].p).toBe(fresh.classes[0].p);
    }
  });

  it("gives the same answer from a kept pair-state fixed point as from a fresh solve (VI + BE)", () => {
    // 1 VI + 3 BE: the zone offsets are the same at 700 and 1400 bytes, so the second solve starts from the first.
    const channel = (bytes: number) => contentionChannel("HE MCS7 1SS 20MHz 5GHz", [{ access: "VI", stations: 1 }, { access: "BE", stations: 3 }], bytes);
    edcaSaturation(channel(700));
    const kept = edcaSaturation(channel(1400));
    const fresh = edcaSaturation(channel(1400), { tableStart: 32 });
    expect(kept.pairs).toBe(true);
    expect(kept.sweeps).toBe(1);
    kept.classes.forEach((c, i) => {
      expect(c.goodputMbps).toBe(fresh.classes[i].goodputMbps);
      expect(c.p).toBe(fresh.classes[i].p);
    });
  });
});

describe("COLLIDE against the simulator", () => {
  // COLLIDE has no link: the EDCA countdown with every station back on the same grid after a collision
  // (EIFS − DIFS equal to the timeout). 5 GHz slot and SIFS (IEEE 802.11-2020 Table 17-21), CW 15…1023, 7 attempts.
  for (const n of [2, 10, 50]) {
    it(`gives the simulated collision probability of ${n} stations within 0.02`, () => {
      const channel: ContentionChannel = {
        slotUs: 9,
        sifsUs: 16,
        eifsExtraUs: 50,
        classes: [{ name: "BE", stations: n, aifsn: 3, cwMin: 15, cwMax: 1023, retryLimit: 7, countdown: "EDCA", successUs: 300, collisionPpduUs: 250, responseTimeoutUs: 50, payloadBits: 12000, blockAckReq: null }],
      };
      expect(Math.abs(collisionProbability(n) - simulated(channel, 20_000).p[0])).toBeLessThanOrEqual(0.02);
    });
  }

  // Small windows: Bianchi's memoryless countdown is off, the counter tables (SATURATE's model for them) are not.
  it("departs from the simulator for VO's windows (CW 3…7), where SATURATE's counter tables match it", () => {
    const channel: ContentionChannel = {
      slotUs: 9,
      sifsUs: 16,
      eifsExtraUs: 50,
      classes: [{ name: "VO", stations: 2, aifsn: 2, cwMin: 3, cwMax: 7, retryLimit: 7, countdown: "EDCA", successUs: 300, collisionPpduUs: 250, responseTimeoutUs: 50, payloadBits: 12000, blockAckReq: null }],
    };
    const sim = simulated(channel, 20_000).p[0];
    expect(sim - collisionProbability(2, 3, 7)).toBeGreaterThan(0.02);
    expect(Math.abs(edcaSaturation(channel).classes[0].p - sim)).toBeLessThanOrEqual(0.01);
  });
});

type Mix = [string, number][];
/**
 * Mixes of the families issue 11 names (VO + BE, VI + BE, three classes, 1–20 stations each) that EDCAMIX
 * answers, and two of BE beside BK. Where a mix is refused (#N/A), contention.test.ts says so.
 */
const MIXES: Mix[] = [
  [["VO", 1], ["BE", 1]],
  [["VO", 1], ["BE", 20]],
  [["VO", 2], ["BE", 3]],
  [["VO", 2], ["BE", 20]],
  [["VO", 5], ["BE", 3]],
  [["VO", 10], ["BE", 3]],
  [["VI", 1], ["BE", 10]],
  [["VI", 2], ["BE", 1]],
  [["VI", 5], ["BE", 20]],
  [["VI", 10], ["BE", 3]],
  [["VI", 20], ["BE", 1]],
  [["VO", 1], ["VI", 1], ["BE", 1]],
  [["VO", 2], ["VI", 2], ["BE", 5]],
  [["VO", 5], ["VI", 5], ["BE", 10]],
  // Best effort beside several small-window stations, which one pooled listener law per class read 5–14 % low
  // (the pair states of two-class mixes, aifsZones.ts pairedClasses).
  [["VO", 2], ["BE", 1]],
  [["VO", 5], ["BE", 10]],
  [["VI", 5], ["BE", 3]],
  [["VI", 10], ["BE", 20]],
  [["BE", 1], ["BK", 3]],
  [["BE", 2], ["BK", 10]],
];
/** Seeds and busy periods of the reference: a class with a small share needs long runs (its own error enters the check). */
const MIX_SEEDS = [21, 22, 23, 24];
const MIX_BUSY = 150_000;

function simulatedMix(channel: ContentionChannel): { g: number[]; gErr: number[]; p: number[]; pErr: number[] } {
  const runs = MIX_SEEDS.map((seed) => simulate(channel, seed, { busySlots: MIX_BUSY }));
  const stat = (f: (r: SimulationResult) => number): [number, number] => {
    const xs = runs.map(f);
    const m = xs.reduce((a, b) => a + b, 0) / xs.length;
    const sd = Math.sqrt(xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1));
    return [m, sd / Math.sqrt(xs.length)];
  };
  const g = channel.classes.map((_, i) => stat((r) => r.classes[i].goodputMbps));
  const p = channel.classes.map((_, i) => stat((r) => r.classes[i].collisionProbability));
  return { g: g.map((x) => x[0]), gErr: g.map((x) => x[1]), p: p.map((x) => x[0]), pErr: p.map((x) => x[1]) };
}

/** Issue 11's tolerance (5 %, or 0.1 Mb/s under 2 Mb/s; p within 0.02) plus twice the reference's own standard error. */
function expectWithinMixTolerance(model: ReturnType<typeof edcaSaturation>, sim: ReturnType<typeof simulatedMix>): void {
  model.classes.forEach((c, i) => {
    const s = sim.g[i];
    expect(Math.abs(c.goodputMbps - s)).toBeLessThanOrEqual((s < 2 ? 0.1 : 0.05 * s) + 2 * sim.gErr[i]);
    expect(Math.abs(c.p - sim.p[i])).toBeLessThanOrEqual(0.02 + 2 * sim.pErr[i]);
  });
}

describe("EDCAMIX's model against the simulator", () => {
  // Tolerance: issue 11's (5 %, or 0.1 Mb/s under 2 Mb/s; p within 0.02) plus twice the reference's own
  // standard error over its seeds (a class with a 2 % share has a few thousand successes per run).
  for (const mix of MIXES) {
    it(`agrees per class for ${mix.map(([a, n]) => `${n} ${a}`).join(" + ")} (HE MCS7, A-MPDU per class TXOP)`, () => {
      const channel = contentionChannel("HE MCS7 1SS 20MHz 5GHz", mix.map(([access, stations]) => ({ access, stations })), 1500);
      const model = edcaSaturation(channel);
      expect(model.residual).toBeLessThanOrEqual(1e-4);
      expectWithinMixTolerance(model, simulatedMix(channel));
    });
  }

  // BlockAckReq recovery (mac_options BAR) in the mixes EDCAMIX answers with it.
  const BAR_MIXES: Mix[] = [
    [["VO", 1], ["BE", 10]],
    [["VI", 2], ["BE", 3]],
    [["VO", 1], ["VI", 1], ["BE", 1]],
    [["BE", 2], ["BK", 10]],
  ];
  for (const mix of BAR_MIXES) {
    it(`agrees per class with BAR for ${mix.map(([a, n]) => `${n} ${a}`).join(" + ")}`, () => {
      const channel = contentionChannel("HE MCS7 1SS 20MHz 5GHz", mix.map(([access, stations]) => ({ access, stations })), 1500, "auto", "none", "BAR");
      expectWithinMixTolerance(edcaSaturation(channel), simulatedMix(channel));
    });
  }

  it("uses the single-class model for one class", () => {
    const one = contentionChannel("OFDM 54Mbps 5GHz", [{ access: "BE", stations: 10 }], 1500);
    expect(edcaSaturation(one).classes[0].goodputMbps).toBe(saturation(one).goodputMbps);
  });
});

describe("EDCAMIX's counter tables", () => {
  // The solver holds each counter law on its first 32 counters and the rest as a renewal tail (aifsZones.ts,
  // listenerLaw). With tables of all CWmax + 1 counters there is no tail and the listener laws are exact:
  // both must give the same answer to within the solver's tolerance.
  const mixes: Mix[] = [
    [["VO", 2], ["BE", 10]],
    [["VI", 1], ["BE", 20]],
    [["VO", 1], ["VI", 1], ["BE", 3]],
    [["BE", 2], ["BK", 3]],
  ];
  for (const mix of mixes) {
    it(`gives the exact tables' answer with the renewal tail for ${mix.map(([a, n]) => `${n} ${a}`).join(" + ")}`, () => {
      const channel = contentionChannel("HE MCS7 1SS 20MHz 5GHz", mix.map(([access, stations]) => ({ access, stations })), 1500);
      const tail = edcaSaturation(channel);
      const exact = edcaSaturation(channel, { tableStart: 1024 });
      tail.classes.forEach((c, i) => {
        expect(Math.abs(c.goodputMbps / exact.classes[i].goodputMbps - 1)).toBeLessThan(1e-3);
        expect(Math.abs(c.p - exact.classes[i].p)).toBeLessThan(2e-4);
      });
    });
  }

  it("reports an unsettled mix as such (the catalog then answers #N/A)", () => {
    const channel = contentionChannel("HE MCS7 1SS 20MHz 5GHz", [{ access: "VO", stations: 2 }, { access: "BE", stations: 10 }], 1500);
    expect(edcaSaturation(channel, { workLimit: 1000 }).residual).toBe(Infinity);
  });
});
