/**
 * Assertions on the core's refusals (DESIGN.md §4): an AirtallyError of kind
 * "value" (#VALUE!) whose message says what was wrong.
 */
import { AirtallyError } from "../../src/core/errors";

function caughtFrom(fn: () => unknown, kind: "value" | "na" = "value"): AirtallyError {
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(AirtallyError);
  expect((caught as AirtallyError).kind).toBe(kind);
  return caught as AirtallyError;
}

/** A #VALUE! whose message matches the pattern, or equals the text exactly. */
export function expectValueError(fn: () => unknown, message: RegExp | string): void {
  const e = caughtFrom(fn);
  if (typeof message === "string") expect(e.message).toBe(message);
  else expect(e.message).toMatch(message);
}

/** A #VALUE! whose message starts with the argument's name and a colon (`packet_bytes: …`). */
export function expectValueErrorNaming(fn: () => unknown, argument: string): void {
  const message = caughtFrom(fn).message;
  // Compare the message itself when it does not name the argument, so the failure shows it.
  expect(message.startsWith(`${argument}:`) ? argument : message).toBe(argument);
}

/** A #N/A (valid inputs, no answer) whose message matches the pattern. */
export function expectNaError(fn: () => unknown, message: RegExp): void {
  expect(caughtFrom(fn, "na").message).toMatch(message);
}
