/**
 * The backoff chain of Bianchi's saturation model, with a finite retry
 * limit: the attempt probability τ(p), the (τ, p) fixed point that COLLIDE
 * returns, and the bracketed root search every contention model uses.
 * (saturation.ts builds the channel on it.)
 *
 * G. Bianchi, "Performance analysis of the IEEE 802.11 distributed
 * coordination function", IEEE JSAC 18(3), 2000, pp. 535–547: each of n
 * saturated stations transmits in a generic slot with probability τ; a
 * transmission collides with the constant, independent probability
 *
 *     p = 1 − (1 − τ)^(n−1)                                   (Bianchi eq. (9))
 *
 * Backoff stage i (i = 0 … m) draws its counter uniformly from
 * [0, W_i − 1], W_0 = W = CWmin + 1, W_i = min(2^i·W, CWmax + 1); stage i is
 * reached after i collisions of the same frame; after the last stage the frame
 * is dropped and the next one starts at stage 0. The retry limit counts
 * transmission attempts, as dot11ShortRetryLimit does (default 7; IEEE
 * 802.11-2020 Annex C, from memory), so m = retry limit − 1 retransmissions.
 * With m and m' doubling stages (W_m' = CWmax + 1), H. Wu, Y. Peng, K. Long, S. Cheng
 * and J. Ma, "Performance of reliable transport protocol over IEEE 802.11
 * wireless LAN: analysis and enhancement", IEEE INFOCOM 2002, give (closed
 * form as we recall it, from memory; bianchi.test.ts checks it equals the sum
 * form below)
 *
 *   m ≤ m':  τ = 2(1−2p)(1−p^(m+1)) / [ W(1−(2p)^(m+1))(1−p) + (1−2p)(1−p^(m+1)) ]
 *   m > m':  τ = 2(1−2p)(1−p^(m+1)) / [ W(1−(2p)^(m'+1))(1−p) + (1−2p)(1−p^(m+1))
 *                                        + W·2^m'·p^(m'+1)(1−2p)(1−p^(m−m')) ]
 *
 * which is the ratio "attempts per frame ÷ slots per frame" of the chain:
 *
 *     τ(p) = Σ_{i=0..m} p^i  ÷  Σ_{i=0..m} p^i·(W_i + 1)/2
 *
 * (stage i is visited with probability p^i and lasts (W_i − 1)/2 countdown
 * slots on average plus the transmission slot). We evaluate that sum form: it
 * equals Wu's closed form, has no 0/0 at p = ½, and also covers a CWmax + 1
 * that is not a power-of-two multiple of CWmin + 1. As m → ∞ it tends to
 * Bianchi's eq. (7), τ = 2(1−2p) / [(1−2p)(W+1) + pW(1−(2p)^m')].
 *
 * τ(p) falls as p rises and 1 − (1−τ)^(n−1) rises with τ, so
 * g(p) = p − [1 − (1 − τ(p))^(n−1)] is increasing with g(0) ≤ 0 ≤ g(1): one
 * root, found by a bracketed search on p in [0, 1] (bracketedRoot) — it
 * cannot diverge or leave the interval. One station never collides: p = 0, τ = 2/(W+1) exactly.
 */

/** Attempt probability τ(p) per generic slot, for CWmin, CWmax and a retry limit of `retryLimit` attempts (m = retryLimit − 1). */
export function attemptProbability(p: number, cwMin: number, cwMax: number, retryLimit: number): number {
  const m = retryLimit - 1;
  const wMax = cwMax + 1;
  let w = cwMin + 1;
  let pi = 1; // p^i
  let attempts = 0; // Σ p^i
  let slots = 0; // Σ p^i (W_i + 1)/2
  for (let i = 0; i <= m; i++) {
    if (w >= wMax) {
      // Stages i … m all use CWmax + 1: their weights form a geometric series.
      const tail = pi * geometricSum(p, m - i + 1);
      attempts += tail;
      slots += (tail * (wMax + 1)) / 2;
      break;
    }
    attempts += pi;
    slots += (pi * (w + 1)) / 2;
    pi *= p;
    w *= 2;
  }
  return attempts / slots;
}

