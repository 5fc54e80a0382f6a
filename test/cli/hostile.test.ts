/**
 * Hostile and huge workbooks (issue 14): each is generated here, small on
 * disk, and run through the real command (`node bin/airtally.js`, a child
 * process) whose peak memory is measured (process.resourceUsage().maxRSS).
 * The bounds are the documented ones (README "Limits"); the time limits are
 * guards against hangs, not speed targets (speed lives in `npm run bench`).
 */
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { loadPackage } from "../../src/cli/xlsxRead";
import { HEAP_MB, MAX_CELLS, ZIP_LIMITS } from "../../src/cli/zip";
import { airtally, ROOT, report, sha } from "./support/run";
import { budgetBook, budgetDays, deflatedFill, rawZip, type RawPart } from "./support/bigBook";
import { workbookParts, writeXlsx, zipParts, type FixtureBook } from "./support/writeXlsx";

const MiB = 1 << 20;
/** The bound on the process: about 1 GB. */
const MEMORY_BOUND_MB = 1024;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-hostile-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** A valid package whose sheet1.xml is replaced by a raw part (headers as the test wants). */
function packageWithSheet(file: string, sheet: RawPart, book: FixtureBook = { sheets: [{ name: "S", cells: [] }] }): void {
  const parts: RawPart[] = [...workbookParts(book)].filter(([n]) => n !== "xl/worksheets/sheet1.xml").map(([name, text]) => ({ name, data: Buffer.from(text) }));
  rawZip(file, [...parts, sheet]);
}

const SHEET_HEAD = '<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>';

describe("zip bombs and ratios", () => {
  it("refuses a part that declares 4000 MiB inflated before inflating it (exit 2, part and limit named)", () => {
    const file = path.join(dir, "bomb-4g.xlsx");
    const total = 4000 * MiB;
    packageWithSheet(file, { name: "xl/worksheets/sheet1.xml", data: Buffer.alloc(0), deflated: deflatedFill(SHEET_HEAD, " ", total), declaredSize: total, crc: 0 });
    const before = sha(file);
    const r = airtally(["recalc", file]);
    report("4000 MiB bomb", r);
    expect([r.code, /part xl\/worksheets\/sheet1\.xml declares 4000 MiB inflated, over the limit of 512 MiB per part/.test(r.err), r.peakMB < 300, sha(file) === before]).toEqual([2, true, true, true]);
  });

  it("refuses a part that inflates past its declared size while inflating (a lying header)", () => {
    const file = path.join(dir, "bomb-lying.xlsx");
    packageWithSheet(file, { name: "xl/worksheets/sheet1.xml", data: Buffer.alloc(0), deflated: deflatedFill(SHEET_HEAD, " ", 1024 * MiB), declaredSize: 10_000, crc: 0 });
    const r = airtally(["recalc", file]);
    report("1 GiB bomb declaring 10 kB", r);
    expect([r.code, /refused: part xl\/worksheets\/sheet1\.xml is damaged/.test(r.err), r.peakMB < 300]).toEqual([2, true, true]);
  });

  it(`refuses a compression ratio over ${ZIP_LIMITS.maxRatio}:1 (300 MiB of blanks in a few hundred kB)`, () => {
    const file = path.join(dir, "ratio.xlsx");
    const total = 300 * MiB;
    packageWithSheet(file, { name: "xl/worksheets/sheet1.xml", data: Buffer.alloc(0), deflated: deflatedFill(SHEET_HEAD, " ", total), declaredSize: total, crc: 0 });
    const r = airtally(["recalc", file]);
    report("ratio bomb", r);
    expect([r.code, /part xl\/worksheets\/sheet1\.xml declares a compression ratio of \d+:1, over the limit of 200:1/.test(r.err), r.peakMB < 300]).toEqual([2, true, true]);
  });
});

