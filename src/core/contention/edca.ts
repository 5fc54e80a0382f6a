/**
 * Saturated classes of EDCA stations with different AIFSN, CWmin, CWmax,
 * retry limits and exchange lengths sharing one channel.
 *
 * The AIFS differentiation follows the "contention zone" treatment of
 * J. W. Robinson and T. S. Randhawa, "Saturation throughput analysis of IEEE
 * 802.11e enhanced distributed coordination function", IEEE JSAC 22(5),
 * 2004: after every busy period a class with a longer AIFS stays
 * frozen for the first slots in which classes with a shorter AIFS already
 * count down, and a Markov chain over "idle slots since the last busy period"
 * tells how often each zone occurs. Its equations as implemented here (our
 * statement of that model, written from the paper's description from memory;
 * the seeded simulator in simulator.ts checks it):
 *
 *   A = min AIFSN_c,  d_c = AIFSN_c − A (slots class c waits beyond AIFS[A]),
 *   D = max d_c. Zone k = 0 … D counts idle slots since the last busy period
 *   (k = D also for every later idle slot). Class c is active in zone k iff
 *   d_c ≤ k; an active station of class c transmits with probability τ_c.
 *
 *   idle_k  = Π_{c active in k} (1 − τ_c)^{n_c}
 *   π_k     = π_{k−1}·idle_{k−1} (0 < k < D),  π_D = π_{D−1}·idle_{D−1} ÷ (1 − idle_D),
 *             normalised so Σ π_k = 1 (the zone chain's stationary law)
 *   p_c     = Σ_{k ≥ d_c} π_k·[1 − idle_k ÷ (1 − τ_c)]  ÷  Σ_{k ≥ d_c} π_k
 *   τ_c     = τ(p_c) of bianchi.ts (Wu et al. 2002 finite retry limit), since a
 *             class's backoff chain only advances in the slots it is active in
 *   s_c(k)  = n_c·τ_c·idle_k ÷ (1 − τ_c)   (one station of class c alone transmits)
 *
 * Each busy period is followed by AIFS[A]; the zones carry the rest of each
 * class's AIFS. A collision lasts as long as the longest colliding exchange:
 * with the active classes sorted by collisionUs and N_j the probability that
 * no class after the j-th transmits (N_last = 1, N_{−1} = idle_k), the
 * collision whose longest member is class j has probability N_j − N_{j−1} − s_j(k).
 *
 *   E[slot]  = Σ_k π_k [ idle_k·σ + Σ_c s_c(k)·T_s,c + Σ_j P(coll, longest j)·T_c,j ]
 *   T_s,c = successUs_c + AIFS[A],  T_c,j = collisionUs_j + AIFS[A]
 *   S_c      = Σ_k π_k·s_c(k)·E[payload_c] ÷ E[slot]                       (Mb/s)
 *   airtime_c = Σ_k π_k·s_c(k)·T_s,c ÷ E[slot]
 *
 * With one class (D = 0) these are Bianchi's equations exactly. Like
 * Bianchi's, the model assumes each station's attempts meet a constant,
 * independent collision probability; with the tiny VO windows (CW 3…7) and
 * few stations that under-states p by about 0.03 against the simulator
 * (2 VO + 8 BE stations: p_VO 0.36 vs 0.39, VO goodput about 4 % high);
 * with VI, BE and BK windows it agrees within 0.02 on p and 3 % on goodput
 * (test/core/contention/crosscheck.test.ts). The system is
 * solved class by class (Gauss–Seidel), each p_c by a bracketed root search on [0, 1] with
 * the other classes held, until no p_c moves by more than 1e-12 or the sweep
 * cap is reached; every iterate stays in [0, 1], so it cannot diverge.
 */
import { attemptProbability, bracketedRoot } from "./bianchi";
import type { ContentionChannel, ContentionClass } from "./timing";

export interface ClassResult {
  readonly name: string;
  readonly stations: number;
  readonly tau: number;
  readonly p: number;
  /** Aggregate goodput of the class, Mb/s. */
  readonly goodputMbps: number;
  /** Share of airtime in this class's successful exchanges (with the AIFS[A] after them). */
  readonly airtimeShare: number;
}

export interface MixResult {
  readonly classes: readonly ClassResult[];
  readonly meanSlotUs: number;
  /** Share of airtime in idle slots (including the frozen zones) and collisions. */
  readonly contentionShare: number;
  /** Largest |p_c − p(τ)| left at the end (a convergence check). */
  readonly residual: number;
}

const SWEEP_LIMIT = 200;
const SWEEP_TOLERANCE = 1e-12;

/** Zone layout: which zone each class becomes active in, and the zone count. */
interface Zones {
  readonly delay: readonly number[];
  readonly last: number;
  readonly minAifsn: number;
}

function zonesOf(classes: readonly ContentionClass[]): Zones {
  const minAifsn = Math.min(...classes.map((c) => c.aifsn));
  const delay = classes.map((c) => c.aifsn - minAifsn);
  return { delay, last: Math.max(...delay), minAifsn };
}

/** (1 − τ)^n with the exponent 0 giving 1 even at τ = 1. */
function silent(tau: number, n: number): number {
  return n === 0 ? 1 : Math.pow(1 - tau, n);
}