/** 1 + p + … + p^(k−1). */
function geometricSum(p: number, k: number): number {
  return p >= 1 ? k : (1 - Math.pow(p, k)) / (1 - p);
}

export interface FixedPoint {
  /** Attempt probability per generic slot. */
  readonly tau: number;
  /** Conditional collision probability of an attempt. */
  readonly p: number;
}

/** Root-finder iteration cap: Illinois needs about 10 on these curves; bisection alone 60. */
const ROOT_STEPS_MAX = 100;
/** The bracket on p is narrowed to this width. */
const P_TOLERANCE = 1e-14;
const FIXED_POINT_CACHE_LIMIT = 512;
const fixedPointCache = new Map<string, FixedPoint>();

/** The (τ, p) fixed point for n identical stations; memoised. Inputs are assumed already checked. */
export function fixedPoint(stations: number, cwMin: number, cwMax: number, retryLimit: number): FixedPoint {
  const key = `${stations}|${cwMin}|${cwMax}|${retryLimit}`;
  const hit = fixedPointCache.get(key);
  if (hit !== undefined) return hit;
  const result = solveFixedPoint(stations, cwMin, cwMax, retryLimit);
  if (fixedPointCache.size >= FIXED_POINT_CACHE_LIMIT) {
    fixedPointCache.delete(fixedPointCache.keys().next().value as string);
  }
  fixedPointCache.set(key, result);
  return result;
}

function solveFixedPoint(stations: number, cwMin: number, cwMax: number, retryLimit: number): FixedPoint {
  if (stations === 1) return { tau: attemptProbability(0, cwMin, cwMax, retryLimit), p: 0 };
  const others = stations - 1;
  const g = (p: number): number => p - (1 - Math.pow(1 - attemptProbability(p, cwMin, cwMax, retryLimit), others));
  const p = bracketedRoot(g, 0, g(0), 1, g(1));
  return { tau: attemptProbability(p, cwMin, cwMax, retryLimit), p };
}

/**
 * Root of an increasing g on [lo, hi] with g(lo) ≤ 0 ≤ g(hi): regula falsi
 * with the Illinois modification (M. Dowell and P. Jarratt, BIT 11, 1971),
 * which keeps the bracket — so it cannot leave [lo, hi] — and converges
 * superlinearly; a bisection step is taken whenever the secant point fails
 * to shrink the bracket by half, and the iterations are capped. It stops
 * when the bracket is narrower than `tolerance`, or at a secant point where
 * |g| ≤ `gTolerance`.
 */
export function bracketedRoot(g: (x: number) => number, lo: number, gLo: number, hi: number, gHi: number, tolerance: number = P_TOLERANCE, gTolerance: number = 0): number {
  if (gLo >= 0) return lo;
  if (gHi <= 0) return hi;
  let side = 0;
  for (let step = 0; step < ROOT_STEPS_MAX && hi - lo > tolerance; step++) {
    const width = hi - lo;
    let x = (lo * gHi - hi * gLo) / (gHi - gLo);
    if (!(x > lo && x < hi)) x = (lo + hi) / 2;
    const gx = g(x);
    if (Math.abs(gx) <= gTolerance) return x;
    if (gx < 0) {
      lo = x;
      gLo = gx;
      if (side === -1) gHi /= 2; // Illinois: the same end moved twice, so halve the other end's value
      side = -1;
    } else {
      hi = x;
      gHi = gx;
      if (side === 1) gLo /= 2;
      side = 1;
    }
    if (hi - lo > width / 2) {
      // The secant step crept along one end; bisect to guarantee progress.
      const mid = (lo + hi) / 2;
      const gm = g(mid);
      if (gm === 0) return mid;
      if (gm < 0) {
        lo = mid;
        gLo = gm;
      } else {
        hi = mid;
        gHi = gm;
      }
      side = 0;
    }
  }
  return gLo === gHi ? lo : (lo * gHi - hi * gLo) / (gHi - gLo);
}
