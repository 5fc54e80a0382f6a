/**
 * Headless recalculation of a workbook: every formula — native and
 * AIRTALLY.* — in dependency order, with fast-formula-parser (MIT) as the
 * formula engine and the built add-in (bundle.ts) for AIRTALLY.* calls.
 *
 * Decisions (documented in DEVELOPERS.md, "Headless recalculation"):
 * - Order: a dependency graph from fast-formula-parser's DepParser, solved
 *   with Tarjan's strongly connected components; components come out
 *   dependencies first. A component of more than one cell (or a cell that
 *   reads itself) is a circular reference: each member gets #CYCLE! with the
 *   path, and cells that read a member get that error too.
 * - Dependencies the graph cannot see (cells filled by another formula's
 *   spill) are evaluated on demand when read.
 * - Spills: a formula whose result is an array (BREAKDOWN, TXTIMEPARTS,
 *   EDCAMIX, or a native array) fills the cells below and to the right, as
 *   dynamic-array Excel does; if one of those cells is not empty the formula
 *   shows #SPILL! and fills nothing. An array formula stored with a range
 *   (`{=…}` over A1:B9) fills exactly that range: missing entries are #N/A,
 *   extra ones are cut off, as Excel does for array formulas.
 * - Arguments of AIRTALLY.* functions are coerced as the host does from the
 *   parameter types in functions.json; an omitted argument and an empty cell
 *   arrive as null ("use the default", DESIGN.md §4); a range given to a
 *   one-value parameter is #VALUE!; an error argument is passed through.
 * - Errors are values: every failure stays in its cell with a code and a
 *   message; nothing here throws for a bad cell.
 */
import FormulaParser, { DepParser, FormulaError, type CellRef, type FunctionArg, type RangeRef } from "fast-formula-parser";
import { address, areaText, type Area } from "./address";
import { HostError, type AirtallyFunction } from "./bundle";
import { NAMESPACE, STORED_PREFIX } from "./storedForm";

export type Scalar = number | string | boolean | null;
export interface CellError {
  error: string;
  message?: string;
}
export type Value = Scalar | CellError;

export function isCellError(v: unknown): v is CellError {
  return typeof v === "object" && v !== null && typeof (v as CellError).error === "string" && !Array.isArray(v);
}

/** Excel's cycle code does not exist (Excel warns and shows 0); ours names the problem. */
export const CYCLE = "#CYCLE!";
export const SPILL = "#SPILL!";

export interface InputCell {
  row: number;
  col: number;
  /** Formula text without the leading "=", as stored (either AIRTALLY form). */
  formula?: string;
  /** The constant, or the cached value of a formula (ignored: it is recomputed). */
  value?: Value;
  /** Array formula range (legacy `{=…}` / stored spill), e.g. "D2:E9". */
  arrayRange?: Area;
}

export interface InputSheet {
  name: string;
  cells: InputCell[];
}

