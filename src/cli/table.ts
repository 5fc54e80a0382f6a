/** Plain-text tables of recalculated sheets, for the terminal. */
import { columnLetters } from "./address";
import { isCellError, type CellResult, type RecalcResult, type Value } from "./engine";

const MAX_WIDTH = 34;

/** Text safe for a terminal: control characters shown as \xNN escapes, never sent raw. */
export function printable(text: string): string {
  // C0 (also tab and line feed: a cell must not start a fake table row), DEL, C1, and the bidirectional controls that reorder what is shown.
  return text.replace(/[\u0000-\u001F\u007F-\u009F\u061C\u200E\u200F\u2028\u2029\u202A-\u202E\u2066-\u2069]/g, (c) => (c < "\u0100" ? `\\x${c.charCodeAt(0).toString(16).padStart(2, "0")}` : `\\u${c.charCodeAt(0).toString(16)}`));
}

/** A value as the table shows it: numbers to 6 significant digits, errors by code. */
export function formatValue(v: Value): string {
  if (v === null) return "";
  if (isCellError(v)) return v.error;
  if (typeof v === "number") {
    if (Number.isInteger(v)) return String(v);
    const a = Math.abs(v);
    return a !== 0 && (a < 1e-4 || a >= 1e9) ? v.toExponential(4) : String(Number(v.toPrecision(6)));
  }
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return printable(v);
}

function clip(text: string): string {
  return text.length > MAX_WIDTH ? `${text.slice(0, MAX_WIDTH - 1)}…` : text;
}

/**
 * One sheet as a grid of its used rows and columns, with column letters and
 * row numbers, written line by line: a first pass over the cells measures
 * the columns, a second writes the rows (a million-row sheet is never held
 * as text).
 */
export function printSheet(name: string, each: () => Iterable<CellResult>, write: (text: string) => void): void {
  const widths = new Map<number, number>();
  let rowWidth = 0;
  let any = false;
  for (const c of each()) {
    any = true;
    const w = clip(formatValue(c.value)).length;
    widths.set(c.col, Math.max(widths.get(c.col) ?? columnLetters(c.col).length, w));
    rowWidth = Math.max(rowWidth, String(c.row).length);
  }
  if (!any) {
    write(`== ${printable(name)} == (empty)\n`);
    return;
  }
  const cols = [...widths.keys()].sort((a, b) => a - b);
  const at = new Map(cols.map((c, i) => [c, i]));
  const numeric = (s: string) => /^-?[\d.]+(e[-+]\d+)?$/.test(s);
  const line = (label: string, cells: string[]) =>
    [label.padEnd(rowWidth), ...cells.map((s, j) => (numeric(s) ? s.padStart(widths.get(cols[j])!) : s.padEnd(widths.get(cols[j])!)))].join(" | ").trimEnd();
  write(`== ${printable(name)} ==\n${line("", cols.map(columnLetters))}\n${[rowWidth, ...cols.map((c) => widths.get(c)!)].map((w) => "-".repeat(w)).join("-+-")}\n`);
  let row = -1;
  let cells: string[] = [];
  let batch = "";
  const flush = () => {
    if (row >= 0) batch += line(String(row), cells) + "\n";
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
    }
    cells[at.get(c.col)!] = clip(formatValue(c.value));
  }
  flush();
  write(batch);
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
