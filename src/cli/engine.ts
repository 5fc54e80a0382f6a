/**
 * Headless recalculation of a workbook: every formula — native and
 * AIRTALLY.* — in dependency order. Formulas are read by formula/parse.ts and
 * evaluated by formula/evaluate.ts with the function table of
 * formula/functions.ts (@formulajs/formulajs for scalar functions); AIRTALLY.*
 * calls run the built add-in (bundle.ts).
 *
 * Decisions (documented in DEVELOPERS.md, "Headless recalculation"):
 * - Cells are stored sparsely (one map entry per non-empty cell), so a value
 *   in a far corner costs one entry; whole-column references stop at the
 *   sheet's last used row, and aggregates walk only populated cells when a
 *   range is much larger than the sheet's content.
 * - Order: each formula's references (cells, ranges, names, table columns)
 *   give a dependency graph, solved with Tarjan's strongly connected
 *   components; components come out dependencies first. A component of more
 *   than one cell (or a cell that reads itself) is a circular reference: each
 *   member gets #CYCLE! with the path, and cells that read a member get that
 *   error too.
 * - Dependencies the graph cannot see (cells filled by another formula's
 *   spill) are evaluated on demand when read.
 * - Spills: a formula whose result is an array fills the cells below and to
 *   the right, as dynamic-array Excel does; if one of those cells is not
 *   empty the formula shows #SPILL! and fills nothing. An array formula
 *   stored with a range (`{=…}` over A1:B9) fills exactly that range: missing
 *   entries are #N/A, extra ones are cut off, as Excel does for array formulas.
 * - Arguments of AIRTALLY.* functions are coerced as the host does from the
 *   parameter types in functions.json; an omitted argument and an empty cell
 *   arrive as null ("use the default", DESIGN.md §4); a range given to a
 *   one-value parameter is #VALUE!; an error argument is passed through.
 * - Errors are values: every failure stays in its cell with a code and a
 *   message; nothing here throws for a bad cell.
 */
import { address, areaText, type Area } from "./address";
import { HostError, type AirtallyFunction } from "./bundle";
import { MAX_COL, type Ast } from "./formula/ast";
import { Evaluator, MAX_ARRAY_CELLS, type Book, type FunctionImpl, type Host, type TableInfo } from "./formula/evaluate";
import { nativeFunctions } from "./formula/functions";
import { Grid } from "./grid";
import { FormulaSyntaxError, parseFormula } from "./formula/parse";
import { err, isCellError, isMatrix, isRef, VALUE, type CellError, type EvalValue, type Matrix, type Value } from "./formula/values";
import { NAMESPACE, STORED_PREFIX } from "./storedForm";
import { MAX_CELLS, RefusedInput } from "./zip";

export { isCellError, type CellError, type Value } from "./formula/values";

/** Excel's cycle code does not exist (Excel warns and shows 0); ours names the problem. It is never written to a file. */
export const CYCLE = "#CYCLE!";
export const SPILL = "#SPILL!";

export interface InputCell {
  row: number;
  col: number;
  /** Formula text without the leading "=", as stored (either AIRTALLY form). */
  formula?: string;
  /** The cell the formula text is written for (a shared formula's first cell); default this cell. */
  formulaHost?: { row: number; col: number };
  /** The constant, or the cached value of a formula (ignored: it is recomputed). */
  value?: Value;
  /** Array formula range (legacy `{=…}` / stored spill), e.g. "D2:E9". */
  arrayRange?: Area;
  /** Why the reader will not let this formula run (it becomes a #REF! cell with this message). */
  refused?: string;
}

export interface InputSheet {
  name: string;
  cells: InputCell[];
}

/** A defined name: a range (sheet + area) or any formula text; `scope` = the sheet of a sheet-scoped name. */
export interface InputName {
  name: string;
  sheet?: string;
  area?: Area;
  formula?: string;
  scope?: string;
}

export interface InputTable {
  name: string;
  sheet: string;
  area: Area;
  headerRows: number;
  totalsRows: number;
  columns: string[];
}

export interface InputBook {
  sheets: InputSheet[];
  names?: InputName[];
  tables?: InputTable[];
}

export type CellKind = "constant" | "formula" | "spill";

export interface CellResult {
  sheet: string;
  row: number;
  col: number;
  address: string;
  kind: CellKind;
  formula?: string;
  value: Value;
  /** For spilled cells: the formula cell they come from. */
  anchor?: string;
}

export interface SpillArea {
  sheet: string;
  anchor: { row: number; col: number };
  area: Area;
  /** true when the file stored the formula as an array formula over this range. */
  stored: boolean;
}

export interface ResultSheet {
  name: string;
  /** Every non-empty cell, row-major (built on first use; prefer `each` for large sheets). */
  readonly cells: CellResult[];
  /** The same cells one at a time. */
  each(): Iterable<CellResult>;
  /** One cell, or undefined when empty. */
  at(row: number, col: number): CellResult | undefined;
  /** A cell's kind and value only (cheap, for walking a large sheet). */
  peek(row: number, col: number): { kind: CellKind; value: Value } | undefined;
  /** Positions [row, col] of the cells spills filled. */
  spilledCells(): [number, number][];
}

