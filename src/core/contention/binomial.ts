/**
 * The binomial law that both contention models use for how many stations
 * took part in a collision (aifsZones.ts colliderCounts, saturation.ts
 * colliderCountLaw).
 */

/**
 * Weights of Binomial(N, h) on k = lo … lo + weights.length − 1, renormalised
 * over k ≥ from (from ≤ N, 0 < h < 1). They are built from the mode (at
 * least `from`) both ways by the ratio of successive terms, and cut where a
 * term falls below 1e-13 of the mode. Written into `into` when it is long
 * enough.
 */
export function binomialWeights(N: number, h: number, from: number, into: Float64Array): { readonly lo: number; readonly weights: Float64Array } {
  const mode = Math.max(from, Math.min(N, Math.floor((N + 1) * h)));
  const ratio = h / (1 - h);
  let lo = mode;
  for (let j = mode, v = 1; j > from; j--) {
    v *= j / (N - j + 1) / ratio; // P(j − 1) ÷ P(j)
    if (v <= 1e-13) break;
    lo = j - 1;
  }
  let hi = mode;
  for (let j = mode, v = 1; j < N; j++) {
    v *= ((N - j) / (j + 1)) * ratio; // P(j + 1) ÷ P(j)
    if (v <= 1e-13) break;
    hi = j + 1;
  }
  const w = hi - lo + 1 <= into.length ? into.subarray(0, hi - lo + 1) : new Float64Array(hi - lo + 1);
  w[mode - lo] = 1;
  for (let j = mode, v = 1; j > lo; j--) {
    v *= j / (N - j + 1) / ratio;
    w[j - 1 - lo] = v;
  }
  for (let j = mode, v = 1; j < hi; j++) {
    v *= ((N - j) / (j + 1)) * ratio;
    w[j + 1 - lo] = v;
  }
  let total = 0;
  for (let i = 0; i < w.length; i++) total += w[i];
  for (let i = 0; i < w.length; i++) w[i] /= total;
  return { lo, weights: w };
}
