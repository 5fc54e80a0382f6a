/**
 * Argument checks shared by every core entry point. Spreadsheet hosts hand
 * over `null` for an omitted optional argument and sometimes `0` for an empty
 * referenced cell, so "missing" is decided here, once.
 */
import { invalid } from "./errors";

/** True when a spreadsheet left the argument empty. */
export function isMissing(value: unknown): boolean {
  return value === null || value === undefined || value === "";
}

/*
 * Each check below is a comparison and, only when it fails, a call to a
 * separate function that builds the message. Keeping the message code out of
 * the checks keeps them a few bytes of bytecode, so the JIT inlines a whole
 * chain of them into the caller (V8 inlines by a cumulative bytecode budget;
 * a check that carries its own template string spends it on the cold path).
 */

/** A finite number, else #VALUE! naming the argument. */
export function finiteNumber(name: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) notFinite(name, value);
  return value;
}

function notFinite(name: string, value: unknown): never {
  invalid(`${name}: expected a finite number, got ${describe(value)}`);
}

/** A finite number in [min, max]. */
export function numberInRange(name: string, value: unknown, min: number, max: number, unit = ""): number {
  const n = finiteNumber(name, value);
  if (n < min || n > max) outOfRange(name, n, min, max, unit);
  return n;
}

function outOfRange(name: string, n: number, min: number, max: number, unit: string): never {
  const u = unit ? ` ${unit}` : "";
  invalid(`${name}: must be between ${min} and ${max}${u}, got ${n}`);
}

/** A whole number in [min, max]. */
export function integerInRange(name: string, value: unknown, min: number, max: number, unit = ""): number {
  const n = numberInRange(name, value, min, max, unit);
  if (!Number.isInteger(n)) notWhole(name, n);
  return n;
}

function notWhole(name: string, n: number): never {
  invalid(`${name}: must be a whole number, got ${n}`);
}

/** The value, or `fallback` when the argument was left empty (null, undefined, ""). */
export function orDefault<T>(value: T | null | undefined | "", fallback: T): T {
  return isMissing(value) ? fallback : (value as T);
}

/**
 * Most characters of a user's text a message echoes (issue 16): longer text
 * is cut there and ends with "…", so a 1 000 000-character link gives a
 * message of a few hundred characters, not a million.
 */
export const ECHO_MAX_CHARS = 64;

/**
 * A fresh copy of short text that holds no reference to a larger string.
 * V8 represents a substring (slice, split, match) as a view into its parent,
 * so a short piece of a huge input kept in a message or a memo key would
 * keep the whole input alive; joining the characters builds a new string.
 */
export function detachedCopy(text: string): string {
  return text.split("").join("");
}

/** Text of at most `maxChars` characters: longer text is cut and ends with "…" (never between the halves of a surrogate pair). */
export function truncated(text: string, maxChars: number): string {
  if (text.length <= maxChars) return text;
  let head = text.slice(0, maxChars - 1);
  if (/[\uD800-\uDBFF]$/.test(head)) head = head.slice(0, -1);
  return `${head}…`;
}

/** User text in double quotes for a message: at most ECHO_MAX_CHARS characters inside the quotes, the last "…" when cut. */
export function quoted(text: string): string {
  return `"${detachedCopy(truncated(text, ECHO_MAX_CHARS))}"`;
}

/** Short description of a bad value for error messages. */
export function describe(value: unknown): string {
  if (value === null || value === undefined) return "an empty value";
  if (typeof value === "string") return quoted(value);
  if (typeof value === "number") return String(value);
  if (Array.isArray(value)) return "a range";
  return typeof value;
}
