/**
 * The catalog functions of contention (DESIGN.md §2): argument checks, memo
 * and the rows of EDCAMIX, over the models.
 *
 *   COLLIDE     collisionProbability(stations, cwmin, cwmax, retry_limit)
 *   SATURATE    saturationGoodputMbps(link, stations, packet_bytes, …)
 *   CONTENTION  contentionShare(link, stations, packet_bytes, …)
 *   EDCAMIX     edcaMix(link, access_list, counts, packet_bytes, …)
 */
import { BoundedMemo } from "../memo";
import { AirtallyError, invalid, noAnswer } from "../errors";
import { describe, integerInRange, isMissing } from "../args";
import type { MbPerSecond, Share } from "../units";
import { parseAccess } from "../mac";
import { fixedPoint } from "./bianchi";
import { saturation } from "./saturation";
import { countersMatter, edcaSaturation, RESIDUAL_ACCEPTED, type ClassResult } from "./aifsZones";
import { contentionChannel } from "./fromLink";
import type { ContentionChannel, ContentionClass } from "./parameters";

/** The model is solved for 1 to 1000 stations (DESIGN.md §2; issue 4). */
export const STATIONS_MAX = 1000;
/** CW is 2^ECW − 1 with a 4-bit ECW (IEEE 802.11-2020 9.4.2.28; from memory): at most 32767. */
const CW_MAX_VALUE = 32767;
/** dot11ShortRetryLimit is 1…255 (Annex C; from memory). */
const RETRY_LIMIT_MAX = 255;
/** EDCAMIX takes up to this many classes (rows). */
const MIX_CLASSES_MAX = 16;

function checkStations(value: unknown, name = "stations"): number {
  return integerInRange(name, value, 1, STATIONS_MAX, "stations");
}

/**
 * COLLIDE: the conditional collision probability p of Bianchi's saturation
 * model — the chance that an attempt meets another one — for `stations`
 * identical saturated stations with backoff from CWmin to CWmax and
 * `retryLimit` attempts per frame (bianchi.ts).
 *
 *   collisionProbability(1) → 0;   collisionProbability(10) → ≈ 0.39 (CW 15…1023, 7 attempts)
 */
export function collisionProbability(stations: unknown, cwMin?: unknown, cwMax?: unknown, retryLimit?: unknown): number {
  const n = checkStations(stations);
  const lo = isMissing(cwMin) ? 15 : integerInRange("cwmin", cwMin, 0, CW_MAX_VALUE);
  const hi = isMissing(cwMax) ? 1023 : integerInRange("cwmax", cwMax, 0, CW_MAX_VALUE);
  if (lo > hi) invalid(`cwmin: ${lo} is above cwmax ${hi}; the contention window grows from CWmin up to CWmax`);
  const r = isMissing(retryLimit) ? 7 : integerInRange("retry_limit", retryLimit, 1, RETRY_LIMIT_MAX, "attempts");
  return fixedPoint(n, lo, hi, r).p;
}

/**
 * Where the one-class models stop holding, measured against the simulator
 * (scripts/contention-sweep.ts, `saturate`; DEVELOPERS.md), and the
 * functions answer #N/A rather than a wrong number:
 * - p above 0.95, where nearly every attempt collides: up to p 0.96 every
 *   case of large windows measured stays within 4 % (500 BE or DCF stations
 *   on OFDM 54 Mb/s within 2.7 %); 20 VO stations (p 0.99) read 23 % low.
 * - Small windows (solved on counter tables, aifsZones.ts countersMatter)
 *   above p 0.9: on links where the others' EIFS outlasts the colliders'
 *   timeout by a slot or more, VO reads high as stations are added — on
 *   ERP-OFDM 54 Mb/s 3.6 % at 20 stations (p 0.905), 8 % at 30 (p 0.93).
 * - BlockAckReq recovery with the A-MPDU on air in a collision (no RTS) and
 *   p above 0.72: 100 BE stations (p 0.74) read 5 % low, 200 (p 0.86) 21 %.
 *   A BlockAckReq that collided with a long A-MPDU resumes first — its
 *   timeout ends while the A-MPDU is still on air, and it does not wait EIFS —
 *   and often wins alone, which the model leaves out.
 * - BlockAckReq recovery with small windows (CWmax under 63) and p above
 *   0.5: the same head start, with 5 VI stations (p 0.49) already 3 % high.
 */
const P_MODEL_MAX = 0.95;
const P_MODEL_MAX_COUNTER_TABLES = 0.9;
const P_MODEL_MAX_BAR_LONG_COLLISION = 0.72;
const P_MODEL_MAX_BAR_SMALL_WINDOW = 0.5;
const SMALL_WINDOW_CWMAX = 63;

