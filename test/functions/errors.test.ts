/**
 * The spreadsheet layer's guard on results (src/functions/errors.ts,
 * DESIGN.md §4): a non-finite number from the core is a bug and must reach
 * the cell as #VALUE! with a message, never as NaN or Infinity.
 */
import { arrayCell, numberCell } from "../../src/functions/errors";

class HostError extends Error {
  constructor(
    readonly code: string,
    message?: string,
  ) {
    super(message);
  }
}

beforeAll(() => {
  // The only global the bundle needs, as a host provides it.
  (globalThis as Record<string, unknown>).CustomFunctions = {
    Error: HostError,
    ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A" },
  };
});

function hostErrorFrom(fn: () => unknown): HostError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(HostError);
    return e as HostError;
  }
  throw new Error("expected a refusal");
}

describe("numberCell", () => {
  it.each([NaN, Infinity, -Infinity])("turns a non-finite result (%p) into #VALUE! with a message", (bad) => {
    const e = hostErrorFrom(() => numberCell(() => bad));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toMatch(/not a finite number/);
  });

  it.each([0, -0, 1, -1.5, 5e-324, Number.MAX_VALUE, -Number.MAX_VALUE])("passes a finite result (%p) through unchanged", (ok) => {
    expect(Object.is(numberCell(() => ok), ok)).toBe(true);
  });
});

describe("arrayCell", () => {
  it("refuses a spill with a non-finite number in any row", () => {
    const e = hostErrorFrom(() => arrayCell(() => [["a", 1], ["b", NaN]]));
    expect(e.code).toBe("#VALUE!");
  });

  it("passes text and finite numbers through", () => {
    expect(arrayCell(() => [["a", 1], ["b", -2.5]])).toEqual([["a", 1], ["b", -2.5]]);
  });
});
