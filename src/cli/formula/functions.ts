/**
 * The native function table. Scalar functions (rounding, text, math, dates)
 * come from @formulajs/formulajs (MIT), called with arguments coerced by
 * Excel's rules and lifted over arrays. Written here by hand is only what
 * that library cannot do as Excel does: functions that read references
 * (SUMIF/COUNTIFS… criteria over ranges, INDEX returning a reference,
 * MATCH/XLOOKUP/VLOOKUP, aggregates that must propagate errors and skip text
 * only inside ranges), lazy ones (IF, IFS, IFERROR, IFNA, SWITCH, CHOOSE,
 * LET) and the dynamic-array ones formulajs lacks (SEQUENCE, FILTER,
 * XLOOKUP's modes). DEVELOPERS.md lists which is which.
 */
import * as formulajs from "@formulajs/formulajs";
import type { Ast } from "./ast";
import { char, code, rept, unichar, unicode } from "./characters";
import { ceiling, ceilingMath, floor, floorMath, mround, roundDigits } from "./rounding";
import { Evaluator, finite, lift1, MAX_TEXT, type Env, type FunctionImpl, type Host } from "./evaluate";
import { compareValues, err, isCellError, isMatrix, isRef, NA, parseNumberText, toBoolean, toNumber, toText, VALUE, type CellError, type EvalValue, type Matrix, type Ref, type Value } from "./values";

type Fns = Map<string, FunctionImpl>;

const fj = formulajs as unknown as Record<string, (...a: unknown[]) => unknown>;

// ---------------------------------------------------------------- helpers

function arity(name: string, args: Ast[], min: number, max: number): CellError | undefined {
  if (args.length < min || args.length > max) {
    const want = min === max ? `${min}` : max === Infinity ? `at least ${min}` : `${min} to ${max}`;
    return VALUE(`${name} takes ${want} arguments, got ${args.length}`);
  }
  return undefined;
}

const isOmitted = (a: Ast | undefined) => a === undefined || a.kind === "blank";

/** Excel's serial day number (1900 date system) of a calendar date. */
export function serialOfDate(y: number, m: number, d: number): number {
  return Math.round((Date.UTC(y, m, d) - Date.UTC(1899, 11, 30)) / 86400000);
}

/** A formulajs result as a cell value: its Error objects carry Excel's code as the message; Dates become serials. */
function fromLibrary(r: unknown): Value | Matrix {
  if (isCellError(r)) return r;
  if (r instanceof Error) return EXCEL_ERRORS.has(r.message) ? err(r.message) : VALUE(`the function failed: ${r.message}`);
  if (r instanceof Date) return serialOfDate(r.getFullYear(), r.getMonth(), r.getDate()) + (r.getHours() * 3600 + r.getMinutes() * 60 + r.getSeconds()) / 86400;
  if (typeof r === "number") return finite(r);
  if (typeof r === "string" || typeof r === "boolean") return r;
  if (r === null || r === undefined) return 0;
  if (Array.isArray(r)) return (r as unknown[]).map((row) => (Array.isArray(row) ? row : [row]).map((x) => fromLibrary(x) as Value));
  return VALUE("the function returned an unknown value");
}

/** The error codes a cell can hold in a file; anything else a library produces becomes #VALUE! with its text. */
export const EXCEL_ERRORS = new Set(["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A", "#GETTING_DATA", "#SPILL!", "#CALC!"]);

type Kind = "n" | "s" | "b" | "a";

/**
 * A scalar library function: each argument coerced to its kind (n number, s
 * text, b logical, a as is), arrays and multi-cell ranges lifted element by
 * element (so ROUND(A1:A3,0) is an array, as in Excel 365).
 */
function scalarFn(name: string, kinds: Kind[], minArgs: number, impl: (...a: unknown[]) => unknown): FunctionImpl {
  return (ev, args, host, env) => {
    const bad = arity(name, args, minArgs, kinds.length);
    if (bad) return bad;
    const vals = args.map((a) => (isOmitted(a) ? undefined : ev.arrayOrValue(ev.eval(a, host, env))));
    const call = (items: (Value | undefined)[]): Value => {
      const coerced: unknown[] = [];
      for (let i = 0; i < items.length; i++) {
        const x = items[i];
        if (x === undefined) {
          coerced.push(undefined);
          continue;
        }
        if (isCellError(x)) return x;
        const k = kinds[i];
        const c = k === "n" ? toNumber(x) : k === "s" ? toText(x) : k === "b" ? toBoolean(x) : x === null ? 0 : x;
        if (isCellError(c)) return c;
        coerced.push(c);
      }
      while (coerced.length && coerced[coerced.length - 1] === undefined) coerced.pop();
      try {
        const r = fromLibrary(impl(...coerced));
        if (typeof r === "string" && r.length > MAX_TEXT) return VALUE(`${name}: the text would be ${r.length} characters; the limit is ${MAX_TEXT}`);
        return isMatrix(r) ? VALUE(`${name} returned an array`) : r;
      } catch (e) {
        return VALUE(`${name}: ${e instanceof Error ? e.message : String(e)}`);
      }
    };
    const arrays = vals.filter(isMatrix) as Matrix[];
    if (arrays.length === 0) return call(vals as (Value | undefined)[]);
    const rows = Math.max(...arrays.map((m) => m.length));
    const cols = Math.max(...arrays.map((m) => m[0].length));
    const out: Matrix = [];
    for (let r = 0; r < rows; r++) {
      const row: Value[] = [];
      for (let c = 0; c < cols; c++) {
        const items = vals.map((v) => {
          if (!isMatrix(v)) return v;
          const line = v.length === 1 ? v[0] : v[r];
          return line === undefined ? NA("the arrays differ in size") : line.length === 1 ? line[0] : line[c] ?? NA("the arrays differ in size");
        });
        row.push(call(items));
      }
      out.push(row);
    }
    return out;
  };
}

function evalArgs(ev: Evaluator, args: Ast[], host: Host, env: Env): EvalValue[] {
  return args.map((a) => (isOmitted(a) ? null : ev.eval(a, host, env)));
}

