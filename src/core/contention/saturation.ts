/**
 * Saturation goodput of one class of identical stations (SATURATE,
 * CONTENTION) with exact slot accounting: the countdown rule of the access
 * (EDCA or DCF), the collision as the colliders and as the others see it
 * (response timeout vs EIFS), and the BlockAckReq recovery.
 *
 * The station side is Bianchi's backoff chain (bianchi.ts: G. Bianchi, IEEE
 * JSAC 18(3), 2000, with the finite retry limit of Wu et al., INFOCOM 2002).
 * The channel side is a renewal chain over the state after a busy period —
 * after a success (S) or after a collision (C) — in the manner of the
 * refinements of I. Tinnirello, G. Bianchi and Y. Xiao, "Refinements on IEEE
 * 802.11 distributed coordination function modeling approaches", IEEE Trans.
 * Vehicular Technology 59(3), 2010 (from memory): a frozen counter makes
 * the slots right after a busy period special, and there only the stations
 * that have just transmitted may send. Our statement of it, term by term:
 *
 * Station (per attempt collision probability p, stages i = 0 … m, m = retry
 * limit − 1, windows W_i = min(2^i·(CWmin + 1), CWmax + 1), w_i = p^i):
 *   EDCA (10.23.2.4): every generic slot — idle, or the boundary at which a
 *     busy period starts — is a decrement, which is Bianchi's counting:
 *       τ = Σ w_i ÷ Σ w_i·(W_i + 1)/2                        per regular slot
 *   DCF (10.3.4.3): the counter is frozen over a busy period and at the DIFS
 *     boundary; a counter drawn as k ≥ 1 takes k regular slots, k = 0 sends at
 *     the DIFS boundary right after the station's own busy period:
 *       τ = Σ w_i·(1 − 1/W_i) ÷ Σ w_i·(W_i − 1)/2             per regular slot
 *   BAR: attempts at stage ≥ 1 are BlockAckReqs: b = Σ_{i≥1} w_i ÷ Σ w_i.
 *   Colliders' next counter, per slot right after the collision:
 *       q = [Σ_{i<m} w_i / W_{i+1} + w_m / W_0] ÷ Σ w_i
 *
 * Channel, n stations, regular slots (everybody counts down):
 *   idle I = (1−τ)^n;  data success s_d = n·τ(1−b)(1−τ)^(n−1);  BAR success s_b = n·τ·b(1−τ)^(n−1)
 *   BAR-only collision c_b = (1 − τ(1−b))^n − I − s_b;  collision with data c_d = 1 − I − s_d − s_b − c_b
 *   P_tr = 1 − I; a regular zone lasts σ·(1 − P_tr)/P_tr of idle slots on average.
 * Busy periods, from their first µs to the colliders' (or everybody's) AIFS end:
 *   T_s  = success exchange + AIFS          T_bar = BlockAckReq + SIFS + BlockAck + AIFS
 *   T_c  = colliding PPDU (RTS) + response timeout + AIFS      T_cb = BlockAckReq + timeout + AIFS
 * After a collision the others wait EIFS − DIFS + AIFS after the PPDU
 * (10.3.2.3.7, 10.23.2.4), δ = EIFS − DIFS − timeout longer than the
 * colliders: e = round(δ/σ) slots (the half-slot sensing rule of the
 * simulator) in which only the K colliders may send, K ≥ 2 binomial as in
 * a regular slot's collision (afterCollision; a pair alone read 300 DCF
 * stations 8 % low, since a collision among many leaves many to take those
 * slots).
 * Special slots before the regular zone, and their idle time if nobody sends:
 *   EDCA after S: none (0 µs)             DCF after S: the DIFS boundary, 1/W_0 (σ)
 *   EDCA after C: e exclusive slots       DCF after C: e + 1 exclusive slots (δ + σ)
 *     (δ)                                  exclusive slot j, K colliders: one sends alone
 *                                          K·q·(1 − (j+1)q)^(K−1), none so far (1 − (j+1)q)^K
 * The S/C chain's stationary law weights each state's expected payload and
 * time; goodput = E[payload] ÷ E[time] per busy period. p is the implied
 * share of collided attempts (regular ones collide with 1 − (1−τ)^(n−1), a
 * lone DCF sender at the DIFS boundary never, exclusive ones when both
 * colliders pick the same slot), solved by a bracketed root on [0, 1].
 *
 * One station: p = 0 and goodput = payload ÷ (AIFS + CWmin/2·σ + exchange),
 * which is GOODPUT. With EDCA, δ = 0 and no BAR this is Bianchi's model.
 *
 * Small windows (VO, VI) do not come here: SATURATE solves them on counter
 * tables (aifsZones.ts countersMatter), since a memoryless countdown reads
 * them 3–12 % high.
 */
