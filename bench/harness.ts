/**
 * The measuring loop shared by every benchmark section.
 *
 * Every step — the inline-arithmetic baseline and the function under test
 * alike — is called across a real call boundary, as a host calls a custom
 * function: the loop's call site is made megamorphic before the first
 * measurement, so the JIT inlines no step into the loop. (A loop that inlined
 * its first few steps and then turned megamorphic would favour whichever was
 * measured first; the steps themselves are still optimised, with everything
 * they call inlined.) Results are summed into a local number inside the
 * loop, not a module variable, so no measurement pays for boxing a heap
 * number per call.
 */

/** Milliseconds per measurement batch (BENCH_MS, default 150). */
export const BATCH_MS = Number(process.env.BENCH_MS ?? 150);

type Step = (i: number) => unknown;

function measureLoop(step: Step, batchMs: number): { perSecond: number; checksum: number } {
  let checksum = 0;
  for (let i = 0; i < 20000; i++) {
    const v = step(i);
    checksum += typeof v === "number" ? v : 1;
  }
  let best = 0;
  for (let batch = 0; batch < 3; batch++) {
    let n = 0;
    const t0 = performance.now();
    let t = t0;
    while (t - t0 < batchMs) {
      for (let k = 0; k < 1000; k++, n++) {
        const v = step(n);
        checksum += typeof v === "number" ? v : 1;
      }
      t = performance.now();
    }
    best = Math.max(best, (n / (t - t0)) * 1000);
  }
  return { perSecond: best, checksum };
}

/** Checksums of every measurement, so the JIT cannot drop the work. */
let checksums = 0;

/** Five unrelated steps through the loop make its call site megamorphic before anything is measured. */
function makeCallSiteMegamorphic(): void {
  const warm: Step[] = [(i) => i + 1, (i) => i * 2, (i) => i - 3, (i) => i / 4, (i) => -i, (i) => i & 7];
  for (const w of warm) measureLoop(w, 1);
}
makeCallSiteMegamorphic();

/**
 * Calls per second of `step(i)`: warm-up, then three batches of BATCH_MS;
 * the best batch counts (the least disturbed by other processes).
 */
export function callsPerSecond(step: Step, batchMs = BATCH_MS): number {
  const { perSecond, checksum } = measureLoop(step, batchMs);
  checksums += Number.isFinite(checksum) ? 1 : 0;
  return perSecond;
}

/**
 * Several steps measured in interleaved rounds (a, b, c, a, b, c, …), so a
 * slow spell of the machine hits a whole round rather than one step; returns
 * calls/s per round, rounds × steps.
 */
export function interleaved(steps: readonly Step[], rounds = 3): number[][] {
  const out: number[][] = [];
  for (let r = 0; r < rounds; r++) out.push(steps.map((s) => callsPerSecond(s)));
  return out;
}

export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * The ratio of step `k` to step `base` over interleaved rounds: the median of
 * the per-round ratios. Within a round both ran seconds apart, under the same
 * machine conditions; the median drops the round a disturbance hit.
 */
export function medianRatio(rounds: readonly number[][], k: number, base: number): number {
  return median(rounds.map((r) => r[k] / r[base]));
}

/** How many measurements ran with a finite checksum (printed at the end as a sanity line). */
export function measured(): number {
  return checksums;
}

export function fmtRate(r: number): string {
  return r >= 1e6 ? `${(r / 1e6).toFixed(2)} M/s` : r >= 1e3 ? `${(r / 1e3).toFixed(1)} k/s` : `${r.toFixed(0)} /s`;
}
export function pad(s: string, n: number): string {
  return s.length >= n ? s : s + " ".repeat(n - s.length);
}
export function lpad(s: string, n: number): string {
  return s.length >= n ? s : " ".repeat(n - s.length) + s;
}
