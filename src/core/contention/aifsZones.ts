/**
 * Saturated classes of EDCA (or DCF) stations with different AIFSN, CWmin,
 * CWmax, retry limits and exchange lengths sharing one channel (EDCAMIX).
 *
 * AIFS zones follow the EDCA countdown rule (IEEE 802.11-2020 10.23.2.4;
 * from memory): after a busy period, zone z is the z-th slot boundary of the
 * shortest AIFS; a class with AIFSN_c waits d_c = AIFSN_c − min AIFSN zones,
 * then counts down at every boundary from its own AIFS on — the boundary at
 * the end of its AIFS, and the one at which another station starts, count —
 * and sends at zone d_c + k with counter k. (DCF stations count only the
 * ends of idle slots, 10.3.4.3.) After a collision the stations that only
 * listened wait EIFS − DIFS longer than the colliders (10.3.2.3.7):
 * e = round((EIFS − DIFS − timeout) ÷ σ) more zones.
 *
 * Zone models with a per-slot attempt probability (J. W. Robinson and T. S.
 * Randhawa, "Saturation throughput analysis of IEEE 802.11e enhanced
 * distributed coordination function", IEEE JSAC 22(5), 2004; J. Hui and M.
 * Devetsikiotis, "A unified model for the performance analysis of IEEE
 * 802.11e EDCA", IEEE Trans. Communications 53(9), 2005 — both from memory)
 * treat each station's countdown as memoryless, which breaks down beside a
 * class with small windows: a voice station's fresh counter on 0…3 has sent
 * within four zones for sure, while a constant τ leaves best effort a
 * geometric tail of chances (the +30…60 % of issue 11). So this model keeps
 * the counters themselves, as an exact numerical solution over AIFS-zone
 * states: the mean-field decoupling is only across stations, not in time.
 *
 * State at the start of an idle period (zone 0): the kind of the last busy
 * period — a success of class a (S_a), or a collision among the classes of
 * a set S (C_S; one class alone needs two of its stations) — and, for every
 * station, its counter, independent across stations given the state. In
 * each state a class's n_c stations are K "specials" and n_c − K listeners:
 *   S_a: class a's one special is the station that just succeeded, on
 *        F^S_a = uniform on 0…CWmin_a; no specials elsewhere;
 *   C_S: the colliders of each class in S, on
 *        F^C_c = Σ_i π_i·uniform on 0…W_next(i)−1 (π_i ∝ p_c^i, i = 0…m;
 *        W_next = W_{i+1}, or W_0 after a drop); K is random: kMin + a
 *        binomial with the mean the zones left (E[colliders of c | C_S],
 *        part of the iterate), kMin = 2 for S = {c}, else 1 — whether a class
 *        stays silent, E[a^K·b^(n−K)], is convex in K, so its law matters;
 *   R_c: every listener, on the listener law (solved for).
 * After C_S zone 0 is the longest collider's PPDU end + its timeout +
 * AIFS_min; the other colliders resume after their own timeout or the end of
 * the longest PPDU, whichever is later (so they may start zones early), and
 * the listeners EIFS − DIFS after the PPDU (10.3.2.3.7).
 * Per zone t and class c, with a and b the specials' and the listeners'
 * survival before t (a', b' through t) and p_s, p_l their point masses at t,
 * the sums over K (countSums) Z = Σ_k w_k a^k b^(n−k) (the class silent),
 * R = ∂Z/∂a per special, E = ∂Z/∂b per listener give, with O_c = Π_{c'≠c} Z_c':
 *   P(nobody before t)          = Π_c Z_c
 *   P(one station of c alone)   = (p_s·R'_c + p_l·E'_c)·O'_c
 *   P(collision among S)        = Π_{c∈S}(Z_c − Z'_c)·Π_{c∉S} Z'_c (less the lone sender when S = {c})
 *   E[senders of c at t]        = (p_s·R_c + p_l·E_c)·O_c
 * and the collision lasts the longest PPDU in S. A station that did not
 * send at t keeps k' = k − (t − o + 1) (EDCA) or k − (t − o) (DCF) for t ≥ o,
 * k' = k before its zone. R_c is the stationary law of a listener's counter:
 * its entries are the counters of specials that did not send at the next
 * busy period, and it moves down by the decrements its environment (the
 * others' first busy zone) deals it, computed in one pass from the top
 * counter down (listenerLaw). Counter laws are held on tables of their
 * first 32 counters (doubled when a state's zones outlast them); beyond a
 * table a listener's counter only moves down, and its visits there follow
 * the renewal theorem from the entries' mass and first moment above the
 * table (listenerLaw; a test checks it against tables of all CWmax + 1
 * counters). The kind of the next busy period gives the transition matrix
 * of the state chain, solved directly (stationary); its stationary law
 * weights the cycle times and successes:
 *   cycle = t·σ + (success exchange, or PPDU + timeout) + AIFS_min
 *   S_c   = Σ_states π·P(data success of c)·payload_c ÷ Σ_states π·E[cycle]     (Mb/s)
 *   p_c   = collided attempts of class c ÷ attempts of class c
 * BlockAckReq recovery: a collider's next attempt is a BlockAckReq;
 * listeners send one in the share b_c = 1 − 1/Σ_i p_c^i of their attempts.
 * The whole is a fixed point x = G(x) in x = (p_c, colliders per state as
 * shares of the class, R_c), found by Anderson mixing of the last few
 * sweeps (andersonNext): 6–9 sweeps for two classes. It stops when a sweep
 * moves every entry by less than MAP_TOLERANCE (5e-5: about four
 * significant digits), reporting that move as the residual; a mix that
 * does not get there within the work limit reports Infinity and the
 * catalog refuses it. With one class EDCAMIX uses saturation.ts, which
 * SATURATE uses.
 *
 * Pair states: listeners of a state are not independent given it — they
 * share the state before (after a success that followed a collision, VO
 * listeners sit higher: that collision's listeners waited EIFS, its
 * colliders drew from the wider window). With one listener law per class a
 * deferred class beside several small-window stations read 5–14 % low. So
 * in a mix of two classes the chain runs on pairs (y, s) of states, and the
 * listeners of an EDCA class of at most PAIRED_WINDOW counters (VO, VI)
 * take, in (y, s), the law that y's idle period left (part of the iterate,
 * pairedImage); the other class keeps R_c. S² runs per sweep instead of S,
 * started from the one-law solution (solveDistinct); three classes or more
 * keep one law per class (49 or more runs a sweep).
 *
 * What remains, measured against the simulator (DEVELOPERS.md): a deferred
 * class beyond p 0.8 beside 5 VO reads up to 7 % low, and a class
 * colliding on nearly every attempt (20 VO, p 0.994) 22 % low; the catalog
 * refuses where that exceeds the issue's tolerance.
 */
import type { BlockAckRequestExchange, ContentionChannel, ContentionClass } from "./parameters";
import { saturation } from "./saturation";
import { binomialWeights } from "./binomial";

export interface ClassResult {
  readonly name: string;
  readonly stations: number;
  readonly p: number;
  /** Aggregate goodput of the class, Mb/s. */
  readonly goodputMbps: number;
  /** Share of airtime in this class's successful data exchanges (with the AIFS[min] after them). */
  readonly airtimeShare: number;
}

export interface MixResult {
  readonly classes: readonly ClassResult[];
  /** 1 − the data successes' share of airtime. */
  readonly contentionShare: number;
  /** Estimated distance left to the fixed point on p_c and the listener laws (a convergence check). */
  readonly residual: number;
  /** Evaluations of the fixed-point map it took. */
  readonly sweeps: number;
  /** Work spent, in inner-loop steps (bounded by the work limit). */
  readonly work: number;
  /** All stations alike (one class, or the same settings given twice): solved by saturation.ts. */
  readonly oneClass: boolean;
  /** Solved on pair states (pairedClasses): two classes, one of them with small windows, no class beyond p 0.97. */
  readonly pairs: boolean;
}

const SWEEP_LIMIT = 200;
/** Counters held in a class's tables at first (all of them when CWmax + 1 is no more). */
const TABLE_START = 32;
/** A state whose zones leave more than this chance that nobody has sent when the tables end grows them. */
const OUTLAST_EPSILON = 1e-9;
/** The accelerated iteration stops when one more sweep moves p_c and the listener laws by less than this. */
const MAP_TOLERANCE = 5e-5;
/** Zones are followed until the chance that nobody has sent falls below this. */
const HORIZON_EPSILON = 1e-8;
/** A counter law's tail below this is taken as spent. */
const TAIL_EPSILON = 1e-15;

/**
 * A counter law held on its first K counters (its table, K ≤ CWmax + 1):
 * p[k] for k < K and the tail sums T(j) = P(k ≥ j) for j ≤ K, T(K) being the
 * mass beyond the table. Zones are followed only within the tables (they
 * grow when a state's zones outlast them, see solveDistinct), so beyond a
 * table only its mass matters. Fresh and collider draws keep their uniform
 * pieces, exact at any counter.
 */
interface Law {
  readonly p: Float64Array;
  readonly tails: Float64Array;
  /** Mixture of uniforms on 0…width−1 with these weights (fresh and collider draws); null for a listener's law. */
  readonly pieces: Pieces | null;
}

/** A mixture of uniforms on 0…widths[i] − 1 with weights[i]. */
interface Pieces {
  readonly widths: readonly number[];
  readonly weights: Float64Array;
}

function lawOf(p: Float64Array, beyond: number, pieces: Law["pieces"], tails?: Float64Array): Law {
  return { p, tails: tailsOf(p, beyond, tails), pieces };
}

/** A mixture of uniform pieces on its table of law.length counters; returns the mass beyond the table. */
function piecesTable(pieces: Pieces, law: Float64Array): number {
  const K = law.length;
  law.fill(0);
  let beyond = 0;
  // Each piece as steps of a difference array, summed once.
  for (let i = 0; i < pieces.widths.length; i++) {
    const width = pieces.widths[i];
    const weight = pieces.weights[i];
    const v = weight / width;
    law[0] += v;
    if (width < K) law[width] -= v;
    else beyond += weight * ((width - K) / width);
  }
  for (let k = 1; k < K; k++) law[k] += law[k - 1];
  return beyond;
}

/** Zones of a listener's environment followed one by one (beyond, a geometric tail of the same mass). */
const REACH_MAX = 12;
/**
 * Work allowed for one solution, in inner-loop steps (a bound on the time a loaded machine
 * may spend, far from the 50 ms call guard; measured: two-class mixes of VO or VI with BE
 * take 1.5–4e4, BE beside BK up to 2e5, four classes up to 3.5e5, 10–17 ms with 100–300
 * stations each): the fixed point stops there, and if it has not settled the catalog
 * answers #N/A rather than an unsettled number.
 */
