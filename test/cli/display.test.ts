/**
 * How `airtally recalc` shows cells (issue 15): numbers under their cells'
 * number formats, read from the workbook's styles part; --csv; --width and
 * full width when stdout is not a terminal. The workbook is written here
 * with exceljs (a reference library: it stores "0%" as the built-in format 9
 * and "0.0%" as a custom numFmt, so both paths of the styles part are read).
 * Check values are applied by hand from the number format rules (ECMA-376
 * Part 1 §18.8.31 numFmts, §18.8.30 built-in ids) and, where LibreOffice is
 * installed, compared with its CSV export "as shown". Needs `npm run build`.
 */
import { execFileSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { parseString } from "fast-csv";
import { BUILTIN_NUMBER_FORMATS, STYLE_LIMITS } from "../../src/cli/cellFormats";
import { CLI_CAUTION } from "../../src/cli/caution";
import { EXIT, main } from "../../src/cli/main";
import { workbookParts, zipParts } from "./support/writeXlsx";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-display-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const LONG_TEXT = "Corvid & Pike Systems, north wing atrium, ceiling mount";
const QUOTED_TEXT = 'Zone "B", level 2';

/** [address, value or formula, number format code or undefined for General, shown, why]. */
const CELLS: [string, number | string | { formula: string }, string | undefined, string, string][] = [
  ["A1", 0.7, "0%", "70%", "issue 15 acceptance: % multiplies by 100"],
  ["A2", 0.031084, "0.0%", "3.1%", "3.1084 rounded to one decimal"],
  ["A3", 1234567.891, "#,##0", "1,234,568", "thousands grouped, rounded half away from zero"],
  ["A4", 1234.5, '"$"#,##0.00', "$1,234.50", "a quoted currency literal"],
  ["A5", 0.3333333333, undefined, "0.333333", "General: the table's 6 significant digits"],
  ["A6", 12.3456, "0.00", "12.35", "built-in format 2"],
  ["A7", { formula: "A1/2" }, "0.0%", "35.0%", "a formula's result under its cell's format"],
  ["A8", -1234.5, "#,##0.00;(#,##0.00)", "(1,234.50)", "the negative section"],
  ["A9", 45000, "yyyy-mm-dd", "45000", "a date format: not supported, so General (never a wrong date)"],
  ["B1", LONG_TEXT, undefined, LONG_TEXT, "text"],
  ["B2", QUOTED_TEXT, undefined, QUOTED_TEXT, "text with a comma and quotes"],
  ["B3", 42, '0" MB"', "42 MB", "a literal after the number"],
  ["B4", 5.25, "@", "5.25", "a number under the Text format (built-in 49) shows as General, not as @"],
];

let book: string;
beforeAll(async () => {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet("Plan");
  for (const [address, value, code] of CELLS) {
    const cell = ws.getCell(address);
    cell.value = value as ExcelJS.CellValue;
    if (code) cell.numFmt = code;
  }
  wb.addWorksheet("Notes").getCell("A1").value = "second sheet";
  book = path.join(dir, "display.xlsx");
  await wb.xlsx.writeFile(book);
});

async function cli(args: string[], outIsTTY = false): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (t) => (out += t), err: (t) => (err += t), outIsTTY });
  return { code, out, err };
}

/** The printed table's cells of one row, by column letter order. */
function tableRow(out: string, row: number): string[] {
  const line = out.split("\n").find((l) => l.startsWith(`${row} `) || l.startsWith(`${row}|`))!;
  return line.split("|").slice(1).map((s) => s.trim());
}

/** Add the workbook's relationship to xl/styles.xml (the Styles part relationship type of ECMA-376 Part 1). */
function linkStyles(parts: Map<string, string>): void {
  const rels = "xl/_rels/workbook.xml.rels";
  parts.set(rels, parts.get(rels)!.replace("</Relationships>", '<Relationship Id="rIdStyles" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/styles" Target="styles.xml"/></Relationships>'));
}