/** Numbers an aggregate (SUM, AVERAGE, MAX, MIN) sees: in ranges only numbers count; typed values are coerced; any error wins. */
function numbersOf(ev: Evaluator, vals: EvalValue[]): number[] | CellError {
  const out: number[] = [];
  let bad: CellError | undefined;
  for (const v of vals) {
    ev.each(v, (x, fromRef) => {
      if (isCellError(x)) {
        bad = x;
        return false;
      }
      if (typeof x === "number") out.push(x);
      else if (!fromRef && x !== null) {
        const n = toNumber(x);
        if (isCellError(n)) {
          bad = n;
          return false;
        }
        out.push(n);
      }
    });
    if (bad) return bad;
  }
  return out;
}

function sumOf(xs: number[]): number {
  let s = 0;
  for (const x of xs) s += x;
  return s;
}

/** One argument evaluated to a single value (errors and ranges refused as Excel would). */
function one(ev: Evaluator, a: Ast | undefined, host: Host, env: Env): Value {
  if (isOmitted(a)) return null;
  return ev.scalar(ev.eval(a!, host, env));
}

function oneNumber(ev: Evaluator, a: Ast | undefined, host: Host, env: Env, fallback: number): number | CellError {
  if (isOmitted(a)) return fallback;
  const v = one(ev, a, host, env);
  return isCellError(v) ? v : toNumber(v);
}

// ---------------------------------------------------------------- criteria (SUMIF, COUNTIFS…)

/** Excel's wildcard pattern (* ? and ~ escapes) as a case-insensitive regular expression. */
function wildcard(pattern: string): RegExp {
  let re = "";
  for (let i = 0; i < pattern.length; i++) {
    const ch = pattern[i];
    if (ch === "~" && i + 1 < pattern.length) re += pattern[++i].replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
    else if (ch === "*") re += "[\\s\\S]*";
    else if (ch === "?") re += "[\\s\\S]";
    else re += ch.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  }
  return new RegExp(`^${re}$`, "i");
}

/** A criterion ("<>x", ">=5", "a*", 3, TRUE, "") as a test of one cell value. */
export function criterion(c: Value): (v: Value) => boolean {
  if (isCellError(c)) return (v) => isCellError(v) && v.error === c.error;
  if (typeof c === "number") return (v) => (typeof v === "number" && v === c) || (typeof v === "string" && parseNumberText(v) === c);
  if (typeof c === "boolean") return (v) => v === c;
  if (c === null) return criterion(0); // an empty criterion cell means 0 (matches zeros, not blanks)
  const m = /^(<=|>=|<>|<|>|=)?([\s\S]*)$/.exec(c)!;
  const op = m[1] ?? "=";
  const rest = m[2];
  const n = parseNumberText(rest);
  const bool = /^(true|false)$/i.test(rest) ? /^true$/i.test(rest) : undefined;
  if (rest === "") {
    if (op === "=") return (v) => v === null || v === "";
    if (op === "<>") return (v) => !(v === null || v === "");
  }
  if (n !== undefined) {
    const test = (x: number) => (op === "=" ? x === n : op === "<>" ? x !== n : op === "<" ? x < n : op === ">" ? x > n : op === "<=" ? x <= n : x >= n);
    return (v) => {
      if (typeof v === "number") return test(v);
      if (typeof v === "string" && op === "=") return parseNumberText(v) === n;
      return op === "<>";
    };
  }
  if (bool !== undefined) return (v) => (op === "=" ? v === bool : op === "<>" ? v !== bool : false);
  if (op === "=" || op === "<>") {
    const re = wildcard(rest);
    return (v) => {
      const hit = typeof v === "string" && re.test(v);
      return op === "=" ? hit : !hit;
    };
  }
  return (v) => {
    if (typeof v !== "string") return false;
    const d = compareValues(v, rest);
    return op === "<" ? d < 0 : op === ">" ? d > 0 : op === "<=" ? d <= 0 : d >= 0;
  };
}

/** A range argument of a *IF(S) function as a matrix, its shape checked against the first range. */
function rangeMatrix(ev: Evaluator, v: EvalValue, name: string): Matrix | CellError {
  if (!isRef(v) && !isMatrix(v)) return VALUE(`${name} needs a range`);
  return ev.matrix(v);
}

/** Cells (row, col offsets) where every (range, criterion) pair matches. */
function matches(ev: Evaluator, pairs: [EvalValue, Value][], name: string): { rows: number; cols: number; hit: boolean[] } | CellError {
  let rows = -1;
  let cols = -1;
  let hit: boolean[] = [];
  for (const [range, crit] of pairs) {
    const m = rangeMatrix(ev, range, name);
    if (isCellError(m)) return m;
    if (rows < 0) {
      rows = m.length;
      cols = m[0].length;
      hit = new Array(rows * cols).fill(true);
    } else if (m.length !== rows || m[0].length !== cols) return VALUE(`${name}: the ranges differ in size`);
    const test = criterion(isCellError(crit) ? crit : crit);
    for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) if (hit[r * cols + c] && !test(m[r][c])) hit[r * cols + c] = false;
  }
  return { rows, cols, hit };
}

/** A *IF with a separate result range (SUMIF's sum_range, AVERAGEIF's average_range): same top-left, same size as the criteria range. */
function resized(v: EvalValue, rows: number, cols: number): EvalValue {
  if (!isRef(v)) return v;
  return { ...v, bottom: v.top + rows - 1, right: v.left + cols - 1 };
}