const WORK_LIMIT = 1.5e6;
export const RESIDUAL_ACCEPTED = 1e-4;

interface Work {
  done: number;
}

/** A listener still silent with everybody else beyond this chance no longer shapes its environment. */
const LISTENER_HORIZON = 1e-8;
/** Relative zones r = t − o_g of the listeners' environment sit at r + ENV_SHIFT; every r < 0 (a busy period before the listener's own zone, all alike) in slot 0. */
const ENV_SHIFT = 1;

function windowOf(c: ContentionClass, stage: number): number {
  let w = c.cwMin + 1;
  for (let i = 0; i < stage && w < c.cwMax + 1; i++) w *= 2;
  return Math.min(w, c.cwMax + 1);
}

function uniform(size: number, width: number): Float64Array {
  const law = new Float64Array(size);
  for (let k = 0; k < Math.min(width, size); k++) law[k] = 1 / width;
  return law;
}

function freshLaw(c: ContentionClass, K: number): Law {
  const pieces = { widths: [c.cwMin + 1], weights: Float64Array.of(1) };
  const law = new Float64Array(K);
  return lawOf(law, piecesTable(pieces, law), pieces);
}

/** The counter law of a collider of class c: the next stage's window, stages weighted by p^i. */
function colliderLaw(c: ContentionClass, p: number, scratch: ColliderScratch, pieces: Pieces): Law {
  const m = c.retryLimit - 1;
  let w = 1;
  let total = 0;
  for (let i = 0; i <= m; i++) {
    total += w;
    w *= p;
  }
  w = 1;
  const weights = pieces.weights;
  for (let i = 0; i <= m; i++) {
    weights[i] = w / total;
    w *= p;
  }
  return lawOf(scratch.law, piecesTable(pieces, scratch.law), pieces, scratch.tails);
}

/** A collider's table and tails, rewritten every sweep. */
interface ColliderScratch {
  readonly law: Float64Array;
  readonly tails: Float64Array;
}

/** The pieces of a collider's next draw: W_{i+1} after attempt i + 1 fails, W_0 after the last (a drop). */
function colliderPieces(c: ContentionClass): Pieces {
  const m = c.retryLimit - 1;
  const widths: number[] = [];
  for (let i = 0; i <= m; i++) widths.push(i < m ? windowOf(c, i + 1) : windowOf(c, 0));
  return { widths, weights: new Float64Array(m + 1) };
}

function barShare(c: ContentionClass, p: number): number {
  if (c.blockAckReq === null) return 0;
  let w = 1;
  let total = 0;
  for (let i = 0; i < c.retryLimit; i++) {
    total += w;
    w *= p;
  }
  return 1 - 1 / total;
}

/**
 * The states after a busy period: a success of class a (index a), or a
 * collision among the classes of a set S (a bit mask; one class alone needs
 * two of its stations), state index C + position in `masks`.
 */
interface StateSpace {
  readonly count: number;
  /** The class set of each collision state, state index C + q. */
  readonly masks: readonly number[];
  /**
   * -1: every collision among the set (no BlockAckReq recovery in a mixed set, or one class); v: the
   * first class in byLength order with a data sender is byLength[v] (those before it sent BlockAckReqs
   * only); byLength.length: BlockAckReqs only.
   */
  readonly variant: readonly number[];
  /** The class whose PPDU was on air longest (its timeout follows it), that PPDU (µs), and the classes that sent BlockAckReqs only. */
  readonly longest: readonly number[];
  readonly airUs: readonly number[];
  readonly barSenders: readonly number[];
  /** The collision states of each class set, in order. */
  readonly groups: readonly { readonly mask: number; readonly states: readonly number[] }[];
  /** The longest BlockAckReq PPDU of each collision state's set when every class in it recovers by BlockAckReq, else 0. */
  readonly barPpduUs: readonly number[];
  /** Each collision state's classes in order of their data PPDU, longest first; whether any of them uses BlockAckReq recovery. */
  readonly byLength: readonly (readonly number[])[];
  readonly anyBar: readonly boolean[];
}

function stateSpace(classes: readonly ContentionClass[]): StateSpace {
  const C = classes.length;
  const masks: number[] = [];
  const variant: number[] = [];
  const longest: number[] = [];
  const airUs: number[] = [];
  const barSenders: number[] = [];
  const barPpduUs: number[] = [];
  const byLength: number[][] = [];
  const anyBar: boolean[] = [];
  const groups: { mask: number; states: number[] }[] = [];
  const barOf = (i: number): number => (classes[i].blockAckReq as BlockAckRequestExchange).collisionPpduUs;
  for (let mask = 1; mask < 1 << C; mask++) {
    const members = classes.map((_, i) => i).filter((i) => mask & (1 << i));
    if (members.length === 1 && classes[members[0]].stations < 2) continue;
    const order = [...members].sort((a, b) => classes[b].collisionPpduUs - classes[a].collisionPpduUs);
    const allBar = members.every((i) => classes[i].blockAckReq !== null);
    const bars = allBar ? Math.max(...members.map(barOf)) : 0;
    const some = members.some((i) => classes[i].blockAckReq !== null);
    const group = { mask, states: [] as number[] };
    const push = (v: number, long: number, air: number, senders: number): void => {
      group.states.push(masks.length);
      masks.push(mask);
      variant.push(v);
      longest.push(long);
      airUs.push(air);
      barSenders.push(senders);
      barPpduUs.push(bars);
      byLength.push(order);
      anyBar.push(some);
    };
    if (members.length === 1 || !some) push(-1, order[0], classes[order[0]].collisionPpduUs, 0);
    else {
      // With BlockAckReq recovery a mixed collision's longest PPDU is that of the first class, in order of
      // their A-MPDUs, with a data sender; the classes before it sent BlockAckReqs only. Who was on air
      // longest sets when the others resume, so each case is a state of its own.
      let senders = 0;
      for (let v = 0; v < order.length; v++) {
        push(v, order[v], classes[order[v]].collisionPpduUs, senders);
        if (classes[order[v]].blockAckReq === null) break; // a class without BAR always sends data
        senders |= 1 << order[v];
      }
      if (allBar) push(order.length, members.reduce((a, b) => (barOf(b) > barOf(a) ? b : a)), bars, mask);
    }
    groups.push(group);
  }
  return { count: C + masks.length, masks, variant, longest, airUs, barSenders, barPpduUs, byLength, anyBar, groups };
}

/** What one state leads to: the next state's law, cycle time, successes, attempts and listener residuals. */
interface StateOutcome {
  readonly next: Float64Array;
  /** Mean time from zone 0 of this state to zone 0 of the next (with the lead of a collision state, stateLeadUs), µs. */
  cycleUs: number;
  readonly dataSuccess: Float64Array;
  readonly attempts: Float64Array;
  readonly collided: Float64Array;
  /** Attempts by listeners, and BlockAckReq attempts by specials (BAR recovery: the listeners' share follows from them). */
  readonly listenerTries: Float64Array;
  readonly specialBarTries: Float64Array;
  /**
   * Counters (unnormalised) of the stations that had just sent and did not send again — they join the
   * listeners — as difference arrays per class (the caller's buffers, reused across sweeps).
   */
  readonly residualDiff: Float64Array[];
  /**
   * The listeners' environment per class: Σ_g n_g·P(the others' first busy zone is o_g + r), every r < 0 in slot 0,
   * and Σ_g n_g (listeners of the class in this state).
   */
  readonly env: Float64Array[];
  readonly envWeight: Float64Array;
  /** Per collision state q and class c (index q·C + c): P(that collision) × E[colliders of class c in it]. */
  readonly colliders: Float64Array;
  /** The chance that nobody had sent when the counter tables ended (0 when the zones ended first). */
  readonly leftover: number;
  /** The state's members (whose specials left residuals). */
  readonly members: readonly Member[];
}

/**
 * One class in one state: its n stations are K "specials" (the station that
 * has just succeeded, on a fresh draw, or the colliders, on their next
 * window) and n − K listeners (on R_c). K is random in a collision state:
 * kMin + j with weights[j] (see colliderCounts); its law matters because
 * whether all of a class stay silent, E[a^K·b^(n−K)], is convex in K.
 */
interface Member {
  readonly n: number;
  readonly special: Law | null;
  readonly specialOffset: number;
  /** Share of the specials' attempts that are BlockAckReqs. */
  readonly specialBar: number;
  readonly kMin: number;
  readonly weights: Float64Array;
  readonly listener: Law;
  readonly listenerOffset: number;
  readonly listenerBar: number;
}

/** S(j − 1) = P(k ≥ j) of a law at relative zone j (1 before the law starts), and its point mass at j. */
function survivalAt(law: Law, j: number): number {
  return j <= 0 ? 1 : law.tails[Math.min(j, law.p.length)];
}

function massAt(law: Law, j: number): number {
  return j >= 0 && j < law.p.length ? law.p[j] : 0;
}

/**
 * The sums over the special count K = k (listeners m = n − k) that one zone
 * needs, with a the specials' and b the listeners' survival:
 *   Z = Σ w_k a^k b^m,  R = Σ w_k k a^(k−1) b^m,  E = Σ w_k m a^k b^(m−1)
 * (R and E are Z's derivatives: per special, and per listener, "all the
 * others of the class silent").
 */
function countSums(mb: Member, a: number, b: number, out: Float64Array): void {
  const w = mb.weights;
  const n = mb.n;
  if (w.length === 1) {
    // One count (a success state, or a class outside the collision): no loop, one power at most.
    const k = mb.kMin;
    const m = n - k;
    const ak1 = k === 0 ? 0 : k === 1 ? 1 : k === 2 ? a : Math.pow(a, k - 1);
    const ak = k === 0 ? 1 : ak1 * a;
    const bm1 = m === 0 ? 0 : m === 1 ? 1 : m === 2 ? b : Math.pow(b, m - 1);
    const bm = m === 0 ? 1 : bm1 * b;
    out[0] = ak * bm;
    out[1] = k * ak1 * bm;
    out[2] = m * ak * bm1;
    return;
  }
  // Two powers per call: a^(k − 1) upward from k = kMin, and b^(m − 1) upward from the fewest listeners
  // (m = n − kTop), read back from the top (POWERS_SCRATCH).
  let z = 0;
  let r = 0;
  let e = 0;
  const L = w.length;
  const kTop = mb.kMin + L - 1;
  const mLow = n - kTop;
  const bp = POWERS_SCRATCH.length >= L + 1 ? POWERS_SCRATCH : new Float64Array(L + 1);
  // bp[j] = b^(mLow − 1 + j) (b^(−1) is never used: its factor m is 0 there)
  bp[0] = mLow >= 1 ? Math.pow(b, mLow - 1) : 0;
  let v = mLow >= 1 ? bp[0] * b : 1;
  for (let j = 1; j <= L; j++) {
    bp[j] = v;
    v *= b;
  }
  let ak1 = mb.kMin >= 1 ? Math.pow(a, mb.kMin - 1) : 0;
  for (let i = 0; i < L; i++) {
    const k = mb.kMin + i;
    const m = n - k;
    const ak = k >= 1 ? ak1 * a : 1;
    const bm1 = m >= 1 ? bp[L - 1 - i] : 0;
    const bm = m >= 1 ? bp[L - i] : 1;
    z += w[i] * ak * bm;
    r += w[i] * k * ak1 * bm;
    e += w[i] * m * ak * bm1;
    ak1 = k >= 1 ? ak : 1;
  }
  out[0] = z;
  out[1] = r;
  out[2] = e;
}

