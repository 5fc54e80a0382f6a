/**
 * Reading a cell's formula in the pane: find the AIRTALLY call and split its
 * arguments, and tell literals from references. Pure text; no DOM, no Office.
 */
export interface Call {
  /** Function id, e.g. "GOODPUT". */
  id: string;
  /** Argument texts, trimmed; "" for an omitted argument. */
  args: string[];
}

export type Argument =
  | { kind: "omitted" }
  | { kind: "literal"; value: string | number | boolean }
  | { kind: "reference"; address: string }
  | { kind: "expression"; text: string };

/** The first AIRTALLY.NAME(…) call of a formula (either the displayed or the saved `_xldudf_AIRTALLY_` spelling); null if none. */
export function findCall(formula: string): Call | null {
  const text = formula.trim();
  const re = /(?:^|[^A-Za-z0-9_.])(?:AIRTALLY\.|_xldudf_AIRTALLY_)([A-Za-z][A-Za-z0-9]*)\s*\(/gi;
  let quoted = false;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    // skip matches inside string literals
    const start = m.index + (/^[^A-Za-z_]/.test(m[0]) && !m[0].startsWith("_") ? 1 : 0);
    quoted = (text.slice(0, start).match(/"/g) ?? []).length % 2 === 1;
    if (quoted) continue;
    const open = m.index + m[0].length - 1;
    const args = splitArguments(text, open);
    if (args) return { id: m[1].toUpperCase(), args };
  }
  return null;
}

/** Split the arguments of the call whose "(" is at `open`; null if unbalanced. */
export function splitArguments(text: string, open: number): string[] | null {
  const args: string[] = [];
  let depth = 0;
  let current = "";
  let quoted = false;
  for (let i = open + 1; i < text.length; i++) {
    const ch = text[i];
    if (ch === '"') quoted = !quoted;
    if (!quoted) {
      if (ch === "(" || ch === "{") depth++;
      if (ch === ")" || ch === "}") {
        if (depth === 0 && ch === ")") {
          args.push(current.trim());
          return args.length === 1 && args[0] === "" ? [] : args;
        }
        depth--;
      }
      if (ch === "," && depth === 0) {
        args.push(current.trim());
        current = "";
        continue;
      }
    }
    current += ch;
  }
  return null;
}

const REFERENCE = /^(?:(?:'[^']+'|[A-Za-z0-9_.]+)!)?\$?[A-Za-z]{1,3}\$?\d+(?::\$?[A-Za-z]{1,3}\$?\d+)?$/;

/** What one argument text is. */
export function classify(text: string): Argument {
  const t = text.trim();
  if (t === "") return { kind: "omitted" };
  if (/^"(?:[^"]|"")*"$/.test(t)) return { kind: "literal", value: t.slice(1, -1).replace(/""/g, '"') };
  if (/^(TRUE|FALSE)$/i.test(t)) return { kind: "literal", value: /^TRUE$/i.test(t) };
  if (/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?%?$/i.test(t)) {
    const pct = t.endsWith("%");
    const n = Number(pct ? t.slice(0, -1) : t);
    return { kind: "literal", value: pct ? n / 100 : n };
  }
  if (REFERENCE.test(t)) return { kind: "reference", address: t };
  return { kind: "expression", text: t };
}
