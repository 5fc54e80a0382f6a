/**
 * A seeded, deterministic, event-driven Monte Carlo of saturated DCF/EDCA
 * stations, written from the standard's rules and apart from the analytic
 * models (it imports none of their code or algebra) so the two can check
 * each other. Time is continuous (µs); each station keeps its own slot grid.
 *
 * Rules (IEEE Std 802.11-2020; clause numbers from memory):
 * - Every station always has a frame waiting (saturation). A new frame, or a
 *   frame after a success, starts with CW = CWmin; after a collision
 *   CW ← min(2·(CW + 1) − 1, CWmax); the counter is uniform on 0…CW
 *   (10.3.4.3, 10.23.2.2). After `retryLimit` attempts the frame is dropped.
 * - Grid: after the medium goes idle a station waits its IFS (below); its
 *   slot boundaries are then resume + i·aSlotTime, i = 0, 1, … A station
 *   whose counter is k sends at boundary k, under either countdown rule.
 * - Frozen countdown: when another station's transmission starts at t, the
 *   station counts the boundaries it passed before it could sense the medium
 *   busy (those before t + aSlotTime/2, see below) and freezes the rest:
 *     EDCA (10.23.2.4): every boundary from i = 0 on is a decrement — the
 *       one at the end of AIFS, and the one at which the other station
 *       starts, count;
 *     DCF (10.3.4.3): only boundaries i ≥ 1 (the end of an idle slot after
 *       DIFS) decrement; the counter is frozen at the DIFS boundary.
 * - Sensing: a transmission that starts less than half a slot after another
 *   one cannot have been sensed (aCCATime is about half of aSlotTime, e.g.
 *   < 4 of 9 µs for OFDM, Table 17-21) and collides with it. On aligned grids
 *   this is "the same slot boundary".
 * - A lone transmission succeeds: everybody decodes its response and waits
 *   AIFS[AC] (DIFS) after it.
 * - A collision: each collider waits its response timeout (AckTimeout or
 *   CTSTimeout, 10.3.2.9) after its own PPDU, and if the medium was busy
 *   longer, until the end of the longest colliding PPDU; then its AIFS. Every
 *   other station received a frame it could not decode and waits
 *   EIFS − DIFS + AIFS[AC] after the end of the longest PPDU (10.3.2.3.7,
 *   10.23.2.4).
 * - BlockAckReq recovery (`blockAckReq` set): a collided A-MPDU is a missed
 *   BlockAck; the station's next attempt, with the doubled window, is a
 *   BlockAckReq (which may collide too, and then doubles again). The
 *   BlockAck that answers it resets CW to CWmin, and the MPDUs go again in
 *   the next A-MPDU. Without it the MPDUs go in the next A-MPDU at once.
 */
import { invalid } from "../errors";

export interface SimulationClass {
  readonly name: string;
  readonly stations: number;
  readonly aifsn: number;
  readonly cwMin: number;
  readonly cwMax: number;
  /** Transmission attempts (data or BlockAckReq) before the frame is dropped, at least 1. */
  readonly retryLimit: number;
  /** "DCF" or "EDCA" countdown rule. */
  readonly countdown: string;
  /** Busy time of a success without the AIFS that follows, µs. */
  readonly successUs: number;
  /** Time a collider is on air, µs. */
  readonly collisionPpduUs: number;
  /** AckTimeout / CTSTimeout after a collider's PPDU, µs. */
  readonly responseTimeoutUs: number;
  /** Payload bits per success. */
  readonly payloadBits: number;
  /** BlockAckReq recovery: its exchange and its PPDU, µs; null = none. */
  readonly blockAckReq: { readonly successUs: number; readonly collisionPpduUs: number } | null;
}

export interface SimulationParams {
  readonly slotUs: number;
  readonly sifsUs: number;
  /** EIFS − DIFS, µs. */
  readonly eifsExtraUs: number;
  readonly classes: readonly SimulationClass[];
}

export interface SimulationLength {
  /** Stop after this many busy periods (transmissions or collisions). */
  readonly busySlots?: number;
  /** Stop once this much channel time has been simulated, µs. */
  readonly durationUs?: number;
  /** Called with the fraction done (0…1) every `progressEvery` busy periods. */
  readonly onProgress?: (fraction: number) => void;
  readonly progressEvery?: number;
}