/**
 * Follow one state's zones until somebody sends. Zone t lies t·σ after zone
 * 0 (t may be negative for a collider that resumes before the reference).
 * Classes are independent given the state; within a class the specials'
 * count K is mixed over exactly (countSums).
 */
function runState(
  channel: ContentionChannel,
  members: readonly Member[],
  space: StateSpace,
  aifsMin: number,
  work: Work,
  out: StateBuffers,
  zone: ZoneScratch,
): StateOutcome {
  const classes = channel.classes;
  const C = classes.length;
  const sigma = channel.slotUs;
  const { next, dataSuccess, attempts, collided, listenerTries, specialBarTries, env, envWeight, colliders, residualDiff: diff, beyond } = out;
  for (let i = 0; i < next.length; i++) next[i] = 0;
  for (let i = 0; i < colliders.length; i++) colliders[i] = 0;
  for (let c = 0; c < C; c++) dataSuccess[c] = attempts[c] = collided[c] = listenerTries[c] = specialBarTries[c] = envWeight[c] = 0;
  const envLength = env[0].length;
  for (let c = 0; c < C; c++) {
    env[c].fill(0);
    if (members[c].special !== null) diff[c].fill(0); // read only where there are specials (sweepOnce)
    beyond[c].fill(0);
    const mb = members[c];
    for (let i = 0; i < mb.weights.length; i++) envWeight[c] += mb.weights[i] * (mb.n - mb.kMin - i);
  }
  // Per class: before t (0) and through t (1): Z = P(none of the class sent), R, E (countSums), and
  // o = Π of the other classes' Z; the specials' and the listeners' point masses at t. The sums
  // through t are the next zone's sums before it.
  const { z0, z1, zb, r0, r1, e0, e1, o0, o1, ps, pl, a1s, b1s, sums } = zone;
  let cycle = 0;
  let first = Infinity;
  let last = -Infinity;
  for (const mb of members) {
    first = Math.min(first, mb.listenerOffset, mb.special ? mb.specialOffset : Infinity);
    last = Math.max(last, mb.listenerOffset + mb.listener.p.length, mb.special ? mb.specialOffset + mb.special.p.length : -Infinity);
  }
  const finalOthers = zone.finalOthers;
  for (let c = 0; c < C; c++) finalOthers[c] = 0;
  let leftover = 0; // P(nobody has sent) when the tables end: the zones outlast them
  /**
   * P(the collision among set q at this zone) × its PPDU time on air: the longest PPDU sent, which with
   * BlockAckReq recovery need not be the longest class's A-MPDU — a class whose senders all send a
   * BlockAckReq (zb − z1: some sender, no data) is on air only that long. Classes in order of their data
   * PPDU, longest first: the first with a data sender sets it; if none has one, the longest BlockAckReq.
   */
  const collisionAirUs = (q: number, single: number, m: number): number => {
    const order = space.byLength[q];
    if (!space.anyBar[q]) return m * classes[order[0]].collisionPpduUs;
    let outside = 1;
    for (let c = 0; c < C; c++) if (!(space.masks[q] & (1 << c))) outside *= z1[c];
    let air = 0;
    let allBar = outside;
    for (let j = 0; j < order.length; j++) {
      const c = order[j];
      let rest = 1;
      for (let i = j + 1; i < order.length; i++) rest *= z0[order[i]] - z1[order[i]];
      air += allBar * (z0[c] - zb[c]) * rest * classes[c].collisionPpduUs;
      allBar *= zb[c] - z1[c];
    }
    air += allBar * space.barPpduUs[q];
    if (single >= 0) {
      // Less the lone sender (a success, not a collision), by the kind of PPDU it sent.
      const mb = members[single];
      const loneData = (ps[single] * (1 - mb.specialBar) * r1[single] + pl[single] * (1 - mb.listenerBar) * e1[single]) * o1[single];
      const loneBar = (ps[single] * mb.specialBar * r1[single] + pl[single] * mb.listenerBar * e1[single]) * o1[single];
      air -= loneData * classes[single].collisionPpduUs + loneBar * space.barPpduUs[q];
    }
    // Rounding can leave the split a hair off the mass m: keep it between the shortest and longest PPDU.
    const shortest = space.barPpduUs[q] > 0 ? Math.min(space.barPpduUs[q], classes[order[order.length - 1]].collisionPpduUs) : classes[order[order.length - 1]].collisionPpduUs;
    return Math.min(m * classes[order[0]].collisionPpduUs, Math.max(m * shortest, air));
  };
  for (let c = 0; c < C; c++) {
    const mb = members[c];
    countSums(mb, mb.special ? survivalAt(mb.special, first - mb.specialOffset) : 1, survivalAt(mb.listener, first - mb.listenerOffset), sums);
    z0[c] = sums[0];
    r0[c] = sums[1];
    e0[c] = sums[2];
  }
  for (let t = first; t <= last; t++) {
    work.done += 40 * C;
    let alive = 1;
    let still = 1;
    if (t > first) {
      for (let c = 0; c < C; c++) {
        z0[c] = z1[c];
        r0[c] = r1[c];
        e0[c] = e1[c];
      }
    }
    for (let c = 0; c < C; c++) {
      const mb = members[c];
      const js = t - mb.specialOffset;
      const jl = t - mb.listenerOffset;
      const a1 = mb.special ? survivalAt(mb.special, js + 1) : 1;
      const b1 = survivalAt(mb.listener, jl + 1);
      ps[c] = mb.special ? massAt(mb.special, js) : 0;
      pl[c] = massAt(mb.listener, jl);
      a1s[c] = a1;
      b1s[c] = b1;
      countSums(mb, a1, b1, sums);
      z1[c] = sums[0];
      r1[c] = sums[1];
      e1[c] = sums[2];
      // With BlockAckReq recovery: P(none of c before t, and no data PPDU of c at t) — its senders at t, if
      // any, all send a BlockAckReq, whose PPDU is far shorter than an A-MPDU's.
      if (mb.specialBar > 0 || mb.listenerBar > 0) {
        countSums(mb, a1 + ps[c] * mb.specialBar, b1 + pl[c] * mb.listenerBar, sums);
        zb[c] = sums[0];
      } else zb[c] = z1[c];
      alive *= z0[c];
      still *= z1[c];
    }
    exceptEach(z0, o0);
    exceptEach(z1, o1);
    // Some listener may still be silent with everybody else silent too: its environment still matters.
    let waiting = 0;
    for (let c = 0; c < C; c++) waiting = Math.max(waiting, e1[c] * b1s[c] * o1[c]);
    leftover = 0;
    if (!(alive > HORIZON_EPSILON) && !(waiting > LISTENER_HORIZON)) break;
    leftover = still;
    const busy = alive - still;
    const zoneUs = t * sigma + aifsMin;
    if (busy > 0) {
      for (let c = 0; c < C; c++) {
        const mb = members[c];
        const k = classes[c];
        const loneSpecial = ps[c] * r1[c] * o1[c];
        const loneListener = pl[c] * e1[c] * o1[c];
        const alone = loneSpecial + loneListener;
        next[c] += alone;
        dataSuccess[c] += loneSpecial * (1 - mb.specialBar) + loneListener * (1 - mb.listenerBar);
        if (alone > 0) {
          const bars = loneSpecial * mb.specialBar + loneListener * mb.listenerBar;
          const barUs = k.blockAckReq !== null ? k.blockAckReq.successUs : 0;
          cycle += alone * (zoneUs + k.successUs) + bars * (barUs - k.successUs);
        }
        const tries = (ps[c] * r0[c] + pl[c] * e0[c]) * o0[c];
        attempts[c] += tries;
        listenerTries[c] += pl[c] * e0[c] * o0[c];
        specialBarTries[c] += ps[c] * r0[c] * o0[c] * mb.specialBar;
        collided[c] += Math.max(0, tries - alone);
        // Specials that stay silent while somebody else starts at t join the listeners with k − dec.
        if (mb.special && mb.special.pieces) {
          const scale = r0[c] * o0[c] - r1[c] * o1[c]; // Σ over specials of P(others busy at t, none before) ÷ P(it silent through t)
          const js = t - mb.specialOffset;
          if (scale > 0 && a1s[c] > TAIL_EPSILON) {
            const dec = js < 0 ? 0 : k.countdown === "DCF" ? js : js + 1;
            const from = js < 0 ? 0 : js + 1; // it did not send: k > t − o
            const d = diff[c];
            const K = mb.listener.p.length;
            const KE = d.length - 1;
            const { widths, weights } = mb.special.pieces;
            for (let i = 0; i < widths.length; i++) {
              const width = widths[i];
              const hi = width - 1 - dec;
              const lo = from - dec;
              if (hi < lo) continue;
              const v = (scale * weights[i]) / width;
              const top = Math.min(hi, KE - 1);
              if (lo <= top) {
                d[lo] += v;
                d[top + 1] -= v;
              }
              // Beyond the listeners' table: the mass and the first moment Σ (j − K + 1) (listenerLaw).
              const above = Math.max(lo, K);
              if (above <= hi) {
                beyond[c][0] += v * (hi - above + 1);
                beyond[c][1] += v * (triangle(hi - K + 1) - triangle(above - K));
              }
            }
          }
        }
      }
      // Collisions by the set S of classes that take part: Π_{c∈S} P(some of c send at t) · Π_{c∉S} P(none
      // of c), less the lone sender when S is one class; the colliders each class brings go with the state.
      for (const group of space.groups) {
        const mask = group.mask;
        let m = 1;
        let single = -1;
        for (let c = 0; c < C; c++) m *= mask & (1 << c) ? z0[c] - z1[c] : z1[c];
        if ((mask & (mask - 1)) === 0) {
          single = 31 - Math.clz32(mask);
          m -= (ps[single] * r1[single] + pl[single] * e1[single]) * o1[single];
        }
        if (!(m > 0)) continue;
        for (const q of group.states) {
          let mq = m;
          let airUs: number;
          if (space.variant[q] < 0) airUs = collisionAirUs(q, single, m);
          else {
            // This case's share: the classes before byLength[v] sent BlockAckReqs only (zb − z1), byLength[v]
            // some data (z0 − zb), the rest anything (z0 − z1); all BlockAckReqs when v is past the end.
            const order = space.byLength[q];
            const v = space.variant[q];
            mq = 1;
            for (let c = 0; c < C; c++) if (!(mask & (1 << c))) mq *= z1[c];
            for (let i = 0; i < order.length; i++) {
              const c = order[i];
              mq *= i < v ? zb[c] - z1[c] : i === v ? z0[c] - zb[c] : z0[c] - z1[c];
            }
            if (!(mq > 0)) continue;
            airUs = mq * space.airUs[q];
          }
          next[C + q] += mq;
          cycle += mq * zoneUs + airUs;
          for (let c = 0; c < C; c++) {
            if (!(mask & (1 << c))) continue;
            const some = z0[c] - z1[c];
            const senders = ps[c] * r0[c] + pl[c] * e0[c]; // E[senders of c at t; none of c before]
            const lone = ps[c] * r1[c] + pl[c] * e1[c];
            const e = c === single ? (some - lone > 1e-300 ? (senders - lone) / (some - lone) : 2) : some > 1e-300 ? senders / some : 1;
            colliders[q * C + c] += mq * Math.min(classes[c].stations, Math.max(c === single ? 2 : 1, e));
          }
        }
      }
    }
    // The listeners' environment: when do the others first send, whatever the listener's own counter?
    for (let c = 0; c < C; c++) {
      const r = Math.max(0, t - members[c].listenerOffset + ENV_SHIFT);
      env[c][Math.min(r, envLength - 1)] += e0[c] * o0[c] - e1[c] * o1[c];
      finalOthers[c] = e1[c] * o1[c];
    }
  }
  // The listeners' environment beyond the horizon: the others are still silent, and will send later.
  for (let c = 0; c < C; c++) env[c][envLength - 1] += finalOthers[c];
  // Normalise the next-state law (the horizon leaves at most HORIZON_EPSILON unaccounted).
  let total = 0;
  for (let i = 0; i < next.length; i++) total += next[i];
  for (let i = 0; i < next.length; i++) next[i] /= total;
  for (let c = 0; c < C; c++) {
    dataSuccess[c] /= total;
    attempts[c] /= total;
    collided[c] /= total;
    listenerTries[c] /= total;
    specialBarTries[c] /= total;
  }
  for (let i = 0; i < colliders.length; i++) colliders[i] /= total;
  return { next, cycleUs: cycle / total, dataSuccess, attempts, collided, listenerTries, specialBarTries, residualDiff: diff, env, envWeight, colliders, leftover, members };
}

