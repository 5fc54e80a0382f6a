/**
 * Argument helpers shared by the RF and site-budget functions: an omitted
 * optional argument (null, undefined, "") takes its catalog default
 * (DESIGN.md §2, §4); anything else must be a finite number in range.
 */
import { finiteNumber, isMissing } from "../args";
import { invalid } from "../errors";

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
  if (value > max) invalid(`${name}: must be at most ${max}${unit ? " " + unit : ""}, got ${value}`);
  return value;
}

/** A finite number ≥ `min` (min > 0): keeps logarithms and divisions away from underflow. */
export function atLeast(name: string, value: number, min: number, unit: string): number {
  if (!(value >= min)) invalid(`${name}: must be at least ${min}${unit ? " " + unit : ""}, got ${value}`);
  return value;
}

/** A finite number > 0. */
export function positive(name: string, value: number, unit: string): number {
  if (!(value > 0)) invalid(`${name}: must be greater than 0${unit ? " " + unit : ""}, got ${value}`);
  return value;
}

/** A finite number ≥ 0. */
export function nonNegative(name: string, value: number, unit: string): number {
  if (!(value >= 0)) invalid(`${name}: must be 0${unit ? " " + unit : ""} or more, got ${value}`);
  return value;
}

/** A whole number ≥ 0. */
export function wholeNonNegative(name: string, value: number): number {
  if (!Number.isInteger(value) || value < 0) invalid(`${name}: must be a whole number 0 or more, got ${value}`);
  return value;
}

/**
 * ceil() of a ratio after rounding away binary noise at 1e-9, so that e.g.
 * 1.2 ÷ (0.7 − 0.1) = 2.0000000000000004 counts as 2, not 3.
 */
export function ceilRatio(ratio: number): number {
  return Math.ceil(Math.round(ratio * 1e9) / 1e9);
}
