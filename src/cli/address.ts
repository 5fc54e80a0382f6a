/** A1-style addresses: column letters ↔ numbers (1-based), ranges. */

export function columnLetters(col: number): string {
  let s = "";
  let n = col;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

export function address(row: number, col: number): string {
  return `${columnLetters(col)}${row}`;
}

export function parseAddress(text: string): { row: number; col: number } {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d+)$/.exec(text.trim());
  if (!m) throw new Error(`not a cell address: ${text}`);
  let col = 0;
  for (const ch of m[1].toUpperCase()) col = col * 26 + (ch.charCodeAt(0) - 64);
  return { row: Number(m[2]), col };
}

export interface Area {
  top: number;
  left: number;
  bottom: number;
  right: number;
}

export function parseArea(text: string): Area {
  const [a, b] = text.split(":");
  const p = parseAddress(a);
  const q = b ? parseAddress(b) : p;
  return { top: Math.min(p.row, q.row), left: Math.min(p.col, q.col), bottom: Math.max(p.row, q.row), right: Math.max(p.col, q.col) };
}

export function areaText(area: Area): string {
  const a = address(area.top, area.left);
  return area.top === area.bottom && area.left === area.right ? a : `${a}:${address(area.bottom, area.right)}`;
}

/** A sheet name as a formula writes it: quoted when it is not a plain word. */
export function sheetPrefix(name: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) ? `${name}!` : `'${name.replace(/'/g, "''")}'!`;
}
