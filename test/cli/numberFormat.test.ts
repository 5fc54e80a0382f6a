/**
 * src/cli/numberFormat.ts against the number format rules (hand-applied,
 * one vector per case) and against an independent engine: LibreOffice
 * headless prints a workbook of values × format codes to CSV "as shown",
 * and every cell must match. Without /usr/bin/soffice that cross-check is
 * skipped with a warning.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { execFileSync } from "child_process";
import ExcelJS from "exceljs";
import { formatGeneral, formatNumber, formatText } from "../../src/cli/numberFormat";

describe("formatNumber by the format code rules", () => {
  it.each([
    // [value, code, shown, why]
    [0.7, "0%", "70%", "% multiplies by 100 (issue 15: 0.7 shows as 70%)"],
    [0.031084, "0.0%", "3.1%", "3.1084 rounded to one decimal"],
    [0.1234, "0.00%", "12.34%", ""],
    [1234.5, "#,##0", "1,235", "half away from zero, thousands grouped"],
    [1234.5, "#,##0.00", "1,234.50", "0 placeholders keep trailing zeros"],
    [0.5, "0.00", "0.50", ""],
    [1.005, "0.00", "1.01", "decimal rounding of the 15-digit value 1.00500000000000, not the binary 1.00499999999999989…"],
    [-2.5, "0", "-3", "one section: the minus sign, magnitude rounded half away from zero"],
    [-2, "0.00;(0.00)", "(2.00)", "the negative section shows the magnitude with its own literals"],
    [0, '0.00;-0.00;"zero"', "zero", "the third section is for zero"],
    [12.3, '"$"#,##0.00', "$12.30", "quoted currency text"],
    [12.3, "[$€-407] #,##0.00", "€ 12.30", "a [$symbol-locale] block prints its symbol"],
    [1234567, "#,##0,", "1,235", "a trailing comma divides by 1000"],
    [0.000123, "0.00E+00", "1.23E-04", "scientific, exponent sign always shown with E+"],
    [123456, "0.0E+00", "1.2E+05", ""],
    [0.5, "#.00", ".50", "# shows no leading zero"],
    [5, "00", "05", ""],
    [5, "??0", "  5", "? pads with a space"],
    [1.5, "0.0#", "1.5", "# drops a trailing zero"],
    [1.25, "0.0#", "1.25", ""],
    [42, '0" MB"', "42 MB", "literal after the number"],
    [3.25, "[Red]0.00;[Blue]-0.00", "3.25", "colours are ignored"],
    [7, "0_);(0)", "7 ", "_x leaves the width of x as a space"],
  ])("%p under %p shows %p (%s)", (value, code, shown) => {
    expect(formatNumber(value as number, code as string)).toBe(shown);
  });

  it("uses General for an empty code", () => {
    expect(formatNumber(0.25, "")).toBe("0.25");
  });

  it("returns null for what it does not support: dates, conditions, fractions", () => {
    expect([formatNumber(45000, "yyyy-mm-dd"), formatNumber(5, "[>=10]0;0.0"), formatNumber(0.5, "# ?/?")]).toEqual([null, null, null]);
  });

  it("returns null for a number under a text section (@, the Text format), so it shows as General, not as '@'", () => {
    expect([formatNumber(5.25, "@"), formatNumber(0, "@")]).toEqual([null, null]);
  });

  it("returns null for a number that is not finite", () => {
    expect(formatNumber(Number.NaN, "0")).toBeNull();
  });
});

describe("formatGeneral", () => {
  it("shows up to 10 significant digits without trailing zeros", () => {
    expect([formatGeneral(3.14159), formatGeneral(1 / 3), formatGeneral(2), formatGeneral(0.0310840001)]).toEqual(["3.14159", "0.3333333333", "2", "0.0310840001"]);
  });

  it("goes scientific for very large and very small numbers", () => {
    expect([formatGeneral(123456789012), formatGeneral(1.5e-12)]).toEqual(["1.23457E+11", "1.5E-12"]);
  });
});

describe("formatText", () => {
  it("puts text into the fourth section's @", () => {
    expect(formatText("hi", '0;0;0;"<"@">"')).toBe("<hi>");
  });

  it("leaves text alone without a text section", () => {
    expect(formatText("HE MCS9", "0.00")).toBe("HE MCS9");
  });
});

const SOFFICE = "/usr/bin/soffice";
const CODES = ["0%", "0.0%", "0.00%", "0", "0.0", "0.00", "#,##0", "#,##0.00", "0.00;(0.00)", '0.00;-0.00;"zero"', '"$"#,##0.00', "[$€-407] #,##0.00", "#,##0,", "0.00E+00", "0.0E+00", "#.00", "00", "0.0#", '0" MB"', '#,##0.00 "kb"', "[Red]0.00;[Blue]-0.00"];
const VALUES = [0.7, 0.031084, 1234.5, 0.5, 1.005, 2.5, -2.5, -2, 0, 12.3, 1234567, 0.000123, 123456, 5, 1.25, -0.001, 1e6, 0.125, -1234.5678, 99.995];

/**
 * Where LibreOffice and this module knowingly differ:
 * - a negative number that rounds to zero with one section: LibreOffice
 *   shows "0", spreadsheets following the code literally show "-0" (the
 *   familiar "negative zero" of Excel sheets; from memory);
 * - 1.005 under "0%": the binary product 1.005 × 100 = 100.49999999999999
 *   shows as 100% in LibreOffice; scaled as the 15-digit decimal 100.5 it
 *   rounds to 101% here.
 */
