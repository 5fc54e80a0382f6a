/**
 * A hand-written reader of Excel formula text (A1 style, as .xlsx files store
 * it) into an Ast. Hand-written because the engine needs what no MIT parser on
 * the registry gives together: position-independent references (one parse for
 * every cell of a shared formula), structured table references, `_xlfn.` /
 * `_xlpm.` stored forms, and a nesting bound so hostile input cannot exhaust
 * the stack. Operator precedence follows Excel: `:` > unary minus > `%` > `^`
 * > `* /` > `+ -` > `&` > comparisons.
 */
import { MAX_COL, MAX_ROW, type Ast, type Coord } from "./ast";

/** Excel's own limits: 8192 characters per formula, 64 nested function levels (we allow more operator depth). */
export const MAX_FORMULA_LENGTH = 8192;
export const MAX_NESTING = 200;

export class FormulaSyntaxError extends Error {}

const ERROR_LITERALS = ["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A", "#GETTING_DATA", "#SPILL!", "#CALC!"];

type Token =
  | { t: "num"; v: number }
  | { t: "str"; v: string }
  | { t: "err"; v: string }
  | { t: "word"; v: string; sheet?: string } // identifier, possibly with a sheet prefix
  | { t: "rowrange"; v: string; sheet?: string } // 1:3
  | { t: "table"; table?: string; body: string }
  | { t: "op"; v: string };

/** Stored-form prefixes Excel writes before newer functions and LET/LAMBDA parameter names. */
export function stripStoredPrefixes(name: string): string {
  return name.replace(/^(?:_xlfn\.|_xlws\.|_xlpm\.)+/i, "");
}

function tokenize(text: string): Token[] {
  const out: Token[] = [];
  let i = 0;
  const n = text.length;
  const peekSheet = (): string | undefined => {
    // 'My sheet'!  or  Sheet1!
    if (text[i] === "'") {
      let j = i + 1;
      let name = "";
      while (j < n) {
        if (text[j] === "'" && text[j + 1] === "'") {
          name += "'";
          j += 2;
        } else if (text[j] === "'") break;
        else name += text[j++];
      }
      if (text[j] !== "'" || text[j + 1] !== "!") throw new FormulaSyntaxError("unterminated sheet name");
      i = j + 2;
      return name;
    }
    const m = /^[A-Za-z0-9_.\u00C0-\uFFFF]+!/.exec(text.slice(i, i + 260));
    if (m && !/^\d+!$/.test(m[0])) {
      i += m[0].length;
      return m[0].slice(0, -1);
    }
    return undefined;
  };
  while (i < n) {
    const ch = text[i];
    if (ch === " " || ch === "\n" || ch === "\r" || ch === "\t") {
      i++;
      continue;
    }
    if (ch === '"') {
      let j = i + 1;
      let s = "";
      for (;;) {
        if (j >= n) throw new FormulaSyntaxError("unterminated text");
        if (text[j] === '"') {
          if (text[j + 1] === '"') {
            s += '"';
            j += 2;
            continue;
          }
          break;
        }
        s += text[j++];
      }
      out.push({ t: "str", v: s });
      i = j + 1;
      continue;
    }
    if (ch === "#") {
      const e = ERROR_LITERALS.find((x) => text.substr(i, x.length).toUpperCase() === x);
      if (!e) throw new FormulaSyntaxError(`unknown error literal at ${text.slice(i, i + 12)}`);
      out.push({ t: "err", v: e });
      i += e.length;
      continue;
    }
    if (ch === "[") {
      out.push({ t: "table", body: readBrackets() });
      continue;
    }
    if (/[0-9.]/.test(ch)) {
      const rows = /^\$?\d+:\$?\d+/.exec(text.slice(i));
      if (rows && !/^[0-9.]*[eE]/.test(text.slice(i))) {
        out.push({ t: "rowrange", v: rows[0] });
        i += rows[0].length;
        continue;
      }
      const m = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/.exec(text.slice(i));
      if (!m) throw new FormulaSyntaxError(`cannot read a number at ${text.slice(i, i + 12)}`);
      out.push({ t: "num", v: Number(m[0]) });
      i += m[0].length;
      continue;
    }
    if (ch === "'" || /[A-Za-z_$\\\u00C0-\uFFFF]/.test(ch) || (/[0-9]/.test(ch) && false)) {
      const start = i;
      const sheet = peekSheet();
      if (sheet !== undefined) {
        const rows = /^\$?\d+:\$?\d+/.exec(text.slice(i));
        if (rows) {
          out.push({ t: "rowrange", v: rows[0], sheet });
          i += rows[0].length;
          continue;
        }
      } else i = start;
      const m = /^[A-Za-z0-9_.$\\\u00C0-\uFFFF?]+/.exec(text.slice(i));
      if (!m) throw new FormulaSyntaxError(`cannot read a reference after ${sheet}!`);
      i += m[0].length;
      if (text[i] === "[" && sheet === undefined) {
        out.push({ t: "table", table: m[0], body: readBrackets() });
        continue;
      }
      out.push({ t: "word", v: m[0], sheet });
      continue;
    }
    const two = text.substr(i, 2);
    if (two === "<=" || two === ">=" || two === "<>") {
      out.push({ t: "op", v: two });
      i += 2;
      continue;
    }
    if ("+-*/^&=<>%(),;{}:".includes(ch)) {
      out.push({ t: "op", v: ch });
      i++;
      continue;
    }
    throw new FormulaSyntaxError(`unexpected character ${JSON.stringify(ch)}`);
  }
  return out;

  function readBrackets(): string {
    // [ ... ] with nesting one level deep ([[#This Row],[Col]]) and ' escapes.
    let depth = 0;
    const s = i;
    while (i < n) {
      const c = text[i];
      if (c === "'") {
        i += 2;
        continue;
      }
      if (c === "[") depth++;
      else if (c === "]") {
        depth--;
        if (depth === 0) {
          i++;
          return text.slice(s, i);
        }
      }
      i++;
    }
    throw new FormulaSyntaxError("unterminated [ in a table reference");
  }
}