function ifsAggregate(name: string, kind: "sum" | "avg" | "max" | "min", single: boolean): FunctionImpl {
  return (ev, args, host, env) => {
    let valuesArg: EvalValue | undefined;
    const pairs: [EvalValue, Value][] = [];
    if (single) {
      const bad = arity(name, args, 2, 3);
      if (bad) return bad;
      const range = ev.eval(args[0], host, env);
      pairs.push([range, one(ev, args[1], host, env)]);
      valuesArg = isOmitted(args[2]) ? range : ev.eval(args[2], host, env);
    } else {
      if (args.length < 3 || args.length % 2 === 0) return VALUE(`${name} takes a range then range/criterion pairs`);
      valuesArg = ev.eval(args[0], host, env);
      for (let i = 1; i < args.length; i += 2) pairs.push([ev.eval(args[i], host, env), one(ev, args[i + 1], host, env)]);
    }
    const m = matches(ev, pairs, name);
    if (isCellError(m)) return m;
    const vm = rangeMatrix(ev, single ? resized(valuesArg, m.rows, m.cols) : valuesArg, name);
    if (isCellError(vm)) return vm;
    if (!single && (vm.length !== m.rows || vm[0].length !== m.cols)) return VALUE(`${name}: the ranges differ in size`);
    const xs: number[] = [];
    for (let r = 0; r < m.rows; r++)
      for (let c = 0; c < m.cols; c++) {
        if (!m.hit[r * m.cols + c]) continue;
        const v = vm[r]?.[c] ?? null;
        if (isCellError(v)) return v;
        if (typeof v === "number") xs.push(v);
      }
    if (kind === "sum") return finite(sumOf(xs));
    if (kind === "avg") return xs.length ? finite(sumOf(xs) / xs.length) : err("#DIV/0!", `${name}: no cell matches`);
    if (!xs.length) return 0;
    return kind === "max" ? xs.reduce((a, b) => (b > a ? b : a)) : xs.reduce((a, b) => (b < a ? b : a));
  };
}

function countIfs(name: string, single: boolean): FunctionImpl {
  return (ev, args, host, env) => {
    if (single ? args.length !== 2 : args.length < 2 || args.length % 2 === 1) return VALUE(`${name} takes range/criterion pairs`);
    const pairs: [EvalValue, Value][] = [];
    for (let i = 0; i < args.length; i += 2) pairs.push([ev.eval(args[i], host, env), one(ev, args[i + 1], host, env)]);
    const m = matches(ev, pairs, name);
    if (isCellError(m)) return m;
    return m.hit.reduce((n, h) => n + (h ? 1 : 0), 0);
  };
}

// ---------------------------------------------------------------- lookups

/** A reference or array narrowed to one row/column (INDEX, XLOOKUP results). */
function slice(ev: Evaluator, v: EvalValue, r0: number, r1: number, c0: number, c1: number): EvalValue {
  if (isRef(v)) return { ...v, top: v.top + r0, bottom: v.top + r1, left: v.left + c0, right: v.left + c1 };
  const m = isMatrix(v) ? v : [[v]];
  const out = m.slice(r0, r1 + 1).map((row) => row.slice(c0, c1 + 1));
  return out.length === 1 && out[0].length === 1 ? out[0][0] : out;
}

function dims(ev: Evaluator, v: EvalValue): { rows: number; cols: number } {
  if (isRef(v)) return { rows: v.bottom - v.top + 1, cols: v.right - v.left + 1 };
  if (isMatrix(v)) return { rows: v.length, cols: v[0].length };
  return { rows: 1, cols: 1 };
}

/** A lookup vector (one row or column) as a flat list. */
function vector(ev: Evaluator, v: EvalValue, name: string): Value[] | CellError {
  const m = ev.matrix(v);
  if (isCellError(m)) return m;
  if (m.length === 1) return m[0];
  if (m[0].length === 1) return m.map((r) => r[0]);
  return err("#N/A", `${name}: the lookup range must be one row or one column`);
}

const sameType = (a: Value, b: Value) => (typeof a === "number" && typeof b === "number") || (typeof a === "string" && typeof b === "string") || (typeof a === "boolean" && typeof b === "boolean");

function exactIndex(list: Value[], key: Value, wild: boolean, reverse = false): number {
  const re = wild && typeof key === "string" && /[*?~]/.test(key) ? wildcard(key) : undefined;
  const n = list.length;
  for (let k = 0; k < n; k++) {
    const i = reverse ? n - 1 - k : k;
    const v = list[i];
    if (re) {
      if (typeof v === "string" && re.test(v)) return i;
    } else if (sameType(v, key) && compareValues(v, key) === 0) return i;
  }
  return -1;
}

/** Approximate match on a sorted list (Excel's binary search): last item ≤ key (ascending) or ≥ key (descending). */
function sortedIndex(list: Value[], key: Value, descending: boolean): number {
  let lo = 0;
  let hi = list.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = list[mid];
    if (v === null || !sameType(v, key)) {
      // Excel skips values of another type; step linearly to the nearest comparable one.
      let j = mid - 1;
      while (j >= lo && (list[j] === null || !sameType(list[j], key))) j--;
      if (j < lo) {
        lo = mid + 1;
        continue;
      }
      const d = compareValues(list[j], key);
      if (descending ? d >= 0 : d <= 0) {
        found = j;
        lo = mid + 1;
      } else hi = j - 1;
      continue;
    }
    const d = compareValues(v, key);
    if (descending ? d >= 0 : d <= 0) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

const INDEX: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("INDEX", args, 2, 3);
  if (bad) return bad;
  const src = ev.eval(args[0], host, env);
  if (isCellError(src)) return src;
  const d = dims(ev, src);
  let r = oneNumber(ev, args[1], host, env, 0);
  let c = oneNumber(ev, args[2], host, env, 0);
  if (isCellError(r)) return r;
  if (isCellError(c)) return c;
  r = Math.trunc(r);
  c = Math.trunc(c);
  if (args.length === 2 && d.rows === 1 && d.cols > 1) [r, c] = [1, r];
  if (r < 0 || c < 0 || r > d.rows || c > d.cols) return err("#REF!", `INDEX: position ${r},${c} is outside the ${d.rows}×${d.cols} range`);
  if (c === 0 && d.cols > 1 && args.length === 2) c = 1;
  const r0 = r === 0 ? 0 : r - 1;
  const r1 = r === 0 ? d.rows - 1 : r - 1;
  const c0 = c === 0 ? 0 : c - 1;
  const c1 = c === 0 ? d.cols - 1 : c - 1;
  return slice(ev, src, r0, r1, c0, c1);
};