function knownDifference(value: number, code: string): boolean {
  const oneNumericSection = !code.includes(";");
  const roundsToZero = value < 0 && formatNumber(-value, code) === formatNumber(0, code);
  return (oneNumericSection && roundsToZero) || (value === 1.005 && code === "0%");
}

(fs.existsSync(SOFFICE) ? describe : describe.skip)("formatNumber against LibreOffice headless", () => {
  let shown: string[][];
  beforeAll(async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-numfmt-"));
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Formats");
    CODES.forEach((code, i) =>
      VALUES.forEach((v, j) => {
        const cell = ws.getCell(i + 1, j + 1);
        cell.value = v;
        cell.numFmt = code;
      }),
    );
    const file = path.join(dir, "formats.xlsx");
    await wb.xlsx.writeFile(file);
    // Text filter options: tab-separated (9), double quote (34), UTF-8 (76), from line 1, …, "save cell contents as shown" = true.
    execFileSync(SOFFICE, [`-env:UserInstallation=file://${path.join(dir, "profile")}`, "--headless", "--convert-to", "csv:Text - txt - csv (StarCalc):9,34,76,1,,0,false,true,true", "--outdir", dir, file], { stdio: "ignore", timeout: 170_000 });
    shown = fs
      .readFileSync(path.join(dir, "formats.csv"), "utf8")
      .trim()
      .split(/\r?\n/)
      .map((line) => line.split("\t").map((c) => c.replace(/^"|"$/g, "")));
  }, 180_000);

  it.each(CODES.map((code, i) => [code, i]))("shows every value under %p as LibreOffice does", (code, i) => {
    const theirs = shown[i as number];
    const ours = VALUES.map((v) => formatNumber(v, code as string)!);
    expect(theirs).toHaveLength(ours.length);
    const compared = VALUES.map((v, j) => (knownDifference(v, code as string) ? null : [ours[j], theirs[j]]));
    expect(compared.filter((c) => c !== null && c[0] !== c[1])).toEqual([]);
    expect(compared.filter((c) => c !== null).length).toBeGreaterThan(VALUES.length / 2);
  });
});

if (!fs.existsSync(SOFFICE)) {
  console.warn(`SKIPPED: number format cross-check needs ${SOFFICE} (LibreOffice); apt-get install libreoffice-calc`);
}
