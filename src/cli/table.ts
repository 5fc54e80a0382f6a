/** Plain-text tables of recalculated sheets, for the terminal. */
import { columnLetters } from "./address";
import { isCellError, type CellResult, type RecalcResult, type Value } from "./engine";

const MAX_WIDTH = 34;

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
  return v;
}

function clip(text: string): string {
  return text.length > MAX_WIDTH ? `${text.slice(0, MAX_WIDTH - 1)}…` : text;
}

/** One sheet as a grid with column letters and row numbers. */
export function sheetTable(name: string, cells: CellResult[]): string {
  if (cells.length === 0) return `== ${name} == (empty)\n`;
  const rows = Math.max(...cells.map((c) => c.row));
  const cols = Math.max(...cells.map((c) => c.col));
  const grid: string[][] = Array.from({ length: rows + 1 }, () => Array<string>(cols + 1).fill(""));
  for (let c = 1; c <= cols; c++) grid[0][c] = columnLetters(c);
  for (let r = 1; r <= rows; r++) grid[r][0] = String(r);
  for (const c of cells) grid[c.row][c.col] = clip(formatValue(c.value));
  const used = grid.filter((row, i) => i === 0 || row.slice(1).some((x) => x !== ""));
  const widths = grid[0].map((_, j) => Math.max(...used.map((row) => row[j].length)));
  const numeric = (s: string) => /^-?[\d.]+(e[-+]\d+)?$/.test(s);
  const line = (row: string[]) => row.map((s, j) => (j > 0 && numeric(s) ? s.padStart(widths[j]) : s.padEnd(widths[j]))).join(" | ").trimEnd();
  const out = [`== ${name} ==`, line(used[0]), widths.map((w) => "-".repeat(w)).join("-+-")];
  for (const row of used.slice(1)) out.push(line(row));
  return out.join("\n") + "\n";
}

/** Every error cell with its message, and every circular reference. */
export function errorList(result: RecalcResult): string {
  const lines: string[] = [];
  for (const e of result.errors) {
    const v = e.value as { error: string; message?: string };
    lines.push(`${e.sheet}!${e.address}: ${v.error}${v.message ? ` ${v.message}` : ""}`);
  }
  return lines.join("\n");
}
