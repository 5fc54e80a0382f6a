/**
 * Display text of a number under a spreadsheet number format code, so the
 * command line can print a cell as a spreadsheet shows it (70% for 0.7 under
 * "0%", 3.1% for 0.031084 under "0.0%", 1,235 for 1234.5 under "#,##0").
 * Pure; src/cli/table.ts passes each cell's format code (read from the
 * styles part by xlsxRead.ts) and falls back to General where this returns
 * null.
 *
 * The rules are those of the number format codes of ECMA-376 Part 1
 * (SpreadsheetML numFmt formatCode), as spreadsheet programs apply them
 * (from memory; test/cli/numberFormat.test.ts checks them against
 * LibreOffice headless):
 * - Up to four sections split by `;`: positive; negative; zero; text. With
 *   one section a negative number gets a leading "-"; the negative section
 *   shows the magnitude without a sign (its own literals say how).
 * - Digit placeholders: `0` (digit or zero), `#` (digit or nothing), `?`
 *   (digit or a space); `.` the decimal point; a `,` between integer
 *   placeholders groups thousands; each `,` right after the last digit
 *   placeholder divides by 1000; `%` multiplies by 100 and prints "%";
 *   `E+00` / `E-00` scientific with one integer digit.
 * - Literals: "quoted text", `\x` (one character), `$ - + ( ) : / space`
 *   and other characters that are not codes; `[$€-407]` prints its symbol;
 *   `_x` prints a space (the width of x); `*x` (fill) prints nothing;
 *   `[Red]`-style colours are ignored. `General` is the general format.
 * - Rounding: half away from zero on the decimal value rounded to 15
 *   significant digits (the digits a spreadsheet keeps), so 1.005 under
 *   "0.00" shows 1.01, not the binary double's 1.00.
 *
 * Not supported (formatNumber returns null, so a caller can fall back to
 * General and say so): a number under a text section (`@`), dates and times, conditions such as `[>=100]`,
 * fractions (`# ?/?`), engineering exponents (`##0.0E+0`).
 */

/** One section of a format code: literal text around one numeric pattern (or none). */
interface Section {
  readonly before: string;
  readonly after: string;
  readonly pattern: NumericPattern | null;
  readonly general: boolean;
  readonly percent: number;
  readonly hasText: boolean;
}

interface NumericPattern {
  readonly intPlaceholders: string;
  readonly fracPlaceholders: string;
  readonly hasPoint: boolean;
  readonly grouping: boolean;
  readonly thousandsScale: number;
  readonly exponent: { readonly sign: "+" | "-"; readonly digits: number } | null;
}

class Unsupported extends Error {}

const DATE_CODES = /[yYmMdDhHsS]/;
const GENERAL_SIGNIFICANT_DIGITS = 10;
const SPREADSHEET_DIGITS = 15;

/** Split a code into sections on `;` outside quotes and brackets. */
function splitSections(code: string): string[] {
  const out: string[] = [];
  let current = "";
  let quoted = false;
  let bracket = false;
  for (let i = 0; i < code.length; i++) {
    const c = code[i];
    if (c === "\\" && !quoted && i + 1 < code.length) {
      current += c + code[++i];
      continue;
    }
    if (c === '"') quoted = !quoted;
    else if (!quoted && c === "[") bracket = true;
    else if (!quoted && c === "]") bracket = false;
    if (c === ";" && !quoted && !bracket) {
      out.push(current);
      current = "";
    } else current += c;
  }
  out.push(current);
  return out;
}

/** `[…]` blocks: colours are ignored, `[$sym-lcid]` gives its symbol, anything else is unsupported. */
function bracketText(inner: string): string {
  if (/^\$/.test(inner)) return inner.slice(1).replace(/-[0-9A-Fa-f]+$/, "");
  if (/^(black|blue|cyan|green|magenta|red|white|yellow|color\s*\d+)$/i.test(inner)) return "";
  throw new Unsupported(`[${inner}]`);
}

function parseNumeric(run: string): NumericPattern {
  const e = /[eE]([+-])(0+)$/.exec(run);
  const mantissa = e ? run.slice(0, e.index) : run;
  const point = mantissa.indexOf(".");
  let intPart = point < 0 ? mantissa : mantissa.slice(0, point);
  const fracPart = point < 0 ? "" : mantissa.slice(point + 1).replace(/,/g, "");
  const trailing = /,+$/.exec(intPart);
  const thousandsScale = trailing ? trailing[0].length : 0;
  if (trailing) intPart = intPart.slice(0, trailing.index);
  const grouping = intPart.includes(",");
  const intPlaceholders = intPart.replace(/,/g, "");
  if (e && intPlaceholders.length !== 1) throw new Unsupported("engineering exponent");
  return {
    intPlaceholders,
    fracPlaceholders: fracPart,
    hasPoint: point >= 0,
    grouping,
    thousandsScale,
    exponent: e ? { sign: e[1] as "+" | "-", digits: e[2].length } : null,
  };
}

