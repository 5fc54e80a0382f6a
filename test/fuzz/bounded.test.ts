/**
 * No input may make a function run without bound (issue 7: solver iterations
 * capped, huge counts refused). This is a GUARD, not a benchmark: every call
 * must finish within CALL_BOUND_MS (50 ms, two orders of magnitude above a
 * closed-form call, re-timed before it counts — see fuzzLib), which only an
 * unbounded loop, a runaway solver or a count the function should have
 * refused can exceed. Speed is measured by `npm run bench`, never here.
 *
 * Inputs are biased to the expensive end: the most stations, the largest
 * PSDU and durations, the longest text, many classes, big ranges, and the
 * numbers just past every limit.
 */
import fc from "fast-check";
import { CALL_BOUND_MS, fcOptions, hostileAny, invoke, metadata, plausible, plausibleArgsFor, validLinkText, violations, type FunctionMeta, type ParamMeta } from "./fuzzLib";

const tokens = ["HE", "MCS11", "8SS", "160MHz", "GI0.8", "5GHz", "LDPC", "x", "MCS", "HE"];

/** Values at the expensive end, by parameter name; other names fall back to huge or edge numbers. */
const HEAVY: Record<string, fc.Arbitrary<unknown>> = {
  link: fc.oneof(validLinkText, fc.nat({ max: 9 }).map((k) => Array.from({ length: 20000 }, (_, i) => tokens[(i + k) % tokens.length]).join(" "))),
  stations: fc.constantFrom(1000, 999, 1001, 1e6, 1e308),
  packet_bytes: fc.constantFrom(1, 2304, 2296, 1e9),
  psdu_bytes: fc.constantFrom(0, 4095, 65535, 1048575, 4194303, 6500631, 6500632, 1e12),
  duration_us: fc.constantFrom(0, 5484, 1e6, 1e9, 1e300),
  mpdus: fc.constantFrom("auto", 1, 64, 256, 1024, 1025, 65536, 1e9),
  count: fc.constantFrom(1, 64, 256, 1024, 1e6, 1e9),
  cwmin: fc.constantFrom(0, 1, 32767),
  cwmax: fc.constantFrom(0, 1, 1023, 32767),
  retry_limit: fc.constantFrom(1, 255, 256, 1e9),
  mpdu_loss: fc.constantFrom(0, 0.5, 0.99, 0.999999, 1 - 1e-12),
  mac_options: fc.constantFrom("AMSDU=1000", "BA=1024 AMPDU=7 TXOP=8160", "RETRY=255", "CWMIN=32767 CWMAX=32767", "x ".repeat(5000)),
  access_list: fc.nat({ max: 3 }).map((k) => Array.from({ length: 16 + k }, (_, i) => [["BK", "BE", "VI", "VO"][i % 4]])),
  counts: fc.nat({ max: 3 }).map((k) => Array.from({ length: 16 + k }, () => [62])),
  links: fc.constantFrom(1, 200, 1000).chain((n) => fc.array(validLinkText, { minLength: n, maxLength: n }).map((xs) => xs.map((x) => [x]))),
  demands_mbps: fc.constantFrom(1, 200, 1000).map((n) => Array.from({ length: n }, () => [5])),
  ssids: fc.constantFrom(1, 1000, 1e9),
  aps_heard: fc.constantFrom(1, 1000, 1e9),
  floors: fc.constantFrom(0, 1000, 1e9),
  area_m2: fc.constantFrom(1e12, 1e300),
  reach_m: fc.constantFrom(0.001, 1e-300),
  distance_m: fc.constantFrom(1e-300, 1e300),
  total_share: fc.constantFrom(1e6, 1e300),
};

function heavyArgs(fn: FunctionMeta): fc.Arbitrary<unknown[]> {
  return fc.tuple(
    ...(fn.parameters as ParamMeta[]).map((p) =>
      fc.oneof({ weight: 3, arbitrary: HEAVY[p.name] ?? fc.constantFrom(1e308, -1e308, 2 ** 53, 0.5) }, { weight: 3, arbitrary: plausible(p) }, { weight: 1, arbitrary: hostileAny }),
    ),
  );
}

describe(`every call finishes within ${CALL_BOUND_MS} ms (a guard against unbounded work, not a benchmark)`, () => {
  for (const fn of metadata.functions) {
    it(`${fn.id} never runs longer than the bound, whatever the input`, () => {
      let worst = { ms: 0, args: [] as unknown[] };
      fc.assert(
        fc.property(fc.oneof(heavyArgs(fn), plausibleArgsFor(fn)), (args) => {
          const out = invoke(fn.id, args);
          if (out.ms > worst.ms) worst = { ms: out.ms, args };
          // The same call must also keep the error discipline: a guard that only times would hide a refusal without a name.
          const problems = violations(fn, args, out);
          if (problems.length > 0) throw new Error(problems.join("\n"));
          return true;
        }),
        fcOptions(60),
      );
      expect(worst.ms).toBeLessThan(CALL_BOUND_MS);
    });
  }
});
