/**
 * A seeded, deterministic slot-level Monte Carlo of saturated DCF/EDCA
 * stations. It is written apart from the analytic model (it imports none of
 * it) so the two can check each other.
 *
 * Every station always has a frame waiting. Time runs in generic slots
 * (G. Bianchi, IEEE JSAC 18(3), 2000, §II–III): an idle slot lasts aSlotTime;
 * a slot with one transmitter lasts that class's success exchange, with two or
 * more the longest colliding exchange; every busy slot is followed by the
 * smallest AIFS of the classes present. A station of class c is frozen for
 * AIFSN_c − AIFSN_min further slots after every busy slot (its longer AIFS,
 * IEEE 802.11-2020 10.23.2; clause from memory) — a busy slot seen by a
 * station still frozen restarts its wait.
 *
 * In each generic slot in which it is not frozen a station transmits if its
 * backoff counter is 0 and otherwise counts it down by one — Bianchi's
 * counting (his Markov chain of §III). After a success, or after a collision
 * that used up the retry limit (the frame is dropped), the station starts a
 * new frame with CW = CWmin; after any other collision
 * CW ← min(2·(CW + 1) − 1, CWmax). A new counter is uniform on [0, CW]
 * (IEEE 802.11-2020 10.3.4.3 and 10.23.2; clause numbers from memory).
 *
 * The run is event-driven: rather than visit each idle slot it jumps to the
 * next slot in which some station's counter reaches 0.
 */
import { invalid } from "../errors";

export interface SimulationClass {
  readonly name: string;
  readonly stations: number;
  readonly aifsn: number;
  readonly cwMin: number;
  readonly cwMax: number;
  /** Transmission attempts before the frame is dropped (dot11ShortRetryLimit), at least 1. */
  readonly retryLimit: number;
  /** Busy time of a success without the AIFS that follows, µs. */
  readonly successUs: number;
  /** Busy time of a collision without the AIFS that follows, µs. */
  readonly collisionUs: number;
  /** Payload bits per success. */
  readonly payloadBits: number;
}

export interface SimulationParams {
  readonly slotUs: number;
  readonly sifsUs: number;
  readonly classes: readonly SimulationClass[];
}

export interface SimulationLength {
  /** Stop after this many busy slots (transmissions or collisions). */
  readonly busySlots?: number;
  /** Stop once this much channel time has been simulated, µs. */
  readonly durationUs?: number;
  /** Called with the fraction done (0…1) every `progressEvery` busy slots. */
  readonly onProgress?: (fraction: number) => void;
  readonly progressEvery?: number;
}

export interface SimulatedClass {
  readonly name: string;
  readonly stations: number;
  readonly attempts: number;
  readonly successes: number;
  readonly collisions: number;
  readonly drops: number;
  /** collided attempts ÷ attempts: the conditional collision probability. */
  readonly collisionProbability: number;
  /** Delivered payload ÷ simulated time, Mb/s. */
  readonly goodputMbps: number;
  /** Time in this class's successes (with the AIFS after them) ÷ simulated time. */
  readonly airtimeShare: number;
}

export interface SimulationResult {
  readonly seed: number;
  readonly durationUs: number;
  readonly busySlots: number;
  readonly idleSlots: number;
  readonly classes: readonly SimulatedClass[];
  readonly goodputMbps: number;
  /** Time in idle slots and collisions (with their AIFS) ÷ simulated time. */
  readonly contentionShare: number;
}