function parseCsv(text: string): Promise<string[][]> {
  return new Promise((resolve, reject) => {
    const rows: string[][] = [];
    parseString(text, { headers: false })
      .on("data", (r: string[]) => rows.push(r))
      .on("error", reject)
      .on("end", () => resolve(rows));
  });
}

describe("recalc prints numbers with their cells' number formats", () => {
  let out: string;
  beforeAll(async () => {
    const r = await cli(["recalc", book, "--sheet", "Plan"]);
    expect(r.code).toBe(EXIT.ok);
    out = r.out;
  });

  it.each(CELLS.map(([address, , code, shown, why]) => [address, code ?? "General", shown, why]))("%s under %p shows %p (%s)", (address, _code, shown) => {
    const col = (address as string).charCodeAt(0) - 64;
    expect(tableRow(out, Number((address as string).slice(1)))[col - 1]).toBe(shown);
  });

  it("right-aligns a formatted number in its column", () => {
    expect(out).toMatch(/\n1 +\| +70% \|/);
  });

  it("still ends with the caution line", () => {
    expect(out.trimEnd().split("\n").pop()).toBe(CLI_CAUTION);
  });
});

describe("the built-in number formats", () => {
  it("match exceljs's table of built-in ids (ECMA-376 Part 1 §18.8.30), id by id", () => {
    // exceljs/lib/xlsx/defaultnumformats.js: the reference library's own copy of the standard's list. It writes
    // 22 as m/d/yy "h":mm (the h quoted) and 39/40 with a space before ";" (#,##0.00 ;(#,##0.00)); the list
    // here follows the standard's table (from memory) — the space is a trailing space on positive numbers only,
    // so the two are compared without spaces and without that quoting.
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const theirs = require("exceljs/lib/xlsx/defaultnumformats.js") as Record<string, { f?: string }>;
    const plain = (code: string) => code.replace(/"h"/, "h").replace(/ /g, "");
    const compared = [...BUILTIN_NUMBER_FORMATS].map(([id, code]) => [id, plain(code), theirs[id]?.f === undefined ? undefined : plain(theirs[id].f!)]);
    expect(compared.filter(([, ours, ref]) => ours !== ref)).toEqual([]);
  });

  it("reads a cell styled with built-in id 10 (0.00%) and id 3 (#,##0) from a hand-written styles part", async () => {
    const parts = workbookParts({ sheets: [{ name: "S", cells: [{ ref: "A1", value: 0.1234 }, { ref: "A2", value: 9876543 }] }] });
    parts.set("xl/worksheets/sheet1.xml", parts.get("xl/worksheets/sheet1.xml")!.replace('<c r="A1"', '<c r="A1" s="1"').replace('<c r="A2"', '<c r="A2" s="2"'));
    parts.set(
      "xl/styles.xml",
      '<?xml version="1.0" encoding="UTF-8"?><styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><cellStyleXfs count="1"><xf numFmtId="9"/></cellStyleXfs><cellXfs count="3"><xf numFmtId="0"/><xf numFmtId="10"/><xf numFmtId="3"/></cellXfs></styleSheet>',
    );
    linkStyles(parts);
    const file = path.join(dir, "builtin.xlsx");
    await zipParts(file, parts);
    const r = await cli(["recalc", file]);
    // 0.1234 × 100 = 12.34 with two decimals; 9 876 543 grouped by thousands.
    expect([r.code, tableRow(r.out, 1)[0], tableRow(r.out, 2)[0]]).toEqual([EXIT.ok, "12.34%", "9,876,543"]);
  });
});

describe("--width and full width", () => {
  it("prints text whole when stdout is not a terminal", async () => {
    const r = await cli(["recalc", book, "--sheet", "Plan"]);
    expect(tableRow(r.out, 1)[1]).toBe(LONG_TEXT);
  });

  it("cuts text at 34 characters on a terminal", async () => {
    const r = await cli(["recalc", book, "--sheet", "Plan"], true);
    expect(tableRow(r.out, 1)[1]).toBe(`${LONG_TEXT.slice(0, 33)}…`);
  });

  it("cuts text at --width N, also when not a terminal, and never cuts a number", async () => {
    const r = await cli(["recalc", book, "--sheet", "Plan", "--width", "6"]);
    expect([tableRow(r.out, 1)[1], tableRow(r.out, 3)[0]]).toEqual(["Corvi…", "1,234,568"]);
  });

  it.each([["0"], ["-3"], ["wide"], ["--csv"]])("refuses --width %p (exit 2)", async (n) => {
    expect((await cli(["recalc", book, "--width", n])).code).toBe(EXIT.usage);
  });
});

