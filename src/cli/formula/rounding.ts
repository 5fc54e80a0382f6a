/**
 * Rounding as spreadsheets do it on decimal values, written by hand because
 * @formulajs/formulajs (like a naive `Math.ceil(x * 10 ** d) / 10 ** d`)
 * rounds the binary value: ROUNDUP(0.1+0.2, 1) gives 0.4 there, where the
 * reference engine gives 0.3, and ROUNDDOWN(4.35*100, 0) gives 434 for 435.
 * Two steps make it exact: the argument is first taken to 15 significant
 * digits (the precision spreadsheets display and compare at), then scaled by
 * a power of ten through the decimal text (`Number("1.005e2")` is exactly
 * 100.5), so boundaries (ROUNDUP(2,0) = 2, ROUND(1.005,2) = 1.01) fall where
 * the decimal value says.
 */
import { err, type Value } from "./values";

/** The value at 15 significant digits (removes binary noise such as 0.30000000000000004). */
export function snap15(x: number): number {
  return x === 0 || !Number.isFinite(x) ? x : Number(x.toPrecision(15));
}

/** x × 10^d through the decimal text, exact for decimal inputs. */
function shift(x: number, d: number): number {
  const [m, e] = String(x).split("e");
  return Number(`${m}e${Number(e ?? 0) + d}`);
}

type Mode = "nearest" | "up" | "down";

function integerBy(x: number, mode: Mode): number {
  return mode === "up" ? Math.ceil(x) : mode === "down" ? Math.floor(x) : Math.round(x);
}

/** ROUND / ROUNDUP / ROUNDDOWN: half away from zero, away from zero, toward zero; d may be negative. */
export function roundDigits(x: number, digits: number, mode: Mode): number {
  const d = Math.trunc(digits);
  const a = snap15(Math.abs(x));
  const r = shift(integerBy(snap15(shift(a, d)), mode), -d);
  return x < 0 ? -r : r === 0 ? 0 : r;
}

/** Multiples of `step` (> 0) by a rounding mode on |x|, sign kept. */
function toMultiple(x: number, step: number, mode: Mode): number {
  const q = snap15(Math.abs(x) / step);
  const r = snap15(integerBy(q, mode) * step);
  return x < 0 ? -r : r === 0 ? 0 : r;
}

/** CEILING(x, significance): up to a multiple; a negative x with a negative significance rounds away from zero. */
export function ceiling(x: number, sig: number): Value {
  if (sig === 0 || x === 0) return 0;
  if (x > 0 && sig < 0) return err("#NUM!", "CEILING: a positive number needs a positive significance");
  const step = Math.abs(sig);
  if (x < 0 && sig > 0) return toMultiple(x, step, "down"); // toward +∞ is toward zero for negatives
  return toMultiple(x, step, "up");
}

/** FLOOR(x, significance): down to a multiple; a negative x with a negative significance rounds toward zero. */
export function floor(x: number, sig: number): Value {
  if (sig === 0) return x === 0 ? 0 : err("#DIV/0!", "FLOOR: significance 0");
  if (x === 0) return 0;
  if (x > 0 && sig < 0) return err("#NUM!", "FLOOR: a positive number needs a positive significance");
  const step = Math.abs(sig);
  if (x < 0 && sig > 0) return toMultiple(x, step, "up"); // toward −∞ is away from zero for negatives
  return toMultiple(x, step, "down");
}

/** CEILING.MATH(x, significance = 1, mode = 0): toward +∞; mode ≠ 0 sends negatives away from zero. */
export function ceilingMath(x: number, sig = 1, mode = 0): Value {
  const step = Math.abs(sig);
  if (step === 0 || x === 0) return 0;
  return x > 0 ? toMultiple(x, step, "up") : toMultiple(x, step, mode !== 0 ? "up" : "down");
}

/** FLOOR.MATH(x, significance = 1, mode = 0): toward −∞; mode ≠ 0 sends negatives toward zero. */
export function floorMath(x: number, sig = 1, mode = 0): Value {
  const step = Math.abs(sig);
  if (step === 0 || x === 0) return 0;
  return x > 0 ? toMultiple(x, step, "down") : toMultiple(x, step, mode !== 0 ? "down" : "up");
}

/** MROUND(x, multiple): nearest multiple, halves away from zero; opposite signs are #NUM!. */
export function mround(x: number, m: number): Value {
  if (m === 0 || x === 0) return 0;
  if (x > 0 !== m > 0) return err("#NUM!", "MROUND: the number and the multiple have opposite signs");
  return toMultiple(x, Math.abs(m), "nearest");
}