function outsideModel(cls: ContentionClass, p: number): boolean {
  if (p > (countersMatter(cls) ? P_MODEL_MAX_COUNTER_TABLES : P_MODEL_MAX)) return true;
  if (cls.blockAckReq === null) return false;
  if (cls.cwMax < SMALL_WINDOW_CWMAX) return p > P_MODEL_MAX_BAR_SMALL_WINDOW;
  // The A-MPDU is on air when it collides unless an RTS goes first (then only the RTS is, fromLink.ts).
  const aMpduCollides = cls.collisionPpduUs > cls.blockAckReq.collisionPpduUs;
  return aMpduCollides && p > P_MODEL_MAX_BAR_LONG_COLLISION;
}

/**
 * Where EDCAMIX stops holding, measured against the simulator
 * (scripts/contention-sweep.ts; HE MCS7 20 MHz, 1500 bytes, 4 seeds × 200 000
 * busy periods; DEVELOPERS.md), for mixes of two or more classes (one class
 * alone is SATURATE's model and its range, outsideModel):
 * - Any class colliding on more than 97 % of its attempts: with 20 VO
 *   stations (CW 3…7, p 0.994) the mix model reads VO 22 % low, since its
 *   goodput rests on the 0.6 % of attempts that succeed. Up to p 0.93 (10 VO,
 *   20 VI) it stays within 2 %.
 * - A deferred class (an AIFSN above the smallest in the mix) colliding on
 *   more than 80 % of its attempts while it still carries 1.4 Mb/s or more,
 *   when the mix was solved on pair states (two classes, aifsZones.ts
 *   pairedClasses): there best effort beside 5 VO stations reads up to 7 %
 *   low (5 VO + 10 BE, p 0.83, 1.11 against 1.18 Mb/s) — more than the
 *   acceptance's 0.1 Mb/s once it carries 1.4 Mb/s. Solved with one listener
 *   law per class (three classes or more), beyond p 0.75 at 0.5 Mb/s or
 *   more: best effort beside 1 VO + 3 VI reads 8 % low there.
 */
const P_MIX_MAX = 0.97;
/** A first window of this many slots or fewer (VO's CW 3) is a "short" one (BAR in a mix). */
const SHORT_FIRST_WINDOW = 4;
const DEFERRED_LIMITS = {
  pairs: { p: 0.8, answeredBelowMbps: 1.4, readsLow: "up to 7 %" },
  oneLaw: { p: 0.75, answeredBelowMbps: 0.5, readsLow: "8–14 %" },
};

function mixOutsideModel(classes: readonly ContentionClass[], solved: readonly ClassResult[], pairs: boolean): { cls: number; why: "crowded" | "deferred" } | null {
  for (let i = 0; i < classes.length; i++) if (solved[i].p > P_MIX_MAX) return { cls: i, why: "crowded" };
  const minAifsn = Math.min(...classes.map((c) => c.aifsn));
  const limit = pairs ? DEFERRED_LIMITS.pairs : DEFERRED_LIMITS.oneLaw;
  for (let i = 0; i < classes.length; i++) {
    if (classes[i].aifsn > minAifsn && solved[i].p > limit.p && solved[i].goodputMbps >= limit.answeredBelowMbps) return { cls: i, why: "deferred" };
  }
  return null;
}

function refuseCrowd(arg: string, stations: number, name: string, p: number): never {
  return noAnswer(
    `${arg}: ${stations} saturated ${name} stations collide on ${(100 * p).toFixed(0)} % of their attempts, beyond the range where the contention model agrees with a simulation of the standard's rules; use fewer stations, a wider window (CWMIN=, CWMAX=) or the simulator (npm run simulate)`,
  );
}

/** One class's solution: p, goodput and contention share. */
interface OneClass {
  readonly p: number;
  readonly goodputMbps: MbPerSecond;
  readonly contentionShare: Share;
}

/**
 * One class of stations: saturation.ts, or for small windows the counter
 * tables of aifsZones.ts (countersMatter); an unsettled table solve is
 * refused, never answered.
 */
function oneClassSaturation(channel: ContentionChannel): OneClass {
  const cls = channel.classes[0];
  if (!countersMatter(cls)) return saturation(channel);
  const r = edcaSaturation(channel);
  if (!(r.residual <= RESIDUAL_ACCEPTED)) {
    noAnswer(`stations: ${cls.stations} ${cls.name} stations did not settle within the model's work limit; use fewer stations or the simulator (npm run simulate)`);
  }
  return { p: r.classes[0].p, goodputMbps: r.classes[0].goodputMbps, contentionShare: r.contentionShare };
}

/** Keyed by every argument's text (link and mac_options are free text), so bounded by key characters too (memo.ts). */
const saturationCache = new BoundedMemo<OneClass>("saturation", 1024, 1024 * 256, 2048);

