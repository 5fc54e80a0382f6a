/**
 * The airtally command line on workbooks with errors, a cycle, blank cells,
 * ranges and spills: every problem stays in its cell, the command never
 * crashes, and the exit code says what happened. Needs `npm run build` (the
 * CLI runs dist/functions.js). Check values are hand derivations from the
 * standard, written as their breakdown.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { loadAirtally } from "../../src/cli/bundle";
import { recalc, evaluateFormula, type InputCell, type RecalcResult, type Value } from "../../src/cli/engine";
import { main, EXIT } from "../../src/cli/main";
import { bookFromExcel } from "../../src/cli/xlsx";

const functions = loadAirtally();
/** IEEE 802.11-2020 17.4.3 eq. (17-29): preamble 16 + SIGNAL 4 + N_SYM × 4 µs, N_SYM = ceil((16 + 8·100 + 6) / 24) = 35. */
const TXTIME_OFDM6_100 = 16 + 4 + 4 * 35;

function run(cells: Record<string, string | number | null>, sheet = "S"): RecalcResult {
  const input: InputCell[] = Object.entries(cells).map(([a, v]) => {
    const m = /^([A-Z])(\d+)$/.exec(a)!;
    const cell: InputCell = { row: Number(m[2]), col: m[1].charCodeAt(0) - 64 };
    if (typeof v === "string" && v.startsWith("=")) cell.formula = v.slice(1);
    else if (v !== null) cell.value = v;
    return cell;
  });
  return recalc({ sheets: [{ name: sheet, cells: input }] }, functions);
}

function at(r: RecalcResult, address: string, sheet = r.sheets[0].name): Value | undefined {
  return r.sheets.find((s) => s.name === sheet)!.cells.find((c) => c.address === address)?.value;
}

describe("recalc: values", () => {
  it("computes an AIRTALLY call with the built add-in", () => {
    expect(at(run({ A1: '=AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",100)' }), "A1")).toBe(TXTIME_OFDM6_100);
  });

  it("reads the saved _xldudf_AIRTALLY_ spelling like the displayed one", () => {
    expect(at(run({ A1: '=_xldudf_AIRTALLY_TXTIME("OFDM 6Mbps 5GHz",100)' }), "A1")).toBe(TXTIME_OFDM6_100);
  });

  it("evaluates in dependency order whatever the cell order", () => {
    const r = run({ A1: "=A2*2", A2: '=AIRTALLY.TXTIME(A3,A4)', A3: "OFDM 6Mbps 5GHz", A4: 100 });
    expect(at(r, "A1")).toBe(2 * TXTIME_OFDM6_100);
  });

  it("sums a range of AIRTALLY results", () => {
    const r = run({ A1: '=AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",100)', A2: '=AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",100)', A3: "=SUM(A1:A2)" });
    expect(at(r, "A3")).toBe(2 * TXTIME_OFDM6_100);
  });

  it("passes an empty cell as 'use the default' (HE guard interval 0.8 µs, DESIGN.md §2)", () => {
    const r = run({ A1: '=AIRTALLY.LINK("HE",9,2,80,B1)' });
    expect(at(r, "A1")).toBe("HE MCS9 2SS 80MHz GI0.8 5GHz");
  });

  it("reads an empty cell as 0 in arithmetic, as Excel does", () => {
    expect(at(run({ A1: "=B7+1" }), "A1")).toBe(1);
  });

  it("gives MAX over a range Excel's result (text in a range is skipped)", () => {
    expect(at(run({ A1: 3, A2: 8, A3: "text", A4: "=MAX(A1:A3)" }), "A4")).toBe(8);
  });
});