export interface SimulatedClass {
  readonly name: string;
  readonly stations: number;
  /** Attempts of every kind (data and BlockAckReq). */
  readonly attempts: number;
  /** Data frames delivered. */
  readonly successes: number;
  readonly collisions: number;
  readonly drops: number;
  /** BlockAckReq exchanges that got their BlockAck. */
  readonly blockAckReqs: number;
  /** collided attempts ÷ attempts: the conditional collision probability. */
  readonly collisionProbability: number;
  /** Delivered payload ÷ simulated time, Mb/s. */
  readonly goodputMbps: number;
  /** Time in this class's data successes (with the AIFS after them) ÷ simulated time. */
  readonly airtimeShare: number;
}

export interface SimulationResult {
  readonly seed: number;
  readonly durationUs: number;
  readonly busySlots: number;
  readonly classes: readonly SimulatedClass[];
  readonly goodputMbps: number;
  /** 1 − the data successes' share (with their AIFS): idle slots, collisions, EIFS, BlockAckReq exchanges. */
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
  const slot = params.slotUs;
  const sensing = slot / 2;
  const ifs = classes.map((c) => params.sifsUs + c.aifsn * slot);

  const cls: number[] = [];
  classes.forEach((c, i) => {
    for (let s = 0; s < c.stations; s++) cls.push(i);
  });
  const n = cls.length;
  const cw = cls.map((i) => classes[i].cwMin);
  const tries = cls.map(() => 0);
  const barPending = cls.map(() => false);
  const counter = cw.map((w) => draw(w));
  const resume = cls.map((i) => ifs[i]);
  const dcf = classes.map((c) => c.countdown === "DCF");

  const attempts = classes.map(() => 0);
  const successes = classes.map(() => 0);
  const collided = classes.map(() => 0);
  const drops = classes.map(() => 0);
  const bars = classes.map(() => 0);
  const successTimeUs = classes.map(() => 0);
  let endUs = 0;
  let busySlots = 0;

  const maxBusy = length.busySlots ?? (length.durationUs === undefined ? DEFAULT_BUSY_SLOTS : Infinity);
  const maxTime = length.durationUs ?? Infinity;
  const every = Math.max(1, length.progressEvery ?? 10_000);
  const senders: number[] = [];
  const start: number[] = cls.map(() => 0);

  function draw(w: number): number {
    return Math.floor(random() * (w + 1));
  }

  function newFrame(s: number): void {
    tries[s] = 0;
    barPending[s] = false;
    cw[s] = classes[cls[s]].cwMin;
    counter[s] = draw(cw[s]);
  }

  while (busySlots < maxBusy && endUs < maxTime) {
    let first = Infinity;
    for (let s = 0; s < n; s++) {
      start[s] = resume[s] + counter[s] * slot;
      if (start[s] < first) first = start[s];
    }
    const sensed = first + sensing;
    senders.length = 0;
    for (let s = 0; s < n; s++) {
      if (start[s] < sensed) {
        senders.push(s);
        continue;
      }
      // Boundaries passed before the busy medium could be sensed.
      if (resume[s] < sensed) {
        const passed = Math.ceil((sensed - resume[s]) / slot);
        counter[s] -= dcf[cls[s]] ? passed - 1 : passed;
      }
    }
    busySlots++;

    if (senders.length === 1) {
      const s = senders[0];
      const c = cls[s];
      const k = classes[c];
      attempts[c]++;
      const bar = barPending[s] && k.blockAckReq !== null;
      const end = start[s] + (bar ? (k.blockAckReq as { successUs: number }).successUs : k.successUs);
      if (bar) bars[c]++;
      else {
        successes[c]++;
        successTimeUs[c] += k.successUs + ifs[c];
      }
      for (let o = 0; o < n; o++) resume[o] = end + ifs[cls[o]];
      endUs = end + ifs[c];
      newFrame(s); // the BlockAck resets CW: the MPDUs go again from CWmin
    } else {
      let longest = 0;
      for (const s of senders) {
        const k = classes[cls[s]];
        const onAir = barPending[s] && k.blockAckReq !== null ? k.blockAckReq.collisionPpduUs : k.collisionPpduUs;
        start[s] += onAir; // now the end of its PPDU
        if (start[s] > longest) longest = start[s];
      }
      for (let o = 0; o < n; o++) resume[o] = longest + params.eifsExtraUs + ifs[cls[o]];
      for (const s of senders) {
        const c = cls[s];
        const k = classes[c];
        attempts[c]++;
        collided[c]++;
        resume[s] = Math.max(start[s] + k.responseTimeoutUs, longest) + ifs[c];
        if (tries[s] + 1 >= k.retryLimit) {
          drops[c]++;
          newFrame(s);
        } else {
          tries[s]++;
          if (k.blockAckReq !== null) barPending[s] = true;
          cw[s] = Math.min(2 * (cw[s] + 1) - 1, k.cwMax);
          counter[s] = draw(cw[s]);
        }
      }
      endUs = longest + params.eifsExtraUs + Math.min(...ifs);
    }
    if (length.onProgress && busySlots % every === 0 && busySlots < maxBusy && endUs < maxTime) {
      length.onProgress(Math.min(1, Math.max(busySlots / maxBusy, endUs / maxTime)));
    }
  }
  if (length.onProgress) length.onProgress(1);