/** Stationary zone law π_k and idle_k for given τ. */
function zoneLaw(classes: readonly ContentionClass[], zones: Zones, tau: readonly number[]): { pi: number[]; idle: number[] } {
  const idle: number[] = [];
  for (let k = 0; k <= zones.last; k++) {
    let q = 1;
    for (let c = 0; c < classes.length; c++) if (zones.delay[c] <= k) q *= silent(tau[c], classes[c].stations);
    idle.push(q);
  }
  const pi: number[] = [1];
  for (let k = 1; k <= zones.last; k++) pi.push(pi[k - 1] * idle[k - 1]);
  if (zones.last > 0) pi[zones.last] /= 1 - idle[zones.last];
  const total = pi.reduce((a, b) => a + b, 0);
  return { pi: pi.map((x) => x / total), idle };
}

/** Probability that a class-c transmission meets another transmitter in zone k. */
function othersSilent(classes: readonly ContentionClass[], zones: Zones, tau: readonly number[], c: number, k: number): number {
  let q = silent(tau[c], classes[c].stations - 1);
  for (let o = 0; o < classes.length; o++) if (o !== c && zones.delay[o] <= k) q *= silent(tau[o], classes[o].stations);
  return q;
}

/** p_c implied by the current τ vector. */
function collisionOf(classes: readonly ContentionClass[], zones: Zones, tau: readonly number[], c: number): number {
  const { pi } = zoneLaw(classes, zones, tau);
  let weight = 0;
  let collide = 0;
  for (let k = zones.delay[c]; k <= zones.last; k++) {
    weight += pi[k];
    collide += pi[k] * (1 - othersSilent(classes, zones, tau, c, k));
  }
  return collide / weight;
}

function tauOf(cls: ContentionClass, p: number): number {
  return attemptProbability(p, cls.cwMin, cls.cwMax, cls.retryLimit);
}

/** Solve the multi-class fixed point and the per-class goodput. Inputs are assumed already checked. */
export function edcaSaturation(channel: ContentionChannel): MixResult {
  const classes = channel.classes;
  const zones = zonesOf(classes);
  const p = classes.map(() => 0);
  const tau = classes.map((c) => tauOf(c, 0));
  for (let sweep = 0; sweep < SWEEP_LIMIT; sweep++) {
    let moved = 0;
    for (let c = 0; c < classes.length; c++) {
      const next = solveClass(classes, zones, tau, c);
      moved = Math.max(moved, Math.abs(next - p[c]));
      p[c] = next;
      tau[c] = tauOf(classes[c], next);
    }
    if (moved < SWEEP_TOLERANCE) break;
  }
  const residual = Math.max(...classes.map((_, c) => Math.abs(p[c] - collisionOf(classes, zones, tau, c))));
  return throughput(channel, zones, tau, p, residual);
}

/** p_c with the other classes' τ held (bracketed root on [0, 1]). */
function solveClass(classes: readonly ContentionClass[], zones: Zones, tau: number[], c: number): number {
  const held = tau[c];
  const g = (p: number): number => {
    tau[c] = tauOf(classes[c], p);
    return p - collisionOf(classes, zones, tau, c);
  };
  const p = bracketedRoot(g, 0, g(0), 1, g(1));
  tau[c] = held;
  return p;
}

function throughput(channel: ContentionChannel, zones: Zones, tau: readonly number[], p: readonly number[], residual: number): MixResult {
  const classes = channel.classes;
  const { pi, idle } = zoneLaw(classes, zones, tau);
  const aifsMin = channel.sifsUs + zones.minAifsn * channel.slotUs;
  const successRate = classes.map(() => 0); // Σ_k π_k s_c(k)
  let idleUs = 0;
  let collisionUs = 0;
  for (let k = 0; k <= zones.last; k++) {
    idleUs += pi[k] * idle[k] * channel.slotUs;
    const active = classes.map((_, c) => c).filter((c) => zones.delay[c] <= k);
    const success: number[] = [];
    for (const c of active) {
      const s = classes[c].stations * tau[c] * othersSilent(classes, zones, tau, c, k);
      success[c] = s;
      successRate[c] += pi[k] * s;
    }
    // Collisions by their longest member: sort by collisionUs, walk up.
    active.sort((a, b) => classes[a].collisionUs - classes[b].collisionUs);
    let below = idle[k]; // N_{j−1}: nobody after j−1 transmits … starts as "nobody at all"
    for (let j = 0; j < active.length; j++) {
      let above = 1; // N_j: nobody after j transmits
      for (let i = j + 1; i < active.length; i++) above *= silent(tau[active[i]], classes[active[i]].stations);
      const c = active[j];
      const collision = Math.max(0, above - below - success[c]);
      collisionUs += pi[k] * collision * (classes[c].collisionUs + aifsMin);
      below = above;
    }
  }
  let successUs = 0;
  const busy = classes.map((c, i) => successRate[i] * (c.successUs + aifsMin));
  for (const b of busy) successUs += b;
  const meanSlotUs = idleUs + collisionUs + successUs;
  return {
    classes: classes.map((c, i) => ({
      name: c.name,
      stations: c.stations,
      tau: tau[i],
      p: p[i],
      goodputMbps: (successRate[i] * c.payloadBits) / meanSlotUs,
      airtimeShare: busy[i] / meanSlotUs,
    })),
    meanSlotUs,
    contentionShare: (idleUs + collisionUs) / meanSlotUs,
    residual,
  };
}
