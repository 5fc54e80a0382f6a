/**
 * Maps core errors to spreadsheet errors (DESIGN.md §4). Hosts show a message
 * only on #VALUE! and #N/A, so every refusal uses one of the two.
 *
 * `CustomFunctions` is read when an error is raised, never at load time, so
 * the bundle loads in a bare context with only that global defined.
 */
import { AirtallyError } from "../core/errors";
import { truncated } from "../core/args";

/**
 * Longest message a cell carries, characters (issue 16). The core already
 * echoes at most ECHO_MAX_CHARS (64) characters of a user's text; this bound
 * covers the rest (a message wrapped by a range's "item n:" prefix, an
 * internal error's text). The longest refusal written today is about 330.
 */
export const MESSAGE_MAX_CHARS = 400;

declare const CustomFunctions: {
  Error: new (code: string, message?: string) => Error;
  ErrorCode: { invalidValue: string; notAvailable: string };
};

/** The spreadsheet error for anything a core call threw. */
export function toSpreadsheetError(e: unknown): Error {
  if (e instanceof AirtallyError) {
    const code = e.kind === "na" ? CustomFunctions.ErrorCode.notAvailable : CustomFunctions.ErrorCode.invalidValue;
    return new CustomFunctions.Error(code, truncated(e.message, MESSAGE_MAX_CHARS));
  }
  // A bug, not bad input: still answer with #VALUE! and a message rather than a host-specific crash.
  const message = e instanceof Error ? e.message : String(e);
  return new CustomFunctions.Error(CustomFunctions.ErrorCode.invalidValue, truncated(`internal error: ${message}`, MESSAGE_MAX_CHARS));
}

/** A number the core returned; a non-finite one is a bug and becomes #VALUE!, never a cell showing NaN. */
function finiteResult(value: number): number {
  // x − x is 0 for every finite number and NaN for NaN and ±Infinity. Written so rather than
  // Number.isFinite because the JIT knows nothing of what `call()` returned and, measured in
  // `npm run bench`, the builtin cost the cheapest functions (COVERAGEAPS) about 15 % per call.
  if (!(value - value === 0)) notFinite();
  return value;
}

/** Out of line, so finiteResult stays a comparison the JIT inlines into every wrapper (src/core/args.ts). */
function notFinite(): never {
  throw new AirtallyError("value", "internal error: the result is not a finite number");
}

/** Run a core call for a numeric cell. */
export function numberCell(call: () => number): number {
  try {
    return finiteResult(call());
  } catch (e) {
    throw toSpreadsheetError(e);
  }
}

/** Run a core call for a text cell. */
export function textCell(call: () => string): string {
  try {
    return call();
  } catch (e) {
    throw toSpreadsheetError(e);
  }
}

/** Run a core call for a spilled array; every numeric entry must be finite. */
export function arrayCell(call: () => (string | number)[][]): (string | number)[][] {
  try {
    const rows = call();
    for (const row of rows) for (const v of row) if (typeof v === "number") finiteResult(v);
    return rows;
  } catch (e) {
    throw toSpreadsheetError(e);
  }
}