function parseSection(text: string): Section {
  let before = "";
  let after = "";
  let run = "";
  let runDone = false;
  let percent = 0;
  let general = false;
  let hasText = false;
  const emit = (s: string) => {
    if (run === "" && !general) before += s;
    else {
      runDone = true;
      after += s;
    }
  };
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') {
      const end = text.indexOf('"', i + 1);
      const lit = end < 0 ? text.slice(i + 1) : text.slice(i + 1, end);
      emit(lit);
      i = end < 0 ? text.length : end;
    } else if (c === "\\") {
      emit(text[++i] ?? "");
    } else if (c === "[") {
      const end = text.indexOf("]", i);
      if (end < 0) throw new Unsupported("unclosed [");
      emit(bracketText(text.slice(i + 1, end)));
      i = end;
    } else if (c === "_") {
      i++;
      emit(" ");
    } else if (c === "*") {
      i++;
    } else if (text.slice(i, i + 7).toLowerCase() === "general") {
      if (run !== "" || general) throw new Unsupported("General with digits");
      general = true;
      i += 6;
    } else if (c === "@") {
      hasText = true;
      emit("@");
    } else if ("0#?.,".includes(c) || ((c === "E" || c === "e") && run !== "" && /[+-]/.test(text[i + 1] ?? ""))) {
      if (runDone) throw new Unsupported("two numbers in one section");
      if (c === "E" || c === "e") {
        run += c + text[i + 1];
        i++;
      } else if (c === "," && run === "") {
        emit(c); // a comma before any digit is plain text
      } else run += c;
    } else if (c === "%") {
      percent++;
      emit("%");
    } else if (DATE_CODES.test(c) || c === "/") {
      if (c === "/" && run !== "") throw new Unsupported("fraction");
      if (c !== "/") throw new Unsupported("date or time");
      emit(c);
    } else emit(c);
  }
  return { before, after, pattern: run === "" ? null : parseNumeric(run), general, percent, hasText };
}

/** |x| as a decimal string rounded half away from zero to `places` decimals, via its 15-significant-digit value. */
function roundedDecimal(x: number, places: number): { int: string; frac: string } {
  const [mant, expText] = Math.abs(x).toExponential(SPREADSHEET_DIGITS - 1).split("e");
  const exp = Number(expText);
  const digits = mant.replace(".", ""); // 15 digits, value = 0.d1d2… × 10^(exp + 1)
  const pointAt = exp + 1; // digits before the decimal point
  const padded = pointAt <= 0 ? "0".repeat(1 - pointAt) + digits : digits + "0".repeat(Math.max(0, pointAt - digits.length + places + 1));
  const point = pointAt <= 0 ? 1 : pointAt;
  const keep = padded.slice(0, point + places);
  const next = Number(padded[point + places] ?? "0");
  let n = BigInt(keep === "" ? "0" : keep);
  if (next >= 5) n += BigInt(1);
  const s = n.toString().padStart(places + 1, "0");
  return { int: s.slice(0, s.length - places).replace(/^0+(?=\d)/, ""), frac: places > 0 ? s.slice(s.length - places) : "" };
}

function group(int: string): string {
  return int.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
}

