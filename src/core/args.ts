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

/** Short description of a bad value for error messages. */
export function describe(value: unknown): string {
  if (value === null || value === undefined) return "an empty value";
  if (typeof value === "string") return `"${value.length > 40 ? value.slice(0, 40) + "…" : value}"`;
  if (typeof value === "number") return String(value);
  if (Array.isArray(value)) return "a range";
  return typeof value;
}