/** A memo key when every argument is a plain value (text, number, empty); else null. */
function keyOf(args: readonly unknown[]): string | null {
  let key = "";
  for (const a of args) {
    if (a === null || a === undefined) key += "\u0000";
    else if (typeof a === "string" || typeof a === "number") key += (typeof a === "string" ? "s" : "n") + String(a);
    else return null;
    key += "\u0001";
  }
  return key;
}

function saturationOf(
  link: unknown,
  stations: unknown,
  packetBytes: unknown,
  mpdus: unknown,
  access: unknown,
  protection: unknown,
  macOptions: unknown,
): OneClass {
  const key = keyOf([link, stations, packetBytes, mpdus, access, protection, macOptions]);
  const hit = key === null ? undefined : saturationCache.get(key);
  if (hit !== undefined) return hit;
  const n = checkStations(stations);
  const channel = contentionChannel(link, [{ access, stations: n }], packetBytes, mpdus, protection, macOptions);
  const result = oneClassSaturation(channel);
  if (outsideModel(channel.classes[0], result.p)) refuseCrowd("stations", n, channel.classes[0].name, result.p);
  if (key !== null) saturationCache.set(key, result);
  return result;
}

/**
 * SATURATE: aggregate packet-layer goodput of `stations` identical saturated
 * stations, Mb/s — Bianchi's model with EDCA timing (AIFS for DIFS) and the
 * channel access of the MAC layer (A-MPDU, protection, Ack/BlockAck). For one
 * station it equals GOODPUT (mean backoff CWmin ÷ 2 slots, no loss).
 *
 *   saturationGoodputMbps("OFDM 54Mbps 5GHz", 10, 1500) → ≈ 26 Mb/s
 */
export function saturationGoodputMbps(
  link: unknown,
  stations: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): MbPerSecond {
  return saturationOf(link, stations, packetBytes, mpdus, access, protection, macOptions).goodputMbps;
}

/**
 * CONTENTION: share of airtime spent in idle backoff slots and in collisions
 * (with the AIFS after them), 0…1; the AIFS after a success counts with the
 * success (bianchi.ts `saturation`).
 */
export function contentionShare(
  link: unknown,
  stations: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): Share {
  return saturationOf(link, stations, packetBytes, mpdus, access, protection, macOptions).contentionShare;
}

export interface EdcaMixRow {
  readonly access: string;
  readonly stations: number;
  /** Aggregate goodput of the class, Mb/s. */
  readonly goodputMbps: number;
  /** goodputMbps ÷ stations (0 for a class of 0 stations), Mb/s. */
  readonly perStationMbps: number;
  /** Share of airtime in the class's successful exchanges (with the AIFS after each), 0…1. */
  readonly airtimeShare: number;
}

/** Cells of a range (row by row), or the items of a text list ("VO, BE" or "VO BE"). */
function listOf(name: string, value: unknown): unknown[] {
  if (Array.isArray(value)) {
    const cells: unknown[] = [];
    for (const row of value) {
      if (Array.isArray(row)) cells.push(...row);
      else cells.push(row);
    }
    return cells;
  }
  if (typeof value === "string" && !isMissing(value)) return value.split(/[\s,;]+/).filter((t) => t !== "");
  if (typeof value === "number") return [value];
  return invalid(`${name}: expected a range or a list such as "VO, BE", got ${describe(value)}`);
}

function countOf(value: unknown, i: number): number {
  const v = typeof value === "string" && value.trim() !== "" ? Number(value) : value;
  if (typeof v !== "number" || !Number.isInteger(v) || v < 0 || v > STATIONS_MAX) {
    invalid(`counts: item ${i + 1} must be a whole number of stations from 0 to ${STATIONS_MAX}, got ${describe(value)}`);
  }
  return v;
}

