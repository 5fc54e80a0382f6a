/**
 * Argument helpers shared by the RF and site-budget functions: an omitted
 * optional argument (null, undefined, "") takes its catalog default
 * (DESIGN.md §2, §4); anything else must be a finite number in range.
 */
import { finiteNumber, isMissing } from "../args";
import { invalid } from "../errors";

/**
 * The refusal of every check below, out of line: the checks stay a comparison
 * and a call, small enough for the JIT to inline a chain of them (see
 * src/core/args.ts). The message is only built when a check fails.
 */
function refuse(name: string, requirement: string, value: number): never {
  invalid(`${name}: must be ${requirement}, got ${value}`);
}
function withUnit(unit: string): string {
  return unit ? " " + unit : "";
}
function tooLarge(name: string, max: number, unit: string, value: number): never {
  refuse(name, `at most ${max}${withUnit(unit)}`, value);
}
function tooSmall(name: string, min: number, unit: string, value: number): never {
  refuse(name, `at least ${min}${withUnit(unit)}`, value);
}
function notPositive(name: string, unit: string, value: number): never {
  refuse(name, `greater than 0${withUnit(unit)}`, value);
}
function negative(name: string, unit: string, value: number): never {
  refuse(name, `0${withUnit(unit)} or more`, value);
}

/** A finite number, or `fallback` when the argument was left empty. */
export function optionalNumber(name: string, value: unknown, fallback: number): number {
  return isMissing(value) ? fallback : finiteNumber(name, value);
}

/**
 * A finite number no larger than `max`. Bounds are generous (far beyond any
 * real site) and exist so that no input can overflow the arithmetic into
 * Infinity or underflow it to 0 (DESIGN.md §4: never a non-finite result).
 */
export function atMost(name: string, value: number, max: number, unit: string): number {
  if (value > max) tooLarge(name, max, unit, value);
  return value;
}

/** A finite number ≥ `min` (min > 0): keeps logarithms and divisions away from underflow. */
export function atLeast(name: string, value: number, min: number, unit: string): number {
  if (!(value >= min)) tooSmall(name, min, unit, value);
  return value;
}

/** A finite number > 0. */
export function positive(name: string, value: number, unit: string): number {
  if (!(value > 0)) notPositive(name, unit, value);
  return value;
}

/** A finite number ≥ 0. */
export function nonNegative(name: string, value: number, unit: string): number {
  if (!(value >= 0)) negative(name, unit, value);
  return value;
}

/** A whole number ≥ 0. */
export function wholeNonNegative(name: string, value: number): number {
  if (!Number.isInteger(value) || value < 0) refuse(name, "a whole number 0 or more", value);
  return value;
}

/**
 * ceil() of a ratio after rounding away binary noise at 1e-9, so that e.g.
 * 1.2 ÷ (0.7 − 0.1) = 2.0000000000000004 counts as 2, not 3.
 */
export function ceilRatio(ratio: number): number {
  return Math.ceil(Math.round(ratio * 1e9) / 1e9);
}
