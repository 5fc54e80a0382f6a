/**
 * The command line ends with one caution line, in full, wherever it speaks of
 * power or path loss: --help, eval of REACH/TOPLINK/INDOORLOSS/FSPL, and
 * recalc (whose table would otherwise cut a sheet's caution cell to its
 * column width). Needs `npm run build`.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { main } from "../../src/cli/main";
import { CLI_CAUTION } from "../../src/cli/caution";

async function cli(args: string[]): Promise<{ code: number; out: string }> {
  let out = "";
  const code = await main(args, { out: (t) => (out += t), err: () => undefined });
  return { code, out };
}

const lastLine = (text: string) => text.trimEnd().split("\n").pop();

describe("the caution line of the command line", () => {
  it("says what the brief's cautions say: planning estimate, site survey, limits vary by country, local practice decides", () => {
    expect(CLI_CAUTION).toMatch(/planning estimate/);
    expect(CLI_CAUTION).toMatch(/site survey/);
    expect(CLI_CAUTION).toMatch(/vary by country/);
    expect(CLI_CAUTION).toMatch(/licensed practice decide/);
  });

  it("ends --help", async () => {
    expect(lastLine((await cli(["--help"])).out)).toBe(CLI_CAUTION);
  });

  it.each([
    '=AIRTALLY.REACH(20,-67,5500)',
    '=AIRTALLY.TOPLINK("HE",-60)',
    "=AIRTALLY.INDOORLOSS(20,5500)",
    "=airtally.fspl(10,2437)",
  ])("ends eval of %s", async (formula) => {
    const r = await cli(["eval", formula]);
    expect([r.code, lastLine(r.out)]).toEqual([0, CLI_CAUTION]);
  });

  it("is not added to eval of a function that says nothing of power", async () => {
    expect((await cli(["eval", '=AIRTALLY.RATE("HE MCS11 2SS 80MHz")'])).out).not.toContain(CLI_CAUTION);
  });

  it("ends recalc, in full", async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-caution-"));
    try {
      const wb = new ExcelJS.Workbook();
      wb.addWorksheet("Plan").getCell("A1").value = { formula: "AIRTALLY.FSPL(10,5500)" } as ExcelJS.CellFormulaValue;
      const file = path.join(dir, "plan.xlsx");
      await wb.xlsx.writeFile(file);
      const r = await cli(["recalc", file]);
      expect([r.code, lastLine(r.out)]).toEqual([0, CLI_CAUTION]);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
