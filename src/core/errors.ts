/**
 * Errors raised by the core. The spreadsheet layer maps `value` to #VALUE!
 * and `na` to #N/A (DESIGN.md §4); hosts show a message only on those two.
 * Every message names the argument and says what it accepts.
 */
export type ErrorKind = "value" | "na";

export class AirtallyError extends Error {
  readonly kind: ErrorKind;
  constructor(kind: ErrorKind, message: string) {
    super(message);
    this.name = "AirtallyError";
    this.kind = kind;
  }
}

/** Throw a #VALUE! error: wrong type, out of range, or forbidden by the standard. */
export function invalid(message: string): never {
  throw new AirtallyError("value", message);
}

/** Throw a #N/A error: the inputs are valid but no answer exists. */
export function noAnswer(message: string): never {
  throw new AirtallyError("na", message);
}