import { bracketedRoot, fixedPoint } from "./bianchi";
import { binomialWeights } from "./binomial";
import { aifsUs, type ContentionChannel, type ContentionClass } from "./parameters";

export interface Saturation {
  /** Attempt probability per regular slot. */
  readonly tau: number;
  /** Conditional collision probability of an attempt (all kinds). */
  readonly p: number;
  /** Aggregate goodput, Mb/s. */
  readonly goodputMbps: number;
  /** 1 − the data successes' share of airtime (with their AIFS): idle slots, collisions, EIFS, BlockAckReq exchanges. */
  readonly contentionShare: number;
  /** Mean time from one busy period's start to the next one's, µs. */
  readonly cycleUs: number;
}

/** Station-side quantities for a given p. */
interface StationSide {
  readonly tau: number;
  readonly barShare: number;
  readonly colliderHazard: number;
}

function windowOf(cls: ContentionClass, stage: number): number {
  return Math.min(2 ** stage * (cls.cwMin + 1), cls.cwMax + 1);
}

function stationSide(cls: ContentionClass, p: number): StationSide {
  const m = cls.retryLimit - 1;
  const dcf = cls.countdown === "DCF";
  let w = 1;
  let weight = 0;
  let attempts = 0;
  let slots = 0;
  let hazard = 0;
  for (let i = 0; i <= m; i++) {
    const W = windowOf(cls, i);
    weight += w;
    attempts += dcf ? w * (1 - 1 / W) : w;
    slots += dcf ? (w * (W - 1)) / 2 : (w * (W + 1)) / 2;
    hazard += w / (i < m ? windowOf(cls, i + 1) : windowOf(cls, 0));
    w *= p;
  }
  return {
    tau: slots > 0 ? Math.min(1, attempts / slots) : 1,
    barShare: cls.blockAckReq === null ? 0 : 1 - 1 / weight,
    colliderHazard: hazard / weight,
  };
}

/** The special slots after a busy period: outcome probabilities and the idle time before each. */
interface Special {
  readonly dataSuccess: number;
  readonly barSuccess: number;
  readonly collision: number;
  /** Σ P(outcome) × idle µs before it. */
  readonly idleBeforeUs: number;
  /** Nobody sent in the special slots. */
  readonly silent: number;
  readonly silentIdleUs: number;
  /** Attempts and collided attempts in the special slots. */
  readonly attempts: number;
  readonly collided: number;
}

function afterSuccess(cls: ContentionClass, slotUs: number): Special {
  if (cls.countdown !== "DCF") return { dataSuccess: 0, barSuccess: 0, collision: 0, idleBeforeUs: 0, silent: 1, silentIdleUs: 0, attempts: 0, collided: 0 };
  const q = 1 / windowOf(cls, 0); // the station that just succeeded drew 0: alone at the DIFS boundary
  return { dataSuccess: q, barSuccess: 0, collision: 0, idleBeforeUs: 0, silent: 1 - q, silentIdleUs: slotUs, attempts: q, collided: 0 };
}

/**
 * How many stations collided, given that a regular slot held a collision:
 * K ≥ 2 of n, each sending with probability τ (binomial, conditioned on
 * K ≥ 2). Weights for K = kMin … kMin + length − 1, cut where a term falls
 * below 1e-13 of the largest (into `scratch` when it is long enough).
 */
function colliderCountLaw(n: number, tau: number, scratch: Float64Array): { readonly kMin: number; readonly weights: Float64Array } {
  if (n <= 2 || tau <= 0) return { kMin: 2, weights: ONE };
  if (tau >= 1) return { kMin: n, weights: ONE };
  // P(K = k) ∝ C(n, k)·τ^k·(1 − τ)^(n − k) for k ≥ 2.
  const { lo, weights } = binomialWeights(n, tau, 2, scratch);
  return { kMin: lo, weights };
}