describe("--csv", () => {
  it("prints one sheet as RFC 4180 CSV of the values as displayed, the summary and caution on stderr", async () => {
    const r = await cli(["recalc", book, "--sheet", "Plan", "--csv"]);
    const rows = await parseCsv(r.out);
    expect(rows[0]).toEqual(["", "A", "B"]);
    const byAddress = new Map(rows.slice(1).flatMap((row) => row.slice(1).map((v, j) => [`${rows[0][j + 1]}${row[0]}`, v] as [string, string])));
    expect(CELLS.map(([address]) => byAddress.get(address))).toEqual(CELLS.map(([, , , shown]) => shown));
    expect([r.code, r.out.includes(CLI_CAUTION), r.err.trimEnd().split("\n").pop(), /\r\n$/.test(r.out)]).toEqual([EXIT.ok, false, CLI_CAUTION, true]);
  });

  it("quotes a field with a comma or quotes, doubling the quotes (RFC 4180 §2 rules 6 and 7)", async () => {
    const r = await cli(["recalc", book, "--sheet", "Plan", "--csv"]);
    expect(r.out).toContain(`,"Zone ""B"", level 2"\r\n`);
  });

  it("heads each sheet with a # Sheet line when it prints several", async () => {
    const r = await cli(["recalc", book, "--csv"]);
    expect(r.out.split("\r\n").filter((l) => l.startsWith("# Sheet:"))).toEqual(["# Sheet: Plan", "# Sheet: Notes"]);
  });

  it("keeps control characters escaped", async () => {
    const wb = new ExcelJS.Workbook();
    // U+009B (a C1 control, valid in XML 1.0, read by a terminal as the start of a control sequence) and a line break.
    wb.addWorksheet("S").getCell("A1").value = "csi\u009B and\nbreak";
    const file = path.join(dir, "control.xlsx");
    await wb.xlsx.writeFile(file);
    const [csv, table] = [await cli(["recalc", file, "--csv"]), await cli(["recalc", file])];
    expect([csv.out.split("\r\n")[1], tableRow(table.out, 1)[0]]).toEqual(["1,csi\\x9b and\\x0abreak", "csi\\x9b and\\x0abreak"]);
  });

  it("refuses --csv with --quiet, and --csv with --width (exit 2)", async () => {
    expect([(await cli(["recalc", book, "--csv", "--quiet"])).code, (await cli(["recalc", book, "--csv", "--width", "9"])).code]).toEqual([EXIT.usage, EXIT.usage]);
  });
});

describe("--help", () => {
  it("lists --csv and --width", async () => {
    const r = await cli(["--help"]);
    expect([/--csv +print the sheets as CSV/.test(r.out), /--width N +cut text cells/.test(r.out)]).toEqual([true, true]);
  });
});

describe("--out", () => {
  it("refuses an option as its value: --out --quiet is a usage error (exit 2), not a file named --quiet", async () => {
    const cwd = process.cwd();
    process.chdir(dir);
    try {
      const r = await cli(["recalc", book, "--out", "--quiet"]);
      expect([r.code, /--out needs a value/.test(r.err), fs.existsSync(path.join(dir, "--quiet"))]).toEqual([EXIT.usage, true, false]);
    } finally {
      process.chdir(cwd);
    }
  });
});