/** 1 + 2 + … + x. */
function triangle(x: number): number {
  return (x * (x + 1)) / 2;
}

/** o[c] = Π_{c' ≠ c} z[c'], by products from both ends (no division: a z may be 0). */
function exceptEach(z: Float64Array, o: Float64Array): void {
  let left = 1;
  for (let c = 0; c < z.length; c++) {
    o[c] = left;
    left *= z[c];
  }
  let right = 1;
  for (let c = z.length - 1; c >= 0; c--) {
    o[c] *= right;
    right *= z[c];
  }
}

/** The arrays one state's outcome is written into (kept per state: the sweep reads them all afterwards). */
interface StateBuffers {
  readonly next: Float64Array;
  readonly dataSuccess: Float64Array;
  readonly attempts: Float64Array;
  readonly collided: Float64Array;
  readonly listenerTries: Float64Array;
  readonly specialBarTries: Float64Array;
  readonly env: Float64Array[];
  readonly envWeight: Float64Array;
  readonly colliders: Float64Array;
  /** Per class: the residual difference array, and its mass and moment beyond the table. */
  readonly residualDiff: Float64Array[];
  readonly beyond: Float64Array[];
}

function stateBuffersOf(space: StateSpace, tables: readonly number[]): StateBuffers {
  const C = tables.length;
  return {
    next: new Float64Array(space.count),
    dataSuccess: new Float64Array(C),
    attempts: new Float64Array(C),
    collided: new Float64Array(C),
    listenerTries: new Float64Array(C),
    specialBarTries: new Float64Array(C),
    // Zones r < 0 together, 0 … REACH_MAX + 1 one by one, and the mass of all later zones in the last slot (listenerLaw).
    env: tables.map(() => new Float64Array(ENV_SHIFT + REACH_MAX + 3)),
    envWeight: new Float64Array(C),
    colliders: new Float64Array(space.masks.length * C),
    residualDiff: tables.map((K) => new Float64Array(K + ENTRY_MARGIN + 1)),
    beyond: tables.map(() => new Float64Array(2)),
  };
}

/** Per-zone working arrays of runState, shared by the states of a sweep. */
interface ZoneScratch {
  readonly z0: Float64Array;
  readonly z1: Float64Array;
  readonly zb: Float64Array;
  readonly r0: Float64Array;
  readonly r1: Float64Array;
  readonly e0: Float64Array;
  readonly e1: Float64Array;
  readonly o0: Float64Array;
  readonly o1: Float64Array;
  readonly ps: Float64Array;
  readonly pl: Float64Array;
  readonly a1s: Float64Array;
  readonly b1s: Float64Array;
  readonly finalOthers: Float64Array;
  readonly sums: Float64Array;
}

function zoneScratchOf(C: number): ZoneScratch {
  const a = () => new Float64Array(C);
  return { z0: a(), z1: a(), zb: a(), r0: a(), r1: a(), e0: a(), e1: a(), o0: a(), o1: a(), ps: a(), pl: a(), a1s: a(), b1s: a(), finalOthers: a(), sums: new Float64Array(3) };
}

/**
 * The law of a collision's colliders of one class, K ≥ kMin with mean E (as
 * the zones left it): kMin + Binomial(n − kMin, (E − kMin)/(n − kMin)), a
 * law of our own choosing with the right mean, bounds and the binomial's
 * spread (a collision's extra senders are independent stations).
 */
function colliderCounts(n: number, kMin: number, mean: number, into: Float64Array): { readonly kMin: number; readonly weights: Float64Array } {
  const N = n - kMin;
  const h = N > 0 ? Math.min(1, Math.max(0, (mean - kMin) / N)) : 0;
  if (h <= 1e-12) return { kMin, weights: ONE };
  if (h >= 1 - 1e-12) return { kMin: n, weights: ONE };
  const { lo, weights } = binomialWeights(N, h, 0, into);
  return { kMin: kMin + lo, weights };
}

/** countSums' powers of b (grown on demand for very wide count laws). */
const POWERS_SCRATCH = new Float64Array(128);

/** One station exactly (a success state's special), or no specials at all. */
const ONE = Float64Array.of(1);

/**
 * The zones at which the stations of collision state q resume, relative to
 * zone 0 = the longest collider's PPDU end + its timeout + AIFS_min: the
 * other colliders after their own timeout or the end of the longest PPDU,
 * whichever is later; the listeners EIFS − DIFS after the longest PPDU
 * (10.3.2.3.7). Written into `into` (one entry per class).
 */
function collisionOffsets(channel: ContentionChannel, space: StateSpace, q: number, into: number[]): { readonly colliderOffset: readonly number[]; readonly listenerLag: number } {
  const classes = channel.classes;
  const sigma = channel.slotUs;
  const long = space.longest[q];
  const L = space.airUs[q];
  const refUs = L + classes[long].responseTimeoutUs;
  into.length = classes.length;
  for (let c = 0; c < classes.length; c++) {
    const onAirUs = space.barSenders[q] & (1 << c) ? (classes[c].blockAckReq as BlockAckRequestExchange).collisionPpduUs : classes[c].collisionPpduUs;
    into[c] = c === long ? 0 : Math.round((Math.max(onAirUs + classes[c].responseTimeoutUs, L) - refUs) / sigma);
  }
  return { colliderOffset: into, listenerLag: Math.max(0, Math.round((L + channel.eifsExtraUs - refUs) / sigma)) };
}

/** collisionOffsets' scratch (membersOf reads it before the next call). */
const ZONE_OFFSETS: number[] = [];

/** The members of one state: per class its specials (fresh, or colliders and how many) and its listeners, with their zone offsets. */
function membersOf(channel: ContentionChannel, state: number, space: StateSpace, laws: Laws, delay: readonly number[]): Member[] {
  const classes = channel.classes;
  const C = classes.length;
  if (state < C) {
    return classes.map((c, i) => ({
      n: c.stations,
      special: i === state ? laws.fresh[i] : null,
      specialOffset: delay[i],
      specialBar: 0,
      kMin: i === state ? 1 : 0,
      weights: ONE,
      listener: laws.listener[i],
      listenerOffset: delay[i],
      listenerBar: laws.bar[i],
    }));
  }
  const q = state - C;
  const mask = space.masks[q];
  const single = (mask & (mask - 1)) === 0;
  // Reference: the longest collider's PPDU end + its timeout + AIFS_min. The others of the collision
  // resume after their own timeout or the end of the longest PPDU, whichever is later; the listeners
  // EIFS − DIFS after the longest PPDU (10.3.2.3.7).
  const { colliderOffset, listenerLag } = collisionOffsets(channel, space, q, ZONE_OFFSETS);
  return classes.map((c, i) => {
    const inside = (mask & (1 << i)) !== 0;
    const counts = inside ? colliderCounts(c.stations, single ? 2 : 1, laws.colliders[q * C + i] * c.stations, laws.countScratch[q * C + i]) : { kMin: 0, weights: ONE };
    return {
      n: c.stations,
      special: inside ? laws.collider[i] : null,
      specialOffset: delay[i] + (inside ? colliderOffset[i] : 0),
      specialBar: c.blockAckReq === null ? 0 : 1,
      kMin: counts.kMin,
      weights: counts.weights,
      listener: laws.listener[i],
      listenerOffset: delay[i] + listenerLag,
      listenerBar: laws.bar[i],
    };
  });
}


/**
 * The listener law R_c from its entries E (counters of stations that had just
 * sent and then listened) and its environment env (the others' first busy
 * zone r relative to the listener's own offset): the expected visits
 *   U(k) = [E(k) + Σ_{j>k} U(j)·P(j → k)] ÷ (1 − P(k → k))
 * with P(j → j − r − 1) = env(r), r ≥ 0 (EDCA), P(j → j − r) = env(r), r ≥ 1
 * (DCF), and a busy period before the listener's own zone (r < 0; DCF also
 * r = 0) leaving k unchanged. A listener with counter j sends at r = j and
 * leaves. Computed from the top of the table down; R_c = U ÷ Σ U.
 *
 * Beyond the table (k ≥ K, where no listener sends within a cycle) the
 * counter only moves down, by jumps of law f, so U there follows the
 * renewal theorem (W. Feller, An Introduction to Probability Theory and Its
 * Applications, vol. I, ch. XIII; from memory): with H(d) the chance that
 * the walk visits d below its start, H → 1/μ (μ the mean jump), so
 *   U(k) ≈ [M(k)/μ + c·E(k)] ÷ (1 − P(k → k)),  M(k) = Σ_{j≥k} E(j),
 *   c = Σ_d (H(d) − 1/μ),
 * and Σ_{k≥K} U(k) ≈ [Σ_{j≥K} E(j)·(j − K + 1)/μ + c·M(K)] ÷ (1 − P(k → k)).
 * Only the tail's mass M(K) and first moment enter (`tailMass`,
 * `tailMoment`); E is exact on the table and R_MAX + 3 counters above it.
 * With a table of all CWmax + 1 counters the tail is empty and U exact.
 */