/** The integer digits in the placeholders: the placeholders left of the digits print as 0, a space (?) or nothing (#). */
function fillInteger(digits: string, placeholders: string, grouping: boolean): string {
  const significant = digits === "0" ? "" : digits;
  const padSource = placeholders.slice(0, Math.max(0, placeholders.length - significant.length));
  const padded = padSource.replace(/#/g, "").replace(/\?/g, " ") + significant;
  return grouping ? group(padded) : padded;
}

function fillFraction(digits: string, placeholders: string): string {
  let out = digits.split("");
  for (let i = placeholders.length - 1; i >= 0 && out[i] === "0"; i--) {
    if (placeholders[i] === "#") out = out.slice(0, i);
    else if (placeholders[i] === "?") out[i] = " ";
    else break;
  }
  return out.join("");
}

function formatPattern(x: number, p: NumericPattern): string {
  if (p.exponent) {
    if (x === 0) return "0" + (p.hasPoint ? "." + fillFraction("0".repeat(p.fracPlaceholders.length), p.fracPlaceholders) : "") + "E" + (p.exponent.sign === "+" ? "+" : "") + "0".repeat(p.exponent.digits);
    let exp = Math.floor(Math.log10(Math.abs(x)));
    let r = roundedDecimal(Math.abs(x) / Math.pow(10, exp), p.fracPlaceholders.length);
    if (r.int === "10") {
      exp += 1;
      r = roundedDecimal(Math.abs(x) / Math.pow(10, exp), p.fracPlaceholders.length);
    }
    const sign = exp < 0 ? "-" : p.exponent.sign === "+" ? "+" : "";
    const frac = p.hasPoint ? "." + fillFraction(r.frac, p.fracPlaceholders) : "";
    return r.int + frac + "E" + sign + String(Math.abs(exp)).padStart(p.exponent.digits, "0");
  }
  const r = roundedDecimal(x, p.fracPlaceholders.length);
  const int = fillInteger(r.int, p.intPlaceholders, p.grouping);
  return int + (p.hasPoint ? "." + fillFraction(r.frac, p.fracPlaceholders) : "");
}

/** General: up to 10 significant digits, trailing zeros dropped; scientific when very large or small. */
export function formatGeneral(x: number): string {
  if (x === 0) return "0";
  const abs = Math.abs(x);
  if (abs >= 1e11 || abs < 1e-9) {
    const [m, e] = x.toExponential(5).split("e");
    const mant = m.replace(/\.?0+$/, "");
    const exp = Number(e);
    return `${mant}E${exp < 0 ? "-" : "+"}${String(Math.abs(exp)).padStart(2, "0")}`;
  }
  const s = x.toPrecision(GENERAL_SIGNIFICANT_DIGITS);
  return s.includes("e") ? String(Number(s)) : s.includes(".") ? s.replace(/\.?0+$/, "") : s;
}

function applySection(x: number, s: Section): string {
  const scaled = x * Math.pow(100, s.percent) / Math.pow(1000, s.pattern?.thousandsScale ?? 0);
  const body = s.general ? formatGeneral(scaled) : s.pattern ? formatPattern(scaled, s.pattern) : "";
  return s.before + body + s.after;
}

/**
 * A number as the format code shows it; null when the code uses something
 * this module does not support (dates, conditions, fractions).
 *
 *   formatNumber(0.7, "0%") → "70%";  formatNumber(1234.5, "#,##0") → "1,235";  formatNumber(-2, "0.00;(0.00)") → "(2.00)"
 */
export function formatNumber(value: number, code: string): string | null {
  if (!Number.isFinite(value)) return null;
  const sections = parsedCode(code);
  if (!sections) return null;
  const numeric = sections.slice(0, 3);
  const section = value === 0 && numeric.length >= 3 ? numeric[2] : value < 0 && numeric.length >= 2 ? numeric[1] : numeric[0];
  // A text section (`@`, the Text format) does not format numbers: a number there shows as General, so the caller's.
  if (section.hasText) return null;
  if (section !== numeric[0]) return applySection(Math.abs(value), section);
  const text = applySection(Math.abs(value), numeric[0]);
  // One section: a minus sign, also when the digits shown round to zero ("-0", as spreadsheets following the
  // code literally show it; LibreOffice drops that sign — test/cli/numberFormat.test.ts lists the difference).
  return value < 0 ? "-" + text : text;
}

/**
 * Parsed codes, remembered: a sheet repeats a handful of codes over many
 * cells, and parsing is most of the cost of a formatted cell. Bounded (a
 * workbook may hold many codes): the memo starts again when full.
 */
const MAX_PARSED_CODES = 1024;
const parsed = new Map<string, Section[] | null>();

/** The sections of a code, or null when the code uses something unsupported. */
function parsedCode(code: string): Section[] | null {
  let sections = parsed.get(code);
  if (sections !== undefined) return sections;
  try {
    sections = splitSections(code.trim() === "" ? "General" : code).map(parseSection);
  } catch (e) {
    if (!(e instanceof Unsupported)) throw e;
    sections = null;
  }
  if (parsed.size >= MAX_PARSED_CODES) parsed.clear();
  parsed.set(code, sections);
  return sections;
}

/** Text under a format code: the text section's `@` replaced by the text; without one, the text itself. */
export function formatText(value: string, code: string): string {
  const sections = splitSections(code);
  if (sections.length < 4 && !sections[0].includes("@")) return value;
  try {
    const s = parseSection(sections.length >= 4 ? sections[3] : sections[0]);
    return (s.before + s.after).replace(/@/g, value);
  } catch (e) {
    if (e instanceof Unsupported) return value;
    throw e;
  }
}
