/** Cell values and Excel's coercion rules between them. */
import { MAX_COL, MAX_ROW } from "./ast";

export interface CellError {
  error: string;
  message?: string;
}
export type Value = number | string | boolean | null | CellError;
export type Matrix = Value[][];

/** A reference to a rectangle of one sheet (the sheet is the engine's own object). */
export interface Ref {
  ref: true;
  sheet: unknown;
  top: number;
  left: number;
  bottom: number;
  right: number;
}
export type EvalValue = Value | Matrix | Ref;

export function isCellError(v: unknown): v is CellError {
  return typeof v === "object" && v !== null && typeof (v as CellError).error === "string" && !Array.isArray(v);
}
export function isRef(v: unknown): v is Ref {
  return typeof v === "object" && v !== null && (v as Ref).ref === true;
}
export function isMatrix(v: unknown): v is Matrix {
  return Array.isArray(v);
}

export const err = (code: string, message?: string): CellError => (message ? { error: code, message } : { error: code });
export const VALUE = (message?: string) => err("#VALUE!", message);
export const NA = (message?: string) => err("#N/A", message);
export const NUM = (message?: string) => err("#NUM!", message);
export const DIV0 = (message?: string) => err("#DIV/0!", message);

export function clampArea(top: number, left: number, bottom: number, right: number): boolean {
  return top >= 1 && left >= 1 && bottom <= MAX_ROW && right <= MAX_COL && top <= bottom && left <= right;
}

/** Text → number as Excel reads typed text: "12", " 1.5e3 ", "1,234.5", "50%", "-3". */
export function parseNumberText(s: string): number | undefined {
  const t = s.trim();
  if (t === "") return undefined;
  let m = /^([+-]?)(\d{1,3}(?:,\d{3})+|\d*)(\.\d*)?(?:[eE]([+-]?\d+))?(%?)$/.exec(t);
  if (!m || (m[2] === "" && (m[3] === undefined || m[3] === "."))) {
    m = null;
    return undefined;
  }
  let n = Number(`${m[1]}${m[2].replace(/,/g, "") || "0"}${m[3] ?? ""}${m[4] !== undefined ? `e${m[4]}` : ""}`);
  if (m[5]) n /= 100;
  return Number.isFinite(n) ? n : undefined;
}

export function toNumber(v: Value): number | CellError {
  if (typeof v === "number") return v;
  if (v === null) return 0;
  if (typeof v === "boolean") return v ? 1 : 0;
  if (typeof v === "string") {
    const n = parseNumberText(v);
    return n === undefined ? VALUE(`${JSON.stringify(v.length > 40 ? v.slice(0, 40) + "…" : v)} is not a number`) : n;
  }
  return v;
}

/**
 * A number as it joins text (General format): plain digits from 1E-14 up to
 * 1E+16, rounded to 15 significant digits (integers below 1E+16 exactly),
 * scientific outside that range with a two-digit exponent ("1E-15",
 * "1E+20"). The plain range and the digits are what the reference engine
 * writes (checked in test/cli/libreoffice.test.ts); it writes three exponent
 * digits ("1E+020") where the spreadsheet host writes two.
 */
export function numberText(n: number): string {
  if (n === 0) return "0";
  const a = Math.abs(n);
  if (Number.isInteger(n) && a < 1e16) return String(n);
  const r = Number(n.toPrecision(15));
  if (a >= 1e-14 && a < 1e16) {
    if (Math.abs(r) >= 1e-6) return String(r);
    const digits = Math.min(100, 14 - Math.floor(Math.log10(Math.abs(r))));
    return r.toFixed(digits).replace(/\.?0+$/, "");
  }
  const e = /^(-?[\d.]+)e([+-])(\d+)$/.exec(r.toExponential())!;
  return `${e[1]}E${e[2]}${e[3].padStart(2, "0")}`;
}

export function toText(v: Value): string | CellError {
  if (typeof v === "string") return v;
  if (v === null) return "";
  if (typeof v === "number") return numberText(v);
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return v;
}

export function toBoolean(v: Value): boolean | CellError {
  if (typeof v === "boolean") return v;
  if (typeof v === "number") return v !== 0;
  if (v === null) return false;
  if (typeof v === "string") {
    if (/^true$/i.test(v)) return true;
    if (/^false$/i.test(v)) return false;
    return VALUE(`${JSON.stringify(v)} is not TRUE or FALSE`);
  }
  return v;
}

/** Excel's ordering for comparisons: numbers < text < logical; text without case. Blank is 0 or "" to match the other side. */
export function compareValues(a: Value, b: Value): number {
  if (a === null) a = typeof b === "string" ? "" : typeof b === "boolean" ? false : 0;
  if (b === null) b = typeof a === "string" ? "" : typeof a === "boolean" ? false : 0;
  const rank = (v: Value) => (typeof v === "number" ? 0 : typeof v === "string" ? 1 : 2);
  const ra = rank(a);
  const rb = rank(b);
  if (ra !== rb) return ra - rb;
  if (typeof a === "number" && typeof b === "number") return a < b ? -1 : a > b ? 1 : 0;
  if (typeof a === "string" && typeof b === "string") {
    const x = a.toLowerCase();
    const y = b.toLowerCase();
    return x < y ? -1 : x > y ? 1 : 0;
  }
  return Number(a) - Number(b);
}