function listenerLaw(entries: Float64Array, tailMass: number, tailMoment: number, env: Float64Array, dcf: boolean, work: Work, u: Float64Array, out: Float64Array): void {
  const K = out.length;
  const KE = entries.length;
  // Zones r = 0 … R of the environment are followed one by one; beyond R (the others silent for many
  // zones) the environment is taken as geometric with the same first term a and tail mass M,
  // a·ρ^(r−R−1) with ρ = 1 − a/M, so its part of the inflow obeys T(k) = a·u[k + R + 1 + s] + ρ·T(k + 1)
  // (s = 1 for EDCA, 0 for DCF) and costs one step per counter instead of one per zone.
  const last = env.length - 1 - ENV_SHIFT;
  // Beyond the last zone the others may send in, nothing moves the counter: stop the inner loop there.
  let reach = last;
  while (reach > 0 && env[ENV_SHIFT + reach] === 0) reach--;
  const R = Math.min(REACH_MAX, reach);
  let a = 0;
  let M = 0;
  if (R < last) {
    a = env[ENV_SHIFT + R + 1];
    for (let r = R + 1; r <= last; r++) M += env[ENV_SHIFT + r];
  }
  const rho = M > 0 ? Math.max(0, 1 - a / M) : 0;
  const shift = dcf ? 0 : 1; // j = k + r + shift
  const r0 = dcf ? 1 : 0; // the first zone that moves the counter
  work.done += K * (R + 2);
  let self = 0;
  for (let r = 0; r < ENV_SHIFT + r0; r++) self += env[r];
  const stay = Math.max(1e-12, 1 - self);
  let beyondTotal = 0;
  u.fill(0);
  if (tailMass > 0) {
    // The jump law given a move: f(i) = env(r) ÷ stay at i = r + shift, r0 ≤ r ≤ the last zone kept
    // (whose slot holds all later zones: counted there, a little short).
    // c = Σ_d (H(d) − 1/μ) = E[X(X − 1)] ÷ 2μ² for the jump X (the constant term of the renewal
    // generating function 1/(1 − f̂(z)) at z = 1; an Abel sum where the jumps are periodic).
    let mu = 0;
    let m2 = 0;
    for (let r = r0; r <= reach; r++) {
      const x = r + shift;
      mu += env[ENV_SHIFT + r] * x;
      m2 += env[ENV_SHIFT + r] * x * (x - 1);
    }
    mu /= stay;
    m2 /= stay;
    const c = m2 / (2 * mu * mu);
    let m = tailMass;
    for (let k = K; k < KE; k++) {
      u[k] = Math.max(0, (m / mu + c * entries[k]) / stay);
      m -= entries[k];
    }
    beyondTotal = Math.max(0, (tailMoment / mu + c * tailMass) / stay);
  }
  let total = beyondTotal;
  // Beyond the table the counters change slowly: the geometric part of the inflow starts at its nearest value.
  let tail = M * u[Math.min(KE - 1, K + R + 1 + shift)]; // T(k + 1)
  for (let k = K - 1; k >= 0; k--) {
    let inflow = entries[k];
    // From j = k + r + shift; DCF r = 0 is the self-loop, and only k ≥ 1 is reachable.
    const far = k + R + 1 + shift;
    tail = (far < KE ? a * u[far] : 0) + rho * tail;
    if (!dcf || k >= 1) {
      // The zones r whose source counter j = k + r + shift lies inside the table, bounds taken once.
      const rTop = Math.min(R, KE - 1 - k - shift);
      for (let r = r0, j = k + r + shift, e = ENV_SHIFT + r; r <= rTop; r++, j++, e++) inflow += u[j] * env[e];
      inflow += tail;
    }
    u[k] = inflow / stay;
    total += u[k];
  }
  for (let k = 0; k < K; k++) out[k] = total > 0 ? u[k] / total : 0;
}

/** T(j) = Σ_{k ≥ j} law[k] + beyond, j = 0 … law.length (into `t` when given, a buffer of law.length + 1 reused across sweeps). */
function tailsOf(law: Float64Array, beyond: number, t: Float64Array = new Float64Array(law.length + 1)): Float64Array {
  t[law.length] = beyond;
  for (let k = law.length - 1; k >= 0; k--) t[k] = t[k + 1] + law[k];
  return t;
}

/**
 * Stationary law of a small Markov chain given by rows: π(I − P) = 0 with
 * Σπ = 1, the last balance equation replaced by the sum, by Gaussian
 * elimination with partial pivoting.
 */
function stationary(rows: readonly Float64Array[]): Float64Array {
  const S = rows.length;
  const W = S + 1;
  // Unknowns π_b; equation a: Σ_b π_b (δ_ab − P_ba) = 0 for a < S − 1, and Σ_b π_b = 1. Row a at a·W.
  const A = S * W <= STATIONARY_SCRATCH.length ? STATIONARY_SCRATCH : new Float64Array(S * W);
  for (let a = 0; a < S; a++) {
    for (let b = 0; b < S; b++) A[a * W + b] = a === S - 1 ? 1 : (a === b ? 1 : 0) - rows[b][a];
    A[a * W + S] = a === S - 1 ? 1 : 0;
  }
  for (let col = 0; col < S; col++) {
    let best = col;
    for (let r = col + 1; r < S; r++) if (Math.abs(A[r * W + col]) > Math.abs(A[best * W + col])) best = r;
    if (best !== col) {
      for (let k = 0; k < W; k++) {
        const t = A[col * W + k];
        A[col * W + k] = A[best * W + k];
        A[best * W + k] = t;
      }
    }
    const piv = A[col * W + col];
    if (piv === 0) continue;
    for (let r = col + 1; r < S; r++) {
      const q = A[r * W + col] / piv;
      if (q === 0) continue;
      for (let k = col; k < W; k++) A[r * W + k] -= q * A[col * W + k];
    }
  }
  const pi = new Float64Array(S);
  for (let r = S - 1; r >= 0; r--) {
    let v = A[r * W + S];
    for (let k = r + 1; k < S; k++) v -= A[r * W + k] * pi[k];
    pi[r] = A[r * W + r] !== 0 ? Math.max(0, v / A[r * W + r]) : 0;
  }
  let total = 0;
  for (let b = 0; b < S; b++) total += pi[b];
  for (let b = 0; b < S; b++) pi[b] /= total;
  return pi;
}

/** stationary's elimination rows (the solver never reenters). */
const STATIONARY_SCRATCH = new Float64Array(64 * 65);

interface Laws {
  readonly fresh: readonly Law[];
  readonly collider: readonly Law[];
  readonly listener: readonly Law[];
  readonly bar: readonly number[];
  /** Buffers for the colliders' count laws per collision state and class (index q·C + c). */
  readonly countScratch: readonly Float64Array[];
  /** Expected colliders per collision state and class (index q·C + c) as a share of the class's stations, from the iterate (a share, so that the accelerator weighs it like p). */
  readonly colliders: Float64Array;
}

/** The busy time charged before zone 0 of a state beyond what runState adds: a collision's timeout. */
function stateLeadUs(channel: ContentionChannel, state: number, space: StateSpace): number {
  const C = channel.classes.length;
  if (state < C) return 0;
  return channel.classes[space.longest[state - C]].responseTimeoutUs;
}

/** Every setting of a class but its name and station count: classes with the same key are the same stations. */
function settingsKey(c: ContentionClass): string {
  const bar = c.blockAckReq === null ? "" : `${c.blockAckReq.successUs}/${c.blockAckReq.collisionPpduUs}`;
  return [c.aifsn, c.cwMin, c.cwMax, c.retryLimit, c.countdown, c.successUs, c.collisionPpduUs, c.responseTimeoutUs, c.payloadBits, bar].join("|");
}

/**
 * Solve the multi-class model. Inputs are assumed already checked. Classes
 * with the same settings (the same access category given twice) are solved
 * as one and shared out by stations: their stations are alike.
 */
export function edcaSaturation(channel: ContentionChannel, options: SolverOptions = {}): MixResult {
  if (channel.classes.length === 1) return solveDistinct(channel, options);
  const keys = channel.classes.map(settingsKey);
  const distinct = [...new Set(keys)];
  if (distinct.length === channel.classes.length) return solveDistinct(channel, options);
  const merged = distinct.map((k) => {
    const members = channel.classes.filter((_, i) => keys[i] === k);
    return { ...members[0], stations: members.reduce((a, c) => a + c.stations, 0) };
  });
  const solved = solveDistinct({ ...channel, classes: merged }, options);
  return {
    ...solved,
    classes: channel.classes.map((c, i) => {
      const m = solved.classes[distinct.indexOf(keys[i])];
      const share = c.stations / merged[distinct.indexOf(keys[i])].stations;
      return { name: c.name, stations: c.stations, p: m.p, goodputMbps: m.goodputMbps * share, airtimeShare: m.airtimeShare * share };
    }),
  };
}

/** One evaluation of the fixed-point map: the states' outcomes under (p, R), and the (p, R) they imply. */
interface Sweep {
  readonly outcomes: readonly StateOutcome[];
  readonly pi: Float64Array;
  /** The map's image, laid out as the iterate: p_c for every class, then every class's listener law. */
  readonly image: Float64Array;
}

/** The iterate (p, colliders, R_0, R_1, …) as one vector, so that an accelerator can mix iterates. */
interface Layout {
  readonly C: number;
  /** Collision states; their expected colliders per class, as shares of its stations, follow p at C + q·C + c, then the listeners' BlockAckReq share per class at C·(1 + Q) + c. */
  readonly Q: number;
  /** Start of class c's listener table in the vector, and its length K_c. */
  readonly start: readonly number[];
  readonly size: readonly number[];
  /**
   * Pair states (pairedClasses): per state y and class c, the start of the law its listeners leave to
   * the next state (-1 for a class that is not paired); null when no class is.
   */
  readonly after: readonly (readonly number[])[] | null;
  readonly length: number;
}