const MATCH: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("MATCH", args, 2, 3);
  if (bad) return bad;
  const key = one(ev, args[0], host, env);
  if (isCellError(key)) return key;
  const list = vector(ev, ev.eval(args[1], host, env), "MATCH");
  if (isCellError(list)) return list;
  const type = oneNumber(ev, args[2], host, env, 1);
  if (isCellError(type)) return type;
  const i = type === 0 ? exactIndex(list, key, true) : sortedIndex(list, key, type < 0);
  return i < 0 ? NA(`MATCH: ${describe(key)} not found`) : i + 1;
};

function describe(v: Value): string {
  return typeof v === "string" ? JSON.stringify(v) : String(toText(v as Value));
}

const XLOOKUP: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("XLOOKUP", args, 3, 6);
  if (bad) return bad;
  const key = one(ev, args[0], host, env);
  if (isCellError(key)) return key;
  const lookupArg = ev.eval(args[1], host, env);
  const list = vector(ev, lookupArg, "XLOOKUP");
  if (isCellError(list)) return list;
  const ret = ev.eval(args[2], host, env);
  const mode = oneNumber(ev, args[4], host, env, 0);
  const search = oneNumber(ev, args[5], host, env, 1);
  if (isCellError(mode)) return mode;
  if (isCellError(search)) return search;
  if (![0, -1, 1, 2].includes(mode) || ![1, -1, 2, -2].includes(search)) return VALUE("XLOOKUP: match_mode is 0, -1, 1 or 2 and search_mode 1, -1, 2 or -2");
  const reverse = search === -1;
  let i = -1;
  if (mode === 0 || mode === 2) i = exactIndex(list, key, mode === 2, reverse);
  else {
    let best = -1;
    for (let k = 0; k < list.length; k++) {
      const j = reverse ? list.length - 1 - k : k;
      const v = list[j];
      if (!sameType(v, key)) continue;
      const d = compareValues(v, key);
      if (d === 0) {
        best = j;
        break;
      }
      if (mode === -1 && d < 0 && (best < 0 || compareValues(v, list[best]) > 0)) best = j;
      if (mode === 1 && d > 0 && (best < 0 || compareValues(v, list[best]) < 0)) best = j;
    }
    i = best;
  }
  if (i < 0) return isOmitted(args[3]) ? NA(`XLOOKUP: ${describe(key)} not found`) : ev.eval(args[3], host, env);
  const ld = dims(ev, lookupArg);
  const rd = dims(ev, ret);
  if (ld.cols === 1 && ld.rows > 1 || (ld.rows === 1 && ld.cols === 1 && rd.rows > 1)) {
    if (rd.rows !== list.length) return VALUE("XLOOKUP: the return range and the lookup range differ in length");
    return slice(ev, ret, i, i, 0, rd.cols - 1);
  }
  if (rd.cols !== list.length) return VALUE("XLOOKUP: the return range and the lookup range differ in length");
  return slice(ev, ret, 0, rd.rows - 1, i, i);
};

function tableLookup(name: "VLOOKUP" | "HLOOKUP"): FunctionImpl {
  return (ev, args, host, env) => {
    const bad = arity(name, args, 3, 4);
    if (bad) return bad;
    const key = one(ev, args[0], host, env);
    if (isCellError(key)) return key;
    const table = ev.eval(args[1], host, env);
    const m = ev.matrix(table);
    if (isCellError(m)) return m;
    const k = oneNumber(ev, args[2], host, env, 1);
    if (isCellError(k)) return k;
    const approx = isOmitted(args[3]) ? true : toBoolean(one(ev, args[3], host, env));
    if (isCellError(approx)) return approx;
    const vertical = name === "VLOOKUP";
    const width = vertical ? m[0].length : m.length;
    const idx = Math.trunc(k);
    if (idx < 1) return VALUE(`${name}: the index must be 1 or more`);
    if (idx > width) return err("#REF!", `${name}: the table has ${width} ${vertical ? "columns" : "rows"}`);
    const keys = vertical ? m.map((r) => r[0]) : m[0];
    const i = approx ? sortedIndex(keys, key, false) : exactIndex(keys, key, true);
    if (i < 0) return NA(`${name}: ${describe(key)} not found`);
    return vertical ? m[i][idx - 1] : m[idx - 1][i];
  };
}

// ---------------------------------------------------------------- logic

const IF: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("IF", args, 2, 3);
  if (bad) return bad;
  const test = ev.arrayOrValue(ev.eval(args[0], host, env));
  const pick = (t: Value): EvalValue => {
    if (isCellError(t)) return t;
    const b = toBoolean(t);
    if (isCellError(b)) return b;
    if (b) return isOmitted(args[1]) ? 0 : ev.eval(args[1], host, env);
    return args.length < 3 ? false : isOmitted(args[2]) ? 0 : ev.eval(args[2], host, env);
  };
  if (!isMatrix(test)) return pick(test);
  // An array test (inside SUMPRODUCT, FILTER…): both branches element by element.
  const yes = ev.arrayOrValue(isOmitted(args[1]) ? 0 : ev.eval(args[1], host, env));
  const no = ev.arrayOrValue(args.length < 3 ? false : isOmitted(args[2]) ? 0 : ev.eval(args[2], host, env));
  const at = (v: Value | Matrix, r: number, c: number): Value => (isMatrix(v) ? (v.length === 1 ? v[0] : v[r] ?? [])[v[0].length === 1 ? 0 : c] ?? NA() : v);
  return test.map((row, r) =>
    row.map((t, c) => {
      if (isCellError(t)) return t;
      const b = toBoolean(t);
      if (isCellError(b)) return b;
      return at(b ? yes : no, r, c);
    }),
  );
};