  const delivered = classes.map((c, i) => successes[i] * c.payloadBits);
  const successTotal = successTimeUs.reduce((a, b) => a + b, 0);
  return {
    seed,
    durationUs: endUs,
    busySlots,
    classes: classes.map((c, i) => ({
      name: c.name,
      stations: c.stations,
      attempts: attempts[i],
      successes: successes[i],
      collisions: collided[i],
      drops: drops[i],
      blockAckReqs: bars[i],
      collisionProbability: attempts[i] > 0 ? collided[i] / attempts[i] : 0,
      goodputMbps: delivered[i] / endUs,
      airtimeShare: successTimeUs[i] / endUs,
    })),
    goodputMbps: delivered.reduce((a, b) => a + b, 0) / endUs,
    contentionShare: 1 - successTotal / endUs,
  };
}

function positive(name: string, v: unknown): void {
  if (typeof v !== "number" || !Number.isFinite(v) || v <= 0) invalid(`${name}: expected a positive number, got ${String(v)}`);
}

function nonNegative(name: string, v: unknown): void {
  if (typeof v !== "number" || !Number.isFinite(v) || v < 0) invalid(`${name}: expected 0 or more, got ${String(v)}`);
}

function whole(name: string, v: unknown, min: number, max: number): void {
  if (typeof v !== "number" || !Number.isInteger(v) || v < min || v > max) invalid(`${name}: expected a whole number from ${min} to ${max}, got ${String(v)}`);
}

/** Refuse parameters the run could not use (it would loop forever or produce NaN). */
function checkParams(params: SimulationParams, seed: number, length: SimulationLength): void {
  whole("seed", seed, 0, 0xffffffff);
  positive("slotUs", params.slotUs);
  nonNegative("sifsUs", params.sifsUs);
  nonNegative("eifsExtraUs", params.eifsExtraUs);
  if (!Array.isArray(params.classes) || params.classes.length === 0) invalid("classes: give at least one class of stations");
  let total = 0;
  for (const c of params.classes) {
    whole(`${c.name}.stations`, c.stations, 1, 10_000);
    whole(`${c.name}.aifsn`, c.aifsn, 1, 15);
    whole(`${c.name}.cwMin`, c.cwMin, 0, 32767);
    whole(`${c.name}.cwMax`, c.cwMax, c.cwMin, 32767);
    whole(`${c.name}.retryLimit`, c.retryLimit, 1, 255);
    if (c.countdown !== "DCF" && c.countdown !== "EDCA") invalid(`${c.name}.countdown: expected DCF or EDCA, got ${String(c.countdown)}`);
    positive(`${c.name}.successUs`, c.successUs);
    positive(`${c.name}.collisionPpduUs`, c.collisionPpduUs);
    nonNegative(`${c.name}.responseTimeoutUs`, c.responseTimeoutUs);
    if (c.blockAckReq !== null) {
      positive(`${c.name}.blockAckReq.successUs`, c.blockAckReq.successUs);
      positive(`${c.name}.blockAckReq.collisionPpduUs`, c.blockAckReq.collisionPpduUs);
    }
    if (typeof c.payloadBits !== "number" || !(c.payloadBits >= 0)) invalid(`${c.name}.payloadBits: expected 0 or more bits, got ${String(c.payloadBits)}`);
    total += c.stations;
  }
  if (total > 10_000) invalid(`classes: at most 10000 stations in all, got ${total}`);
  if (length.busySlots !== undefined) whole("busySlots", length.busySlots, 1, Number.MAX_SAFE_INTEGER);
  if (length.durationUs !== undefined) positive("durationUs", length.durationUs);
}