describe("a hostile styles part", () => {
  it("is refused when it has a DOCTYPE (exit 2), like every other part", async () => {
    const parts = workbookParts({ sheets: [{ name: "S", cells: [{ ref: "A1", value: 1 }] }] });
    parts.set("xl/styles.xml", '<?xml version="1.0"?><!DOCTYPE s [<!ENTITY a "aaaa">]><styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"/>');
    linkStyles(parts);
    const file = path.join(dir, "doctype-styles.xlsx");
    await zipParts(file, parts);
    const r = await cli(["recalc", file]);
    expect([r.code, /DOCTYPE/.test(r.err)]).toEqual([EXIT.usage, true]);
  });

  it("keeps no more than the bounded number of cell formats and no over-long code: those cells print as General", async () => {
    const last = STYLE_LIMITS.maxCellFormats; // index of the first entry past the bound
    const longCode = "0" + '" "'.repeat(100) + "%"; // 302 characters, a valid code past the 255 bound
    const parts = workbookParts({ sheets: [{ name: "S", cells: [{ ref: "A1", value: 0.7 }, { ref: "A2", value: 0.7 }, { ref: "A3", value: 0.7 }] }] });
    parts.set(
      "xl/worksheets/sheet1.xml",
      parts.get("xl/worksheets/sheet1.xml")!.replace('<c r="A1"', '<c r="A1" s="1"').replace('<c r="A2"', `<c r="A2" s="${last}"`).replace('<c r="A3"', '<c r="A3" s="2"'),
    );
    const xfs = Array.from({ length: last + 1 }, (_, i) => `<xf numFmtId="${i === 2 ? 164 : 9}"/>`).join("");
    parts.set(
      "xl/styles.xml",
      `<?xml version="1.0" encoding="UTF-8"?><styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><numFmts count="1"><numFmt numFmtId="164" formatCode="${longCode.replace(/"/g, "&quot;")}"/></numFmts><cellXfs count="${last + 1}">${xfs}</cellXfs></styleSheet>`,
    );
    linkStyles(parts);
    const file = path.join(dir, "many-styles.xlsx");
    await zipParts(file, parts);
    const r = await cli(["recalc", file]);
    // Entry 1 (within the bound) is built-in 9, "0%": 70%. Entry `last` is past the bound, entry 2 names the over-long code: General.
    expect([r.code, tableRow(r.out, 1)[0], tableRow(r.out, 2)[0], tableRow(r.out, 3)[0]]).toEqual([EXIT.ok, "70%", "0.7", "0.7"]);
  });
});

const SOFFICE = "/usr/bin/soffice";
(fs.existsSync(SOFFICE) ? describe : describe.skip)("--csv against LibreOffice's CSV export as shown", () => {
  it("shows every number cell as LibreOffice shows it (General cells aside: the table's General is 6 digits)", async () => {
    const plan = path.join(dir, "plan-only.xlsx");
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(book);
    wb.removeWorksheet(wb.getWorksheet("Notes")!.id);
    await wb.xlsx.writeFile(plan);
    // Filter options: comma (44), double quote (34), UTF-8 (76), line 1, …, "save cell contents as shown" = true.
    execFileSync(SOFFICE, [`-env:UserInstallation=file://${path.join(dir, "profile")}`, "--headless", "--convert-to", "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,true", "--outdir", dir, plan], { stdio: "ignore", timeout: 170_000 });
    const theirs = await parseCsv(fs.readFileSync(path.join(dir, "plan-only.csv"), "utf8"));
    const ours = await parseCsv((await cli(["recalc", plan, "--csv"])).out);
    const oursAt = new Map(ours.slice(1).flatMap((row) => row.slice(1).map((v, j) => [`${ours[0][j + 1]}${row[0]}`, v] as [string, string])));
    const compared = CELLS.filter(([, value, code]) => code !== undefined && !/y/.test(code) && typeof value !== "string").map(([address]) => {
      const col = address.charCodeAt(0) - 65;
      return [address, oursAt.get(address), theirs[Number(address.slice(1)) - 1][col]];
    });
    expect(compared.filter(([, a, b]) => a !== b)).toEqual([]);
    expect(compared.length).toBeGreaterThanOrEqual(8);
  }, 180_000);
});