function columnNumber(letters: string): number {
  let col = 0;
  for (const ch of letters.toUpperCase()) col = col * 26 + (ch.charCodeAt(0) - 64);
  return col;
}

/** A1 text → coordinate relative to the host cell unless `$`-pinned. */
function coord(text: string, host: { row: number; col: number }): Coord | undefined {
  const m = /^(\$?)([A-Za-z]{1,3})(\$?)(\d{1,7})$/.exec(text);
  if (!m) return undefined;
  const col = columnNumber(m[2]);
  const row = Number(m[4]);
  if (col < 1 || col > MAX_COL || row < 1 || row > MAX_ROW) return undefined;
  const colAbs = m[1] === "$";
  const rowAbs = m[3] === "$";
  return { row: rowAbs ? row : row - host.row, col: colAbs ? col : col - host.col, rowAbs, colAbs };
}

function wholeColumn(text: string, host: { col: number }, top: boolean): Coord | undefined {
  const m = /^(\$?)([A-Za-z]{1,3})$/.exec(text);
  if (!m) return undefined;
  const col = columnNumber(m[2]);
  if (col > MAX_COL) return undefined;
  const colAbs = m[1] === "$";
  return { row: top ? 1 : MAX_ROW, rowAbs: true, col: colAbs ? col : col - host.col, colAbs };
}