function layoutOf(C: number, space: StateSpace, tables: readonly number[], paired: readonly boolean[]): Layout {
  const start: number[] = [];
  const Q = space.masks.length;
  let at = C * (2 + Q);
  for (const K of tables) {
    start.push(at);
    at += K;
  }
  let after: number[][] | null = null;
  if (paired.some((b) => b)) {
    after = [];
    for (let y = 0; y < space.count; y++) {
      const row: number[] = [];
      for (let c = 0; c < C; c++) {
        row.push(paired[c] ? at : -1);
        if (paired[c]) at += tables[c];
      }
      after.push(row);
    }
  }
  return { C, Q, start, size: tables, after, length: at };
}

/**
 * Classes whose listeners are followed per previous state (pair states): EDCA classes of at most
 * PAIRED_WINDOW counters, held whole on their tables, in a mix of two classes (solveDistinct).
 *
 * Why: the listeners of a state are not independent given it; they share the state before. In the
 * simulator (5 VO + 1 BE) the VO listeners' counters average 1.37 after a success that followed a success,
 * 2.0–2.5 after one that followed a collision (its listeners waited EIFS, its colliders drew from the
 * wider window), and with one pooled law best effort beside several VO or VI read 5–14 % low. So the
 * state chain runs on pairs (y, s), and a paired class's listeners in (y, s) take the law the
 * non-senders of y's idle period left (its part of the iterate); the others keep R_c. Two classes
 * only (solveDistinct).
 */
const PAIRED_WINDOW = 32;

function pairedClasses(classes: readonly ContentionClass[], tables: readonly number[]): boolean[] {
  if (classes.length < 2) return classes.map(() => false);
  return classes.map((c, i) => c.countdown === "EDCA" && c.cwMax + 1 <= PAIRED_WINDOW && tables[i] === c.cwMax + 1);
}

/** Counters of a listener's entries kept beyond its table (the renewal tail reads them). */
const ENTRY_MARGIN = REACH_MAX + 3;

/** Arrays of about K_c entries per class that one sweep fills and the next overwrites (no allocation per sweep). */
interface Buffers {
  /** Per state (per pair of states y·S + s with paired classes): what runState writes. */
  readonly states: readonly StateBuffers[];
  /** The pair chain's transition rows, and the tails of the paired laws per state and class (empty without paired classes). */
  readonly pairRows: readonly Float64Array[];
  readonly pairTails: readonly (readonly Float64Array[])[];
  readonly zone: ZoneScratch;
  readonly collider: readonly ColliderScratch[];
  readonly listenerTails: readonly Float64Array[];
  readonly entries: readonly Float64Array[];
  readonly visits: readonly Float64Array[];
  /** Per class: the listeners' environment averaged over the states. */
  readonly env: readonly Float64Array[];
  /** Per collision state and class: its colliders' count law. */
  readonly counts: readonly Float64Array[];
  /**
   * Rings of iterate-sized vectors for the fixed point: the sweeps' images (the accelerator keeps
   * ANDERSON_DEPTH + 1 of them, and the check sweep adds one), the residuals it keeps, and the next
   * iterates (the one being swept, and the one being formed).
   */
  readonly images: Ring;
  readonly residuals: Ring;
  readonly iterates: Ring;
}

interface Ring {
  readonly slots: readonly Float64Array[];
  at: number;
}

function ringOf(size: number, length: number): Ring {
  return { slots: Array.from({ length: size }, () => new Float64Array(length)), at: 0 };
}

/** The next slot of a ring (its content is whatever was left in it). */
function ring(r: Ring): Float64Array {
  r.at = (r.at + 1) % r.slots.length;
  return r.slots[r.at];
}

function buffersOf(space: StateSpace, tables: readonly number[], layout: Layout): Buffers {
  const iterateLength = layout.length;
  const runs = layout.after === null ? space.count : space.count * space.count;
  return {
    states: Array.from({ length: runs }, () => stateBuffersOf(space, tables)),
    pairRows: layout.after === null ? [] : Array.from({ length: runs }, () => new Float64Array(runs)),
    pairTails: layout.after === null ? [] : Array.from({ length: space.count }, () => tables.map((K) => new Float64Array(K + 1))),
    zone: zoneScratchOf(tables.length),
    collider: tables.map((K) => ({ law: new Float64Array(K), tails: new Float64Array(K + 1) })),
    listenerTails: tables.map((K) => new Float64Array(K + 1)),
    entries: tables.map((K) => new Float64Array(K + ENTRY_MARGIN)),
    visits: tables.map((K) => new Float64Array(K + ENTRY_MARGIN)),
    env: tables.map(() => new Float64Array(ENV_SHIFT + REACH_MAX + 3)),
    counts: Array.from({ length: space.masks.length * tables.length }, () => new Float64Array(64)),
    images: ringOf(ANDERSON_DEPTH + 3, iterateLength),
    residuals: ringOf(ANDERSON_DEPTH + 2, iterateLength),
    iterates: ringOf(3, iterateLength),
  };
}

/**
 * Working buffers by shape, reused across solutions (allocating the few
 * dozen small arrays costs more than a solution's arithmetic). Every buffer
 * is overwritten or cleared before it is read, so no answer depends on what
 * an earlier solution left in them. At most POOL_LIMIT shapes are kept.
 */
const BUFFER_POOL = new Map<string, Buffers>();
const POOL_LIMIT = 32;

function pooledBuffers(space: StateSpace, tables: readonly number[], layout: Layout): Buffers {
  const key = `${space.masks.join(",")}|${tables.join(",")}|${layout.length}`;
  let b = BUFFER_POOL.get(key);
  if (!b) {
    if (BUFFER_POOL.size >= POOL_LIMIT) BUFFER_POOL.clear();
    b = buffersOf(space, tables, layout);
    BUFFER_POOL.set(key, b);
  }
  return b;
}

/** What a sweep needs that does not change between sweeps of one table size. */
interface Setup {
  readonly channel: ContentionChannel;
  readonly space: StateSpace;
  readonly layout: Layout;
  readonly fresh: readonly Law[];
  /** Per class: the windows of a collider's next draw, and their weights (rewritten every sweep). */
  readonly colliderPieces: readonly Pieces[];
  readonly delay: readonly number[];
  readonly aifsMin: number;
  readonly buffers: Buffers;
}

/**
 * The paired classes' part of the map's image: per state s and paired class c, the law of the stations
 * of c that did not send in s's idle period, over the runs (y, s) weighted by the pair chain's law —
 * listeners on y's law moved down by their environment (EDCA: a busy period at relative zone r ≥ 0 takes
 * r + 1 from a counter above r; one before the listener's own zone, nothing), and the specials that did
 * not send (their residuals). Written into `image`; a state never visited keeps the iterate's law.
 */
function pairedImage(layout: Layout, outcomes: readonly StateOutcome[], pi: Float64Array, x: Float64Array, image: Float64Array, S: number, work: Work): void {
  const after = layout.after as readonly (readonly number[])[];
  for (let s = 0; s < S; s++) for (let c = 0; c < layout.C; c++) if (after[s][c] >= 0) image.fill(0, after[s][c], after[s][c] + layout.size[c]);
  for (let y = 0; y < S; y++) {
    for (let s = 0; s < S; s++) {
      const run = y * S + s;
      const w = pi[run];
      if (!(w > 0)) continue;
      const o = outcomes[run];
      for (let c = 0; c < layout.C; c++) {
        const from = after[y][c];
        if (from < 0) continue;
        const K = layout.size[c];
        const to = after[s][c];
        const env = o.env[c];
        work.done += K * env.length;
        for (let k = 0; k < K; k++) image[to + k] += w * env[0] * x[from + k];
        for (let r = 0; ENV_SHIFT + r < env.length; r++) {
          const e = w * env[ENV_SHIFT + r];
          if (!(e > 0)) continue;
          for (let k = 0; k + r + 1 < K; k++) image[to + k] += e * x[from + k + r + 1];
        }
        if (o.members[c].special !== null) {
          const d = o.residualDiff[c];
          let acc = 0;
          for (let k = 0; k < K; k++) {
            acc += d[k];
            image[to + k] += w * acc;
          }
        }
      }
    }
  }
  for (let s = 0; s < S; s++) {
    for (let c = 0; c < layout.C; c++) {
      const at = after[s][c];
      if (at < 0) continue;
      let total = 0;
      for (let k = at; k < at + layout.size[c]; k++) total += image[k];
      if (total > 0) for (let k = at; k < at + layout.size[c]; k++) image[k] /= total;
      else image.set(x.subarray(at, at + layout.size[c]), at);
    }
  }
}

