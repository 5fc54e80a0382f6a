/**
 * Evaluation of a parsed formula against a workbook: references, names,
 * tables, LET variables, array arithmetic (element by element with Excel's
 * broadcasting) and the function table of functions.ts.
 */
import { MAX_COL, MAX_ROW, type Ast, type Coord } from "./ast";
import { compareValues, err, isCellError, isMatrix, isRef, toNumber, toText, VALUE, type CellError, type EvalValue, type Matrix, type Ref, type Value } from "./values";

/** More cells than this in one array (not an aggregate over a reference) is refused rather than risk memory. */
export const MAX_ARRAY_CELLS = 5_000_000;
/** Characters in one text value (Excel's cell limit). */
export const MAX_TEXT = 32767;

export interface Host {
  sheet: unknown;
  row: number;
  col: number;
}

export interface TableInfo {
  name: string;
  sheet: unknown;
  top: number;
  left: number;
  bottom: number;
  right: number;
  headerRows: number;
  totalsRows: number;
  columns: string[];
}

/** What the evaluator needs from the workbook (the engine implements it). */
export interface Book {
  sheetNamed(name: string): unknown | undefined;
  sheetName(sheet: unknown): string;
  value(sheet: unknown, row: number, col: number): Value;
  /** Last used row and column of a sheet (whole-column references stop there). */
  extent(sheet: unknown): { rows: number; cols: number };
  /** How many cells the sheet holds (to choose between dense and sparse walks). */
  population(sheet: unknown): number;
  /** The populated cells of a sheet inside a rectangle, row-major. */
  populated(sheet: unknown, top: number, left: number, bottom: number, right: number): [number, number][];
  /** A defined name visible from `sheet` (sheet scope first, then workbook scope), or one of a named sheet. */
  name(name: string, fromSheet: unknown, scopeSheet?: string): { ast: Ast; host: Host } | undefined;
  table(name: string | undefined, host: Host): TableInfo | undefined;
}

export type Env = Map<string, EvalValue> | undefined;

/** Functions get their argument trees and evaluate them (lazy where Excel is lazy: IF, IFERROR, LET…). */
export type FunctionImpl = (ev: Evaluator, args: Ast[], host: Host, env: Env) => EvalValue;

export class Evaluator {
  constructor(
    readonly book: Book,
    readonly functions: Map<string, FunctionImpl>,
  ) {}

  eval(ast: Ast, host: Host, env: Env): EvalValue {
    switch (ast.kind) {
      case "number":
        return ast.value;
      case "string":
        return ast.value;
      case "boolean":
        return ast.value;
      case "error":
        return err(ast.code);
      case "blank":
        return null;
      case "cell": {
        const sheet = this.sheetOf(ast.sheet, host);
        if (isCellError(sheet)) return sheet;
        const r = resolve(ast.at, host);
        if (r.row < 1 || r.row > MAX_ROW || r.col < 1 || r.col > MAX_COL) return err("#REF!", "the reference is off the sheet");
        return { ref: true, sheet, top: r.row, left: r.col, bottom: r.row, right: r.col };
      }
      case "area": {
        const sheet = this.sheetOf(ast.sheet, host);
        if (isCellError(sheet)) return sheet;
        const a = resolve(ast.from, host);
        const b = resolve(ast.to, host);
        const top = Math.min(a.row, b.row);
        const bottom = Math.max(a.row, b.row);
        const left = Math.min(a.col, b.col);
        const right = Math.max(a.col, b.col);
        if (top < 1 || left < 1 || bottom > MAX_ROW || right > MAX_COL) return err("#REF!", "the range is off the sheet");
        return { ref: true, sheet, top, left, bottom, right };
      }
      case "name":
        return this.name(ast.name, ast.sheet, host, env);
      case "table":
        return this.tableRef(ast, host);
      case "array":
        return ast.rows.map((row) => row.map((c) => this.eval(c, host, env) as Value));
      case "unary": {
        const v = this.eval(ast.arg, host, env);
        if (ast.op === "+") return v;
        return lift1(this.arrayOrValue(v), (x) => {
          const n = toNumber(x);
          if (isCellError(n)) return n;
          return ast.op === "-" ? -n : n / 100;
        });
      }
      case "binary":
        return this.binary(ast.op, this.arrayOrValue(this.eval(ast.left, host, env)), this.arrayOrValue(this.eval(ast.right, host, env)));
      case "chain": {
        let acc = this.arrayOrValue(this.eval(ast.first, host, env));
        for (let i = 0; i < ast.rest.length; i++) acc = this.binary(ast.ops[i], acc, this.arrayOrValue(this.eval(ast.rest[i], host, env)));
        return acc;
      }
      case "call": {
        const f = this.functions.get(ast.name);
        if (!f) return err("#NAME?", `${ast.name} is not a function the command line computes`);
        return f(this, ast.args, host, env);
      }
    }
  }