describe("recalc: errors stay in their cells", () => {
  it("turns a CustomFunctions error into #VALUE! with the function's message", () => {
    const v = at(run({ A1: '=AIRTALLY.RATE("HX MCS1")' }), "A1") as { error: string; message: string };
    expect(v.error).toBe("#VALUE!");
    expect(v.message).toMatch(/^link: /);
  });

  it("propagates an error to the cells that read it", () => {
    const r = run({ A1: '=AIRTALLY.RATE("HX MCS1")', A2: "=A1+1" });
    expect((at(r, "A2") as { error: string }).error).toBe("#VALUE!");
  });

  it("lists every error cell", () => {
    const r = run({ A1: '=AIRTALLY.RATE("HX MCS1")', A2: "=A1+1", A3: "=1+1" });
    expect(r.errors.map((e) => e.address)).toEqual(["A1", "A2"]);
  });

  it("answers #NAME? for a function the build does not have", () => {
    expect((at(run({ A1: "=AIRTALLY.NOSUCH(1)" }), "A1") as { error: string }).error).toBe("#NAME?");
  });

  it("answers #NAME? with a message for a formula it cannot read", () => {
    const v = at(run({ A1: "=1+" }), "A1") as { error: string; message: string };
    expect(v.error).toBe("#NAME?");
    expect(v.message).toMatch(/cannot read the formula/);
  });

  it("refuses a range where the function takes one value", () => {
    const v = at(run({ A1: "OFDM 6Mbps 5GHz", A2: "OFDM 6Mbps 5GHz", A3: "=AIRTALLY.RATE(A1:A2)" }), "A3") as { error: string; message: string };
    expect(v.error).toBe("#VALUE!");
    expect(v.message).toMatch(/link takes one value/);
  });
});

describe("recalc: forms the engine does not compute are error cells, never a guess", () => {
  const forms = ["OFFSET(B1,1,0)", 'INDIRECT("B1")', "B1#", "S:T!B1", "SUM(B1:B2 B2:B3)", "SUM((B1,B2))", "LAMBDA(x,x+1)(2)", 'CLEAN("a")'];
  for (const f of forms)
    it(`=${f} is an error cell with a message`, () => {
      const v = at(run({ A1: `=${f}`, B1: 1, B2: 2, B3: 3 }), "A1") as { error: string; message?: string };
      expect([typeof v === "object" && v !== null && v.error.startsWith("#"), typeof v === "object" && !!v?.message]).toEqual([true, true]);
    });
});

describe("recalc: circular references", () => {
  const r = run({ A1: "=A2+1", A2: "=A1*2", A3: "=A1", B1: 5, B2: "=B1+1" });

  it("marks every cell of the cycle #CYCLE! with the path", () => {
    expect(at(r, "A1")).toEqual({ error: "#CYCLE!", message: "circular reference: S!A1 → S!A2 → S!A1" });
  });

  it("reports the cycle once with its cells", () => {
    expect(r.cycles).toEqual([["S!A1", "S!A2"]]);
  });

  it("gives a cell that reads the cycle its error", () => {
    expect((at(r, "A3") as { error: string }).error).toBe("#CYCLE!");
  });

  it("still computes the cells outside the cycle", () => {
    expect(at(r, "B2")).toBe(6);
  });

  it("finds a cell that reads itself", () => {
    expect(run({ A1: "=A1+1" }).cycles).toEqual([["S!A1"]]);
  });
});

describe("recalc: spills", () => {
  it("spills TXTIMEPARTS below and to the right, total last", () => {
    const r = run({ A1: '=AIRTALLY.TXTIMEPARTS("OFDM 6Mbps 5GHz",100)' });
    const last = r.spills[0].area.bottom;
    expect(at(r, `B${last}`)).toBe(TXTIME_OFDM6_100);
  });

  it("lets other formulas read spilled cells", () => {
    const r = run({ A1: '=AIRTALLY.TXTIMEPARTS("OFDM 6Mbps 5GHz",100)', D1: "=MAX(B1:B30)" });
    expect(at(r, "D1")).toBe(TXTIME_OFDM6_100);
  });

  it("shows #SPILL! when a cell in the way is not empty", () => {
    const v = at(run({ A1: '=AIRTALLY.TXTIMEPARTS("OFDM 6Mbps 5GHz",100)', B3: "in the way" }), "A1") as { error: string; message: string };
    expect(v.error).toBe("#SPILL!");
    expect(v.message).toMatch(/B3 is not empty/);
  });
});