export interface RecalcResult {
  sheets: ResultSheet[];
  /** Formula and spilled cells whose value is an error. */
  errors: CellResult[];
  /** Each circular reference, as the addresses of its cells ("Sheet!A1"). */
  cycles: string[][];
  spills: SpillArea[];
  formulaCount: number;
}

export interface RecalcOptions {
  /** Called every `progressEvery` formulas with (done, total). */
  onProgress?: (done: number, total: number) => void;
  progressEvery?: number;
}

interface Node {
  sheet: SheetState;
  row: number;
  col: number;
  formula: string;
  ast: Ast | CellError;
  arrayRange?: Area;
  state: 0 | 1 | 2; // pending, busy, done
  value: Value;
  deps: Node[];
  mayArray: boolean;
  /** Tarjan's bookkeeping (index -1: not visited) and the graph builder's de-duplication stamp. */
  index: number;
  low: number;
  onStack: boolean;
  stamp: number;
}

/** One shared empty list for formulas that read no other formula. */
const NO_DEPS: Node[] = [];

interface SheetState {
  name: string;
  index: number;
  constants: Grid<Value>;
  formulas: Grid<Node>;
  /** Cells covered by a stored array formula → its node. */
  owned: Grid<Node>;
  spilled: Grid<{ value: Value; anchor: Node }>;
  /** Rows holding formulas, per column, ascending (to find the formulas inside a range). */
  formulaRows: Map<number, number[]>;
  /** Formulas that may spill and are not evaluated yet. */
  pendingSpills: Node[];
  maxRow: number;
  maxCol: number;
}

const MAX_ON_DEMAND_DEPTH = 64;
/** One number per cell: row-major, 16384 columns (Excel's grid). */
const cellKey = (row: number, col: number) => row * MAX_COL + (col - 1);
const keyRow = (k: number) => Math.floor(k / MAX_COL);
const keyCol = (k: number) => (k % MAX_COL) + 1;
const nodeKey = (n: Node) => `${n.sheet.name}!${address(n.row, n.col)}`;

/** Functions whose result is one value whatever their arguments: a formula made of them never spills. */
const SCALAR_RESULT = new Set(
  "SUM SUMIF SUMIFS COUNT COUNTA COUNTIF COUNTIFS AVERAGE AVERAGEIF AVERAGEIFS SUMPRODUCT MAX MIN MAXIFS MINIFS MATCH VLOOKUP HLOOKUP AND OR CONCAT TEXTJOIN ROWS COLUMNS TODAY".split(" "),
);
const ARRAY_RESULT = new Set(["SEQUENCE", "FILTER", "UNIQUE", "SORT", "MMULT", "TRANSPOSE"]);

function mayArray(ast: Ast, matrixFns: Set<string>): boolean {
  switch (ast.kind) {
    case "area":
    case "table":
    case "array":
    case "name":
      return true;
    case "unary":
      return mayArray(ast.arg, matrixFns);
    case "binary":
      return mayArray(ast.left, matrixFns) || mayArray(ast.right, matrixFns);
    case "chain":
      return mayArray(ast.first, matrixFns) || ast.rest.some((a) => mayArray(a, matrixFns));
    case "call":
      if (ARRAY_RESULT.has(ast.name) || matrixFns.has(ast.name)) return true;
      if (SCALAR_RESULT.has(ast.name)) return false;
      return ast.args.some((a) => mayArray(a, matrixFns));
    default:
      return false;
  }
}