const ONE = Float64Array.of(1);
const COUNT_SCRATCH = new Float64Array(256);

/**
 * The exclusive slots after a collision, in which only its K colliders may
 * send (the others still wait out EIFS), each on its next draw with the
 * hazard q per slot: with u_j = max(0, 1 − j·q) (a collider silent before
 * slot j) and K mixed over its law (colliderCountLaw),
 *   P(nobody before j)           = u_j^K
 *   P(one collider alone at j)    = K·q·u_{j+1}^(K−1)
 *   E[senders at j, none before]  = K·q·u_j^(K−1)
 *   P(a collision at j)           = u_j^K − u_{j+1}^K − K·q·u_{j+1}^(K−1)
 * (K = 2 gives the pair's 2q·u_{j+1} and q²).
 */
function afterCollision(cls: ContentionClass, side: StationSide, slotUs: number, exclusive: number, lagUs: number, colliders: { readonly kMin: number; readonly weights: Float64Array }): Special {
  const dcf = cls.countdown === "DCF";
  const slots = dcf ? exclusive + 1 : exclusive;
  const q = side.colliderHazard;
  const bar = cls.blockAckReq !== null;
  let single = 0;
  let both = 0;
  let senders = 0;
  let idleBeforeUs = 0;
  let silent = 0;
  const { kMin, weights } = colliders;
  // Powers of u_j and u_{j+1} upward in K, from K − 1 = kMin − 1 (two Math.pow per slot, not per count).
  for (let j = 0; j < slots; j++) {
    const u = Math.max(0, 1 - j * q);
    const u1 = Math.max(0, 1 - (j + 1) * q);
    let uK1 = Math.pow(u, kMin - 1);
    let u1K1 = Math.pow(u1, kMin - 1);
    for (let i = 0; i < weights.length; i++) {
      const K = kMin + i;
      const w = weights[i];
      const one = K * q * u1K1;
      const two = Math.max(0, uK1 * u - u1K1 * u1 - one);
      single += w * one;
      both += w * two;
      senders += w * (K * q * uK1 - one);
      idleBeforeUs += w * (one + two) * j * slotUs;
      uK1 *= u;
      u1K1 *= u1;
    }
  }
  const uEnd = Math.max(0, 1 - slots * q);
  for (let i = 0, v = Math.pow(uEnd, kMin); i < weights.length; i++, v *= uEnd) silent += weights[i] * v;
  return {
    dataSuccess: bar ? 0 : single,
    barSuccess: bar ? single : 0,
    collision: both,
    idleBeforeUs,
    silent,
    silentIdleUs: lagUs + (dcf ? slotUs : 0),
    attempts: single + senders,
    collided: senders,
  };
}

interface Cycle {
  readonly p: number;
  readonly tau: number;
  readonly dataRate: number;
  readonly cycleUs: number;
}

