/**
 * issue 14's acceptance check: the coverage workbook (test/cli/support/
 * coverageBook.ts) and the demo (examples/site-budget.xlsx), recalculated by
 * `airtally recalc` and by LibreOffice Calc headless (Debian's
 * libreoffice-calc-nogui, installed by .ci/run), agree on every native cell:
 * numbers to 1e-9 relative, the same error codes, the same text. AIRTALLY
 * cells are compared with the core functions called directly. Without
 * soffice the comparisons are skipped and the reason is printed.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import * as core from "../../src/core/index";
import { columnLetters } from "../../src/cli/address";
import { loadAirtally } from "../../src/cli/bundle";
import { isCellError, recalc, type RecalcResult, type Value } from "../../src/cli/engine";
import { main } from "../../src/cli/main";
import { bookFromExcel } from "../../src/cli/xlsx";
import { loadPackage } from "../../src/cli/xlsxRead";
import { CASES, CASES_SHEET, caseRows, coverageBook, OURS_COL, THEIRS_COL, WRONG_CACHE } from "./support/coverageBook";
import { findSoffice, recalcWithLibreOffice, sameValue, storedValues } from "./support/libreoffice";
import { writeXlsx } from "./support/writeXlsx";

const soffice = findSoffice();
if (!soffice.bin) console.warn(`SKIPPED: the LibreOffice comparisons of test/cli/libreoffice.test.ts did not run: ${soffice.why}`);
const withLibreOffice = soffice.bin ? it : it.skip;
const functions = loadAirtally();
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-cov-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const show = (v: Value | undefined) => (v === undefined ? "(nothing)" : isCellError(v) ? `${v.error}${v.message ? ` (${v.message})` : ""}` : JSON.stringify(v));

function valuesOf(result: RecalcResult): Map<string, Value> {
  const out = new Map<string, Value>();
  for (const s of result.sheets) for (const c of s.cells) out.set(`${s.name}!${c.row},${c.col}`, c.value);
  return out;
}

describe("the coverage workbook", () => {
  const file = path.join(dir, "coverage.xlsx");
  let ours: Map<string, Value>;
  let result: RecalcResult;

  beforeAll(async () => {
    await writeXlsx(file, coverageBook());
    const loaded = await loadPackage(file);
    loaded.pkg.close();
    result = recalc(loaded.book, functions);
    ours = valuesOf(result);
  });

  it("has no #NAME? cell: every function of the list is known in both stored forms", () => {
    expect(result.errors.filter((e) => isCellError(e.value) && e.value.error === "#NAME?").map((e) => `${e.address} ${show(e.value)}`)).toEqual([]);
  });

  it("recalculates through the command line too (exit 1: the error cases are error cells)", async () => {
    const code = await main(["recalc", file, "--quiet"], { out: () => undefined, err: () => undefined });
    expect(code).toBe(1);
  });

  withLibreOffice(
    "agrees with LibreOffice Calc on every case",
    async () => {
      const theirs = await storedValues(recalcWithLibreOffice(soffice.bin!, file));
      const rows = caseRows();
      const problems: string[] = [];
      const divergent: string[] = [];
      let compared = 0;
      for (const c of CASES) {
        const row = rows.get(c.id)!;
        const [h, w] = c.spill ?? [1, 1];
        for (let i = 0; i < h; i++)
          for (let j = 0; j < w; j++) {
            const mine = ours.get(`${CASES_SHEET}!${row + i},${OURS_COL + j}`);
            const ref = theirs.get(`${CASES_SHEET}!${row + i},${(c.twin !== undefined ? THEIRS_COL : OURS_COL) + j}`);
            compared++;
            if (c.divergence) {
              if (show(mine).split(" (")[0] !== c.divergence.excel || show(ref).replace(/^"|"$/g, "") !== c.divergence.libreOffice)
                problems.push(`${c.id}: expected the documented divergence (airtally ${c.divergence.excel}, LibreOffice ${c.divergence.libreOffice}), got airtally ${show(mine)}, LibreOffice ${show(ref)}`);
              else divergent.push(`${c.id}: ${c.divergence.why}`);
            } else if (typeof ref === "number" && ref === WRONG_CACHE) problems.push(`${c.id}: LibreOffice did not recompute`);
            else if (!sameValue(mine, ref)) problems.push(`${c.id} [${columnLetters(OURS_COL + j)}${row + i}] =${c.formula}: airtally ${show(mine)}, LibreOffice ${show(ref)}`);
          }
      }
      console.log(`coverage workbook: ${CASES.length} cases, ${compared} cells compared with LibreOffice, ${problems.length} differ; documented divergences:\n  ${divergent.join("\n  ")}`);
      expect(problems).toEqual([]);
    },
    240_000,
  );

  withLibreOffice(
    "writes --out as a package both LibreOffice and exceljs open, its cached values the recalculated ones",
    async () => {
      const out = path.join(dir, "coverage-out.xlsx");
      expect(await main(["recalc", file, "--quiet", "--out", out], { out: () => undefined, err: () => undefined })).toBe(1);
      const cached = await storedValues(out);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile(out);
      const opened = await storedValues(recalcWithLibreOffice(soffice.bin!, out));
      const rows = caseRows();
      const stale = CASES.filter((c) => !c.spill && !c.twin && !c.divergence)
        .map((c) => `${CASES_SHEET}!${rows.get(c.id)},${OURS_COL}`)
        .filter((k) => !sameValue(cached.get(k), ours.get(k)) || !sameValue(opened.get(k), ours.get(k)));
      expect([wb.worksheets.length, stale]).toEqual([3, []]);
    },
    240_000,
  );

  it("computes an AIRTALLY call in the workbook as the core does", async () => {
    const f = path.join(dir, "airtally-call.xlsx");
    await writeXlsx(f, { sheets: [{ name: "S", cells: [{ ref: "A1", value: "OFDM 6Mbps 5GHz" }, { ref: "B1", formula: "_xldudf_AIRTALLY_TXTIME(A1,100)+Data", cached: WRONG_CACHE }] }], names: [{ name: "Data", text: "0" }] });
    const loaded = await loadPackage(f);
    loaded.pkg.close();
    const r = recalc(loaded.book, functions);
    expect(r.sheets[0].cells.find((c) => c.address === "B1")!.value).toBeCloseTo(core.txtimeUs("OFDM 6Mbps 5GHz", 100), 9);
  });
});

describe("the demo workbook", () => {
  withLibreOffice(
    "agrees with LibreOffice Calc on every native formula cell (AIRTALLY cells given to it as values)",
    async () => {
      const demo = path.resolve(__dirname, "../../examples/site-budget.xlsx");
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile(demo);
      const result = recalc(bookFromExcel(wb), functions);
      const ours = valuesOf(result);
      // AIRTALLY cells (and what they spill) become constants; every native formula gets a wrong cached value.
      const native: string[] = [];
      for (const s of result.sheets) {
        const ws = wb.getWorksheet(s.name)!;
        for (const c of s.cells) {
          const cell = ws.getCell(c.row, c.col);
          const airtally = c.kind === "spill" ? /AIRTALLY/i.test(s.cells.find((x) => x.address === c.anchor?.split("!")[1])?.formula ?? "") : /AIRTALLY/i.test(c.formula ?? "");
          if (c.kind === "constant") continue;
          if (airtally || c.kind === "spill") cell.value = isCellError(c.value) ? null : (c.value as ExcelJS.CellValue);
          else {
            cell.value = { formula: c.formula!, result: WRONG_CACHE } as ExcelJS.CellFormulaValue;
            native.push(`${s.name}!${c.row},${c.col}`);
          }
        }
      }
      const frozen = path.join(dir, "demo-frozen.xlsx");
      await wb.xlsx.writeFile(frozen);
      const theirs = await storedValues(recalcWithLibreOffice(soffice.bin!, frozen));
      const problems = native.filter((k) => !sameValue(ours.get(k), theirs.get(k))).map((k) => `${k}: airtally ${show(ours.get(k))}, LibreOffice ${show(theirs.get(k))}`);
      console.log(`demo workbook: ${native.length} native formula cells compared with LibreOffice, ${problems.length} differ`);
      expect([native.length > 0, problems]).toEqual([true, []]);
    },
    240_000,
  );
});