function sweepOnce(setup: Setup, x: Float64Array, work: Work, image: Float64Array): Sweep {
  const { channel, space, layout, fresh, delay, aifsMin, buffers } = setup;
  const classes = channel.classes;
  const C = classes.length;
  const listener = classes.map((_, i) => x.subarray(layout.start[i], layout.start[i] + layout.size[i]));
  const laws: Laws = {
    fresh,
    listener: listener.map((l, i) => {
      let held = 0;
      for (let k = 0; k < l.length; k++) held += l[k];
      return lawOf(l, Math.max(0, 1 - held), null, buffers.listenerTails[i]);
    }),
    collider: classes.map((c, i) => colliderLaw(c, x[i], buffers.collider[i], setup.colliderPieces[i])),
    bar: classes.map((c, i) => (c.blockAckReq === null ? 0 : x[C * (1 + layout.Q) + i])),
    colliders: x.subarray(C, C * (1 + layout.Q)),
    countScratch: buffers.counts,
  };
  const outcomes: StateOutcome[] = [];
  const S = space.count;
  const after = layout.after;
  // Per sweep every state (pair) fills and sums counter-table arrays of each class.
  for (const K of layout.size) work.done += (K + ENTRY_MARGIN) * (3 * buffers.states.length + 8);
  let pi: Float64Array;
  if (after === null) {
    for (let s = 0; s < S; s++) {
      const o = runState(channel, membersOf(channel, s, space, laws, delay), space, aifsMin, work, buffers.states[s], buffers.zone);
      o.cycleUs += stateLeadUs(channel, s, space);
      outcomes.push(o);
    }
    pi = stationary(outcomes.map((o) => o.next));
  } else {
    // Pair states (y, s), run y·S + s: a paired class's listeners in s take the law y's idle period left.
    const leftBy = after.map((row, y) => row.map((at, i) => (at < 0 ? null : lawOf(x.subarray(at, at + layout.size[i]), 0, null, buffers.pairTails[y][i]))));
    for (let s = 0; s < S; s++) {
      const base = membersOf(channel, s, space, laws, delay);
      const lead = stateLeadUs(channel, s, space);
      for (let y = 0; y < S; y++) {
        const members = base.map((m, i) => (leftBy[y][i] === null ? m : { ...m, listener: leftBy[y][i] as Law }));
        const run = y * S + s;
        const o = runState(channel, members, space, aifsMin, work, buffers.states[run], buffers.zone);
        o.cycleUs += lead;
        outcomes[run] = o;
        const row = buffers.pairRows[run].fill(0);
        for (let n = 0; n < S; n++) row[s * S + n] = o.next[n];
      }
    }
    pi = stationary(buffers.pairRows);
  }
  image.fill(0);
  for (let c = 0; c < C; c++) {
    let a = 0;
    let k = 0;
    for (let s = 0; s < outcomes.length; s++) {
      a += pi[s] * outcomes[s].attempts[c];
      k += pi[s] * outcomes[s].collided[c];
    }
    image[c] = a > 0 ? k / a : 0;
    // BlockAckReq recovery: attempts at backoff stage ≥ 1 are BlockAckReqs, 1 − 1/Σ p^i of all (barShare);
    // the specials of a collision state send nothing else, so the listeners carry the rest.
    const at = C * (1 + layout.Q) + c;
    if (classes[c].blockAckReq === null) image[at] = 0;
    else {
      let listened = 0;
      let specialBars = 0;
      for (let s = 0; s < outcomes.length; s++) {
        listened += pi[s] * outcomes[s].listenerTries[c];
        specialBars += pi[s] * outcomes[s].specialBarTries[c];
      }
      image[at] = listened > 0 ? Math.min(1, Math.max(0, (a * barShare(classes[c], image[c]) - specialBars) / listened)) : 0;
    }
  }
  for (let q = 0; q < layout.Q; q++) {
    let mass = 0;
    for (let s = 0; s < outcomes.length; s++) mass += pi[s] * outcomes[s].next[C + q];
    for (let c = 0; c < C; c++) {
      let e = 0;
      for (let s = 0; s < outcomes.length; s++) e += pi[s] * outcomes[s].colliders[q * C + c];
      image[C + q * C + c] = mass > 0 ? e / mass / classes[c].stations : x[C + q * C + c];
    }
  }
  for (let i = 0; i < C; i++) {
    const c = classes[i];
    const entries = buffers.entries[i].fill(0);
    const env = buffers.env[i].fill(0);
    let weight = 0;
    let tailMass = 0;
    let tailMoment = 0;
    for (let s = 0; s < outcomes.length; s++) {
      const o = outcomes[s];
      const w = pi[s];
      const r = o.residualDiff[i];
      if (o.members[i].special !== null) for (let k = 0; k < entries.length; k++) entries[k] += w * r[k]; // else all 0
      const e = o.env[i];
      for (let k = 0; k < env.length; k++) env[k] += w * e[k];
      weight += w * o.envWeight[i];
      tailMass += w * buffers.states[s].beyond[i][0]; // s: the run (a state, or a pair of states)
      tailMoment += w * buffers.states[s].beyond[i][1];
    }
    if (weight <= 0) {
      image.set(listener[i], layout.start[i]);
      continue;
    }
    for (let k = 1; k < entries.length; k++) entries[k] += entries[k - 1]; // prefix sums of the difference arrays
    for (let k = 0; k < env.length; k++) env[k] /= weight;
    listenerLaw(entries, tailMass, tailMoment, env, c.countdown === "DCF", work, buffers.visits[i], image.subarray(layout.start[i], layout.start[i] + layout.size[i]));
  }
  if (after !== null) pairedImage(layout, outcomes, pi, x, image, S, work);
  return { outcomes, pi, image };
}

/** Iterates and images kept by the accelerator (Anderson mixing, memory ANDERSON_DEPTH). */
const ANDERSON_DEPTH = 3;

function maxDistance(a: Float64Array, b: Float64Array): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
  return d;
}

/** Keep a mixed iterate a valid one: p in [0, 1), colliders within their bounds, every listener table non-negative and at most 1 in all. */
function project(x: Float64Array, layout: Layout, space: StateSpace, classes: readonly ContentionClass[]): void {
  for (let c = 0; c < layout.C; c++) x[c] = Math.min(0.999999, Math.max(0, x[c]));
  for (let q = 0; q < layout.Q; q++) {
    const mask = space.masks[q];
    const single = (mask & (mask - 1)) === 0;
    for (let c = 0; c < layout.C; c++) {
      const i = layout.C + q * layout.C + c;
      x[i] = mask & (1 << c) ? Math.min(1, Math.max((single ? 2 : 1) / classes[c].stations, x[i])) : 0;
    }
  }
  for (let c = 0; c < layout.C; c++) {
    const at = layout.C * (1 + layout.Q) + c;
    x[at] = Math.min(1, Math.max(0, x[at]));
  }
  for (let c = 0; c < layout.C; c++) {
    let total = 0;
    const end = layout.start[c] + layout.size[c];
    for (let k = layout.start[c]; k < end; k++) {
      if (!(x[k] > 0)) x[k] = 0;
      total += x[k];
    }
    if (total > 1) for (let k = layout.start[c]; k < end; k++) x[k] /= total;
  }
  // Paired laws hold every counter: each is a law (sums to 1) when it has any mass.
  layout.after?.forEach((row) =>
    row.forEach((at, c) => {
      if (at < 0) return;
      let total = 0;
      for (let k = at; k < at + layout.size[c]; k++) {
        if (!(x[k] > 0)) x[k] = 0;
        total += x[k];
      }
      if (total > 0) for (let k = at; k < at + layout.size[c]; k++) x[k] /= total;
    }),
  );
}

/**
 * Anderson mixing (D. G. Anderson, "Iterative procedures for nonlinear
 * integral equations", J. ACM 12(4), 1965; in the form of H. F. Walker and
 * P. Ni, "Anderson acceleration for fixed-point iterations", SIAM J. Numer.
 * Anal. 49(4), 2011 — both from memory): the next iterate is the image
 * g_k − ΔG·γ, γ minimising |f_k − ΔF·γ| over the last few residuals
 * f = g − x. Solved by the normal equations, lightly regularised (the
 * memory is at most ANDERSON_DEPTH).
 */
function andersonNext(gs: readonly Float64Array[], fs: readonly Float64Array[], next: Float64Array): Float64Array {
  const k = gs.length - 1;
  const m = Math.min(ANDERSON_DEPTH, k);
  const n = gs[k].length;
  const base = k - m;
  const fk = fs[k];
  // One pass over the iterate for the normal equations: the ΔF columns f_{i+1} − f_i (m at most
  // ANDERSON_DEPTH) are formed entry by entry, each sum still taken in entry order.
  const cols = fs.slice(base, k + 1);
  // Plain arrays: m is at most ANDERSON_DEPTH, and small typed arrays cost more to make than to use.
  const A: number[][] = [];
  const b: number[] = [];
  const d: number[] = [];
  for (let i = 0; i < m; i++) {
    A.push(new Array<number>(m).fill(0));
    b.push(0);
    d.push(0);
  }
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < m; i++) d[i] = cols[i + 1][j] - cols[i][j];
    for (let i = 0; i < m; i++) {
      const di = d[i];
      const Ai = A[i];
      for (let l = i; l < m; l++) Ai[l] += di * d[l];
      b[i] += di * fk[j];
    }
  }
  let scale = 0;
  for (let i = 0; i < m; i++) {
    for (let l = 0; l < i; l++) A[i][l] = A[l][i];
    scale = Math.max(scale, A[i][i]);
  }
  for (let i = 0; i < m; i++) A[i][i] += 1e-10 * scale + 1e-300;
  const gamma = solveSmall(A, b);
  next.set(gs[k]);
  const g = gs.slice(base, k + 1);
  for (let j = 0; j < n; j++) {
    let v = next[j];
    for (let i = 0; i < m; i++) v -= gamma[i] * (g[i + 1][j] - g[i][j]);
    next[j] = v;
  }
  return next;
}

/** Gaussian elimination with partial pivoting for the small normal equations. */
function solveSmall(A: number[][], b: number[]): number[] {
  const m = b.length;
  const M: number[][] = [];
  for (let i = 0; i < m; i++) M.push([...A[i], b[i]]);
  for (let col = 0; col < m; col++) {
    let best = col;
    for (let r = col + 1; r < m; r++) if (Math.abs(M[r][col]) > Math.abs(M[best][col])) best = r;
    [M[col], M[best]] = [M[best], M[col]];
    const piv = M[col][col];
    if (piv === 0) continue;
    for (let r = col + 1; r < m; r++) {
      const q = M[r][col] / piv;
      for (let c = col; c <= m; c++) M[r][c] -= q * M[col][c];
    }
  }
  const x = new Array<number>(m).fill(0);
  for (let r = m - 1; r >= 0; r--) {
    let s = M[r][m];
    for (let c = r + 1; c < m; c++) s -= M[r][c] * x[c];
    x[r] = M[r][r] !== 0 ? s / M[r][r] : 0;
  }
  return x;
}

/** For tests and studies: a smaller work limit, or tables that start larger (CWmax + 1 = exact, no renewal tail). */
export interface SolverOptions {
  readonly workLimit?: number;
  readonly tableStart?: number;
}

/**
 * Stations whose backoff windows are this small are solved on their counter
 * tables even as one class (SATURATE, CONTENTION): Bianchi's memoryless
 * countdown (saturation.ts) reads them 3–12 % high — a fresh counter on
 * 0…3 has sent within four slots for sure, and the one left behind after a
 * success sits low — while the tables match the simulator within 1 %
 * (DEVELOPERS.md). A first window of up to 8 slots, or a last of up to 16:
 * VO and VI with their default parameters.
 */
const SMALL_FIRST_WINDOW = 8;
const SMALL_LAST_WINDOW = 16;

export function countersMatter(c: ContentionClass): boolean {
  return c.stations >= 2 && (c.cwMin + 1 <= SMALL_FIRST_WINDOW || c.cwMax + 1 <= SMALL_LAST_WINDOW);
}

/**
 * What a fixed point (p, colliders, listener laws) depends on: each class's
 * station count and backoff settings (AIFSN, CWmin, CWmax, retry limit,
 * countdown, BlockAckReq recovery or not), and per collision state the
 * order of its classes' PPDUs, which class was on air longest and the zones
 * at which colliders and listeners resume (collisionOffsets). The durations
 * themselves only turn the states' outcomes into time and payload, so
 * channels that agree on all this (another packet size, MCS or link of the
 * same slot grid) share the fixed point.
 */
function fixedPointKey(channel: ContentionChannel, space: StateSpace): string {
  let key = "";
  for (const c of channel.classes) key += `${c.stations},${c.aifsn},${c.cwMin},${c.cwMax},${c.retryLimit},${c.countdown},${c.blockAckReq === null ? 0 : 1};`;
  for (let q = 0; q < space.masks.length; q++) {
    const { colliderOffset, listenerLag } = collisionOffsets(channel, space, q, ZONE_OFFSETS);
    key += `|${space.variant[q]},${space.longest[q]},${space.byLength[q].join(".")},${colliderOffset.join(".")},${listenerLag}`;
  }
  return key;
}

