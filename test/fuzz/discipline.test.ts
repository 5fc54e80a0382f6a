/**
 * Error discipline of every function the built bundle registers (DESIGN.md §4,
 * issue 7): whatever arrives — NaN, ±Infinity, 1e308, fractions where whole
 * numbers are due, booleans, text for numbers, ranges for scalars, omitted
 * arguments — the answer is a finite value of the declared shape or #VALUE! /
 * #N/A with a message that starts with the argument's name. Each call also
 * runs under a time guard (fuzzLib CALL_BOUND_MS: a guard against unbounded
 * loops, not a benchmark).
 *
 * Generic over dist/functions.json: a newly registered function is fuzzed
 * here without editing this file.
 */
import fc from "fast-check";
import { argsFor, bundle, fcOptions, hostileAny, invoke, metadata, plausibleArgsFor, violations, type FunctionMeta } from "./fuzzLib";

/** Property: every outcome obeys DESIGN.md §4; collects all problems so one failure shows the pattern. */
function obeys(fn: FunctionMeta, args: unknown[]): boolean {
  const problems = violations(fn, args, invoke(fn.id, args));
  if (problems.length > 0) throw new Error(problems.join("\n"));
  return true;
}

describe("every registered function keeps the error discipline (DESIGN.md §4)", () => {
  it("declares at least the PHY functions in functions.json and registers them all", () => {
    const declared = metadata.functions.map((f) => f.id);
    expect(declared).toEqual(expect.arrayContaining(["LINK", "RATE", "TXTIME", "PSDUFIT", "SENSITIVITY", "TXTIMEPARTS"]));
    expect(declared.filter((id) => !bundle.functions.has(id))).toEqual([]);
  });

  for (const fn of metadata.functions) {
    describe(fn.id, () => {
      it("answers plausible arguments with a finite value or a named refusal", () => {
        fc.assert(fc.property(plausibleArgsFor(fn), (args) => obeys(fn, args)), fcOptions(60));
      });

      it("answers a mix of plausible, hostile and omitted arguments with a finite value or a named refusal", () => {
        fc.assert(fc.property(argsFor(fn), (args) => obeys(fn, args)), fcOptions(150));
      });

      it("refuses each hostile argument in an otherwise plausible call by name, or answers", () => {
        const n = fn.parameters.length;
        fc.assert(
          fc.property(plausibleArgsFor(fn), fc.nat({ max: n - 1 }), hostileAny, (args, i, bad) => {
            const call = [...args];
            call[i] = bad;
            return obeys(fn, call);
          }),
          fcOptions(100),
        );
      });

      it("refuses a call with every argument omitted (null) by naming a required argument, or answers", () => {
        const args = fn.parameters.map(() => null);
        expect(violations(fn, args, invoke(fn.id, args))).toEqual([]);
      });

      it("refuses a call with no arguments at all by naming a required argument, or answers", () => {
        expect(violations(fn, [], invoke(fn.id, []))).toEqual([]);
      });

      it("does not mutate a range passed to it", () => {
        fc.assert(
          fc.property(plausibleArgsFor(fn), (args) => {
            const before = JSON.stringify(args);
            invoke(fn.id, args);
            return JSON.stringify(args) === before;
          }),
          fcOptions(30),
        );
      });
    });
  }
});