/** The channel's renewal chain for a given p: implied p, success rate per busy period and mean cycle. */
function channelCycle(channel: ContentionChannel, cls: ContentionClass, p: number): Cycle {
  const n = cls.stations;
  const sigma = channel.slotUs;
  const side = stationSide(cls, p);
  const tau = side.tau;
  const b = side.barShare;
  const aifs = aifsUs(channel, cls);
  const lagUs = Math.max(0, channel.eifsExtraUs - cls.responseTimeoutUs);
  const exclusive = n === 1 ? 0 : Math.round(lagUs / sigma);

  const idle = Math.pow(1 - tau, n);
  const lone = n * tau * Math.pow(1 - tau, n - 1);
  const sd = lone * (1 - b);
  const sb = lone * b;
  const cb = Math.max(0, Math.pow(1 - tau * (1 - b), n) - idle - sb);
  const cd = Math.max(0, 1 - idle - lone - cb);
  const busy = 1 - idle;
  const regularIdleUs = (sigma * idle) / busy;
  const regularAttempts = (n * tau) / busy;
  const regularCollided = regularAttempts * (1 - Math.pow(1 - tau, n - 1));

  const tS = cls.successUs + aifs;
  const tBar = (cls.blockAckReq?.successUs ?? 0) + aifs;
  const tC = cls.collisionPpduUs + cls.responseTimeoutUs + aifs;
  const tCb = (cls.blockAckReq?.collisionPpduUs ?? 0) + cls.responseTimeoutUs + aifs;
  const exclusiveCollisionUs = cls.blockAckReq === null ? tC : tCb;

  const states = [afterSuccess(cls, sigma), afterCollision(cls, side, sigma, exclusive, lagUs, colliderCountLaw(n, tau, COUNT_SCRATCH))];
  // Per state: P(next busy is a success), E[payload successes], E[time], attempts, collided.
  const toSuccess: number[] = [];
  const data: number[] = [];
  const time: number[] = [];
  const tries: number[] = [];
  const hits: number[] = [];
  for (const st of states) {
    const r = st.silent;
    toSuccess.push(st.dataSuccess + st.barSuccess + (r * (sd + sb)) / busy);
    data.push(st.dataSuccess + (r * sd) / busy);
    time.push(
      st.idleBeforeUs +
        st.dataSuccess * tS +
        st.barSuccess * tBar +
        st.collision * exclusiveCollisionUs +
        r * (st.silentIdleUs + regularIdleUs + (sd * tS + sb * tBar + cd * tC + cb * tCb) / busy),
    );
    tries.push(st.attempts + r * regularAttempts);
    hits.push(st.collided + r * regularCollided);
  }
  // Stationary law of the S/C chain: π_S·(1 − P(S→S)) = π_C·P(C→S).
  const leaveS = 1 - toSuccess[0];
  const piS = leaveS + toSuccess[1] > 0 ? toSuccess[1] / (leaveS + toSuccess[1]) : 1;
  const piC = 1 - piS;
  const attempts = piS * tries[0] + piC * tries[1];
  return {
    p: attempts > 0 ? (piS * hits[0] + piC * hits[1]) / attempts : 0,
    tau,
    dataRate: piS * data[0] + piC * data[1],
    cycleUs: piS * time[0] + piC * time[1],
  };
}

/** Half-width of the first bracket around Bianchi's p: the exact accounting moves p by less than this in the cases measured. */
const NEAR = 0.02;
/**
 * p to about 1e-11: g(x) = x − p(x) has a slope near 1 there, so |g| ≤ 1e-12 puts x that close to the
 * root; the goodput's relative error follows p's.
 */
const P_SOLVED = 1e-11;
const G_SOLVED = 1e-12;

/**
 * The root of the increasing g on [0, 1] by the secant method from the two
 * points ±NEAR around Bianchi's p (the exact accounting moves p little, and
 * g is smooth: 5–7 evaluations), falling back to the bracketed root on
 * [0, 1] if the secant steps leave [0, 1] or do not settle.
 */
function rootNear(g: (x: number) => number, guess: number): number {
  let a = Math.max(0, guess - NEAR);
  let b = Math.min(1, guess + NEAR);
  let ga = g(a);
  let gb = g(b);
  for (let step = 0; step < SECANT_STEPS; step++) {
    if (Math.abs(gb) <= G_SOLVED) return b;
    if (gb === ga) break;
    const x = b - (gb * (b - a)) / (gb - ga);
    if (!(x >= 0 && x <= 1)) break;
    a = b;
    ga = gb;
    b = x;
    gb = g(b);
  }
  return bracketedRoot(g, 0, g(0), 1, g(1), P_SOLVED, G_SOLVED);
}
const SECANT_STEPS = 12;

/** Saturation of the channel's first class. Inputs are assumed already checked. */
export function saturation(channel: ContentionChannel): Saturation {
  const cls = channel.classes[0];
  let p = 0;
  if (cls.stations > 1) {
    const g = (x: number): number => x - channelCycle(channel, cls, x).p;
    const plain = cls.countdown === "EDCA" && cls.blockAckReq === null && Math.round(Math.max(0, channel.eifsExtraUs - cls.responseTimeoutUs) / channel.slotUs) === 0;
    // Bianchi's case has its own memoised fixed point.
    const bianchi = fixedPoint(cls.stations, cls.cwMin, cls.cwMax, cls.retryLimit).p;
    p = plain ? bianchi : rootNear(g, bianchi);
  }
  const c = channelCycle(channel, cls, p);
  const successShare = (c.dataRate * (cls.successUs + aifsUs(channel, cls))) / c.cycleUs;
  return { tau: c.tau, p, goodputMbps: (c.dataRate * cls.payloadBits) / c.cycleUs, contentionShare: 1 - successShare, cycleUs: c.cycleUs };
}