const IFS: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 2 || args.length % 2) return VALUE("IFS takes condition/value pairs");
  for (let i = 0; i < args.length; i += 2) {
    const t = one(ev, args[i], host, env);
    if (isCellError(t)) return t;
    const b = toBoolean(t);
    if (isCellError(b)) return b;
    if (b) return ev.eval(args[i + 1], host, env);
  }
  return NA("IFS: no condition is TRUE");
};

function ifError(name: string, only?: string): FunctionImpl {
  return (ev, args, host, env) => {
    const bad = arity(name, args, 2, 2);
    if (bad) return bad;
    const v = ev.arrayOrValue(ev.eval(args[0], host, env));
    const caught = (x: Value) => isCellError(x) && (!only || x.error === only);
    if (!isMatrix(v)) return caught(v) ? ev.eval(args[1], host, env) : v;
    if (!v.some((row) => row.some(caught))) return v;
    const alt = ev.arrayOrValue(ev.eval(args[1], host, env));
    return v.map((row, r) => row.map((x, c) => (caught(x) ? (isMatrix(alt) ? alt[r]?.[c] ?? NA() : alt) : x)));
  };
}

const SWITCH: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 3) return VALUE("SWITCH takes an expression and value/result pairs");
  const v = one(ev, args[0], host, env);
  if (isCellError(v)) return v;
  let i = 1;
  for (; i + 1 < args.length; i += 2) {
    const c = one(ev, args[i], host, env);
    if (isCellError(c)) return c;
    if (sameType(v ?? 0, c ?? 0) && compareValues(v, c) === 0) return ev.eval(args[i + 1], host, env);
  }
  return i < args.length ? ev.eval(args[i], host, env) : NA("SWITCH: no value matches");
};

function logical(name: "AND" | "OR"): FunctionImpl {
  return (ev, args, host, env) => {
    if (args.length < 1) return VALUE(`${name} takes at least one argument`);
    let seen = 0;
    let acc = name === "AND";
    let bad: CellError | undefined;
    for (const v of evalArgs(ev, args, host, env)) {
      ev.each(v, (x, fromRef) => {
        if (isCellError(x)) {
          bad = x;
          return false;
        }
        if (x === null || (fromRef && typeof x === "string")) return;
        const b = toBoolean(x);
        if (isCellError(b)) {
          bad = b;
          return false;
        }
        seen++;
        acc = name === "AND" ? acc && b : acc || b;
      });
      if (bad) return bad;
    }
    return seen ? acc : VALUE(`${name}: no logical values`);
  };
}

const CHOOSE: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 2) return VALUE("CHOOSE takes an index and at least one value");
  const k = oneNumber(ev, args[0], host, env, 0);
  if (isCellError(k)) return k;
  const i = Math.trunc(k);
  if (i < 1 || i >= args.length) return VALUE(`CHOOSE: index ${i} is not between 1 and ${args.length - 1}`);
  return ev.eval(args[i], host, env);
};

const LET: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 3 || args.length % 2 === 0) return VALUE("LET takes name/value pairs and a calculation");
  const scope = new Map(env ?? []);
  for (let i = 0; i + 1 < args.length; i += 2) {
    const n = args[i];
    if (n.kind !== "name" || n.sheet !== undefined) return VALUE("LET: a name is expected");
    scope.set(n.name.toUpperCase(), ev.eval(args[i + 1], host, scope));
  }
  return ev.eval(args[args.length - 1], host, scope);
};

// ---------------------------------------------------------------- arrays

const SUMPRODUCT: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 1) return VALUE("SUMPRODUCT takes at least one array");
  const arrays: Matrix[] = [];
  for (const v of evalArgs(ev, args, host, env)) {
    const m = ev.matrix(v);
    if (isCellError(m)) return m;
    if (arrays.length && (m.length !== arrays[0].length || m[0].length !== arrays[0][0].length)) return VALUE("SUMPRODUCT: the arrays differ in size");
    arrays.push(m);
  }
  let sum = 0;
  const rows = arrays[0].length;
  const cols = arrays[0][0].length;
  for (let r = 0; r < rows; r++)
    for (let c = 0; c < cols; c++) {
      let p = 1;
      for (const m of arrays) {
        const x = m[r][c];
        if (isCellError(x)) return x;
        p *= typeof x === "number" ? x : 0; // text and logical values count as 0, as Excel does
      }
      sum += p;
    }
  return finite(sum);
};

const SEQUENCE: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("SEQUENCE", args, 1, 4);
  if (bad) return bad;
  const nums = [oneNumber(ev, args[0], host, env, 1), oneNumber(ev, args[1], host, env, 1), oneNumber(ev, args[2], host, env, 1), oneNumber(ev, args[3], host, env, 1)];
  for (const n of nums) if (isCellError(n)) return n;
  const [rows, cols, start, step] = nums as number[];
  const R = Math.trunc(rows);
  const C = Math.trunc(cols);
  if (R < 1 || C < 1) return err("#CALC!", "SEQUENCE: rows and columns must be 1 or more");
  if (R * C > 1_048_576) return err("#NUM!", "SEQUENCE: more than 1 048 576 items");
  return Array.from({ length: R }, (_, r) => Array.from({ length: C }, (_, c) => finite(start + (r * C + c) * step)));
};

const FILTER: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("FILTER", args, 2, 3);
  if (bad) return bad;
  const m = ev.matrix(ev.eval(args[0], host, env));
  if (isCellError(m)) return m;
  const inc = ev.matrix(ev.eval(args[1], host, env));
  if (isCellError(inc)) return inc;
  const byRow = inc[0].length === 1 && inc.length === m.length;
  const byCol = inc.length === 1 && inc[0].length === m[0].length;
  if (!byRow && !byCol) return VALUE("FILTER: include must be one column as tall as the array or one row as wide");
  const flags: boolean[] = [];
  for (const x of byRow ? inc.map((r) => r[0]) : inc[0]) {
    if (isCellError(x)) return x;
    const b = toBoolean(x === null ? false : x);
    if (isCellError(b)) return b;
    flags.push(b);
  }
  const out = byRow ? m.filter((_, i) => flags[i]) : m.map((row) => row.filter((_, j) => flags[j]));
  if (out.length === 0 || out[0].length === 0) return isOmitted(args[2]) ? err("#CALC!", "FILTER: nothing matches") : ev.eval(args[2], host, env);
  return out;
};

