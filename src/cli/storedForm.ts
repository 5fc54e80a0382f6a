/**
 * How a saved workbook spells an add-in custom function.
 *
 * Excel shows `=AIRTALLY.RATE(A2)` in the formula bar, but a saved .xlsx
 * stores calls to Office JavaScript custom functions as user-defined-function
 * names with the `_xldudf_` prefix and the namespace's dot turned into an
 * underscore: `_xldudf_AIRTALLY_RATE(A2)`. When the add-in registers its
 * functions, Excel maps the stored name back to `AIRTALLY.RATE`. Sources and
 * the evidence are in DEVELOPERS.md ("How a saved workbook stores AIRTALLY
 * calls").
 *
 * The demo writer stores that form; the command line reads both forms (and
 * `eval` accepts both). Pure text functions: no Node, no Office.
 */

export const NAMESPACE = "AIRTALLY";
/** Prefix Excel writes before a custom function's name in the file. */
export const STORED_PREFIX = "_xldudf_";

/** A formula with its string literals kept intact, split into code and literal runs. */
function mapOutsideStrings(formula: string, fn: (code: string) => string): string {
  let out = "";
  let code = "";
  let i = 0;
  while (i < formula.length) {
    const ch = formula[i];
    if (ch === '"') {
      out += fn(code);
      code = "";
      let j = i + 1;
      while (j < formula.length) {
        if (formula[j] === '"' && formula[j + 1] === '"') j += 2;
        else if (formula[j] === '"') break;
        else j++;
      }
      out += formula.slice(i, j + 1);
      i = j + 1;
      continue;
    }
    code += ch;
    i++;
  }
  return out + fn(code);
}

/** `AIRTALLY.RATE(` → `_xldudf_AIRTALLY_RATE(` everywhere outside string literals. */
export function toStoredFormula(formula: string): string {
  return mapOutsideStrings(formula, (code) =>
    code.replace(/(^|[^A-Za-z0-9_.])AIRTALLY\.([A-Za-z][A-Za-z0-9]*)\s*\(/gi, (_m, before: string, id: string) => `${before}${STORED_PREFIX}${NAMESPACE}_${id.toUpperCase()}(`),
  );
}

/** `_xldudf_AIRTALLY_RATE(` → `AIRTALLY.RATE(`: the form Excel shows in the formula bar. */
export function toDisplayFormula(formula: string): string {
  return mapOutsideStrings(formula, (code) =>
    code.replace(/(^|[^A-Za-z0-9_.])_xldudf_AIRTALLY_([A-Za-z][A-Za-z0-9]*)\s*\(/gi, (_m, before: string, id: string) => `${before}${NAMESPACE}.${id.toUpperCase()}(`),
  );
}

/** The AIRTALLY function ids a formula calls, in order of first appearance (either form). */
export function airtallyCalls(formula: string): string[] {
  const ids: string[] = [];
  mapOutsideStrings(toDisplayFormula(formula), (code) => {
    for (const m of code.matchAll(/(?:^|[^A-Za-z0-9_.])AIRTALLY\.([A-Za-z][A-Za-z0-9]*)\s*\(/gi)) {
      const id = m[1].toUpperCase();
      if (!ids.includes(id)) ids.push(id);
    }
    return code;
  });
  return ids;
}