/** mulberry32: a small 32-bit seeded generator (T. Ettinger, public domain); uniform on [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const DEFAULT_BUSY_SLOTS = 100_000;

/** Run the simulation. Deterministic for a given seed. */
export function simulate(params: SimulationParams, seed: number, length: SimulationLength = {}): SimulationResult {
  checkParams(params, seed, length);
  const random = mulberry32(seed);
  const classes = params.classes;
  const minAifsn = Math.min(...classes.map((c) => c.aifsn));
  const aifsMinUs = params.sifsUs + minAifsn * params.slotUs;

  // Flat per-station state.
  const cls: number[] = [];
  classes.forEach((c, i) => {
    for (let s = 0; s < c.stations; s++) cls.push(i);
  });
  const n = cls.length;
  const frozen = cls.map((i) => classes[i].aifsn - minAifsn); // slots each must see idle after a busy slot
  const cw = cls.map((i) => classes[i].cwMin);
  const retries = cls.map(() => 0);
  const counter = cw.map((w) => Math.floor(random() * (w + 1)));

  const attempts = classes.map(() => 0);
  const successes = classes.map(() => 0);
  const collided = classes.map(() => 0);
  const drops = classes.map(() => 0);
  const successTimeUs = classes.map(() => 0);
  let timeUs = 0;
  let idleTimeUs = 0;
  let collisionTimeUs = 0;
  let idleSlots = 0;
  let busySlots = 0;

  const maxBusy = length.busySlots ?? (length.durationUs === undefined ? DEFAULT_BUSY_SLOTS : Infinity);
  const maxTime = length.durationUs ?? Infinity;
  const every = Math.max(1, length.progressEvery ?? 10_000);
  const transmitters: number[] = [];

  while (busySlots < maxBusy && timeUs < maxTime) {
    // Each pass starts right after a busy slot (or at the start): station s is
    // frozen for frozen[s] slots, then transmits after counter[s] more.
    let next = Infinity;
    for (let s = 0; s < n; s++) {
      const wait = frozen[s] + counter[s];
      if (wait < next) next = wait;
    }
    // `next` idle slots, then the busy slot.
    transmitters.length = 0;
    for (let s = 0; s < n; s++) {
      const hold = frozen[s];
      const wait = hold + counter[s];
      if (wait === next) transmitters.push(s);
      else if (next >= hold) counter[s] -= next - hold + 1; // idle active slots, then the busy one
    }
    idleSlots += next;
    idleTimeUs += next * params.slotUs;
    timeUs += next * params.slotUs;
    busySlots++;

    if (transmitters.length === 1) {
      const s = transmitters[0];
      const c = cls[s];
      attempts[c]++;
      successes[c]++;
      const t = classes[c].successUs + aifsMinUs;
      successTimeUs[c] += t;
      timeUs += t;
      newFrame(s);
    } else {
      let longest = 0;
      for (const s of transmitters) {
        const c = cls[s];
        attempts[c]++;
        collided[c]++;
        longest = Math.max(longest, classes[c].collisionUs);
        if (retries[s] + 1 >= classes[c].retryLimit) {
          drops[c]++;
          newFrame(s);
        } else {
          retries[s]++;
          cw[s] = Math.min(2 * (cw[s] + 1) - 1, classes[c].cwMax);
          counter[s] = Math.floor(random() * (cw[s] + 1));
        }
      }
      collisionTimeUs += longest + aifsMinUs;
      timeUs += longest + aifsMinUs;
    }
    if (length.onProgress && busySlots % every === 0 && busySlots < maxBusy && timeUs < maxTime) {
      length.onProgress(Math.min(1, Math.max(busySlots / maxBusy, timeUs / maxTime)));
    }
  }
  if (length.onProgress) length.onProgress(1);

  function newFrame(s: number): void {
    retries[s] = 0;
    cw[s] = classes[cls[s]].cwMin;
    counter[s] = Math.floor(random() * (cw[s] + 1));
  }

  const delivered = classes.map((c, i) => successes[i] * c.payloadBits);
  return {
    seed,
    durationUs: timeUs,
    busySlots,
    idleSlots,
    classes: classes.map((c, i) => ({
      name: c.name,
      stations: c.stations,
      attempts: attempts[i],
      successes: successes[i],
      collisions: collided[i],
      drops: drops[i],
      collisionProbability: attempts[i] > 0 ? collided[i] / attempts[i] : 0,
      goodputMbps: timeUs > 0 ? delivered[i] / timeUs : 0,
      airtimeShare: timeUs > 0 ? successTimeUs[i] / timeUs : 0,
    })),
    goodputMbps: timeUs > 0 ? delivered.reduce((a, b) => a + b, 0) / timeUs : 0,
    contentionShare: timeUs > 0 ? (idleTimeUs + collisionTimeUs) / timeUs : 0,
  };
}

function positive(name: string, v: unknown): void {
  if (typeof v !== "number" || !Number.isFinite(v) || v <= 0) invalid(`${name}: expected a positive number, got ${String(v)}`);
}

function whole(name: string, v: unknown, min: number, max: number): void {
  if (typeof v !== "number" || !Number.isInteger(v) || v < min || v > max) invalid(`${name}: expected a whole number from ${min} to ${max}, got ${String(v)}`);
}

/** Refuse parameters the run could not use (it would loop forever or produce NaN). */
function checkParams(params: SimulationParams, seed: number, length: SimulationLength): void {
  whole("seed", seed, 0, 0xffffffff);
  positive("slotUs", params.slotUs);
  if (typeof params.sifsUs !== "number" || !Number.isFinite(params.sifsUs) || params.sifsUs < 0) invalid(`sifsUs: expected 0 or more µs, got ${String(params.sifsUs)}`);
  if (!Array.isArray(params.classes) || params.classes.length === 0) invalid("classes: give at least one class of stations");
  let total = 0;
  for (const c of params.classes) {
    whole(`${c.name}.stations`, c.stations, 1, 10_000);
    whole(`${c.name}.aifsn`, c.aifsn, 1, 15);
    whole(`${c.name}.cwMin`, c.cwMin, 0, 32767);
    whole(`${c.name}.cwMax`, c.cwMax, c.cwMin, 32767);
    whole(`${c.name}.retryLimit`, c.retryLimit, 1, 255);
    positive(`${c.name}.successUs`, c.successUs);
    positive(`${c.name}.collisionUs`, c.collisionUs);
    if (typeof c.payloadBits !== "number" || !(c.payloadBits >= 0)) invalid(`${c.name}.payloadBits: expected 0 or more bits, got ${String(c.payloadBits)}`);
    total += c.stations;
  }
  if (total > 10_000) invalid(`classes: at most 10000 stations in all, got ${total}`);
  if (length.busySlots !== undefined) whole("busySlots", length.busySlots, 1, Number.MAX_SAFE_INTEGER);
  if (length.durationUs !== undefined) positive("durationUs", length.durationUs);
}