const keyOf = (row: Value[]) => JSON.stringify(row.map((v) => (typeof v === "string" ? v.toLowerCase() : v)));

const UNIQUE: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("UNIQUE", args, 1, 3);
  if (bad) return bad;
  const m = ev.matrix(ev.eval(args[0], host, env));
  if (isCellError(m)) return m;
  const byCol = isOmitted(args[1]) ? false : toBoolean(one(ev, args[1], host, env));
  const once = isOmitted(args[2]) ? false : toBoolean(one(ev, args[2], host, env));
  if (isCellError(byCol)) return byCol;
  if (isCellError(once)) return once;
  const lines = byCol ? transpose(m) : m;
  const counts = new Map<string, number>();
  for (const l of lines) counts.set(keyOf(l), (counts.get(keyOf(l)) ?? 0) + 1);
  const seen = new Set<string>();
  const out = lines.filter((l) => {
    const k = keyOf(l);
    if (seen.has(k) || (once && counts.get(k)! > 1)) return false;
    seen.add(k);
    return true;
  });
  if (!out.length) return err("#CALC!", "UNIQUE: nothing left");
  return byCol ? transpose(out) : out.map((l) => l.map((v) => (v === null ? 0 : v)));
};

function transpose(m: Matrix): Matrix {
  return m[0].map((_, c) => m.map((row) => row[c]));
}

/** SORT's order: numbers, text, logical values, errors, blanks last (both directions). */
function sortCompare(a: Value, b: Value): number {
  const rank = (v: Value) => (v === null ? 4 : isCellError(v) ? 3 : typeof v === "boolean" ? 2 : typeof v === "string" ? 1 : 0);
  const ra = rank(a);
  const rb = rank(b);
  if (ra !== rb) return ra - rb;
  if (ra >= 3) return 0;
  return compareValues(a, b);
}

const SORT: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("SORT", args, 1, 4);
  if (bad) return bad;
  const m = ev.matrix(ev.eval(args[0], host, env));
  if (isCellError(m)) return m;
  const index = oneNumber(ev, args[1], host, env, 1);
  const order = oneNumber(ev, args[2], host, env, 1);
  const byCol = isOmitted(args[3]) ? false : toBoolean(one(ev, args[3], host, env));
  if (isCellError(index)) return index;
  if (isCellError(order)) return order;
  if (isCellError(byCol)) return byCol;
  if (order !== 1 && order !== -1) return VALUE("SORT: sort_order is 1 or -1");
  const lines = byCol ? transpose(m) : m;
  const k = Math.trunc(index) - 1;
  if (k < 0 || k >= lines[0].length) return VALUE(`SORT: sort_index ${index} is outside the array`);
  const sorted = lines
    .map((l, i) => ({ l, i }))
    .sort((x, y) => {
      const a = x.l[k];
      const b = y.l[k];
      const blankOrder = a === null || b === null ? sortCompare(a, b) : 0;
      return (blankOrder || order * sortCompare(a, b)) || x.i - y.i;
    })
    .map((x) => x.l.map((v) => (v === null ? 0 : v)));
  return byCol ? transpose(sorted) : sorted;
};

/** SMALL / LARGE: the k-th smallest or largest number of a range (text, logical values and blanks skipped). */
function kth(name: "SMALL" | "LARGE"): FunctionImpl {
  return (ev, args, host, env) => {
    const bad = arity(name, args, 2, 2);
    if (bad) return bad;
    const xs = numbersOf(ev, [ev.eval(args[0], host, env)]);
    if (isCellError(xs)) return xs;
    const k = oneNumber(ev, args[1], host, env, 1);
    if (isCellError(k)) return k;
    const i = Math.ceil(k);
    if (i < 1 || i > xs.length) return err("#NUM!", `${name}: k = ${k} with ${xs.length} numbers`);
    const sorted = xs.sort((a, b) => a - b);
    return name === "SMALL" ? sorted[i - 1] : sorted[sorted.length - i];
  };
}

const MMULT: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("MMULT", args, 2, 2);
  if (bad) return bad;
  const a = ev.matrix(ev.eval(args[0], host, env));
  const b = ev.matrix(ev.eval(args[1], host, env));
  if (isCellError(a)) return a;
  if (isCellError(b)) return b;
  if (a[0].length !== b.length) return VALUE(`MMULT: ${a.length}×${a[0].length} times ${b.length}×${b[0].length} does not fit`);
  for (const m of [a, b]) for (const row of m) for (const x of row) if (typeof x !== "number") return isCellError(x) ? x : VALUE("MMULT takes numbers only");
  return a.map((row) => b[0].map((_, j) => finite((row as number[]).reduce((s, x, k) => s + x * (b[k][j] as number), 0))));
};

const TRANSPOSE: FunctionImpl = (ev, args, host, env) => {
  const bad = arity("TRANSPOSE", args, 1, 1);
  if (bad) return bad;
  const m = ev.matrix(ev.eval(args[0], host, env));
  return isCellError(m) ? m : transpose(m);
};

// ---------------------------------------------------------------- text

/** The texts CONCAT/TEXTJOIN join; #VALUE! as soon as they pass the text limit (never joined into gigabytes). */
function textPieces(ev: Evaluator, vals: EvalValue[], skipEmpty: boolean, name: string): string[] | CellError {
  const out: string[] = [];
  let bad: CellError | undefined;
  let length = 0;
  for (const v of vals) {
    ev.each(v, (x) => {
      if (isCellError(x)) {
        bad = x;
        return false;
      }
      const t = toText(x) as string;
      length += t.length;
      if (length > MAX_TEXT) {
        bad = VALUE(`${name}: the text is longer than ${MAX_TEXT} characters`);
        return false;
      }
      if (!(skipEmpty && t === "")) out.push(t);
    });
    if (bad) return bad;
  }
  return out;
}

