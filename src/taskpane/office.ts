/**
 * The pane's workbook actions through the Excel JavaScript API. Kept thin:
 * the decisions live in budgetTemplate.ts and explain.ts. Each takes the
 * `Excel` namespace (or a mock with the same `run`) so tests can drive it.
 */
import { budgetTemplate, candidateSheetName } from "./budgetTemplate";
import { explain, planExplanation, type Explanation } from "./explain";
import type { FunctionMetadata } from "./reference";

export interface ExcelLike {
  run<T>(batch: (context: Excel.RequestContext) => Promise<T>): Promise<T>;
}

const MAX_CANDIDATES = 200;

/** Write the site budget on a new sheet with a name no sheet has; returns the name. Never writes on an existing sheet. */
export async function insertSiteBudget(excel: ExcelLike): Promise<string> {
  return excel.run(async (context) => {
    const sheets = context.workbook.worksheets;
    let name: string | null = null;
    for (let n = 1; n <= MAX_CANDIDATES && name === null; n++) {
      const candidate = candidateSheetName(n);
      const existing = sheets.getItemOrNullObject(candidate);
      existing.load("isNullObject");
      await context.sync();
      if (existing.isNullObject) name = candidate;
    }
    if (name === null) throw new Error("every candidate sheet name is taken; rename or delete an old Airtally budget sheet");
    const sheet = sheets.add(name);
    // A new sheet is empty; check anyway, so a host that returned an existing sheet never gets its cells overwritten.
    const used = sheet.getUsedRangeOrNullObject(true);
    used.load("isNullObject");
    await context.sync();
    if (!used.isNullObject) throw new Error(`sheet "${name}" is not empty; Airtally writes its budget only on a new, empty sheet`);
    const block = budgetTemplate();
    sheet.getRange(block.address).formulas = block.formulas;
    sheet.activate();
    await context.sync();
    return name;
  });
}

/** Split "Sheet 1!A1:B2" / "'My sheet'!A1" into sheet and address. */
function splitAddress(ref: string): { sheet: string | null; address: string } {
  const bang = ref.lastIndexOf("!");
  if (bang < 0) return { sheet: null, address: ref.replace(/\$/g, "") };
  const sheet = ref.slice(0, bang).replace(/^'(.*)'$/, "$1").replace(/''/g, "'");
  return { sheet, address: ref.slice(bang + 1).replace(/\$/g, "") };
}

/** Explain the active cell: read its formula and the cells its AIRTALLY call references. */
export async function explainActiveCell(excel: ExcelLike, metadata: FunctionMetadata[]): Promise<{ address: string; explanation: Explanation }> {
  return excel.run(async (context) => {
    const cell = context.workbook.getActiveCell();
    cell.load(["address", "formulas", "values"]);
    await context.sync();
    const raw = cell.formulas?.[0]?.[0];
    const plan = planExplanation(typeof raw === "string" ? raw : "");
    const ranges = plan.references.map((ref) => {
      const { sheet, address } = splitAddress(ref);
      const range = sheet ? context.workbook.worksheets.getItem(sheet).getRange(address) : cell.worksheet.getRange(address);
      range.load("values");
      return { ref, range };
    });
    if (ranges.length) await context.sync();
    const values = new Map<string, unknown[][]>(ranges.map(({ ref, range }) => [ref, range.values as unknown[][]]));
    return { address: cell.address, explanation: explain(plan, metadata, values, cell.values?.[0]?.[0]) };
  });
}
