/** Plain-text tables of recalculated sheets, for the terminal. */
import { columnLetters } from "./address";
import { isCellError, type CellResult, type RecalcResult, type Value } from "./engine";

const MAX_WIDTH = 34;

/** Text safe for a terminal: control characters shown as \xNN escapes, never sent raw. */
export function printable(text: string): string {
  return text.replace(/[\u0000-\u0008\u000B-\u001F\u007F-\u009F]/g, (c) => `\\x${c.charCodeAt(0).toString(16).padStart(2, "0")}`);
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

/** One sheet as a grid of its used rows and columns, with column letters and row numbers. */
export function sheetTable(name: string, cells: CellResult[]): string {
  if (cells.length === 0) return `== ${printable(name)} == (empty)\n`;
  const colSet = new Set<number>();
  for (const c of cells) colSet.add(c.col);
  const cols = [...colSet].sort((a, b) => a - b);
  const colIndex = new Map(cols.map((c, i) => [c, i + 1]));
  const rows = new Map<number, string[]>();
  for (const c of cells) {
    let line = rows.get(c.row);
    if (!line) {
      line = Array<string>(cols.length + 1).fill("");
      line[0] = String(c.row);
      rows.set(c.row, line);
    }
    line[colIndex.get(c.col)!] = clip(formatValue(c.value));
  }
  const header = ["", ...cols.map(columnLetters)];
  const used = [header, ...[...rows.entries()].sort((a, b) => a[0] - b[0]).map(([, line]) => line)];
  const widths = header.map(() => 0);
  for (const line of used) for (let j = 0; j < line.length; j++) if (line[j].length > widths[j]) widths[j] = line[j].length;
  const numeric = (s: string) => /^-?[\d.]+(e[-+]\d+)?$/.test(s);
  const line = (row: string[]) => row.map((s, j) => (j > 0 && numeric(s) ? s.padStart(widths[j]) : s.padEnd(widths[j]))).join(" | ").trimEnd();
  const out = [`== ${printable(name)} ==`, line(used[0]), widths.map((w) => "-".repeat(w)).join("-+-")];
  for (const row of used.slice(1)) out.push(line(row));
  return out.join("\n") + "\n";
}

/** Every error cell with its message, and every circular reference. */
export function errorList(result: RecalcResult): string {
  const lines: string[] = [];
  for (const e of result.errors) {
    const v = e.value as { error: string; message?: string };
    lines.push(`${printable(e.sheet)}!${e.address}: ${v.error}${v.message ? ` ${printable(capped(v.message))}` : ""}`);
  }
  return lines.join("\n");
}

/** Messages are capped so a huge cell cannot flood the terminal. */
const MAX_MESSAGE = 300;
function capped(m: string): string {
  return m.length > MAX_MESSAGE ? `${m.slice(0, MAX_MESSAGE - 1)}…` : m;
}