const CONCAT: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 1) return VALUE("CONCAT takes at least one argument");
  const parts = textPieces(ev, evalArgs(ev, args, host, env), false, "CONCAT");
  if (isCellError(parts)) return parts;
  const s = parts.join("");
  return s.length > MAX_TEXT ? VALUE(`CONCAT: the text is longer than ${MAX_TEXT} characters`) : s;
};

const TEXTJOIN: FunctionImpl = (ev, args, host, env) => {
  if (args.length < 3) return VALUE("TEXTJOIN takes a delimiter, ignore_empty and at least one text");
  const d = one(ev, args[0], host, env);
  if (isCellError(d)) return d;
  const skip = toBoolean(one(ev, args[1], host, env));
  if (isCellError(skip)) return skip;
  const parts = textPieces(ev, evalArgs(ev, args.slice(2), host, env), skip, "TEXTJOIN");
  if (isCellError(parts)) return parts;
  const s = parts.join(toText(d) as string);
  return s.length > MAX_TEXT ? VALUE(`TEXTJOIN: the text is longer than ${MAX_TEXT} characters`) : s;
};

// ---------------------------------------------------------------- the table

export function nativeFunctions(): Fns {
  const f: Fns = new Map();
  const aggregate = (name: string, fold: (xs: number[]) => Value) =>
    f.set(name, (ev, args, host, env) => {
      if (args.length < 1) return VALUE(`${name} takes at least one argument`);
      const xs = numbersOf(ev, evalArgs(ev, args, host, env));
      return isCellError(xs) ? xs : fold(xs);
    });
  aggregate("SUM", (xs) => finite(sumOf(xs)));
  aggregate("AVERAGE", (xs) => (xs.length ? finite(sumOf(xs) / xs.length) : err("#DIV/0!", "AVERAGE of no numbers")));
  aggregate("MAX", (xs) => (xs.length ? xs.reduce((a, b) => (b > a ? b : a)) : 0));
  aggregate("MIN", (xs) => (xs.length ? xs.reduce((a, b) => (b < a ? b : a)) : 0));
  f.set("COUNT", (ev, args, host, env) => {
    let n = 0;
    for (const v of evalArgs(ev, args, host, env)) ev.each(v, (x, fromRef) => void (typeof x === "number" || (!fromRef && x !== null && !isCellError(x) && !isCellError(toNumber(x))) ? n++ : 0));
    return n;
  });
  f.set("COUNTA", (ev, args, host, env) => {
    let n = 0;
    for (const v of evalArgs(ev, args, host, env)) ev.each(v, (x) => void (x !== null ? n++ : 0));
    return n;
  });
  f.set("SUMIF", ifsAggregate("SUMIF", "sum", true));
  f.set("AVERAGEIF", ifsAggregate("AVERAGEIF", "avg", true));
  f.set("SUMIFS", ifsAggregate("SUMIFS", "sum", false));
  f.set("AVERAGEIFS", ifsAggregate("AVERAGEIFS", "avg", false));
  f.set("MAXIFS", ifsAggregate("MAXIFS", "max", false));
  f.set("MINIFS", ifsAggregate("MINIFS", "min", false));
  f.set("COUNTIF", countIfs("COUNTIF", true));
  f.set("COUNTIFS", countIfs("COUNTIFS", false));
  f.set("SUMPRODUCT", SUMPRODUCT);
  f.set("IF", IF);
  f.set("IFS", IFS);
  f.set("IFERROR", ifError("IFERROR"));
  f.set("IFNA", ifError("IFNA", "#N/A"));
  f.set("SWITCH", SWITCH);
  f.set("AND", logical("AND"));
  f.set("OR", logical("OR"));
  f.set("NOT", scalarFn("NOT", ["b"], 1, (b) => !b));
  f.set("INDEX", INDEX);
  f.set("MATCH", MATCH);
  f.set("XLOOKUP", XLOOKUP);
  f.set("VLOOKUP", tableLookup("VLOOKUP"));
  f.set("HLOOKUP", tableLookup("HLOOKUP"));
  f.set("CHOOSE", CHOOSE);
  f.set("LET", LET);
  f.set("CONCAT", CONCAT);
  f.set("TEXTJOIN", TEXTJOIN);
  f.set("SEQUENCE", SEQUENCE);
  f.set("FILTER", FILTER);
  f.set("UNIQUE", UNIQUE);
  f.set("SORT", SORT);
  f.set("MMULT", MMULT);
  f.set("SMALL", kth("SMALL"));
  f.set("LARGE", kth("LARGE"));
  f.set("TRANSPOSE", TRANSPOSE);
  f.set("TRUE", () => true);
  f.set("FALSE", () => false);
  f.set("NA", () => NA());
  f.set("TODAY", (_ev, args) => {
    if (args.length) return VALUE("TODAY takes no arguments");
    const d = new Date();
    return serialOfDate(d.getFullYear(), d.getMonth(), d.getDate());
  });
  f.set("ROW", (ev, args, host, env) => (args.length === 0 ? host.row : refPart(ev.eval(args[0], host, env), "row")));
  f.set("COLUMN", (ev, args, host, env) => (args.length === 0 ? host.col : refPart(ev.eval(args[0], host, env), "col")));
  f.set("ROWS", (ev, args, host, env) => (args.length !== 1 ? VALUE("ROWS takes one range") : dims(ev, ev.eval(args[0], host, env)).rows));
  f.set("COLUMNS", (ev, args, host, env) => (args.length !== 1 ? VALUE("COLUMNS takes one range") : dims(ev, ev.eval(args[0], host, env)).cols));
  for (const [name, test] of [
    ["ISERROR", (v: Value) => isCellError(v)],
    ["ISNA", (v: Value) => isCellError(v) && v.error === "#N/A"],
    ["ISNUMBER", (v: Value) => typeof v === "number"],
    ["ISTEXT", (v: Value) => typeof v === "string"],
    ["ISBLANK", (v: Value) => v === null],
  ] as const)
    f.set(name, (ev, args, host, env) => (args.length !== 1 ? VALUE(`${name} takes one value`) : lift1(ev.arrayOrValue(ev.eval(args[0], host, env)), (v) => test(v))));

  // Scalar functions from @formulajs/formulajs (kinds: n number, s text, a any).
  const lib: [string, Kind[], number, string][] = [
    ["ABS", ["n"], 1, "ABS"],
    ["LOG10", ["n"], 1, "LOG10"],
    ["POWER", ["n", "n"], 2, "POWER"],
    ["SQRT", ["n"], 1, "SQRT"],
    ["MOD", ["n", "n"], 2, "MOD"],
    ["INT", ["n"], 1, "INT"],
    ["LEN", ["s"], 1, "LEN"],
    ["LEFT", ["s", "n"], 1, "LEFT"],
    ["RIGHT", ["s", "n"], 1, "RIGHT"],
    ["MID", ["s", "n", "n"], 3, "MID"],
    ["UPPER", ["s"], 1, "UPPER"],
    ["LOWER", ["s"], 1, "LOWER"],
    ["SUBSTITUTE", ["s", "s", "s", "n"], 3, "SUBSTITUTE"],
    ["TRIM", ["s"], 1, "TRIM"],
    ["DATE", ["n", "n", "n"], 3, "DATE"],
    ["EDATE", ["n", "n"], 2, "EDATE"],
  ];
  // Rounding and VALUE by hand (rounding.ts says why; formulajs's VALUE("abc") is 0, not #VALUE!).
  const own: [string, Kind[], number, (...a: never[]) => Value][] = [
    ["ROUND", ["n", "n"], 2, (x: number, d: number) => roundDigits(x, d, "nearest")],
    ["ROUNDUP", ["n", "n"], 2, (x: number, d: number) => roundDigits(x, d, "up")],
    ["ROUNDDOWN", ["n", "n"], 2, (x: number, d: number) => roundDigits(x, d, "down")],
    ["CEILING", ["n", "n"], 2, ceiling],
    ["CEILING.MATH", ["n", "n", "n"], 1, ceilingMath],
    ["FLOOR", ["n", "n"], 2, floor],
    ["FLOOR.MATH", ["n", "n", "n"], 1, floorMath],
    ["MROUND", ["n", "n"], 2, mround],
    ["CHAR", ["n"], 1, char],
    ["CODE", ["s"], 1, code],
    ["UNICHAR", ["n"], 1, unichar],
    ["UNICODE", ["s"], 1, unicode],
    ["REPT", ["s", "n"], 2, rept],
    ["VALUE", ["s"], 1, (s: string) => parseNumberText(s) ?? VALUE(`VALUE: ${JSON.stringify(s.slice(0, 40))} is not a number`)],
  ];
  for (const [name, kinds, min, impl] of own) f.set(name, scalarFn(name, kinds, min, impl as (...a: unknown[]) => unknown));
  f.set("TEXT", scalarFn("TEXT", ["a", "s"], 2, text));
  for (const [name, kinds, min, libName] of lib) {
    const impl = fj[libName];
    if (typeof impl !== "function") throw new Error(`@formulajs/formulajs has no ${libName}`);
    f.set(name, scalarFn(name, kinds, min, name === "SUBSTITUTE" ? boundedSubstitute(impl) : impl));
  }
  return f;
}