/** Pairs (access category, stations) from the two ranges; empty pairs are skipped. */
function mixOf(accessList: unknown, counts: unknown): { access: string; stations: number }[] {
  if (isMissing(accessList)) invalid(`access_list: required; a range or list of access categories (BK, BE, VI, VO, DCF)`);
  if (isMissing(counts)) invalid(`counts: required; one number of stations per access category in access_list`);
  const acs = listOf("access_list", accessList);
  const ns = listOf("counts", counts);
  if (acs.length !== ns.length) {
    invalid(`counts: ${ns.length} cells for ${acs.length} cells of access_list; give one count per access category (ranges of the same size)`);
  }
  const mix: { access: string; stations: number }[] = [];
  for (let i = 0; i < acs.length; i++) {
    if (isMissing(acs[i]) && isMissing(ns[i])) continue;
    if (isMissing(acs[i])) invalid(`access_list: item ${i + 1} is empty but its count is ${describe(ns[i])}`);
    let access: string;
    try {
      access = parseAccess(acs[i]);
    } catch (e) {
      if (!(e instanceof AirtallyError)) throw e;
      return invalid(`access_list: item ${i + 1}: expected BK, BE, VI, VO or DCF, got ${describe(acs[i])}`);
    }
    if (isMissing(ns[i])) invalid(`counts: item ${i + 1} (${access}) is empty; give the number of stations`);
    mix.push({ access, stations: countOf(ns[i], i) });
  }
  if (mix.length === 0) invalid(`access_list: no access categories given`);
  if (mix.length > MIX_CLASSES_MAX) invalid(`access_list: at most ${MIX_CLASSES_MAX} classes, got ${mix.length}`);
  const total = mix.reduce((s, c) => s + c.stations, 0);
  if (total < 1 || total > STATIONS_MAX) {
    invalid(`counts: the stations must add up to between 1 and ${STATIONS_MAX}, got ${total}`);
  }
  return mix;
}

/**
 * EDCAMIX: saturated stations of several access categories sharing one
 * channel, one row per class in the order given: access category, stations,
 * aggregate goodput (Mb/s), goodput per station (Mb/s), share of airtime.
 * Each class uses its own AIFSN, CWmin, CWmax, TXOP limit (hence its own
 * A-MPDU size when mpdus is "auto") and retry limit (edca.ts).
 *
 *   edcaMix("HE MCS7 1SS 20MHz 5GHz", [["VO"], ["BE"]], [[2], [8]], 1500)
 */
export function edcaMix(
  link: unknown,
  accessList: unknown,
  counts: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): EdcaMixRow[] {
  const mix = mixOf(accessList, counts);
  const present = mix.filter((c) => c.stations > 0);
  const channel = contentionChannel(link, present, packetBytes, mpdus, protection, macOptions);
  const mixResult = edcaSaturation(channel);
  if (!(mixResult.residual <= RESIDUAL_ACCEPTED)) {
    noAnswer(`counts: this mix of ${present.length} classes and ${present.reduce((a, c) => a + c.stations, 0)} stations did not settle within the model's work limit; use fewer classes or stations, or the simulator (npm run simulate)`);
  }
  const solved = mixResult.classes;
  if (mixResult.oneClass) {
    // One class of stations (given once, or the same settings twice): SATURATE's model and range.
    solved.forEach((r, i) => {
      if (outsideModel(channel.classes[i], r.p)) refuseCrowd("counts", r.stations, r.name, r.p);
    });
  } else {
    solved.forEach((r, i) => {
      // BlockAckReq recovery with small windows (CWmax under 63) in a mix: from 2 stations with a first
      // window of 4 slots (VO), or 3 with a larger one (VI), the model reads the other classes 9–40 % high
      // (2 VO + 3 or 10 BE, 3 or 5 VI + 3 BE, 3 VI + 10 BE); 1 VO or 2 VI stay within 4 % (DEVELOPERS.md).
      const c = channel.classes[i];
      const most = c.cwMin + 1 <= SHORT_FIRST_WINDOW ? 1 : 2;
      if (c.blockAckReq !== null && c.cwMax < SMALL_WINDOW_CWMAX && r.stations > most) {
        noAnswer(
          `mac_options: BAR with ${r.stations} ${r.name} stations (CWmin ${c.cwMin}, CWmax ${c.cwMax}) beside other access categories is beyond the range where the mix model agrees with a simulation of the standard's rules (it reads the others 9–40 % high); use at most ${most} such station${most > 1 ? "s" : ""}, no BAR, or the simulator (npm run simulate)`,
        );
      }
    });
    const beyond = mixOutsideModel(channel.classes, solved, mixResult.pairs);
    if (beyond !== null) {
      const r = solved[beyond.cls];
      if (beyond.why === "crowded") refuseCrowd("counts", r.stations, r.name, r.p);
      noAnswer(
        `counts: the ${r.stations} ${r.name} stations wait a longer AIFS and collide on ${(100 * r.p).toFixed(0)} % of their attempts, beyond the range where the mix model agrees with a simulation of the standard's rules (it reads them ${(mixResult.pairs ? DEFERRED_LIMITS.pairs : DEFERRED_LIMITS.oneLaw).readsLow} low there); use the simulator (npm run simulate)`,
      );
    }
  }
  let k = 0;
  return mix.map((c) => {
    if (c.stations === 0) return { access: c.access, stations: 0, goodputMbps: 0, perStationMbps: 0, airtimeShare: 0 };
    const r = solved[k++];
    return { access: c.access, stations: c.stations, goodputMbps: r.goodputMbps, perStationMbps: r.goodputMbps / c.stations, airtimeShare: r.airtimeShare };
  });
}