/** Structured reference body `[Col]`, `[@Col]`, `[[#Headers],[A]:[B]]`, `[#All]` → items and columns. */
function tableParts(body: string): { items: string[]; columns: string[] } {
  const inner = body.slice(1, -1).trim();
  const unescape = (s: string) => s.replace(/'(.)/g, "$1");
  if (!inner.startsWith("[")) {
    if (inner.startsWith("@")) return { items: ["#This Row"], columns: inner.length > 1 ? [unescape(inner.slice(1).replace(/^\[|\]$/g, ""))] : [] };
    if (inner.startsWith("#")) return { items: [inner], columns: [] };
    return { items: [], columns: inner ? [unescape(inner)] : [] };
  }
  const items: string[] = [];
  const columns: string[] = [];
  let rest = inner;
  if (rest.startsWith("@")) {
    items.push("#This Row");
    rest = rest.slice(1).trim();
  }
  const parts = rest.match(/\[(?:[^\]']|'.)*\](?:\s*:\s*\[(?:[^\]']|'.)*\])?/g) ?? [];
  for (const p of parts) {
    const cols = p.split(/\]\s*:\s*\[/).map((x) => unescape(x.replace(/^\[|\]$/g, "")));
    if (cols.length === 1 && cols[0].startsWith("#")) items.push(cols[0]);
    else columns.push(cols.join("]:["));
  }
  return { items, columns };
}

/** Parse formula text (without "="), positioned at `host` for relative references. */
export function parseFormula(text: string, host: { row: number; col: number }): Ast {
  if (text.length > MAX_FORMULA_LENGTH) throw new FormulaSyntaxError(`the formula is ${text.length} characters long; Excel's limit is ${MAX_FORMULA_LENGTH}`);
  const toks = tokenize(text);
  let p = 0;
  let depth = 0;
  const peek = () => toks[p];
  const isOp = (v: string) => toks[p]?.t === "op" && (toks[p] as { v: string }).v === v;
  const expect = (v: string) => {
    if (!isOp(v)) throw new FormulaSyntaxError(`expected ${v}${toks[p] ? "" : " before the end"}`);
    p++;
  };
  const deeper = () => {
    if (++depth > MAX_NESTING) throw new FormulaSyntaxError(`the formula nests deeper than ${MAX_NESTING} levels`);
  };

  /** A left-associative level of binary operators over the next level down. */
  const level = (ops: string[], next: () => Ast) => (): Ast => {
    const first = next();
    const opsSeen: string[] = [];
    const rest: Ast[] = [];
    while (toks[p]?.t === "op" && ops.includes((toks[p] as { v: string }).v)) {
      opsSeen.push((toks[p++] as { v: string }).v);
      rest.push(next());
    }
    if (rest.length === 0) return first;
    if (rest.length === 1) return { kind: "binary", op: opsSeen[0], left: first, right: rest[0] };
    return { kind: "chain", first, ops: opsSeen, rest };
  };
  const power = level(["^"], () => percent());
  const multiplicative = level(["*", "/"], power);
  const additive = level(["+", "-"], multiplicative);
  const concat = level(["&"], additive);
  const comparison = level(["=", "<>", "<", ">", "<=", ">="], concat);
  function percent(): Ast {
    let arg = unary();
    while (isOp("%")) {
      p++;
      arg = { kind: "unary", op: "%", arg };
    }
    return arg;
  }
  function unary(): Ast {
    if (isOp("-") || isOp("+")) {
      const op = (toks[p++] as { v: string }).v as "-" | "+";
      deeper();
      const arg = unary();
      depth--;
      return { kind: "unary", op, arg };
    }
    return range();
  }
  function range(): Ast {
    const left = primary();
    if (isOp(":") && (left.kind === "cell" || left.kind === "area")) {
      p++;
      const right = primary();
      const a = left.kind === "cell" ? { from: left.at, to: left.at } : left;
      const b = right.kind === "cell" ? { from: right.at, to: right.at } : right.kind === "area" ? right : undefined;
      if (!b) throw new FormulaSyntaxError("a range needs a cell reference after :");
      return { kind: "area", sheet: left.sheet, from: a.from, to: b.to };
    }
    return left;
  }
  function args(): Ast[] {
    const list: Ast[] = [];
    if (isOp(")")) {
      p++;
      return list;
    }
    for (;;) {
      if (isOp(",") || isOp(")")) list.push({ kind: "blank" });
      else list.push(expression());
      if (isOp(",")) {
        p++;
        continue;
      }
      expect(")");
      return list;
    }
  }
  function expression(): Ast {
    deeper();
    const e = comparison();
    depth--;
    return e;
  }
  function arrayLiteral(): Ast {
    const rows: Ast[][] = [[]];
    for (;;) {
      let sign = 1;
      if (isOp("-")) {
        p++;
        sign = -1;
      }
      const t = toks[p++];
      if (!t) throw new FormulaSyntaxError("unterminated array constant");
      let v: Ast;
      if (t.t === "num") v = { kind: "number", value: sign * t.v };
      else if (t.t === "str") v = { kind: "string", value: t.v };
      else if (t.t === "err") v = { kind: "error", code: t.v };
      else if (t.t === "word" && /^(TRUE|FALSE)$/i.test(t.v)) v = { kind: "boolean", value: /^TRUE$/i.test(t.v) };
      else throw new FormulaSyntaxError("an array constant holds only numbers, text, logical values and errors");
      rows[rows.length - 1].push(v);
      if (isOp(",")) p++;
      else if (isOp(";")) {
        p++;
        rows.push([]);
      } else {
        expect("}");
        break;
      }
    }
    if (rows.some((r) => r.length !== rows[0].length)) throw new FormulaSyntaxError("the rows of an array constant differ in length");
    return { kind: "array", rows };
  }
  function primary(): Ast {
    const t = peek();
    if (!t) throw new FormulaSyntaxError("the formula ends too early");
    p++;
    switch (t.t) {
      case "num":
        return { kind: "number", value: t.v };
      case "str":
        return { kind: "string", value: t.v };
      case "err":
        return { kind: "error", code: t.v };
      case "table":
        return { kind: "table", table: t.table, ...tableParts(t.body) };
      case "rowrange": {
        const m = /^(\$?)(\d+):(\$?)(\d+)$/.exec(t.v)!;
        const r1 = Number(m[2]);
        const r2 = Number(m[4]);
        if (r1 < 1 || r2 > MAX_ROW) throw new FormulaSyntaxError(`row ${r2} is past the last row`);
        return {
          kind: "area",
          sheet: t.sheet,
          from: { row: m[1] ? r1 : r1 - host.row, rowAbs: !!m[1], col: 1, colAbs: true },
          to: { row: m[3] ? r2 : r2 - host.row, rowAbs: !!m[3], col: MAX_COL, colAbs: true },
        };
      }
      case "op":
        if (t.v === "(") {
          const e = expression();
          expect(")");
          return e;
        }
        if (t.v === "{") return arrayLiteral();
        throw new FormulaSyntaxError(`unexpected ${t.v}`);
      case "word": {
        const word = t.v;
        if (isOp("(") && t.sheet === undefined) {
          p++;
          deeper();
          const a = args();
          depth--;
          return { kind: "call", name: stripStoredPrefixes(word).toUpperCase(), args: a };
        }
        const c = coord(word, host);
        if (c) return { kind: "cell", sheet: t.sheet, at: c };
        if (isOp(":")) {
          const next = toks[p + 1];
          const top = wholeColumn(word, host, true);
          if (top && next?.t === "word") {
            const bottom = wholeColumn(next.v, host, false);
            if (bottom) {
              p += 2;
              return { kind: "area", sheet: t.sheet, from: top, to: bottom };
            }
          }
        }
        if (t.sheet === undefined && /^(TRUE|FALSE)$/i.test(word)) return { kind: "boolean", value: /^TRUE$/i.test(word) };
        return { kind: "name", sheet: t.sheet, name: stripStoredPrefixes(word) };
      }
    }
    throw new FormulaSyntaxError("unreadable formula");
  }

  const ast = expression();
  if (p < toks.length) throw new FormulaSyntaxError(`unexpected ${describeToken(toks[p])} after the end of the formula`);
  return ast;
}

function describeToken(t: Token): string {
  return t.t === "op" ? t.v : t.t === "word" ? t.v : t.t;
}