  private sheetOf(name: string | undefined, host: Host): unknown {
    if (name === undefined) return host.sheet;
    return this.book.sheetNamed(name) ?? err("#REF!", `no sheet named ${name}`);
  }

  private readonly nameDepth: string[] = [];

  private name(name: string, sheetName: string | undefined, host: Host, env: Env): EvalValue {
    const key = name.toUpperCase();
    if (sheetName === undefined && env?.has(key)) return env.get(key)!;
    const def = this.book.name(name, host.sheet, sheetName);
    if (!def) {
      if (sheetName === undefined && this.book.table(name, host)) return this.tableRef({ kind: "table", table: name, items: [], columns: [] }, host); // a bare table name is its data rows
      return err("#NAME?", `${name} is not a defined name, a table or a function`);
    }
    if (this.nameDepth.includes(key) || this.nameDepth.length > 32) return err("#NAME?", `the name ${name} refers to itself`);
    this.nameDepth.push(key);
    try {
      return this.eval(def.ast, def.host, undefined);
    } finally {
      this.nameDepth.pop();
    }
  }

  private tableRef(ast: Extract<Ast, { kind: "table" }>, host: Host): EvalValue {
    const t = this.book.table(ast.table, host);
    if (!t) return ast.table ? err("#NAME?", `no table named ${ast.table}`) : err("#NAME?", "a [column] reference outside a table");
    const items = ast.items.map((i) => i.toLowerCase());
    const dataTop = t.top + t.headerRows;
    const dataBottom = t.bottom - t.totalsRows;
    let top = dataTop;
    let bottom = dataBottom;
    if (items.includes("#all")) [top, bottom] = [t.top, t.bottom];
    else if (items.includes("#this row")) {
      if (host.sheet !== t.sheet || host.row < dataTop || host.row > dataBottom) return VALUE(`${t.name}[@…] used outside the table's data rows`);
      top = bottom = host.row;
    } else {
      const hasHeaders = items.includes("#headers");
      const hasTotals = items.includes("#totals");
      const hasData = items.includes("#data") || (!hasHeaders && !hasTotals);
      if (hasHeaders && t.headerRows === 0) return err("#REF!", `${t.name} has no header row`);
      if (hasTotals && t.totalsRows === 0) return err("#REF!", `${t.name} has no totals row`);
      top = hasHeaders ? t.top : hasData ? dataTop : dataBottom + 1;
      bottom = hasTotals ? t.bottom : hasData ? dataBottom : t.top + t.headerRows - 1;
    }
    let left = t.left;
    let right = t.right;
    if (ast.columns.length) {
      const [first, last] = ast.columns[0].split("]:[");
      const i = t.columns.findIndex((c) => c.toLowerCase() === first.toLowerCase());
      const j = last === undefined ? i : t.columns.findIndex((c) => c.toLowerCase() === last.toLowerCase());
      if (i < 0 || j < 0) return err("#REF!", `${t.name} has no column ${i < 0 ? first : last}`);
      left = t.left + Math.min(i, j);
      right = t.left + Math.max(i, j);
    }
    if (bottom < top) return err("#REF!", `${t.name} has no such rows`);
    return { ref: true, sheet: t.sheet, top, left, bottom, right };
  }

  // ------------------------------------------------------------ references → values

  /** A reference's cells as a matrix (whole columns stop at the sheet's last used row). */
  matrix(v: EvalValue): Matrix | CellError {
    if (isMatrix(v)) return v;
    if (!isRef(v)) return [[v]];
    const { bottom, right } = this.clip(v);
    const rows = bottom - v.top + 1;
    const cols = right - v.left + 1;
    if (rows <= 0 || cols <= 0) return [[null]];
    if (rows * cols > MAX_ARRAY_CELLS) return err("#NUM!", `a range of ${rows}×${cols} cells used as an array is over the limit of ${MAX_ARRAY_CELLS} cells`);
    const out: Matrix = new Array(rows);
    for (let r = 0; r < rows; r++) {
      const row: Value[] = new Array(cols);
      for (let c = 0; c < cols; c++) row[c] = this.book.value(v.sheet, v.top + r, v.left + c);
      out[r] = row;
    }
    return out;
  }

  /** The part of a reference that can hold anything: rows/columns past the sheet's extent are empty. */
  clip(v: Ref): { bottom: number; right: number } {
    const e = this.book.extent(v.sheet);
    return { bottom: Math.min(v.bottom, Math.max(e.rows, v.top)), right: Math.min(v.right, Math.max(e.cols, v.left)) };
  }

  /** A value or array (a reference read: one cell → its value, more → a matrix). */
  arrayOrValue(v: EvalValue): Value | Matrix {
    if (!isRef(v)) return v;
    if (v.top === v.bottom && v.left === v.right) return this.book.value(v.sheet, v.top, v.left);
    const m = this.matrix(v);
    return m;
  }