function lowerBound(list: number[], x: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (list[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function insertSorted(list: number[], x: number): void {
  if (!list.length || list[list.length - 1] < x) list.push(x);
  else list.splice(lowerBound(list, x), 0, x);
}

/** A thrown error as a cell value (the evaluator returns errors; this catches the unexpected). */
function thrownToError(e: unknown): CellError {
  if (e instanceof FormulaSyntaxError) return { error: "#NAME?", message: `cannot read the formula: ${e.message}` };
  if (e instanceof RangeError && /call stack/i.test(e.message)) return VALUE("the formula nests too deeply to evaluate");
  return VALUE(`internal error: ${e instanceof Error ? e.message : String(e)}`);
}

// ---------------------------------------------------------------- AIRTALLY.* arguments

function describe(v: unknown): string {
  return typeof v === "string" ? `"${v}"` : String(v);
}

/** One argument for a one-value parameter, coerced by the parameter's type. */
function scalarArgument(fnName: string, p: { name: string; type: string }, raw: Value | Matrix): unknown {
  let v: Value | Matrix = raw;
  if (isMatrix(v)) {
    const rows = v.length;
    const cols = rows ? v[0].length : 0;
    if (rows === 1 && cols === 1) v = v[0][0];
    else return VALUE(`${fnName}: ${p.name} takes one value, got a range of ${rows}×${cols} cells`);
  }
  if (isCellError(v)) return v;
  if (v === undefined || v === null) return null;
  switch (p.type) {
    case "number":
      if (typeof v === "number") return v;
      if (typeof v === "boolean") return v ? 1 : 0;
      if (typeof v === "string") {
        if (v.trim() === "") return null;
        const n = Number(v.trim());
        if (Number.isFinite(n)) return n;
        return VALUE(`${fnName}: ${p.name} takes a number, got ${describe(v)}`);
      }
      return v;
    case "string":
      if (typeof v === "number") return String(v);
      if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
      return v;
    case "boolean":
      if (typeof v === "number") return v !== 0;
      if (typeof v === "string" && /^(true|false)$/i.test(v.trim())) return /^true$/i.test(v.trim());
      return v;
    default:
      return v;
  }
}

/** The result of a registered function as a cell value or array. */
function hostResult(v: unknown): Value | Matrix {
  if (v instanceof HostError) return err(v.code, v.message || undefined);
  if (Array.isArray(v)) {
    const rows = v.map((row) => (Array.isArray(row) ? row : [row]).map((x) => hostResult(x) as Value));
    if (rows.length === 0 || rows[0].length === 0) return VALUE("the function returned an empty array");
    if (rows.some((r) => r.some(isMatrix))) return VALUE("the function returned a nested array");
    return rows;
  }
  if (typeof v === "number") return Number.isFinite(v) ? (v === 0 ? 0 : v) : err("#NUM!", "the function returned a number that is not finite");
  if (v === undefined) return VALUE("the function returned nothing");
  if (v === null || typeof v === "string" || typeof v === "boolean") return v;
  return VALUE("the function returned an unknown value");
}

/** An evaluator function that calls one registered AIRTALLY function like the host does. */
export function hostFunction(f: AirtallyFunction): FunctionImpl {
  const fnName = `${NAMESPACE}.${f.id}`;
  return (ev, args, host, env) => {
    if (args.length > f.parameters.length) return VALUE(`${fnName}: takes at most ${f.parameters.length} arguments, got ${args.length}`);
    const values: unknown[] = [];
    for (let i = 0; i < f.parameters.length; i++) {
      const p = f.parameters[i];
      const a = args[i];
      if (!a || a.kind === "blank") {
        if (!p.optional) return VALUE(`${fnName}: ${p.name} is required`);
        values.push(null);
        continue;
      }
      const raw = ev.eval(a, host, env);
      let v: unknown;
      if (p.matrix) {
        const m = ev.matrix(raw);
        if (isCellError(m)) return m;
        let bad: CellError | undefined;
        for (const row of m) for (const x of row) if (!bad && isCellError(x)) bad = x;
        if (bad) return bad;
        v = m;
      } else v = scalarArgument(fnName, p, ev.arrayOrValue(raw));
      if (isCellError(v)) return v;
      values.push(v);
    }
    while (values.length && values[values.length - 1] === null) values.pop(); // as the host: trailing omitted arguments are absent
    try {
      return hostResult(f.fn(...values));
    } catch (e) {
      if (e instanceof HostError) return err(e.code, e.message || undefined);
      return VALUE(`internal error: ${e instanceof Error ? e.message : String(e)}`);
    }
  };
}

// ---------------------------------------------------------------- the engine

export class Recalc implements Book {
  private readonly sheets: SheetState[] = [];
  private readonly byName = new Map<string, SheetState>();
  private readonly functions: Map<string, FunctionImpl>;
  private readonly matrixFns = new Set<string>();
  /** "SHEET|NAME" for sheet scope, "|NAME" for workbook scope. */
  private readonly names = new Map<string, { ast: Ast | CellError; host: Host; text: string }>();
  private readonly tables: TableInfo[] = [];
  private readonly nodes: Node[] = [];
  private readonly cycles: string[][] = [];
  private readonly spillAreas: SpillArea[] = [];
  private readonly evaluator: Evaluator;
  private readonly astCache = new WeakMap<object, { text: string; ast: Ast | CellError }>();
  private depth = 0;
  private cellCount = 0;

  constructor(
    book: InputBook | null,
    airtally: Map<string, AirtallyFunction>,
    private readonly options: RecalcOptions = {},
  ) {
    this.functions = nativeFunctions();
    for (const f of airtally.values()) {
      const call = hostFunction(f);
      const names = [`${NAMESPACE}.${f.id}`, `${STORED_PREFIX}${NAMESPACE}_${f.id}`.toUpperCase()];
      for (const n of names) {
        this.functions.set(n, call);
        if (f.matrix) this.matrixFns.add(n);
      }
    }
    this.evaluator = new Evaluator(this, this.functions);
    if (!book) return; // loaded cell by cell: addSheets, addCell, finishLoading
    this.addSheets(book.sheets.map((s) => s.name));
    book.sheets.forEach((s, index) => {
      for (const c of s.cells) this.addCell(index, c);
    });
    this.finishLoading(book.names ?? [], book.tables ?? []);
  }

  /** The sheets, in workbook order (first step of loading cell by cell). */
  addSheets(names: string[]): void {
    for (const name of names) {
      const state: SheetState = { name, index: this.sheets.length, constants: new Grid(), formulas: new Grid(), owned: new Grid(), spilled: new Grid(), formulaRows: new Map(), pendingSpills: [], maxRow: 0, maxCol: 0 };
      this.sheets.push(state);
      this.byName.set(name.toUpperCase(), state);
    }
  }

  /** One cell of sheet number `index` (a streaming reader hands cells over as it reads them). */
  addCell(index: number, c: InputCell): void {
    if (++this.cellCount > MAX_CELLS) throw new RefusedInput(`refused: the workbook has more than ${MAX_CELLS} non-empty cells (limit)`);
    const state = this.sheets[index];
    if (c.row > state.maxRow) state.maxRow = c.row;
    if (c.col > state.maxCol) state.maxCol = c.col;
    if (c.formula !== undefined && c.formula.trim() !== "") {
      const formula = c.formula.trim().replace(/^=/, "");
      const node: Node = { sheet: state, row: c.row, col: c.col, formula, ast: c.refused ? err("#REF!", c.refused) : this.parse(formula, c.formulaHost ?? c, c.formulaHost !== undefined), state: 0, value: null, deps: NO_DEPS, mayArray: false, index: -1, low: -1, onStack: false, stamp: -1 };
      const a = c.arrayRange;
      if (a) {
        const cells = (a.bottom - a.top + 1) * (a.right - a.left + 1);
        if (cells > MAX_ARRAY_CELLS) node.ast = err("#NUM!", `the array formula covers ${areaText(a)}, over the limit of ${MAX_ARRAY_CELLS} cells`);
        else {
          node.arrayRange = a;
          state.maxRow = Math.max(state.maxRow, a.bottom);
          state.maxCol = Math.max(state.maxCol, a.right);
        }
      }
      state.formulas.set(c.row, c.col, node);
      let rows = state.formulaRows.get(c.col);
      if (!rows) state.formulaRows.set(c.col, (rows = []));
      insertSorted(rows, c.row);
      this.nodes.push(node);
    } else if (c.value !== undefined && c.value !== null) {
      state.constants.set(c.row, c.col, c.value);
    }
  }

  /** Last step of loading: array formula ranges, names, tables. */
  finishLoading(names: InputName[], tables: InputTable[]): void {
    // Cells inside a stored array formula's range are its output, not constants.
    for (const node of this.nodes) {
      const a = node.arrayRange;
      if (!a) continue;
      const state = node.sheet;
      for (let r = a.top; r <= a.bottom; r++)
        for (let c = a.left; c <= a.right; c++) {
          if (r === node.row && c === node.col) continue;
          state.owned.set(r, c, node);
          state.constants.delete(r, c);
        }
    }
    for (const n of names) this.addName(n);
    for (const t of tables) {
      const sheet = this.byName.get(t.sheet.toUpperCase());
      if (sheet) this.tables.push({ name: t.name, sheet, top: t.area.top, left: t.area.left, bottom: t.area.bottom, right: t.area.right, headerRows: t.headerRows, totalsRows: t.totalsRows, columns: t.columns });
    }
    for (const node of this.nodes) {
      if (isCellError(node.ast)) continue;
      try {
        node.mayArray = mayArray(node.ast, this.matrixFns);
      } catch (e) {
        node.ast = thrownToError(e);
      }
    }
    for (const s of this.sheets) s.pendingSpills = s.formulas.values().filter((n) => n.mayArray && !n.arrayRange);
  }

  /** Parse once per shared formula: its cells carry the same `formulaHost` object and reuse the first cell's tree. */
  private parse(text: string, host: { row: number; col: number }, shared: boolean): Ast | CellError {
    const hit = shared ? this.astCache.get(host) : undefined;
    if (hit && hit.text === text) return hit.ast;
    let ast: Ast | CellError;
    try {
      ast = parseFormula(text, host);
    } catch (e) {
      ast = thrownToError(e);
    }
    if (shared) this.astCache.set(host, { text, ast });
    return ast;
  }

  private addName(n: InputName): void {
    const scopeSheet = n.scope ? this.byName.get(n.scope.toUpperCase()) : undefined;
    if (n.scope && !scopeSheet) return;
    let text = n.formula?.trim().replace(/^=/, "");
    if (text === undefined && n.area && n.sheet) text = `'${n.sheet.replace(/'/g, "''")}'!${areaText(n.area).replace(/([A-Z]+)(\d+)/g, "$$$1$$$2")}`;
    if (text === undefined) return;
    let ast: Ast | CellError;
    try {
      ast = parseFormula(text, { row: 1, col: 1 });
    } catch (e) {
      ast = thrownToError(e);
    }
    const host: Host = { sheet: scopeSheet ?? this.sheets[0], row: 1, col: 1 };
    this.names.set(`${scopeSheet ? scopeSheet.name.toUpperCase() : ""}|${n.name.toUpperCase()}`, { ast, host, text });
  }

  // ------------------------------------------------------------ Book (what the evaluator reads)

  sheetNamed(name: string): unknown {
    return this.byName.get(name.toUpperCase());
  }

  sheetName(sheet: unknown): string {
    return (sheet as SheetState).name;
  }

  extent(sheet: unknown): { rows: number; cols: number } {
    const s = sheet as SheetState;
    return { rows: s.maxRow, cols: s.maxCol };
  }

  population(sheet: unknown): number {
    const s = sheet as SheetState;
    return s.constants.size + s.formulas.size + s.spilled.size;
  }

  populated(sheet: unknown, top: number, left: number, bottom: number, right: number): [number, number][] {
    const s = sheet as SheetState;
    for (const n of [...s.pendingSpills]) if (n.row <= bottom && n.col <= right) this.evaluate(n);
    const keys: number[] = [];
    const take = (r: number, c: number) => {
      if (r >= top && r <= bottom && c >= left && c <= right) keys.push(cellKey(r, c));
    };
    s.constants.forEach(take);
    s.formulas.forEach(take);
    s.spilled.forEach(take);
    s.owned.forEach((r, c) => (s.spilled.has(r, c) ? undefined : take(r, c)));
    keys.sort((a, b) => a - b);
    return keys.map((k) => [keyRow(k), keyCol(k)]);
  }

  name(name: string, fromSheet: unknown, scopeSheet?: string): { ast: Ast; host: Host } | undefined {
    const upper = name.toUpperCase();
    const def = scopeSheet !== undefined ? this.names.get(`${scopeSheet.toUpperCase()}|${upper}`) : this.names.get(`${(fromSheet as SheetState).name.toUpperCase()}|${upper}`) ?? this.names.get(`|${upper}`);
    if (!def) return undefined;
    if (isCellError(def.ast)) return { ast: { kind: "error", code: def.ast.error }, host: def.host };
    return { ast: def.ast, host: def.host };
  }

  table(name: string | undefined, host: Host): TableInfo | undefined {
    if (name !== undefined) return this.tables.find((t) => t.name.toUpperCase() === name.toUpperCase());
    return this.tables.find((t) => t.sheet === host.sheet && host.row >= t.top && host.row <= t.bottom && host.col >= t.left && host.col <= t.right);
  }

  /** The value of any cell, evaluating what it needs first. */
  value(sheet: unknown, row: number, col: number): Value {
    const s = sheet as SheetState;
    const node = s.formulas.get(row, col);
    if (node) {
      if (node.state !== 2) this.evaluate(node);
      return node.value;
    }
    const c = s.constants.get(row, col);
    if (c !== undefined) return c;
    const owner = s.owned.get(row, col);
    if (owner && owner.state !== 2) this.evaluate(owner);
    else if (s.pendingSpills.length && !owner) this.settleSpillsCovering(s, row, col);
    const spill = s.spilled.get(row, col);
    return spill ? spill.value : null;
  }

  /** An empty cell may be filled by a spill not evaluated yet: evaluate the formulas that could reach it. */
  private settleSpillsCovering(sheet: SheetState, row: number, col: number): void {
    for (const n of [...sheet.pendingSpills]) if (n.state === 0 && n.row <= row && n.col <= col) this.evaluate(n);
  }

  private evaluate(node: Node): void {
    if (node.state === 2) return;
    if (node.state === 1) {
      // Read while being computed: a circular reference the graph could not see (through a spill).
      node.value = { error: CYCLE, message: `circular reference through ${nodeKey(node)}` };
      return;
    }
    if (this.depth > MAX_ON_DEMAND_DEPTH) {
      node.value = VALUE("dependency chain too deep to evaluate on demand");
      node.state = 2;
      return;
    }
    node.state = 1;
    this.depth++;
    let result: Value | Matrix;
    try {
      if (isCellError(node.ast)) result = node.ast;
      else {
        const v: EvalValue = this.evaluator.eval(node.ast, { sheet: node.sheet, row: node.row, col: node.col }, undefined);
        result = isRef(v) ? this.evaluator.arrayOrValue(v) : v;
      }
    } catch (e) {
      result = thrownToError(e);
    }
    this.depth--;
    if (isCellError(node.value) && node.value.error === CYCLE) result = node.value;
    node.state = 2;
    if (node.mayArray) {
      const i = node.sheet.pendingSpills.indexOf(node);
      if (i >= 0) node.sheet.pendingSpills.splice(i, 1);
    }
    this.place(node, result);
  }

  /** Put a formula's result in its cell, and spill an array. */
  private place(node: Node, raw: Value | Matrix): void {
    const result: Value | Matrix = isMatrix(raw) ? raw : raw === null ? 0 : raw; // a blank read by a formula shows 0
    if (!isMatrix(result)) {
      node.value = result;
      if (node.arrayRange) this.fillStored(node, [[result]]);
      return;
    }
    const clean = result.map((row) => row.map((v) => (v === null ? 0 : v)));
    if (node.arrayRange) {
      this.fillStored(node, clean);
      return;
    }
    const h = clean.length;
    const w = clean[0].length;
    if (h === 1 && w === 1) {
      node.value = clean[0][0];
      return;
    }
    const s = node.sheet;
    const area: Area = { top: node.row, left: node.col, bottom: node.row + h - 1, right: node.col + w - 1 };
    if (area.bottom > 1048576 || area.right > MAX_COL) {
      node.value = { error: SPILL, message: `the result needs ${h}×${w} cells and runs off the sheet` };
      return;
    }
    for (let r = area.top; r <= area.bottom; r++)
      for (let c = area.left; c <= area.right; c++) {
        if (r === node.row && c === node.col) continue;
        const other = s.spilled.get(r, c);
        if (s.formulas.has(r, c) || s.constants.has(r, c) || s.owned.has(r, c) || (other && other.anchor !== node)) {
          node.value = { error: SPILL, message: `the result needs ${h}×${w} cells (${areaText(area)}) but ${address(r, c)} is not empty` };
          return;
        }
      }
    node.value = clean[0][0];
    for (let i = 0; i < h; i++)
      for (let j = 0; j < w; j++) {
        if (i === 0 && j === 0) continue;
        s.spilled.set(node.row + i, node.col + j, { value: clean[i][j], anchor: node });
      }
    s.maxRow = Math.max(s.maxRow, area.bottom);
    s.maxCol = Math.max(s.maxCol, area.right);
    this.spillAreas.push({ sheet: s.name, anchor: { row: node.row, col: node.col }, area, stored: false });
  }

  /** An array formula stored over a range: fill exactly that range (#N/A past the result, as Excel). */
  private fillStored(node: Node, result: Value[][]): void {
    const a = node.arrayRange!;
    const h = result.length;
    const w = result[0].length;
    const at = (i: number, j: number): Value => {
      const row = result[h === 1 ? 0 : i];
      if (row === undefined) return { error: "#N/A", message: `the result has ${h} rows; the array formula covers ${a.bottom - a.top + 1}` };
      const v = row[w === 1 ? 0 : j];
      return v === undefined ? { error: "#N/A", message: `the result has ${w} columns; the array formula covers ${a.right - a.left + 1}` } : v;
    };
    node.value = at(node.row - a.top, node.col - a.left);
    for (let r = a.top; r <= a.bottom; r++)
      for (let c = a.left; c <= a.right; c++) {
        if (r === node.row && c === node.col) continue;
        node.sheet.spilled.set(r, c, { value: at(r - a.top, c - a.left), anchor: node });
      }
    this.spillAreas.push({ sheet: node.sheet.name, anchor: { row: node.row, col: node.col }, area: a, stored: true });
  }

  // ------------------------------------------------------------ dependency graph

  /** Every cell and range a formula tree reads (names and table columns resolved). */
  private references(ast: Ast, host: Host, out: { sheet: SheetState; top: number; left: number; bottom: number; right: number }[], seenNames: Set<string> | undefined): void {
    const sheetOf = (name: string | undefined) => (name === undefined ? (host.sheet as SheetState) : this.byName.get(name.toUpperCase()));
    const at = (c: { row: number; col: number; rowAbs: boolean; colAbs: boolean }) => ({ row: c.rowAbs ? c.row : c.row + host.row, col: c.colAbs ? c.col : c.col + host.col });
    switch (ast.kind) {
      case "cell": {
        const s = sheetOf(ast.sheet);
        const p = at(ast.at);
        if (s) out.push({ sheet: s, top: p.row, left: p.col, bottom: p.row, right: p.col });
        return;
      }
      case "area": {
        const s = sheetOf(ast.sheet);
        const a = at(ast.from);
        const b = at(ast.to);
        if (s) out.push({ sheet: s, top: Math.min(a.row, b.row), left: Math.min(a.col, b.col), bottom: Math.max(a.row, b.row), right: Math.max(a.col, b.col) });
        return;
      }
      case "name": {
        const def = this.name(ast.name, host.sheet, ast.sheet);
        const key = `${ast.sheet ?? ""}|${ast.name.toUpperCase()}`;
        seenNames ??= new Set();
        if (def && !seenNames.has(key) && seenNames.size < 64) {
          seenNames.add(key);
          this.references(def.ast, def.host, out, seenNames);
        } else if (!def && ast.sheet === undefined) this.references({ kind: "table", table: ast.name, items: [], columns: [] }, host, out, seenNames);
        return;
      }
      case "table": {
        const r = this.evaluator.eval(ast, host, undefined); // the exact rows and columns it names ([#This Row] included)
        if (isRef(r)) out.push({ sheet: r.sheet as SheetState, top: r.top, left: r.left, bottom: r.bottom, right: r.right });
        return;
      }
      case "unary":
        this.references(ast.arg, host, out, seenNames);
        return;
      case "binary":
        this.references(ast.left, host, out, seenNames);
        this.references(ast.right, host, out, seenNames);
        return;
      case "chain":
        this.references(ast.first, host, out, seenNames);
        for (const a of ast.rest) this.references(a, host, out, seenNames);
        return;
      case "call":
        for (const a of ast.args) this.references(a, host, out, seenNames);
        return;
      case "array":
        return;
      default:
        return;
    }
  }

  private buildGraph(): void {
    const arrayNodes = this.nodes.filter((n) => n.arrayRange);
    const refs: { sheet: SheetState; top: number; left: number; bottom: number; right: number }[] = [];
    let stamp = 0;
    for (const node of this.nodes) {
      if (isCellError(node.ast)) continue;
      refs.length = 0;
      try {
        this.references(node.ast, { sheet: node.sheet, row: node.row, col: node.col }, refs, undefined);
      } catch (e) {
        node.ast = thrownToError(e); // a tree too deep to walk is an error cell, never a crash
        continue;
      }
      const mark = stamp++;
      const add = (n: Node | undefined) => {
        if (n && n.stamp !== mark) {
          n.stamp = mark;
          if (node.deps === NO_DEPS) node.deps = [];
          node.deps.push(n);
        }
      };
      for (const ref of refs) {
        const s = ref.sheet;
        if (ref.top === ref.bottom && ref.left === ref.right) {
          add(s.formulas.get(ref.top, ref.left) ?? s.owned.get(ref.top, ref.left));
          continue;
        }
        const width = ref.right - ref.left + 1;
        const visitColumn = (col: number, rows: number[]) => {
          for (let i = lowerBound(rows, ref.top); i < rows.length && rows[i] <= ref.bottom; i++) add(s.formulas.get(rows[i], col));
        };
        if (width <= s.formulaRows.size) {
          for (let col = ref.left; col <= ref.right; col++) {
            const rows = s.formulaRows.get(col);
            if (rows) visitColumn(col, rows);
          }
        } else for (const [col, rows] of s.formulaRows) if (col >= ref.left && col <= ref.right) visitColumn(col, rows);
        for (const n of arrayNodes) {
          const a = n.arrayRange!;
          if (n.sheet === s && a.top <= ref.bottom && a.bottom >= ref.top && a.left <= ref.right && a.right >= ref.left) add(n);
        }
      }
    }
  }

  /**
   * Tarjan's strongly connected components, iterative, with the bookkeeping
   * on the nodes themselves (a million formulas need no maps). Returns every
   * node dependencies first, and the components that are circular.
   */
  private components(): { order: Node[]; cyclic: Node[][] } {
    const stack: Node[] = [];
    const order: Node[] = [];
    const cyclic: Node[][] = [];
    let next = 0;
    const work: { node: Node; i: number }[] = [];
    const visit = (n: Node) => {
      n.index = n.low = next++;
      n.onStack = true;
      stack.push(n);
      work.push({ node: n, i: 0 });
    };
    for (const root of this.nodes) {
      if (root.index >= 0) continue;
      visit(root);
      while (work.length) {
        const top = work[work.length - 1];
        const node = top.node;
        if (top.i < node.deps.length) {
          const d = node.deps[top.i++];
          if (d.index < 0) visit(d);
          else if (d.onStack && d.index < node.low) node.low = d.index;
          continue;
        }
        work.pop();
        if (work.length) {
          const parent = work[work.length - 1].node;
          if (node.low < parent.low) parent.low = node.low;
        }
        if (node.low === node.index) {
          const start = order.length;
          let n: Node;
          do {
            n = stack.pop()!;
            n.onStack = false;
            order.push(n);
          } while (n !== node);
          const size = order.length - start;
          if (size > 1 || node.deps.includes(node)) cyclic.push(order.slice(start));
        }
      }
    }
    return { order, cyclic };
  }

  /** Follow dependencies inside one component from `start` back to it: the cycle's path for the message. */
  private cyclePath(start: Node, members: Set<Node>): Node[] {
    const prev = new Map<Node, Node>();
    const queue: Node[] = [start];
    const seen = new Set<Node>([start]);
    while (queue.length) {
      const n = queue.shift()!;
      for (const d of n.deps) {
        if (d === start) {
          const path: Node[] = [n];
          let p = n;
          while (p !== start) {
            p = prev.get(p)!;
            path.unshift(p);
          }
          return path;
        }
        if (members.has(d) && !seen.has(d)) {
          seen.add(d);
          prev.set(d, n);
          queue.push(d);
        }
      }
    }
    return [start];
  }

  run(): RecalcResult {
    this.buildGraph();
    const { order, cyclic } = this.components();
    for (const comp of cyclic) {
      const members = new Set(comp);
      const sorted = [...comp].sort((a, b) => a.sheet.index - b.sheet.index || a.row - b.row || a.col - b.col);
      const path = this.cyclePath(sorted[0], members);
      const text = [...path, path[0]].map(nodeKey).join(" → ");
      this.cycles.push(sorted.map(nodeKey));
      for (const n of comp) {
        n.state = 2;
        n.value = { error: CYCLE, message: `circular reference: ${text}` };
      }
    }
    const total = order.length;
    const every = this.options.progressEvery ?? 1000;
    let done = 0;
    for (const n of order) {
      this.evaluate(n);
      n.deps = NO_DEPS; // not needed once evaluated
      done++;
      if (this.options.onProgress && done % every === 0) this.options.onProgress(done, total);
    }
    if (this.options.onProgress && total >= every) this.options.onProgress(total, total);
    // A cycle found only while evaluating (through a spill) is reported like the others: one per cell it runs through.
    const throughSpill = new Map<string, string[]>();
    for (const n of this.nodes) {
      const m = isCellError(n.value) && n.value.error === CYCLE ? n.value.message : undefined;
      if (!m?.startsWith("circular reference through") || this.cycles.some((c) => c.includes(nodeKey(n)))) continue;
      if (!throughSpill.has(m)) throughSpill.set(m, []);
      throughSpill.get(m)!.push(nodeKey(n));
    }
    for (const members of throughSpill.values()) this.cycles.push(members);
    return this.result();
  }

  /** The cell at a position as the result reports it (undefined: empty). */
  private cellAt(s: SheetState, row: number, col: number): CellResult | undefined {
    const base = { sheet: s.name, row, col, address: address(row, col) };
    const n = s.formulas.get(row, col);
    if (n) return { ...base, kind: "formula", formula: n.formula, value: n.value };
    const sp = s.spilled.get(row, col);
    if (sp) return { ...base, kind: "spill", value: sp.value, anchor: nodeKey(sp.anchor) };
    const v = s.constants.get(row, col);
    return v === undefined ? undefined : { ...base, kind: "constant", value: v };
  }

  /** Every non-empty cell of a sheet in row-major order, without building them all at once. */
  private *cellsOf(s: SheetState): Generator<CellResult> {
    const keys = new Float64Array(s.constants.size + s.formulas.size + s.spilled.size);
    let i = 0;
    s.formulas.forEach((r, c) => (keys[i++] = cellKey(r, c)));
    s.spilled.forEach((r, c) => (keys[i++] = cellKey(r, c)));
    s.constants.forEach((r, c) => (s.spilled.has(r, c) || s.formulas.has(r, c) ? undefined : (keys[i++] = cellKey(r, c))));
    const sorted = keys.subarray(0, i).sort();
    for (const k of sorted) yield this.cellAt(s, keyRow(k), keyCol(k))!;
  }

  private result(): RecalcResult {
    const errors: CellResult[] = [];
    for (const n of this.nodes) if (isCellError(n.value)) errors.push(this.cellAt(n.sheet, n.row, n.col)!);
    for (const s of this.sheets)
      s.spilled.forEach((r, c, sp) => (isCellError(sp.value) && !isCellError(sp.anchor.value) ? errors.push(this.cellAt(s, r, c)!) : undefined));
    errors.sort((a, b) => this.byName.get(a.sheet.toUpperCase())!.index - this.byName.get(b.sheet.toUpperCase())!.index || a.row - b.row || a.col - b.col);
    const engine = this;
    const sheets: ResultSheet[] = this.sheets.map((s) => {
      let cached: CellResult[] | undefined;
      return {
        name: s.name,
        get cells() {
          return (cached ??= [...engine.cellsOf(s)]);
        },
        each: () => this.cellsOf(s),
        at: (row: number, col: number) => this.cellAt(s, row, col),
        peek: (row: number, col: number) => {
          const n = s.formulas.get(row, col);
          if (n) return { kind: "formula" as const, value: n.value };
          const sp = s.spilled.get(row, col);
          if (sp) return { kind: "spill" as const, value: sp.value };
          const v = s.constants.get(row, col);
          return v === undefined ? undefined : { kind: "constant" as const, value: v };
        },
        spilledCells: () => {
          const out: [number, number][] = [];
          s.spilled.forEach((r, c) => out.push([r, c]));
          return out;
        },
      };
    });
    return { sheets, errors, cycles: this.cycles, spills: this.spillAreas, formulaCount: this.nodes.length };
  }
}
/** Recalculate a workbook model. Never throws for a bad cell: errors are cell values. */
export function recalc(book: InputBook, airtally: Map<string, AirtallyFunction>, options?: RecalcOptions): RecalcResult {
  return new Recalc(book, airtally, options).run();
}

/** Evaluate one formula with no workbook behind it (references read as empty cells). */
export function evaluateFormula(formula: string, airtally: Map<string, AirtallyFunction>): Value | Value[][] {
  const text = formula.trim().replace(/^=/, "");
  const engine = new Recalc({ sheets: [{ name: "Sheet1", cells: [{ row: 1, col: 1, formula: text }] }] }, airtally);
  const result = engine.run();
  const anchor = result.sheets[0].cells.find((c) => c.kind === "formula")!;
  if (result.spills.length === 0) return anchor.value;
  const area = result.spills[0].area;
  const grid: Value[][] = [];
  const byAddress = new Map(result.sheets[0].cells.map((c) => [c.address, c.value]));
  for (let r = area.top; r <= area.bottom; r++) {
    const row: Value[] = [];
    for (let c = area.left; c <= area.right; c++) row.push(byAddress.get(address(r, c)) ?? null);
    grid.push(row);
  }
  return grid;
}
