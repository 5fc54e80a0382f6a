/** Plain-text tables (and CSV) of recalculated sheets, numbers shown with their cells' number formats. */
import { columnLetters } from "./address";
import { isCellError, type CellResult, type RecalcResult, type Value } from "./engine";
import { formatNumber, formatText } from "./numberFormat";

/** How wide a text cell prints on a terminal unless --width says otherwise. */
export const TERMINAL_CELL_WIDTH = 34;

/** Text safe for a terminal: control characters shown as \xNN escapes, never sent raw. */
export function printable(text: string): string {
  // C0 (also tab and line feed: a cell must not start a fake table row), DEL, C1, and the bidirectional controls that reorder what is shown.
  return text.replace(/[\u0000-\u001F\u007F-\u009F\u061C\u200E\u200F\u2028\u2029\u202A-\u202E\u2066-\u2069]/g, (c) => (c < "\u0100" ? `\\x${c.charCodeAt(0).toString(16).padStart(2, "0")}` : `\\u${c.charCodeAt(0).toString(16)}`));
}

/** General as the table shows it: integers whole, other numbers to 6 significant digits. */
function compactGeneral(v: number): string {
  if (Number.isInteger(v)) return String(v);
  const a = Math.abs(v);
  return a !== 0 && (a < 1e-4 || a >= 1e9) ? v.toExponential(4) : String(Number(v.toPrecision(6)));
}

/**
 * A value as the table shows it: a number under its cell's format code
 * (numberFormat.ts), or General (6 significant digits) when there is no code
 * or the code is one numberFormat.ts does not support (dates, times,
 * conditions, fractions); text under a code's text section; errors by code.
 */
export function formatValue(v: Value, code?: string): string {
  if (v === null) return "";
  if (isCellError(v)) return v.error;
  if (typeof v === "number") return printable((code !== undefined ? formatNumber(v, code) : null) ?? compactGeneral(v));
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return printable(code !== undefined ? formatText(v, code) : v);
}

/** Options of the printed table and of CSV. */
export interface PrintOptions {
  /** The widest a text cell prints (longer text is cut with "…"); undefined: never cut. Numbers are never cut. */
  width?: number;
  /** The number format code of a cell, undefined for General. */
  formatOf?: (row: number, col: number) => string | undefined;
}

function shown(c: CellResult, options: PrintOptions): string {
  const text = formatValue(c.value, options.formatOf?.(c.row, c.col));
  const w = options.width;
  return w !== undefined && typeof c.value === "string" && text.length > w ? `${text.slice(0, Math.max(0, w - 1))}…` : text;
}

/**
 * One sheet as a grid of its used rows and columns, with column letters and
 * row numbers, written line by line: a first pass over the cells measures
 * the columns, a second writes the rows (a million-row sheet is never held
 * as text).
 */
export function printSheet(name: string, each: () => Iterable<CellResult>, write: (text: string) => void, options: PrintOptions = { width: TERMINAL_CELL_WIDTH }): void {
  const widths = new Map<number, number>();
  let rowWidth = 0;
  let any = false;
  for (const c of each()) {
    any = true;
    const w = shown(c, options).length;
    widths.set(c.col, Math.max(widths.get(c.col) ?? columnLetters(c.col).length, w));
    rowWidth = Math.max(rowWidth, String(c.row).length);
  }
  if (!any) {
    write(`== ${printable(name)} == (empty)\n`);
    return;
  }
  const cols = [...widths.keys()].sort((a, b) => a - b);
  const line = (label: string, cells: string[], right: boolean[] = []) =>
    [label.padEnd(rowWidth), ...cells.map((s, j) => (right[j] ? s.padStart(widths.get(cols[j])!) : s.padEnd(widths.get(cols[j])!)))].join(" | ").trimEnd();
  write(`== ${printable(name)} ==\n${line("", cols.map(columnLetters))}\n${[rowWidth, ...cols.map((c) => widths.get(c)!)].map((w) => "-".repeat(w)).join("-+-")}\n`);
  writeRows(each, cols, (c) => shown(c, options), (row, cells, right) => line(String(row), cells, right) + "\n", write);
}

/**
 * The rows of a sheet, each as one line of text, written in batches: cells
 * come row by row (ResultSheet.each order), so one row is held at a time.
 */
function writeRows(
  each: () => Iterable<CellResult>,
  cols: number[],
  render: (c: CellResult) => string,
  lineOf: (row: number, cells: string[], numeric: boolean[]) => string,
  write: (text: string) => void,
): void {
  const at = new Map(cols.map((c, i) => [c, i]));
  let row = -1;
  let cells: string[] = [];
  let numeric: boolean[] = [];
  let batch = "";
  const flush = () => {
    if (row >= 0) batch += lineOf(row, cells, numeric);
    if (batch.length > 1 << 16) {
      write(batch);
      batch = "";
    }
  };
  for (const c of each()) {
    if (c.row !== row) {
      flush();
      row = c.row;
      cells = cols.map(() => "");
      numeric = cols.map(() => false);
    }
    const j = at.get(c.col)!;
    cells[j] = render(c);
    numeric[j] = typeof c.value === "number"; // numbers right-aligned in the table, as formatted
  }
  flush();
  write(batch);
}

/** One CSV field (RFC 4180 §2: a field with a comma, quote, CR or LF is quoted, its quotes doubled). */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/**
 * One sheet as CSV (RFC 4180, CRLF line ends): the same grid as the printed
 * table (used rows and columns only), so the first record holds the column
 * letters after an empty field and each record starts with its row number.
 * Values as displayed (number formats applied), never cut; control
 * characters escaped as in the table. Two passes, like printSheet.
 */
export function printCsv(each: () => Iterable<CellResult>, write: (text: string) => void, formatOf?: PrintOptions["formatOf"]): void {
  const used = new Set<number>();
  for (const c of each()) used.add(c.col);
  const cols = [...used].sort((a, b) => a - b);
  if (!cols.length) return;
  write(["", ...cols.map(columnLetters)].join(",") + "\r\n");
  writeRows(each, cols, (c) => csvField(formatValue(c.value, formatOf?.(c.row, c.col))), (row, cells) => [String(row), ...cells].join(",") + "\r\n", write);
}

/** One sheet as a grid (the whole text; for small sheets and tests). */
export function sheetTable(name: string, cells: CellResult[]): string {
  let out = "";
  printSheet(name, () => cells, (t) => (out += t));
  return out;
}

/** Every error cell with its message, and every circular reference. */
export function errorList(result: RecalcResult): string {
  const lines: string[] = [];
  for (const e of result.errors) {
    const v = e.value as { error: string; message?: string };
    lines.push(`${printable(e.sheet)}!${e.address}: ${v.error}${v.message ? ` ${capped(printable(v.message))}` : ""}`);
  }
  return lines.join("\n");
}

/** Messages are capped so a huge cell cannot flood the terminal. */
export const MAX_MESSAGE = 300;
export function capped(m: string): string {
  return m.length > MAX_MESSAGE ? `${m.slice(0, MAX_MESSAGE - 1)}…` : m;
}