/** SUBSTITUTE refused before it runs when its result would pass the text limit (a 32 767-fold growth would need gigabytes). */
function boundedSubstitute(impl: (...a: unknown[]) => unknown): (...a: unknown[]) => unknown {
  return (text, old, replacement, instance) => {
    const [s, o, n] = [text, old, replacement].map((x) => String(x ?? ""));
    if (o && n.length > o.length && instance === undefined) {
      const count = s.split(o).length - 1;
      if (s.length + count * (n.length - o.length) > MAX_TEXT) return VALUE(`SUBSTITUTE: the text would be longer than ${MAX_TEXT} characters`);
    }
    return impl(text, old, replacement, instance);
  };
}

/**
 * TEXT: the number part of the format (0 # , . and %) through formulajs,
 * literal text around it (quoted, or $ € £ spaces, signs) added here because
 * formulajs drops it; any other format (dates, times, scientific, sections,
 * colours) is #VALUE! saying so — formulajs would print the serial number.
 */
function text(value: unknown, format: unknown): unknown {
  const fmt = String(format);
  const m = /^((?:"[^"]*"|[ $€£+\-()])*)([0#,.]*[0#][0#,.]*%?)((?:"[^"]*"|[ $€£+\-()%])*)$/.exec(fmt);
  if (!m) return VALUE(`TEXT: the format ${JSON.stringify(fmt.slice(0, 40))} is not supported here (number formats of 0 # , . % with literal text around them)`);
  let n: unknown = value;
  if (typeof n === "string") {
    const parsed = parseNumberText(n);
    if (parsed === undefined) return n;
    n = parsed;
  }
  if (typeof n === "boolean") return n ? "TRUE" : "FALSE";
  const literal = (s: string) => s.replace(/"([^"]*)"/g, "$1");
  const x = n as number;
  const body = fj.TEXT(Math.abs(x), m[2]);
  if (body instanceof Error) return body;
  return `${x < 0 ? "-" : ""}${literal(m[1])}${body}${literal(m[3])}`;
}

function refPart(v: EvalValue, part: "row" | "col"): Value | Matrix {
  if (!isRef(v)) return VALUE(`${part === "row" ? "ROW" : "COLUMN"} needs a reference`);
  const r = v as Ref;
  if (part === "row") return r.top === r.bottom ? r.top : Array.from({ length: r.bottom - r.top + 1 }, (_, i) => [r.top + i]);
  return r.left === r.right ? r.left : [Array.from({ length: r.right - r.left + 1 }, (_, i) => r.left + i)];
}
