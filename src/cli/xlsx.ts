/**
 * exceljs ↔ the engine's workbook model, for scripts that build workbooks
 * with exceljs (scripts/make-demo.ts); the command line itself reads and
 * writes packages with xlsxRead.ts / xlsxWrite.ts: read every sheet's constants and
 * formulas (shared formulas expanded, array formulas with their range), and
 * write recalculated values back as the formulas' cached results.
 */
import ExcelJS from "exceljs";
import { address, areaText, parseArea, type Area } from "./address";
import { isCellError, CYCLE, type InputBook, type InputCell, type RecalcResult, type Value } from "./engine";

/** Excel's serial date (1900 system) of a JavaScript date. */
function excelSerial(d: Date): number {
  return d.getTime() / 86400000 + 25569;
}

/** A cell's constant as an engine value. */
function constantOf(v: ExcelJS.CellValue): Value | undefined {
  if (v === null || v === undefined) return undefined;
  if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") return v;
  if (v instanceof Date) return excelSerial(v);
  if (typeof v === "object") {
    if ("error" in v) return { error: String((v as ExcelJS.CellErrorValue).error) };
    if ("richText" in v) return (v as ExcelJS.CellRichTextValue).richText.map((r) => r.text).join("");
    if ("text" in v && "hyperlink" in v) return String((v as ExcelJS.CellHyperlinkValue).text);
  }
  return undefined;
}

interface FormulaLike {
  formula?: string;
  sharedFormula?: string;
  shareType?: string;
  ref?: string;
  result?: unknown;
}

/** Read a workbook into the engine's model. */
export function bookFromExcel(wb: ExcelJS.Workbook): InputBook {
  const sheets: InputBook["sheets"] = [];
  wb.eachSheet((ws) => {
    const cells: InputCell[] = [];
    ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      row.eachCell({ includeEmpty: false }, (cell, colNumber) => {
        if (cell.type === ExcelJS.ValueType.Merge) return;
        if (cell.type === ExcelJS.ValueType.Formula) {
          const v = cell.value as FormulaLike;
          const formula = cell.formula; // shared formulas come back translated to this cell
          const item: InputCell = { row: rowNumber, col: colNumber, formula: formula ?? "" };
          if (v.shareType === "array" && v.ref) item.arrayRange = parseArea(v.ref);
          cells.push(item);
          return;
        }
        const value = constantOf(cell.value);
        if (value !== undefined) cells.push({ row: rowNumber, col: colNumber, value });
      });
    });
    sheets.push({ name: ws.name, cells });
  });
  const names: NonNullable<InputBook["names"]> = [];
  const model = (wb.definedNames as unknown as { model: { name: string; ranges: string[] }[] }).model ?? [];
  for (const n of model) {
    if (n.ranges.length !== 1) continue;
    const m = /^'?(.+?)'?!(\$?[A-Z]+\$?\d+(?::\$?[A-Z]+\$?\d+)?)$/.exec(n.ranges[0]);
    if (!m) continue;
    names.push({ name: n.name, sheet: m[1].replace(/''/g, "'"), area: parseArea(m[2].replace(/\$/g, "")) });
  }
  return { sheets, names };
}

/** A value as exceljs stores a formula's cached result; undefined = none (our #CYCLE! is not a file error code). */
function cachedResult(v: Value): ExcelJS.CellValue | undefined {
  if (isCellError(v)) return v.error === CYCLE ? undefined : ({ error: v.error } as ExcelJS.CellErrorValue);
  return v as ExcelJS.CellValue;
}

/**
 * Write the recalculated values into the workbook as cached results. A
 * dynamic spill is stored as an array formula over the cells it filled (the
 * form every Excel version opens); exceljs cannot write the dynamic-array cell
 * metadata of Excel 365.
 */
export function writeResults(wb: ExcelJS.Workbook, result: RecalcResult): void {
  for (const s of result.sheets) {
    const ws = wb.getWorksheet(s.name);
    if (!ws) continue;
    const spillOf = new Map<string, Area>();
    for (const sp of result.spills) if (sp.sheet === s.name) spillOf.set(address(sp.anchor.row, sp.anchor.col), sp.area);
    for (const c of s.cells) {
      if (c.kind === "constant") continue;
      const cell = ws.getCell(c.row, c.col);
      if (c.kind === "spill") {
        cell.value = (cachedResult(c.value) ?? null) as ExcelJS.CellValue;
        continue;
      }
      const old = cell.value as FormulaLike;
      const value: FormulaLike = old && old.sharedFormula && !old.formula ? { sharedFormula: old.sharedFormula } : { formula: c.formula };
      const area = spillOf.get(c.address);
      if (area) {
        value.formula = c.formula;
        delete value.sharedFormula;
        value.shareType = "array";
        value.ref = areaText(area);
      }
      const r = cachedResult(c.value);
      if (r !== undefined) value.result = r;
      cell.value = value as ExcelJS.CellValue;
    }
  }
  wb.calcProperties = { ...(wb.calcProperties ?? {}), fullCalcOnLoad: true };
}
