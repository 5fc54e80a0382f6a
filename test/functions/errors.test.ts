/**
 * The spreadsheet layer's guard on results (src/functions/errors.ts,
 * DESIGN.md §4): a non-finite number from the core is a bug and must reach
 * the cell as #VALUE! with a message, never as NaN or Infinity.
 */
import { arrayCell, MESSAGE_MAX_CHARS, numberCell } from "../../src/functions/errors";
import { AirtallyError } from "../../src/core/errors";

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

describe("message length (issue 16)", () => {
  it("cuts a core message over MESSAGE_MAX_CHARS (400) to 399 characters and an ellipsis", () => {
    const e = hostErrorFrom(() => numberCell(() => { throw new AirtallyError("value", `link: ${"m".repeat(5000)}`); }));
    expect(e.message).toHaveLength(MESSAGE_MAX_CHARS);
    expect(e.message).toBe(`link: ${"m".repeat(MESSAGE_MAX_CHARS - 7)}…`);
  });

  it("cuts an internal error's text the same way", () => {
    const e = hostErrorFrom(() => numberCell(() => { throw new TypeError("z".repeat(1_000_000)); }));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toHaveLength(MESSAGE_MAX_CHARS);
    expect(e.message.startsWith("internal error: zzz")).toBe(true);
  });

  it("passes a message of exactly 400 characters unchanged", () => {
    const text = `link: ${"k".repeat(MESSAGE_MAX_CHARS - 6)}`;
    expect(hostErrorFrom(() => numberCell(() => { throw new AirtallyError("na", text); })).message).toBe(text);
  });
});