export interface InputBook {
  sheets: InputSheet[];
  /** Defined names → a range on a sheet. */
  names?: { name: string; sheet: string; area: Area }[];
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

export interface RecalcResult {
  sheets: { name: string; cells: CellResult[] }[];
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
  key: string;
  sheet: SheetState;
  row: number;
  col: number;
  formula: string;
  arrayRange?: Area;
  state: "pending" | "busy" | "done";
  value: Value;
  array?: Value[][];
  deps: Node[];
  mayArray: boolean;
}

interface SheetState {
  name: string;
  index: number;
  constants: Map<string, Value>;
  formulas: Map<string, Node>;
  /** Cells covered by a stored array formula → its node. */
  owned: Map<string, Node>;
  spilled: Map<string, { value: Value; anchor: Node }>;
  maxRow: number;
  maxCol: number;
}

const MAX_ON_DEMAND_DEPTH = 64;
const cellKey = (row: number, col: number) => `${row},${col}`;

/** A value as fast-formula-parser expects it in a cell. */
function toParser(v: Value): unknown {
  if (isCellError(v)) return new FormulaError(v.error, v.message ?? undefined);
  return v;
}

/** A value fast-formula-parser produced, as a cell value. */
function fromParser(v: unknown, topLevel = true): Value | Value[][] {
  if (v instanceof FormulaError) return v.message ? { error: v.error, message: v.message } : { error: v.error };
  if (v instanceof HostError) return { error: v.code, message: v.message || undefined };
  if (Array.isArray(v)) {
    if (!topLevel) return { error: "#VALUE!", message: "nested array" };
    const rows = v.map((row) => (Array.isArray(row) ? row : [row]).map((x) => fromParser(x, false) as Value));
    if (rows.length === 0 || rows[0].length === 0) return { error: "#VALUE!", message: "the formula returned an empty array" };
    return rows;
  }
  if (v === null || v === undefined) return 0; // a blank read by a formula shows 0, as in Excel
  if (typeof v === "number") {
    if (Number.isNaN(v)) return { error: "#VALUE!", message: "not a number" };
    if (!Number.isFinite(v)) return { error: "#NUM!", message: "the result is not finite" };
    return v === 0 ? 0 : v; // no -0
  }
  if (typeof v === "string" || typeof v === "boolean") return v;
  return { error: "#VALUE!", message: "the formula returned a reference union or an unknown value" };
}

function isBlank(v: Value | undefined): boolean {
  return v === undefined || v === null || v === "";
}

/** Excel's reading of an exception fast-formula-parser threw (parse errors, unknown functions). */
function thrownToError(e: unknown): CellError {
  if (e instanceof FormulaError) {
    const details = e.details;
    if (details instanceof FormulaError) {
      const unknown = /^Function (\S+) is not implemented/.exec(details.message || "");
      if (unknown) {
        const name = unknown[1].toUpperCase();
        const ours = name.startsWith(`${NAMESPACE}.`) || name.startsWith(`${STORED_PREFIX}${NAMESPACE}_`.toUpperCase());
        return { error: "#NAME?", message: ours ? `${name} is not a function of this build of the add-in (dist/functions.js); check the name or run npm run build` : `${name} is not a function the command line knows` };
      }
      return { error: details.error, message: details.message || undefined };
    }
    if (e.error === "#ERROR!") {
      const first = String(e.message || "").split("\n").find((l) => l.trim()) ?? "";
      return { error: "#NAME?", message: `cannot read the formula: ${first.trim()}` };
    }
    return { error: e.error, message: e.message || undefined };
  }
  return { error: "#VALUE!", message: `internal error: ${e instanceof Error ? e.message : String(e)}` };
}

// ---------------------------------------------------------------- AIRTALLY.* arguments

function describe(v: unknown): string {
  return typeof v === "string" ? `"${v}"` : String(v);
}

/** One argument for a one-value parameter, coerced by the parameter's type. */
function scalarArgument(fnName: string, p: { name: string; type: string }, raw: unknown): unknown {
  let v = raw;
  if (Array.isArray(v)) {
    const rows = v.length;
    const cols = rows ? (v[0] as unknown[]).length : 0;
    if (rows === 1 && cols === 1) v = (v[0] as unknown[])[0];
    else return new FormulaError("#VALUE!", `${fnName}: ${p.name} takes one value, got a range of ${rows}×${cols} cells`);
  }
  if (v instanceof FormulaError) return v;
  if (v === undefined || v === null) return null;
  switch (p.type) {
    case "number":
      if (typeof v === "number") return v;
      if (typeof v === "boolean") return v ? 1 : 0;
      if (typeof v === "string") {
        if (v.trim() === "") return null;
        const n = Number(v.trim());
        if (Number.isFinite(n)) return n;
        return new FormulaError("#VALUE!", `${fnName}: ${p.name} takes a number, got ${describe(v)}`);
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

/** One argument for a range parameter: always a 2-D array; blanks → null. */
function matrixArgument(raw: unknown): unknown[][] | FormulaError {
  const rows = Array.isArray(raw) ? (raw as unknown[]).map((r) => (Array.isArray(r) ? r : [r])) : [[raw]];
  for (const row of rows) for (const v of row) if (v instanceof FormulaError) return v;
  return rows.map((row) => row.map((v) => (v === undefined ? null : v)));
}

/** The result of a registered function, as the parser expects it. */
function hostResult(v: unknown): unknown {
  if (v instanceof HostError) return new FormulaError(v.code, v.message || undefined);
  if (Array.isArray(v)) return v.map((row) => (Array.isArray(row) ? row : [row]).map((x) => hostResult(x)));
  if (typeof v === "number" && !Number.isFinite(v)) return new FormulaError("#NUM!", "the function returned a number that is not finite");
  if (v === undefined) return new FormulaError("#VALUE!", "the function returned nothing");
  return v;
}

/** A parser function that calls one registered AIRTALLY function like the host does. */
export function hostFunction(f: AirtallyFunction): (...args: FunctionArg[]) => unknown {
  const fnName = `${NAMESPACE}.${f.id}`;
  return (...args: FunctionArg[]) => {
    if (args.length > f.parameters.length) {
      return new FormulaError("#VALUE!", `${fnName}: takes at most ${f.parameters.length} arguments, got ${args.length}`);
    }
    const values: unknown[] = [];
    for (let i = 0; i < f.parameters.length; i++) {
      const p = f.parameters[i];
      const a = args[i];
      if (!a || a.omitted) {
        if (!p.optional) return new FormulaError("#VALUE!", `${fnName}: ${p.name} is required`);
        values.push(null);
        continue;
      }
      const v = p.matrix ? matrixArgument(a.value) : scalarArgument(fnName, p, a.value);
      if (v instanceof FormulaError) return v;
      values.push(v);
    }
    while (values.length && values[values.length - 1] === null) values.pop(); // as the host: trailing omitted arguments are absent
    try {
      return hostResult(f.fn(...values));
    } catch (e) {
      if (e instanceof HostError) return new FormulaError(e.code, e.message || undefined);
      return new FormulaError("#VALUE!", `internal error: ${e instanceof Error ? e.message : String(e)}`);
    }
  };
}

// ---------------------------------------------------------------- native functions missing from the engine

function flatten(args: FunctionArg[]): { numbers: number[]; error?: FormulaError; count: number } {
  const numbers: number[] = [];
  let count = 0;
  for (const a of args) {
    if (!a || a.omitted) continue;
    const fromRange = a.isRangeRef || Array.isArray(a.value);
    const items = Array.isArray(a.value) ? (a.value as unknown[][]).flat() : [a.value];
    for (const v of items) {
      if (v instanceof FormulaError) return { numbers, error: v, count };
      if (v !== null && v !== undefined && v !== "") count++;
      if (typeof v === "number") numbers.push(v);
      else if (!fromRange && typeof v === "boolean") numbers.push(v ? 1 : 0);
      else if (!fromRange && typeof v === "string" && v.trim() !== "" && Number.isFinite(Number(v))) numbers.push(Number(v));
      else if (!fromRange && typeof v === "string") return { numbers, error: FormulaError.VALUE, count };
    }
  }
  return { numbers, count };
}

/** MAX, MIN and COUNTA are not in fast-formula-parser 1.0.19; Excel's rules: ranges skip text and blanks. */
export const EXTRA_NATIVE: Record<string, (...args: FunctionArg[]) => unknown> = {
  MAX: (...args) => {
    const f = flatten(args);
    return f.error ?? (f.numbers.length ? Math.max(...f.numbers) : 0);
  },
  MIN: (...args) => {
    const f = flatten(args);
    return f.error ?? (f.numbers.length ? Math.min(...f.numbers) : 0);
  },
  COUNTA: (...args) => {
    let n = 0;
    for (const a of args) {
      if (!a || a.omitted) continue;
      const items = Array.isArray(a.value) ? (a.value as unknown[][]).flat() : [a.value];
      for (const v of items) if (v !== null && v !== undefined && !(a.isRangeRef && v === "")) n++;
    }
    return n;
  },
};

// ---------------------------------------------------------------- the engine

export class Recalc {
  private readonly sheets: SheetState[] = [];
  private readonly byName = new Map<string, SheetState>();
  private readonly parsers: FormulaParser[] = [];
  private readonly functions: Record<string, (...args: FunctionArg[]) => unknown> = {};
  private readonly names = new Map<string, { sheet: string; area: Area }>();
  private readonly nodes: Node[] = [];
  private readonly cycles: string[][] = [];
  private readonly spillAreas: SpillArea[] = [];

  constructor(
    book: InputBook,
    airtally: Map<string, AirtallyFunction>,
    private readonly options: RecalcOptions = {},
  ) {
    Object.assign(this.functions, EXTRA_NATIVE);
    for (const f of airtally.values()) {
      const call = hostFunction(f);
      this.functions[`${NAMESPACE}.${f.id}`] = call;
      this.functions[`${STORED_PREFIX}${NAMESPACE}_${f.id}`.toUpperCase()] = call;
    }
    for (const n of book.names ?? []) this.names.set(n.name.toUpperCase(), { sheet: n.sheet, area: n.area });
    book.sheets.forEach((s, index) => {
      const state: SheetState = { name: s.name, index, constants: new Map(), formulas: new Map(), owned: new Map(), spilled: new Map(), maxRow: 0, maxCol: 0 };
      this.sheets.push(state);
      this.byName.set(s.name.toUpperCase(), state);
      for (const c of s.cells) {
        state.maxRow = Math.max(state.maxRow, c.arrayRange?.bottom ?? c.row);
        state.maxCol = Math.max(state.maxCol, c.arrayRange?.right ?? c.col);
        const key = cellKey(c.row, c.col);
        if (c.formula !== undefined && c.formula.trim() !== "") {
          const formula = c.formula.trim().replace(/^=/, "");
          const node: Node = {
            key: `${s.name}!${address(c.row, c.col)}`,
            sheet: state,
            row: c.row,
            col: c.col,
            formula,
            arrayRange: c.arrayRange,
            state: "pending",
            value: null,
            deps: [],
            mayArray: this.mayReturnArray(formula, airtally),
          };
          state.formulas.set(key, node);
          this.nodes.push(node);
        } else if (c.value !== undefined) {
          state.constants.set(key, c.value);
        }
      }
    });
    // Cells inside a stored array formula's range are its output, not constants.
    for (const s of this.sheets) {
      for (const node of s.formulas.values()) {
        const a = node.arrayRange;
        if (!a) continue;
        for (let r = a.top; r <= a.bottom; r++)
          for (let c = a.left; c <= a.right; c++) {
            const k = cellKey(r, c);
            if (r === node.row && c === node.col) continue;
            s.owned.set(k, node);
            s.constants.delete(k);
          }
      }
    }
  }

  /** Formulas whose result may spill: a matrix AIRTALLY function, or any native array-capable one. */
  private mayReturnArray(formula: string, airtally: Map<string, AirtallyFunction>): boolean {
    const upper = formula.toUpperCase();
    for (const f of airtally.values()) {
      if (f.matrix && (upper.includes(`${NAMESPACE}.${f.id}(`) || upper.includes(`${STORED_PREFIX}${NAMESPACE}_${f.id}(`.toUpperCase()))) return true;
    }
    return /(^|[^A-Z0-9_.])(TRANSPOSE|MMULT|MUNIT|FREQUENCY)\(/.test(upper) || /^[$A-Z]+[$0-9]+:[$A-Z]+[$0-9]+$/.test(upper.replace(/^'?[^!]*'?!/, ""));
  }

  private sheetOf(name: string | undefined, fallback: SheetState): SheetState | undefined {
    if (name === undefined || name === null) return fallback;
    return this.byName.get(String(name).toUpperCase());
  }

  private parserAt(depth: number): FormulaParser {
    let p = this.parsers[depth];
    if (!p) {
      p = new FormulaParser({
        functions: this.functions,
        onCell: (ref: CellRef) => this.readCell(ref, depth),
        onRange: (ref: RangeRef) => this.readRange(ref, depth),
        onVariable: (name: string) => this.variable(name),
      });
      this.parsers[depth] = p;
    }
    return p;
  }

  private variable(name: string): RangeRef | CellRef | null {
    const n = this.names.get(name.toUpperCase());
    if (!n) return null;
    const a = n.area;
    if (a.top === a.bottom && a.left === a.right) return { sheet: n.sheet, row: a.top, col: a.left };
    return { sheet: n.sheet, from: { row: a.top, col: a.left }, to: { row: a.bottom, col: a.right } };
  }

  private current: SheetState[] = [];

  private readCell(ref: CellRef, depth: number): unknown {
    const sheet = this.sheetOf(ref.sheet, this.current[depth]);
    if (!sheet) return FormulaError.REF;
    return toParser(this.valueAt(sheet, ref.row, ref.col, depth + 1));
  }

  private readRange(ref: RangeRef, depth: number): unknown[][] {
    const sheet = this.sheetOf(ref.sheet, this.current[depth]);
    if (!sheet) return [[FormulaError.REF]];
    // Whole columns/rows: only as far as anything on the sheet reaches.
    const bottom = Math.min(ref.to.row, Math.max(sheet.maxRow, ref.from.row));
    const right = Math.min(ref.to.col, Math.max(sheet.maxCol, ref.from.col));
    const out: unknown[][] = [];
    for (let r = ref.from.row; r <= bottom; r++) {
      const row: unknown[] = [];
      for (let c = ref.from.col; c <= right; c++) row.push(toParser(this.valueAt(sheet, r, c, depth + 1)));
      out.push(row);
    }
    return out;
  }

  /** The value of any cell, evaluating what it needs first. */
  private valueAt(sheet: SheetState, row: number, col: number, depth: number): Value {
    const k = cellKey(row, col);
    const node = sheet.formulas.get(k);
    if (node) {
      this.evaluate(node, depth);
      return node.value;
    }
    const owner = sheet.owned.get(k);
    if (owner) this.evaluate(owner, depth);
    else if (!sheet.constants.has(k) && !sheet.spilled.has(k)) this.settleSpillsCovering(sheet, row, col, depth);
    const spill = sheet.spilled.get(k);
    if (spill) return spill.value;
    return sheet.constants.get(k) ?? null;
  }

  /** An empty cell may be filled by a spill not evaluated yet: evaluate the formulas that could reach it. */
  private settleSpillsCovering(sheet: SheetState, row: number, col: number, depth: number): void {
    for (const n of sheet.formulas.values()) {
      if (n.state === "pending" && n.mayArray && !n.arrayRange && n.row <= row && n.col <= col) this.evaluate(n, depth);
    }
  }

  private evaluate(node: Node, depth: number): void {
    if (node.state === "done") return;
    if (node.state === "busy") {
      // Read while being computed: a circular reference the graph could not see (through a spill).
      node.value = { error: CYCLE, message: `circular reference through ${node.key}` };
      return;
    }
    if (depth > MAX_ON_DEMAND_DEPTH) {
      node.value = { error: "#VALUE!", message: "dependency chain too deep to evaluate on demand" };
      node.state = "done";
      return;
    }
    node.state = "busy";
    let result: Value | Value[][];
    try {
      this.current[depth] = node.sheet;
      const direct = this.directReference(node, depth);
      if (direct !== undefined) result = direct;
      else result = fromParser(this.parserAt(depth).parse(node.formula, { sheet: node.sheet.name, row: node.row, col: node.col }, true));
    } catch (e) {
      result = thrownToError(e);
    }
    if (node.state === "busy" && isCellError(node.value) && node.value.error === CYCLE) result = node.value;
    node.state = "done";
    this.place(node, result);
  }

  /**
   * `=A1` / `=Sheet!A1`: read directly. fast-formula-parser 1.0.19 turns an error value reached through a bare
   * reference into a plain #VALUE!, losing the code and message; Excel shows the referenced error.
   */
  private directReference(node: Node, depth: number): Value | undefined {
    const m = /^(?:(?:'((?:[^']|'')+)'|([A-Za-z0-9_.]+))!)?\$?([A-Za-z]{1,3})\$?(\d+)$/.exec(node.formula.trim());
    if (!m) return undefined;
    const sheetName = m[1] !== undefined ? m[1].replace(/''/g, "'") : m[2];
    const sheet = sheetName === undefined ? node.sheet : this.byName.get(sheetName.toUpperCase());
    if (!sheet) return { error: "#REF!", message: `no sheet named ${sheetName}` };
    let col = 0;
    for (const ch of m[3].toUpperCase()) col = col * 26 + (ch.charCodeAt(0) - 64);
    const v = this.valueAt(sheet, Number(m[4]), col, depth + 1);
    return v === null ? 0 : v;
  }

  /** Put a formula's result in its cell, and spill an array. */
  private place(node: Node, result: Value | Value[][]): void {
    if (!Array.isArray(result)) {
      node.value = result;
      if (node.arrayRange) this.fillStored(node, [[result]]);
      return;
    }
    if (node.arrayRange) {
      this.fillStored(node, result);
      return;
    }
    const h = result.length;
    const w = result[0].length;
    if (h === 1 && w === 1) {
      node.value = result[0][0];
      return;
    }
    const s = node.sheet;
    const area: Area = { top: node.row, left: node.col, bottom: node.row + h - 1, right: node.col + w - 1 };
    for (let r = area.top; r <= area.bottom; r++)
      for (let c = area.left; c <= area.right; c++) {
        if (r === node.row && c === node.col) continue;
        const k = cellKey(r, c);
        const other = s.spilled.get(k);
        if (s.formulas.has(k) || !isBlank(s.constants.get(k)) || s.owned.has(k) || (other && other.anchor !== node)) {
          node.value = { error: SPILL, message: `the result needs ${h}×${w} cells (${areaText(area)}) but ${address(r, c)} is not empty` };
          return;
        }
      }
    node.value = result[0][0];
    node.array = result;
    for (let i = 0; i < h; i++)
      for (let j = 0; j < w; j++) {
        if (i === 0 && j === 0) continue;
        s.spilled.set(cellKey(node.row + i, node.col + j), { value: result[i][j], anchor: node });
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
    node.array = result;
    for (let r = a.top; r <= a.bottom; r++)
      for (let c = a.left; c <= a.right; c++) {
        if (r === node.row && c === node.col) continue;
        node.sheet.spilled.set(cellKey(r, c), { value: at(r - a.top, c - a.left), anchor: node });
      }
    this.spillAreas.push({ sheet: node.sheet.name, anchor: { row: node.row, col: node.col }, area: a, stored: true });
  }

  // ------------------------------------------------------------ dependency graph

  private buildGraph(): void {
    const dep = new DepParser({ onVariable: (name: string) => this.variable(name) });
    for (const node of this.nodes) {
      let refs: (CellRef | RangeRef)[] = [];
      try {
        refs = dep.parse(node.formula, { sheet: node.sheet.name, row: node.row, col: node.col });
      } catch {
        refs = []; // the evaluation reports the parse error in the cell
      }
      const seen = new Set<Node>();
      const add = (n: Node | undefined) => {
        if (n && !seen.has(n)) {
          seen.add(n);
          node.deps.push(n);
        }
      };
      for (const ref of refs) {
        const sheet = this.sheetOf(ref.sheet, node.sheet);
        if (!sheet) continue;
        if ("from" in ref) {
          const top = ref.from.row, bottom = ref.to.row, left = ref.from.col, right = ref.to.col;
          for (const n of sheet.formulas.values()) {
            if (n.row >= top && n.row <= bottom && n.col >= left && n.col <= right) add(n);
            else if (n.arrayRange && n.arrayRange.top <= bottom && n.arrayRange.bottom >= top && n.arrayRange.left <= right && n.arrayRange.right >= left) add(n);
          }
        } else {
          const k = cellKey(ref.row, ref.col);
          add(sheet.formulas.get(k) ?? sheet.owned.get(k));
        }
      }
    }
  }

  /** Tarjan's strongly connected components, iterative; returns components dependencies first. */
  private components(): Node[][] {
    const index = new Map<Node, number>();
    const low = new Map<Node, number>();
    const onStack = new Set<Node>();
    const stack: Node[] = [];
    const out: Node[][] = [];
    let next = 0;
    for (const root of this.nodes) {
      if (index.has(root)) continue;
      const work: { node: Node; i: number }[] = [{ node: root, i: 0 }];
      index.set(root, next);
      low.set(root, next++);
      stack.push(root);
      onStack.add(root);
      while (work.length) {
        const top = work[work.length - 1];
        if (top.i < top.node.deps.length) {
          const d = top.node.deps[top.i++];
          if (!index.has(d)) {
            index.set(d, next);
            low.set(d, next++);
            stack.push(d);
            onStack.add(d);
            work.push({ node: d, i: 0 });
          } else if (onStack.has(d)) {
            low.set(top.node, Math.min(low.get(top.node)!, index.get(d)!));
          }
          continue;
        }
        work.pop();
        if (work.length) {
          const parent = work[work.length - 1].node;
          low.set(parent, Math.min(low.get(parent)!, low.get(top.node)!));
        }
        if (low.get(top.node) === index.get(top.node)) {
          const comp: Node[] = [];
          let n: Node;
          do {
            n = stack.pop()!;
            onStack.delete(n);
            comp.push(n);
          } while (n !== top.node);
          out.push(comp);
        }
      }
    }
    return out;
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
    const order = this.components();
    for (const comp of order) {
      const selfLoop = comp.length === 1 && comp[0].deps.includes(comp[0]);
      if (comp.length === 1 && !selfLoop) continue;
      const members = new Set(comp);
      const sorted = [...comp].sort((a, b) => a.sheet.index - b.sheet.index || a.row - b.row || a.col - b.col);
      const path = this.cyclePath(sorted[0], members);
      const text = [...path, path[0]].map((n) => n.key).join(" → ");
      this.cycles.push(sorted.map((n) => n.key));
      for (const n of comp) {
        n.state = "done";
        n.value = { error: CYCLE, message: `circular reference: ${text}` };
      }
    }
    const total = this.nodes.length;
    const every = this.options.progressEvery ?? 1000;
    let done = 0;
    for (const comp of order) {
      for (const n of comp) {
        this.evaluate(n, 0);
        done++;
        if (this.options.onProgress && done % every === 0) this.options.onProgress(done, total);
      }
    }
    if (this.options.onProgress && total >= every) this.options.onProgress(total, total);
    return this.collect();
  }

  private collect(): RecalcResult {
    const sheets: RecalcResult["sheets"] = [];
    const errors: CellResult[] = [];
    for (const s of this.sheets) {
      const cells: CellResult[] = [];
      const base = (row: number, col: number) => ({ sheet: s.name, row, col, address: address(row, col) });
      for (const [k, v] of s.constants) {
        const [row, col] = k.split(",").map(Number);
        if (!s.spilled.has(k)) cells.push({ ...base(row, col), kind: "constant", value: v });
      }
      for (const n of s.formulas.values()) {
        const c: CellResult = { ...base(n.row, n.col), kind: "formula", formula: n.formula, value: n.value };
        cells.push(c);
        if (isCellError(n.value)) errors.push(c);
      }
      for (const [k, sp] of s.spilled) {
        const [row, col] = k.split(",").map(Number);
        const c: CellResult = { ...base(row, col), kind: "spill", value: sp.value, anchor: sp.anchor.key };
        cells.push(c);
        if (isCellError(sp.value) && !isCellError(sp.anchor.value)) errors.push(c);
      }
      cells.sort((a, b) => a.row - b.row || a.col - b.col);
      sheets.push({ name: s.name, cells });
    }
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