describe("eval", () => {
  it("evaluates one formula", () => {
    expect(evaluateFormula('=AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",100)', functions)).toBe(TXTIME_OFDM6_100);
  });

  it("refuses text past 32 767 characters instead of growing it", () => {
    const r = run({ A1: "a".repeat(20000), A2: "=A1&A1" });
    expect((at(r, "A2") as { error: string }).error).toBe("#VALUE!");
  });
});

describe("the command and its exit codes", () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-cli-"));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  async function book(name: string, cells: Record<string, ExcelJS.CellValue>): Promise<string> {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Plan");
    for (const [a, v] of Object.entries(cells)) ws.getCell(a).value = v;
    const file = path.join(dir, name);
    await wb.xlsx.writeFile(file);
    return file;
  }

  async function cli(args: string[]): Promise<{ code: number; out: string; err: string }> {
    let out = "";
    let err = "";
    const code = await main(args, { out: (t) => (out += t), err: (t) => (err += t) });
    return { code, out, err };
  }

  it(`exits ${EXIT.ok} when every formula has a value`, async () => {
    const file = await book("ok.xlsx", { A1: { formula: '_xldudf_AIRTALLY_TXTIME("OFDM 6Mbps 5GHz",100)' } as ExcelJS.CellFormulaValue });
    expect((await cli(["recalc", file])).code).toBe(0);
  });

  it(`exits ${EXIT.cellErrors} and lists the error cells with their messages`, async () => {
    const file = await book("errors.xlsx", { A1: { formula: 'AIRTALLY.RATE("HX")' } as ExcelJS.CellFormulaValue });
    const r = await cli(["recalc", file]);
    expect([r.code, /Plan!A1: #VALUE! link: /.test(r.out)]).toEqual([1, true]);
  });

  it(`exits ${EXIT.cycle} on a circular reference`, async () => {
    const file = await book("cycle.xlsx", { A1: { formula: "A2+1" } as ExcelJS.CellFormulaValue, A2: { formula: "A1+1" } as ExcelJS.CellFormulaValue });
    expect((await cli(["recalc", file])).code).toBe(3);
  });

  it(`exits ${EXIT.usage} for a missing file`, async () => {
    expect((await cli(["recalc", path.join(dir, "absent.xlsx")])).code).toBe(2);
  });

  it(`exits ${EXIT.usage} for a file that is not a workbook, without crashing`, async () => {
    const file = path.join(dir, "junk.xlsx");
    fs.writeFileSync(file, "not a zip");
    expect((await cli(["recalc", file])).code).toBe(2);
  });

  it(`exits ${EXIT.usage} for an unknown command`, async () => {
    expect((await cli(["frobnicate"])).code).toBe(2);
  });

  it("writes the recalculated values into --out as cached results", async () => {
    const file = await book("out.xlsx", { A1: { formula: 'AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",100)' } as ExcelJS.CellFormulaValue });
    const out = path.join(dir, "out-recalc.xlsx");
    await cli(["recalc", file, "--out", out]);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(out);
    expect((wb.getWorksheet("Plan")!.getCell("A1").value as ExcelJS.CellFormulaValue).result).toBe(TXTIME_OFDM6_100);
  });

  it("stores a spill in --out as an array formula over the cells it filled", async () => {
    const file = await book("spill.xlsx", { A1: { formula: 'AIRTALLY.TXTIMEPARTS("OFDM 6Mbps 5GHz",100)' } as ExcelJS.CellFormulaValue });
    const out = path.join(dir, "spill-recalc.xlsx");
    await cli(["recalc", file, "--out", out]);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(out);
    const again = recalc(bookFromExcel(wb), functions);
    expect(again.spills.map((s) => s.stored)).toEqual([true]);
  });

  it("prints the exit codes in --help", async () => {
    const r = await cli(["--help"]);
    expect(/0 +every formula has a value/.test(r.out) && /3 +the workbook has a circular reference/.test(r.out)).toBe(true);
  });
});
