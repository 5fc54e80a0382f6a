/**
 * Each cell's number format code, as the styles part gives it, for the
 * printed tables and CSV. A cell's s= attribute indexes the cellXfs list of
 * xl/styles.xml; the entry's numFmtId is a built-in format (below) or one of
 * the workbook's numFmts. Only cells whose code is not General are stored, so
 * an unformatted million-row sheet costs nothing here.
 */
import { Grid } from "./grid";
import { MAX_CELLS } from "./zip";

/**
 * The built-in number formats of ECMA-376 Part 1 §18.8.30 (numFmt), ids with
 * a code fixed by the standard. Ids 5–8, 23–36 and 41–44 depend on the
 * locale and are not listed: a cell using one prints as General.
 */
export const BUILTIN_NUMBER_FORMATS: ReadonlyMap<number, string> = new Map([
  [0, "General"],
  [1, "0"],
  [2, "0.00"],
  [3, "#,##0"],
  [4, "#,##0.00"],
  [9, "0%"],
  [10, "0.00%"],
  [11, "0.00E+00"],
  [12, "# ?/?"],
  [13, "# ??/??"],
  [14, "mm-dd-yy"],
  [15, "d-mmm-yy"],
  [16, "d-mmm"],
  [17, "mmm-yy"],
  [18, "h:mm AM/PM"],
  [19, "h:mm:ss AM/PM"],
  [20, "h:mm"],
  [21, "h:mm:ss"],
  [22, "m/d/yy h:mm"],
  [37, "#,##0 ;(#,##0)"],
  [38, "#,##0 ;[Red](#,##0)"],
  [39, "#,##0.00;(#,##0.00)"],
  [40, "#,##0.00;[Red](#,##0.00)"],
  [45, "mm:ss"],
  [46, "[h]:mm:ss"],
  [47, "mmss.0"],
  [48, "##0.0E+0"],
  [49, "@"],
]);

/**
 * Bounds on what a styles part may make the reader keep (hostile input):
 * more cell formats than a spreadsheet program allows (65 490 unique cell
 * formats, from memory of Excel's published limits) are ignored, as are
 * format codes longer than 255 characters (the same source); cells using
 * them print as General.
 */
export const STYLE_LIMITS = { maxCellFormats: 65_490, maxCodeLength: 255 } as const;

/** The format code of each cell-format index (cellXfs order); undefined for General or unknown ids. */
export function cellFormatCodes(xfNumFmtIds: readonly number[], custom: ReadonlyMap<number, string>): (string | undefined)[] {
  return xfNumFmtIds.map((id) => {
    const code = custom.get(id) ?? BUILTIN_NUMBER_FORMATS.get(id);
    return code === undefined || /^general$/i.test(code.trim()) || code.trim() === "" ? undefined : code;
  });
}

/** Number format codes by sheet and cell; codes are stored once and cells keep an index. */
export class CellFormats {
  private readonly codes: string[] = [];
  private readonly index = new Map<string, number>();
  private readonly sheets = new Map<number, Grid<number>>();

  private count = 0;

  /** Record a cell's code; past MAX_CELLS formatted cells the rest print as General (a bound on memory). */
  set(sheet: number, row: number, col: number, code: string): void {
    if (this.count >= MAX_CELLS) return;
    this.count++;
    let i = this.index.get(code);
    if (i === undefined) {
      i = this.codes.length;
      this.codes.push(code);
      this.index.set(code, i);
    }
    let grid = this.sheets.get(sheet);
    if (!grid) {
      grid = new Grid<number>();
      this.sheets.set(sheet, grid);
    }
    grid.set(row, col, i);
  }

  /** The cell's format code, or undefined for General. */
  get(sheet: number, row: number, col: number): string | undefined {
    const i = this.sheets.get(sheet)?.get(row, col);
    return i === undefined ? undefined : this.codes[i];
  }
}