/** Solved iterates by fixedPointKey (as bianchi.ts keeps Bianchi's fixed points), at most FIXED_POINT_MEMO_LIMIT. */
const FIXED_POINTS = new Map<
  string,
  {
    readonly tables: readonly number[];
    readonly x: Float64Array;
    readonly fresh: readonly Law[];
    readonly layout: Layout;
    readonly colliderPieces: readonly Pieces[];
  }
>();
const FIXED_POINT_MEMO_LIMIT = 512;

/** A solution and its final iterate (the pair states start from the one-law solution's). */
interface Solved {
  readonly result: MixResult;
  readonly x: Float64Array;
  readonly tables: readonly number[];
}

/**
 * Pair states only for two classes (S² runs per sweep: 25 for two classes, 49 or more for three, too many
 * for a call), and only where no class collides on more than PAIR_P_MAX of its attempts in the one-law
 * solution (the catalog refuses those mixes; their fixed points settle slowly).
 */
const PAIR_P_MAX = 0.97;
/** Work allowed to the pair states after the one-law solution (two-class mixes measured need up to 6e5). */
const PAIR_WORK_LIMIT = 1e6;

function solveDistinct(channel: ContentionChannel, options: SolverOptions): MixResult {
  const classes = channel.classes;
  if (classes.length === 2 && pairedClasses(classes, classes.map((c) => Math.min(c.cwMax + 1, options.tableStart ?? TABLE_START))).some((b) => b)) {
    // A kept pair fixed point needs no one-law solution to start from.
    if (options.tableStart === undefined && options.workLimit === undefined && FIXED_POINTS.has(`P${fixedPointKey(channel, stateSpace(classes))}`)) {
      return solveOnce(channel, options, true, null).result;
    }
    const single = solveOnce(channel, options, false, null);
    if (!(single.result.residual <= MAP_TOLERANCE) || single.result.classes.some((c) => c.p > PAIR_P_MAX)) return single.result;
    const paired = solveOnce(channel, options, true, single);
    // Pair states that do not settle within their own limit leave the one-law solution (and its range).
    if (!(paired.result.residual <= MAP_TOLERANCE)) return { ...single.result, sweeps: single.result.sweeps + paired.result.sweeps, work: single.result.work + paired.result.work };
    return { ...paired.result, sweeps: single.result.sweeps + paired.result.sweeps, work: single.result.work + paired.result.work };
  }
  return solveOnce(channel, options, false, null).result;
}

function solveOnce(channel: ContentionChannel, options: SolverOptions, pairs: boolean, from: Solved | null): Solved {
  const classes = channel.classes;
  if (classes.length === 1 && !countersMatter(classes[0])) {
    const s = saturation(channel);
    const c = classes[0];
    return {
      result: {
        classes: [{ name: c.name, stations: c.stations, p: s.p, goodputMbps: s.goodputMbps, airtimeShare: 1 - s.contentionShare }],
        contentionShare: s.contentionShare,
        residual: 0,
        sweeps: 0,
        work: 0,
        oneClass: true,
        pairs: false,
      },
      x: new Float64Array(0),
      tables: [],
    };
  }
  const space = stateSpace(classes); // holds the PPDU durations: made anew for every channel
  // A fixed point solved before for the same dynamics (fixedPointKey) starts the iteration, which then ends
  // after the sweep that evaluates it. (Study options solve afresh, and are not kept.)
  const memoKey = options.tableStart === undefined && options.workLimit === undefined ? `${pairs ? "P" : "1"}${fixedPointKey(channel, space)}` : null;
  const known = memoKey === null ? undefined : FIXED_POINTS.get(memoKey);
  const minAifsn = Math.min(...classes.map((c) => c.aifsn));
  const aifsMin = channel.sifsUs + minAifsn * channel.slotUs;
  const delay = classes.map((c) => c.aifsn - minAifsn);
  const work: Work = { done: 0 };
  let tables: readonly number[] = from !== null ? from.tables : classes.map((c) => Math.min(c.cwMax + 1, options.tableStart ?? TABLE_START));
  const workLimit = options.workLimit ?? (pairs ? PAIR_WORK_LIMIT : WORK_LIMIT);
  const pairing = (sizes: readonly number[]): boolean[] => (pairs ? pairedClasses(classes, sizes) : classes.map(() => false));
  const setupOf = (sizes: readonly number[]): Setup => {
    // A kept fixed point brings the parts of the setup that depend on the dynamics alone.
    const kept = known !== undefined && sizes === tables;
    const layout = kept ? known.layout : layoutOf(classes.length, space, sizes, pairing(sizes));
    return {
      channel,
      space,
      layout,
      fresh: kept ? known.fresh : classes.map((c, i) => freshLaw(c, sizes[i])),
      colliderPieces: kept ? known.colliderPieces : classes.map(colliderPieces),
      delay,
      aifsMin,
      buffers: pooledBuffers(space, sizes, layout),
    };
  };
  if (known !== undefined) tables = known.tables;
  let setup = setupOf(tables);
  // Start: a kept fixed point (read, never written: the iteration moves on in its own buffers), or p = 0,
  // two colliders of a class alone and one of each class in a mixed collision, every listener on its first window.
  let x: Float64Array = known !== undefined ? known.x : new Float64Array(setup.layout.length);
  if (known === undefined && from !== null) {
    // From the one-law solution: its p, colliders, BlockAckReq shares and listener laws, and every state's
    // law left to the next one taken as the listener law.
    x.set(from.x.subarray(0, Math.min(from.x.length, setup.layout.length)));
    setup.layout.after?.forEach((row) => row.forEach((at, i) => at >= 0 && x.set(from.x.subarray(setup.layout.start[i], setup.layout.start[i] + tables[i]), at)));
    project(x, setup.layout, space, classes);
  } else if (known === undefined) {
    classes.forEach((c, i) => x.set(uniform(tables[i], c.cwMin + 1), setup.layout.start[i]));
    setup.layout.after?.forEach((row) => row.forEach((at, i) => at >= 0 && x.set(uniform(tables[i], classes[i].cwMin + 1), at)));
    project(x, setup.layout, space, classes);
  }
  const fs: Float64Array[] = [];
  const gs: Float64Array[] = [];
  let last: Sweep | null = null;
  let moved = Infinity;
  let best = Infinity;
  let sweeps = 0;
  for (let sweep = 0; sweep < SWEEP_LIMIT && work.done < workLimit; sweep++) {
    sweeps++;
    last = sweepOnce(setup, x, work, ring(setup.buffers.images));
    const outlasted = last.outcomes.some((o) => o.leftover > OUTLAST_EPSILON);
    if (outlasted && tables.some((K, i) => K < classes[i].cwMax + 1)) {
      // The zones outlasted a table: double the short tables and go on from the image, the mass beyond
      // a table spread over the counters added.
      const grown = tables.map((K, i) => Math.min(classes[i].cwMax + 1, 2 * K));
      const next = setupOf(grown);
      const y = new Float64Array(next.layout.length);
      y.set(last.image.subarray(0, classes.length * (2 + space.masks.length)));
      classes.forEach((_, i) => {
        const old = last!.image.subarray(setup.layout.start[i], setup.layout.start[i] + tables[i]);
        let held = 0;
        for (const v of old) held += v;
        const at = next.layout.start[i];
        y.set(old, at);
        const added = grown[i] - tables[i];
        for (let k = tables[i]; k < grown[i]; k++) y[at + k] = added > 0 ? Math.max(0, 1 - held) / added : 0;
      });
      // Paired classes hold all their counters already: their tables do not grow, their laws carry over.
      next.layout.after?.forEach((row, st) =>
        row.forEach((at, i) => {
          const from = setup.layout.after?.[st][i] ?? -1;
          if (at < 0) return;
          if (from >= 0) y.set(last!.image.subarray(from, from + grown[i]), at);
          else y.set(uniform(grown[i], classes[i].cwMin + 1), at);
        }),
      );
      tables = grown;
      setup = next;
      x = y;
      project(x, setup.layout, space, classes);
      fs.length = 0;
      gs.length = 0;
      moved = Infinity;
      best = Infinity;
      continue;
    }
    moved = maxDistance(last.image, x);
    if (moved <= MAP_TOLERANCE) break;
    const f = ring(setup.buffers.residuals);
    for (let j = 0; j < f.length; j++) f[j] = last.image[j] - x[j];
    fs.push(f);
    gs.push(last.image);
    if (gs.length > ANDERSON_DEPTH + 1) {
      fs.shift();
      gs.shift();
    }
    if (moved > 10 * best && gs.length > 2) {
      // The mixed iterate went astray: drop the memory and take the plain step.
      fs.splice(0, fs.length - 1);
      gs.splice(0, gs.length - 1);
    }
    best = Math.min(best, moved);
    // Mixing costs about (m²/2 + 3m) passes over the iterate.
    if (gs.length >= 2) work.done += (ANDERSON_DEPTH * (ANDERSON_DEPTH + 6) * setup.layout.length) / 2;
    const nextX = ring(setup.buffers.iterates);
    x = gs.length < 2 ? (nextX.set(last.image), nextX) : andersonNext(gs, fs, nextX);
    project(x, setup.layout, space, classes);
  }
  // The distance left to the fixed point: the last sweep moved every quantity by `moved` (the
  // accelerated iterate's own residual |G(x) − x|); the answer reported is G(x). Unsettled → Infinity.
  const residual = moved <= MAP_TOLERANCE ? moved : Infinity;
  if (memoKey !== null && residual <= MAP_TOLERANCE && known === undefined) {
    if (FIXED_POINTS.size >= FIXED_POINT_MEMO_LIMIT) FIXED_POINTS.clear();
    FIXED_POINTS.set(memoKey, { tables: [...tables], x: Float64Array.from(x), fresh: setup.fresh, layout: setup.layout, colliderPieces: setup.colliderPieces });
  }
  const { outcomes, pi, image } = last as Sweep;
  let cycleUs = 0;
  outcomes.forEach((o, s) => (cycleUs += pi[s] * o.cycleUs));
  const results = classes.map((c, i) => {
    let successes = 0;
    outcomes.forEach((o, s) => (successes += pi[s] * o.dataSuccess[i]));
    return {
      name: c.name,
      stations: c.stations,
      p: image[i],
      goodputMbps: (successes * c.payloadBits) / cycleUs,
      airtimeShare: (successes * (c.successUs + aifsMin)) / cycleUs,
    };
  });
  return {
    result: { classes: results, contentionShare: 1 - results.reduce((a, r) => a + r.airtimeShare, 0), residual, sweeps, work: work.done, oneClass: classes.length === 1, pairs: setup.layout.after !== null },
    x,
    tables,
  };
}