describe("damaged, foreign and unsafe packages", () => {
  it("refuses a file that is not a zip (exit 2)", () => {
    const file = path.join(dir, "junk.xlsx");
    fs.writeFileSync(file, "PK\u0003\u0004 not really a zip");
    const r = airtally(["recalc", file]);
    expect([r.code, /cannot read .* as an \.xlsx workbook/.test(r.err)]).toEqual([2, true]);
  });

  it("refuses a truncated workbook (exit 2)", async () => {
    const good = path.join(dir, "good.xlsx");
    await writeXlsx(good, { sheets: [{ name: "S", cells: [{ ref: "A1", value: 1 }] }] });
    const file = path.join(dir, "truncated.xlsx");
    fs.writeFileSync(file, fs.readFileSync(good).subarray(0, 300));
    expect(airtally(["recalc", file]).code).toBe(2);
  });

  it("refuses a zip with no workbook part (exit 2)", () => {
    const file = path.join(dir, "no-workbook.xlsx");
    rawZip(file, [{ name: "notes.txt", data: Buffer.from("hello") }]);
    const r = airtally(["recalc", file]);
    expect([r.code, /no workbook part/.test(r.err)]).toEqual([2, true]);
  });

  it("refuses a DOCTYPE (entity expansion) in any part it reads (exit 2)", () => {
    const file = path.join(dir, "doctype.xlsx");
    const laughs = `<?xml version="1.0"?><!DOCTYPE worksheet [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;">]><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>&c;</t></is></c></row></sheetData></worksheet>`;
    packageWithSheet(file, { name: "xl/worksheets/sheet1.xml", data: Buffer.from(laughs) });
    const r = airtally(["recalc", file]);
    expect([r.code, /part xl\/worksheets\/sheet1\.xml has a DOCTYPE/.test(r.err)]).toEqual([2, true]);
  });

  it("never follows an external link: such formulas and names are #REF! cells with a message (exit 1)", async () => {
    const file = path.join(dir, "external.xlsx");
    const book: FixtureBook = {
      sheets: [{ name: "S", cells: [{ ref: "A1", formula: "[1]Prices!A1*2" }, { ref: "A2", formula: "Outside+1" }, { ref: "A3", value: 5 }, { ref: "A4", formula: "A3*2" }] }],
      names: [{ name: "Outside", text: "[1]Prices!$A$1" }],
    };
    const parts = workbookParts(book);
    parts.set("xl/externalLinks/externalLink1.xml", '<?xml version="1.0"?><externalLink xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><externalBook/></externalLink>');
    await zipParts(file, parts);
    const r = airtally(["recalc", file]);
    expect([r.code, /S!A1: #REF! the formula reads another workbook; external links are not followed/.test(r.out), /S!A2: #REF!/.test(r.out), /\|\s+10\b/.test(r.out)]).toEqual([1, true, true, true]);
  });
});

describe("far corners, deep nesting, long chains and cycles", () => {
  it("stores a far-corner cell (XFD1048576) sparsely: whole-column and whole-sheet sums stay cheap", async () => {
    const file = path.join(dir, "far.xlsx");
    await writeXlsx(file, {
      sheets: [
        { name: "S", cells: [{ ref: "A1", value: 1 }, { ref: "A2", value: 2 }, { ref: "XFD1048576", value: 40 }, { ref: "XFD1048575", formula: "XFD1048576*2" }] },
        { name: "T", cells: [{ ref: "A1", formula: "SUM(S!A:A)" }, { ref: "A2", formula: "SUM(S!A1:XFD1048576)" }, { ref: "A3", formula: "COUNTA(S!1:1048576)" }] },
      ],
    });
    const r = airtally(["recalc", file, "--sheet", "T"]);
    report("far corner", r);
    // T!A1 = 1 + 2; T!A2 = 1 + 2 + 40 + 80 (XFD1048575 = 40 × 2); T!A3 counts the four cells of S.
    expect([r.code, /1 \| +3\n/.test(r.out), /2 \| +123\n/.test(r.out), /3 \| +4\n/.test(r.out), r.peakMB < 300, r.seconds < 60]).toEqual([0, true, true, true, true, true]);
  });

  it("answers a formula nested past the bound with an error cell, not a crash (exit 1)", async () => {
    const file = path.join(dir, "deep.xlsx");
    await writeXlsx(file, {
      sheets: [
        {
          name: "S",
          cells: [
            { ref: "A1", formula: "(".repeat(5000) + "1" + ")".repeat(5000) },
            { ref: "A2", formula: "ABS(".repeat(1000) + "1" + ")".repeat(1000) },
            { ref: "A3", formula: "1+".repeat(5000) + "1" },
            { ref: "A4", formula: "-".repeat(5000) + "1" },
            { ref: "A5", formula: "1" + "+1".repeat(4000) },
          ],
        },
      ],
    });
    const r = airtally(["recalc", file]);
    // Two pass the 8192-character limit, two nest past the bound; the flat 4001-term sum is computed.
    expect([r.code, (r.out.match(/cannot read the formula: the formula is 10001 characters long/g) ?? []).length, (r.out.match(/nests deeper than/g) ?? []).length, /\|\s+4001\b/.test(r.out)]).toEqual([1, 2, 2, true]);
  });

  it("evaluates a 200 000-cell dependency chain without recursion (exit 0)", async () => {
    const n = 200_000;
    const file = path.join(dir, "chain.xlsx");
    const cells = [{ ref: "A1", value: 1 }, ...Array.from({ length: n - 1 }, (_, i) => ({ ref: `A${i + 2}`, formula: `A${i + 1}+1` })), { ref: "B1", formula: `1/(A${n}=${n})` }];
    await writeXlsx(file, { sheets: [{ name: "S", cells }] });
    const r = airtally(["recalc", file, "--quiet"]);
    report("200 000-cell chain", r);
    expect([r.code, r.peakMB < MEMORY_BOUND_MB]).toEqual([0, true]);
  });

  it("reports a cycle across sheets with its path (exit 3)", async () => {
    const file = path.join(dir, "cycle.xlsx");
    await writeXlsx(file, { sheets: [{ name: "One", cells: [{ ref: "A1", formula: "Two!A1+1" }] }, { name: "Two", cells: [{ ref: "A1", formula: "One!A1*2" }, { ref: "A2", value: 3 }] }] });
    const r = airtally(["recalc", file]);
    expect([r.code, /circular reference: One!A1 → Two!A1 → One!A1/.test(r.out)]).toEqual([3, true]);
  });
});

describe("a million rows", () => {
  it(
    `recalculates a 1 000 000-row budget of plain formulas under ${MEMORY_BOUND_MB} MB, the total equal to a plain sum (exit 0)`,
    async () => {
      const rows = 1_000_000;
      const file = path.join(dir, "million.xlsx");
      await budgetBook(file, rows, true, budgetDays(rows));
      const out = path.join(dir, "million-out.xlsx");
      const r = airtally(["recalc", file, "--quiet", "--out", out], 600_000);
      report("1 000 000 rows, with --out", r);
      // The copy caches the check cell F (1 when the total matched) and the total E of the last row.
      const last = rows + 2;
      const cached = new Map<string, unknown>();
      const back = await loadPackage(out, { sheets: () => undefined, cell: (_i, c) => (c.row === last ? cached.set(`${c.col}`, c.value) : undefined) });
      back.pkg.close();
      expect([r.code, r.peakMB < MEMORY_BOUND_MB, cached.get("6"), cached.get("5")]).toEqual([0, true, 1, budgetDays(rows)]);
    },
    700_000,
  );
});

describe("the heap bound", () => {
  it("is the one bin/airtally.js runs the command under", () => {
    expect(/const HEAP_MB = (\d+);/.exec(fs.readFileSync(path.join(ROOT, "bin/airtally.js"), "utf8"))?.[1]).toBe(String(HEAP_MB));
  });

  it(
    `refuses a workbook of more than ${MAX_CELLS} non-empty cells while reading it (exit 2)`,
    async () => {
      const file = path.join(dir, "too-many-cells.xlsx");
      await budgetBook(file, Math.ceil(MAX_CELLS / 6) + 10_000, true, undefined, 2); // six cells a row
      const r = airtally(["recalc", file, "--quiet"], 600_000);
      report("over the cell limit", r);
      expect([r.code, /more than 5000000 non-empty cells \(limit\)/.test(r.err), r.peakMB < MEMORY_BOUND_MB]).toEqual([2, true, true]);
    },
    700_000,
  );

  it("runs through bin/airtally.js with the same exit codes", () => {
    const r = spawnSync(process.execPath, [path.join(ROOT, "bin/airtally.js"), "recalc", path.join(dir, "absent.xlsx")], { encoding: "utf8" });
    expect(r.status).toBe(2);
  });
});

describe("--out", () => {
  let file: string;
  beforeAll(async () => {
    file = path.join(dir, "plan.xlsx");
    await writeXlsx(file, { sheets: [{ name: "S", cells: [{ ref: "A1", value: 2 }, { ref: "A2", formula: "A1*3", cached: 0 }] }] });
  });

  // An output that is the input (every spelling and link): test/cli/robustness.test.ts.
  it("leaves nothing behind when the output cannot be written (exit 2)", () => {
    const blocker = path.join(dir, "not-a-folder");
    fs.writeFileSync(blocker, "x");
    const before = fs.readdirSync(dir).sort();
    const r = airtally(["recalc", file, "--out", path.join(blocker, "out.xlsx")]);
    expect([r.code, /nothing written/.test(r.err), fs.readdirSync(dir).sort()]).toEqual([2, true, before]);
  });

  it("writes the copy through a temporary file renamed into place (no temporary file left)", () => {
    const out = path.join(dir, "plan-out.xlsx");
    const r = airtally(["recalc", file, "--out", out]);
    expect([r.code, fs.existsSync(out), fs.readdirSync(dir).filter((n) => n.endsWith(".tmp"))]).toEqual([0, true, []]);
  });
});
