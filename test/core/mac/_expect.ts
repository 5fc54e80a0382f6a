import { AirtallyError } from "../../../src/core/errors";

/** Asserts a #VALUE! AirtallyError whose message matches. */
export function expectValueError(fn: () => unknown, message: RegExp): void {
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(AirtallyError);
  expect((caught as AirtallyError).kind).toBe("value");
  expect((caught as AirtallyError).message).toMatch(message);
}