  /**
   * Visit every value an aggregate sees in an argument: a reference's
   * populated cells (walked sparsely when the rectangle is much larger than
   * the sheet's content), an array's items, or one value. `fromRef` tells the
   * visitor whether Excel's range rules (skip text and logical values) apply.
   */
  each(v: EvalValue, visit: (x: Value, fromRef: boolean) => boolean | void): void {
    if (isRef(v)) {
      const { bottom, right } = this.clip(v);
      const area = (bottom - v.top + 1) * (right - v.left + 1);
      if (area <= 0) return;
      if (area > 4 * this.book.population(v.sheet) + 64) {
        for (const [r, c] of this.book.populated(v.sheet, v.top, v.left, bottom, right)) if (visit(this.book.value(v.sheet, r, c), true) === false) return;
        return;
      }
      for (let r = v.top; r <= bottom; r++) for (let c = v.left; c <= right; c++) if (visit(this.book.value(v.sheet, r, c), true) === false) return;
      return;
    }
    if (isMatrix(v)) {
      for (const row of v) for (const x of row) if (visit(x, true) === false) return;
      return;
    }
    visit(v, false);
  }

  /** One argument as a single value (a one-cell reference read, an array or range → its first cell is refused). */
  scalar(v: EvalValue): Value {
    if (isRef(v)) {
      if (v.top === v.bottom && v.left === v.right) return this.book.value(v.sheet, v.top, v.left);
      return VALUE("a range where one value is expected");
    }
    if (isMatrix(v)) return v.length === 1 && v[0].length === 1 ? v[0][0] : VALUE("an array where one value is expected");
    return v;
  }

  binary(op: string, a: Value | Matrix, b: Value | Matrix): Value | Matrix {
    if (!isMatrix(a) && !isMatrix(b)) return binaryScalar(op, a, b);
    return lift2(a, b, (x, y) => binaryScalar(op, x, y));
  }
}

function resolve(c: Coord, host: Host): { row: number; col: number } {
  return { row: c.rowAbs ? c.row : c.row + host.row, col: c.colAbs ? c.col : c.col + host.col };
}

/** Apply `f` to every item of an array, or to one value. */
export function lift1(v: Value | Matrix, f: (x: Value) => Value): Value | Matrix {
  if (!isMatrix(v)) return f(v);
  return v.map((row) => row.map(f));
}

/** Excel's broadcasting: a 1-row or 1-column array stretches; past the shorter array, #N/A. */
export function lift2(a: Value | Matrix, b: Value | Matrix, f: (x: Value, y: Value) => Value): Matrix {
  const A = isMatrix(a) ? a : [[a]];
  const B = isMatrix(b) ? b : [[b]];
  const rows = Math.max(A.length, B.length);
  const cols = Math.max(A[0].length, B[0].length);
  const pick = (m: Matrix, r: number, c: number): Value | undefined => {
    const row = m.length === 1 ? m[0] : m[r];
    if (row === undefined) return undefined;
    return row.length === 1 ? row[0] : row[c];
  };
  const out: Matrix = [];
  for (let r = 0; r < rows; r++) {
    const row: Value[] = [];
    for (let c = 0; c < cols; c++) {
      const x = pick(A, r, c);
      const y = pick(B, r, c);
      row.push(x === undefined || y === undefined ? err("#N/A", "the arrays differ in size") : f(x, y));
    }
    out.push(row);
  }
  return out;
}

export function binaryScalar(op: string, a: Value, b: Value): Value {
  if (isCellError(a)) return a;
  if (isCellError(b)) return b;
  switch (op) {
    case "&": {
      const x = toText(a);
      const y = toText(b);
      if (isCellError(x)) return x;
      if (isCellError(y)) return y;
      // Excel's cell text limit: a longer result is #VALUE!, not a string that grows without bound.
      return x.length + y.length > MAX_TEXT ? VALUE(`the text would be ${x.length + y.length} characters; the limit is ${MAX_TEXT}`) : x + y;
    }
    case "=":
      return compareValues(a, b) === 0;
    case "<>":
      return compareValues(a, b) !== 0;
    case "<":
      return compareValues(a, b) < 0;
    case ">":
      return compareValues(a, b) > 0;
    case "<=":
      return compareValues(a, b) <= 0;
    case ">=":
      return compareValues(a, b) >= 0;
  }
  const x = toNumber(a);
  if (isCellError(x)) return x;
  const y = toNumber(b);
  if (isCellError(y)) return y;
  let r: number;
  switch (op) {
    case "+":
      r = x + y;
      break;
    case "-":
      r = x - y;
      break;
    case "*":
      r = x * y;
      break;
    case "/":
      if (y === 0) return err("#DIV/0!");
      r = x / y;
      break;
    case "^":
      if (x === 0 && y === 0) return err("#NUM!", "0^0");
      r = Math.pow(x, y);
      break;
    default:
      return VALUE(`unknown operator ${op}`);
  }
  return finite(r);
}

export function finite(r: number): Value {
  if (Number.isNaN(r)) return err("#NUM!", "the result is not a number");
  if (!Number.isFinite(r)) return err("#NUM!", "the result is not finite");
  return r === 0 ? 0 : r;
}
