/**
 * Issue 16, the command line: nothing lost, nothing faked, clean failures.
 * Every workbook is generated here (small on disk) and run through the real
 * command in a child process. What a part must keep comes from the package
 * format (ECMA-376 Part 2, Open Packaging Conventions: a part is a zip entry
 * named by its path); the text limit and the error codes from the host's
 * function reference (32 767 characters per cell, from memory of the
 * published specifications-and-limits page); the exit codes from README.md.
 */
import { spawn, spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { Readable } from "stream";
import yauzl from "yauzl";
import { EXCEL_ERRORS } from "../../src/cli/formula/functions";
import { rawZip } from "./support/bigBook";
import { airtally, report, ROOT, sha } from "./support/run";
import { workbookParts, writeXlsx, zipParts, type FixtureBook } from "./support/writeXlsx";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-robust-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
const BIN = path.join(ROOT, "bin/airtally.js");

/** Every part of a zip, inflated, by name. */
function partsOf(file: string): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.open(file, { lazyEntries: true }, (e, zip) => {
      if (e || !zip) return reject(e);
      const parts = new Map<string, Buffer>();
      zip.on("entry", (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e2, s) => {
          if (e2 || !s) return reject(e2);
          const chunks: Buffer[] = [];
          s.on("data", (c: Buffer) => chunks.push(c));
          s.on("end", () => {
            parts.set(entry.fileName, Buffer.concat(chunks));
            zip.readEntry();
          });
        });
      });
      zip.on("end", () => resolve(parts));
      zip.on("error", reject);
      zip.readEntry();
    });
  });
}

/** Temporary files the writer might leave in a folder. */
const leftovers = (folder: string) => fs.readdirSync(folder).filter((n) => n.endsWith(".tmp") || n.startsWith("."));

/** A one-sheet workbook whose sheet XML is generated row by row as it is zipped (`row(r)`: the <c> cells of row r). */
async function streamedBook(file: string, rows: number, row: (r: number) => string): Promise<void> {
  const parts = new Map<string, string | NodeJS.ReadableStream>(workbookParts({ sheets: [{ name: "S", cells: [] }] }));
  let r = 1;
  parts.set(
    "xl/worksheets/sheet1.xml",
    new Readable({
      read() {
        let chunk = r === 1 ? '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>' : "";
        for (let k = 0; k < 5000 && r <= rows; k++, r++) chunk += `<row r="${r}">${row(r)}</row>`;
        this.push(chunk);
        if (r > rows) {
          this.push("</sheetData></worksheet>");
          this.push(null);
        }
      },
    }),
  );
  await zipParts(file, parts);
}

/** `rows` rows of distinct numbers and a formula each: a copy of tens of kB, slow enough to interrupt when large. */
const numbersBook = (file: string, rows: number) => streamedBook(file, rows, (r) => `<c r="A${r}"><v>${(r * 7919) % 100003}.${r % 97}</v></c><c r="B${r}"><f>A${r}*3+${r}</f></c>`);

describe("--out keeps every part of the package", () => {
  const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
  const C = "http://schemas.openxmlformats.org/drawingml/2006/chart";
  const extra: Record<string, Buffer> = {
    "xl/drawings/drawing1.xml": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<xdr:wsDr xmlns:xdr="http://schemas.openxmlformats.org/drawingml/2006/spreadsheetDrawing" xmlns:a="http://schemas.openxmlformats.org/drawingml/2006/main"><xdr:twoCellAnchor><xdr:from><xdr:col>3</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>1</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:from><xdr:to><xdr:col>9</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>15</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:to><xdr:graphicFrame macro=""><xdr:nvGraphicFramePr><xdr:cNvPr id="2" name="Airtime"/><xdr:cNvGraphicFramePr/></xdr:nvGraphicFramePr><xdr:xfrm><a:off x="0" y="0"/><a:ext cx="0" cy="0"/></xdr:xfrm><a:graphic><a:graphicData uri="${C}"><c:chart xmlns:c="${C}" xmlns:r="${REL}" r:id="rId1"/></a:graphicData></a:graphic></xdr:graphicFrame><xdr:clientData/></xdr:twoCellAnchor></xdr:wsDr>`),
    "xl/drawings/_rels/drawing1.xml.rels": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/chart" Target="../charts/chart1.xml"/></Relationships>`),
    "xl/charts/chart1.xml": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<c:chartSpace xmlns:c="${C}" xmlns:a="http://schemas.openxmlformats.org/drawingml/2006/main"><c:chart><c:plotArea><c:layout/><c:barChart><c:barDir val="col"/><c:grouping val="clustered"/><c:ser><c:idx val="0"/><c:order val="0"/><c:val><c:numRef><c:f>Plan!$B$1:$B$3</c:f></c:numRef></c:val></c:ser><c:axId val="1"/><c:axId val="2"/></c:barChart><c:catAx><c:axId val="1"/><c:scaling><c:orientation val="minMax"/></c:scaling><c:axPos val="b"/><c:crossAx val="2"/></c:catAx><c:valAx><c:axId val="2"/><c:scaling><c:orientation val="minMax"/></c:scaling><c:axPos val="l"/><c:crossAx val="1"/></c:valAx></c:plotArea></c:chart></c:chartSpace>`),
    "customXml/item1.xml": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<survey xmlns="urn:example:brindlecombe-survey"><venue>Brindlecombe Conference Centre</venue><note>\u00e9t\u00e9 &amp; \u2264 5 GHz</note></survey>`),
    "customXml/itemProps1.xml": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="no"?>\n<ds:datastoreItem ds:itemID="{6A1F3C2E-0B7D-4E55-9C1A-2D4F8E6B7A90}" xmlns:ds="http://schemas.openxmlformats.org/officeDocument/2006/customXml"><ds:schemaRefs/></ds:datastoreItem>`),
    "customXml/_rels/item1.xml.rels": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/customXmlProps" Target="itemProps1.xml"/></Relationships>`),
    "xl/worksheets/_rels/sheet1.xml.rels": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rIdD1" Type="${REL}/drawing" Target="../drawings/drawing1.xml"/></Relationships>`),
    "xl/calcChain.xml": Buffer.from(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<calcChain xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><c r="B1" i="1"/><c r="B2"/><c r="B3"/></calcChain>`),
    // Binary bytes that are not text in any encoding (an embedded picture's place).
    "xl/media/image1.png": Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 151 + 7) & 0xff)),
  };
  let file: string;
  let out: string;
  let before: Map<string, Buffer>;
  let after: Map<string, Buffer>;
  let code: number | null;

  beforeAll(async () => {
    file = path.join(dir, "chart.xlsx");
    out = path.join(dir, "chart-out.xlsx");
    const parts = workbookParts({ sheets: [{ name: "Plan", cells: [1, 2, 3].flatMap((r) => [{ ref: `A${r}`, value: r * 10 }, { ref: `B${r}`, formula: `A${r}*2`, cached: -1 }]) }] });
    parts.set("xl/worksheets/sheet1.xml", parts.get("xl/worksheets/sheet1.xml")!.replace("</sheetData>", '</sheetData><drawing r:id="rIdD1"/>'));
    const types = [
      ["/xl/drawings/drawing1.xml", "application/vnd.openxmlformats-officedocument.drawing+xml"],
      ["/xl/charts/chart1.xml", "application/vnd.openxmlformats-officedocument.drawingml.chart+xml"],
      ["/customXml/itemProps1.xml", "application/vnd.openxmlformats-officedocument.customXmlProperties+xml"],
      ["/xl/calcChain.xml", "application/vnd.openxmlformats-officedocument.spreadsheetml.calcChain+xml"],
    ];
    parts.set("[Content_Types].xml", parts.get("[Content_Types].xml")!.replace("</Types>", `<Default Extension="png" ContentType="image/png"/>${types.map(([p, t]) => `<Override PartName="${p}" ContentType="${t}"/>`).join("")}</Types>`));
    parts.set("xl/_rels/workbook.xml.rels", parts.get("xl/_rels/workbook.xml.rels")!.replace("</Relationships>", `<Relationship Id="rIdC" Type="${REL}/calcChain" Target="calcChain.xml"/></Relationships>`));
    parts.set("_rels/.rels", parts.get("_rels/.rels")!.replace("</Relationships>", `<Relationship Id="rIdX" Type="${REL}/customXml" Target="customXml/item1.xml"/></Relationships>`));
    rawZip(file, [...[...parts].map(([name, text]) => ({ name, data: Buffer.from(text) })), ...Object.entries(extra).map(([name, data]) => ({ name, data }))]);
    const r = airtally(["recalc", file, "--out", out, "--quiet"]);
    code = r.code;
    before = await partsOf(file);
    after = await partsOf(out);
  });

  it("writes the copy (exit 0) with the same part listing", () => {
    expect([code, [...after.keys()].sort()]).toEqual([0, [...before.keys()].sort()]);
  });

  it("keeps the chart, drawing, customXml, relationship, picture and calc chain parts byte for byte", () => {
    const kept = [...before.keys()].filter((n) => !/^xl\/worksheets\/sheet\d+\.xml$/.test(n) && n !== "xl/workbook.xml");
    expect(kept.filter((n) => !after.get(n)!.equals(before.get(n)!))).toEqual([]);
    expect(kept).toEqual(expect.arrayContaining(Object.keys(extra)));
  });

  it("changes only cached values in the sheet and only calcPr in workbook.xml", () => {
    const values = (xml: string) => xml.replace(/<v>[^<]*<\/v>/g, "<v/>").replace(/\st="[^"]*"/g, "");
    const sheet = (m: Map<string, Buffer>) => m.get("xl/worksheets/sheet1.xml")!.toString("utf8");
    expect(values(sheet(after))).toBe(values(sheet(before)));
    expect(sheet(after)).toContain("<v>60</v>"); // B3 = A3*2 = 60, the cached -1 replaced
    const calc = (m: Map<string, Buffer>) => m.get("xl/workbook.xml")!.toString("utf8").replace(/<calcPr\b[^>]*>/, "");
    expect(calc(after)).toBe(calc(before));
  });
});

describe("--out never destroys the input or leaves a partial file", () => {
  let file: string;
  let sub: string;
  beforeAll(async () => {
    sub = fs.mkdtempSync(path.join(dir, "same-"));
    file = path.join(sub, "plan.xlsx");
    await writeXlsx(file, { sheets: [{ name: "S", cells: [{ ref: "A1", value: 2 }, { ref: "A2", formula: "A1*3", cached: 0 }] }] });
  });

  it("refuses an output that is the input: same path, another spelling, a symbolic link, a hard link (exit 2, input unchanged)", () => {
    const before = sha(file);
    const sym = path.join(sub, "sym.xlsx");
    const hard = path.join(sub, "hard.xlsx");
    fs.symlinkSync(file, sym);
    fs.linkSync(file, hard);
    const spellings = [file, path.relative(ROOT, file), path.join(sub, ".", "..", path.basename(sub), "plan.xlsx"), sym, hard];
    const runs = spellings.map((o) => airtally(["recalc", file, "--out", o]));
    expect([runs.map((r) => r.code), runs.every((r) => /is the input workbook/.test(r.err)), sha(file), leftovers(sub)]).toEqual([[2, 2, 2, 2, 2], true, before, []]);
  });

  it("leaves no output and no temporary file when a file-size limit stops the write (ulimit -f; exit 2)", async () => {
    const big = path.join(dir, "big.xlsx");
    await numbersBook(big, 4000);
    const folder = fs.mkdtempSync(path.join(dir, "fsize-"));
    const before = sha(big);
    // 16 blocks of 1024 bytes (bash's ulimit -f unit): the copy, about 40 kB, cannot fit.
    const r = spawnSync("bash", ["-c", `ulimit -f 16; exec node ${JSON.stringify(BIN)} recalc ${JSON.stringify(big)} --out ${JSON.stringify(path.join(folder, "out.xlsx"))} --quiet`], { cwd: ROOT, encoding: "utf8", timeout: 120_000 });
    expect([r.status, r.signal, /cannot write .*nothing written/.test(r.stderr), fs.readdirSync(folder), sha(big)]).toEqual([2, null, true, [], before]);
  });

  it("leaves no output and no temporary file when the output folder is read-only (exit 2)", () => {
    const folder = fs.mkdtempSync(path.join(dir, "ro-"));
    fs.chmodSync(folder, 0o555);
    const before = sha(file);
    // A superuser may write into a read-only folder: run the command as an unprivileged user then.
    const asUser = process.getuid?.() === 0 ? { uid: 65534, gid: 65534 } : {};
    for (const p of [dir, path.dirname(file)]) fs.chmodSync(p, 0o755);
    fs.chmodSync(file, 0o644);
    const probe = spawnSync(process.execPath, ["-e", `require("fs").accessSync(${JSON.stringify(BIN)}); require("fs").accessSync(${JSON.stringify(file)})`], asUser);
    if (probe.status !== 0) {
      console.log(`SKIPPED: the unprivileged user cannot read the checkout (${ROOT}), so a read-only folder cannot be tried as root`);
      return;
    }
    const r = spawnSync(process.execPath, [BIN, "recalc", file, "--out", path.join(folder, "out.xlsx"), "--quiet"], { cwd: ROOT, encoding: "utf8", timeout: 120_000, env: { ...process.env, HOME: os.tmpdir() }, ...asUser });
    expect([r.status, /cannot write .*nothing written/.test(r.stderr), fs.readdirSync(folder), sha(file)]).toEqual([2, true, [], before]);
  });

  const interruptions = [
    ["SIGINT", false],
    ["SIGTERM", false],
    ["SIGINT", true], // as a terminal's Ctrl-C sends it: to the whole process group
  ] as const;
  for (const [signal, group] of interruptions) {
    it(`leaves no output and no temporary file when ${signal} arrives during a long --out${group ? " (to the process group)" : ""}`, async () => {
      const big = path.join(dir, "long.xlsx");
      if (!fs.existsSync(big)) await numbersBook(big, 400_000);
      const folder = fs.mkdtempSync(path.join(dir, `sig-${signal}-${group ? "group-" : ""}`));
      const before = sha(big);
      const child = spawn(process.execPath, [BIN, "recalc", big, "--out", path.join(folder, "out.xlsx"), "--quiet"], { cwd: ROOT, stdio: ["ignore", "ignore", "pipe"], detached: group });
      let stderr = "";
      child.stderr.on("data", (c: Buffer) => (stderr += c.toString()));
      const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.on("exit", (code, sig) => resolve({ code, signal: sig })));
      // Interrupt once the temporary file exists (the write has started).
      const t0 = Date.now();
      while (fs.readdirSync(folder).length === 0 && Date.now() - t0 < 100_000 && child.exitCode === null) await new Promise((r) => setTimeout(r, 20));
      const writing = fs.readdirSync(folder).length > 0;
      if (group) process.kill(-child.pid!, signal);
      else child.kill(signal);
      const end = await exited;
      // The process must really stop (not finish the file in an orphaned child): wait past the write's own length.
      await new Promise((r) => setTimeout(r, 1500));
      console.log(`${signal} during --out: exit ${end.code} ${end.signal ?? ""}; ${stderr.trim().split("\n")[0] ?? ""}`);
      expect([writing, end.code, fs.readdirSync(folder), sha(big)]).toEqual([true, 128 + os.constants.signals[signal], [], before]);
    }, 200_000);
  }
});

describe("no raw control characters reach the terminal", () => {
  const RAW = /[\u0000-\u0008\u000B-\u001F\u007F-\u009F\u061C\u200E\u200F\u202A-\u202E\u2066-\u2069]/;

  it("eval of CHAR(27)&\"[2J\" prints the escape as \\x1b (CHAR as in the host: code 27 is ESC)", () => {
    const r = airtally(["eval", '=CHAR(27)&"[2J"']);
    expect([r.code, RAW.test(r.out + r.err), r.out.trim()]).toEqual([0, false, "\\x1b[2J"]);
  });

  it("a workbook cell holding ESC, CR, LF, BEL, C1 controls and U+202E is printed escaped, in the table and in messages", async () => {
    const file = path.join(dir, "controls.xlsx");
    const out = path.join(dir, "controls-out.xlsx");
    // As a package stores them (ECMA-376 Part 1 §22.9.2.19): controls XML cannot hold as _xHHHH_; C1 and U+202E raw.
    const stored = "ok_x001B_[2J_x000D_fake | 1\n9 | row_x0007_\u009b31m\u0085\u202eevil\u2066";
    const decoded = "ok\u001b[2J\rfake | 1\n9 | row\u0007\u009b31m\u0085\u202eevil\u2066";
    await writeXlsx(file, {
      sheets: [
        {
          name: "S",
          cells: [
            { ref: "A1", value: stored },
            { ref: "B1", value: "\u202eevil\u2066" },
            { ref: "A2", formula: 'A1&"!"' },
            { ref: "A3", formula: `AIRTALLY.RATE(A1)` },
            { ref: "A4", formula: "LEN(A1)" },
          ],
        },
      ],
    });
    const r = airtally(["recalc", file, "--out", out]);
    expect([RAW.test(r.out + r.err), r.out.includes("ok\\x1b[2J\\x0dfake"), r.out.includes("\\u202eevil\\u2066"), new RegExp(`^4\\s+\\|\\s+${decoded.length}\\b`, "m").test(r.out)]).toEqual([false, true, true, true]);
    // One line per table row: the LF inside the cell did not start a fake row.
    const tableRows = r.out.split("\n").filter((l) => /^\d+\s+\|/.test(l));
    expect(tableRows.map((l) => l.split(" ")[0])).toEqual(["1", "2", "3", "4"]);
    // The copy stores the controls as the package's escapes again (nothing dropped).
    const sheet = (await partsOf(out)).get("xl/worksheets/sheet1.xml")!.toString("utf8");
    expect(/<c r="A2"[^>]*><f>[^<]*<\/f><v>([^<]*)<\/v>/.exec(sheet)?.[1]).toBe(stored + "!");
  });

  it("escapes what the user typed when it is quoted back (an unknown command, option or file name)", () => {
    const runs = [["\u001b[2Jx"], ["recalc", "\u001b[2J.xlsx"], ["recalc", "a.xlsx", "--\u009b2J"]].map((args) => airtally(args));
    expect(runs.map((r) => [r.code, RAW.test(r.out + r.err), r.err.includes("\\x1b[2J") || r.err.includes("\\x9b2J")])).toEqual([[2, false, true], [2, false, true], [2, false, true]]);
  });

  it("caps a message at a stated length with … (a 1 000 000-character link text)", async () => {
    const file = path.join(dir, "long-link.xlsx");
    await writeXlsx(file, { sheets: [{ name: "S", cells: [{ ref: "A1", value: "HE " + "x".repeat(1_000_000) }, { ref: "B1", formula: "AIRTALLY.RATE(A1)" }] }] });
    const r = airtally(["recalc", file, "--quiet"]);
    const line = r.out.split("\n").find((l) => l.startsWith("S!B1:"))!;
    // 300 characters: the cap in src/cli/table.ts (MAX_MESSAGE), stated in README.
    expect([r.code, line.length <= 300 + "S!B1: #VALUE! ".length, line.endsWith("…")]).toEqual([1, true, true]);
    const e = airtally(["eval", `=AIRTALLY.RATE(REPT("x",30000))`]);
    expect([e.code, e.out.split("\n")[0].length <= 300 + "#VALUE! ".length]).toEqual([1, true]);
  });
});

describe("odd inputs fail cleanly with the documented exit codes", () => {
  it("eval '=' is a usage error (exit 2) with a message, not a crash", () => {
    const r = airtally(["eval", "="]);
    expect([r.code, /eval needs a formula after =/.test(r.err), /unexpected failure|TypeError/.test(r.err)]).toEqual([2, true, false]);
  });

  it("LEN(REPT(\"a\",1E9)) is #VALUE! (text past 32 767 characters) within bounded memory; so are TEXTJOIN and SUBSTITUTE past the cap", () => {
    const r = airtally(["eval", '=LEN(REPT("a",1E9))']);
    report("REPT 1E9", r);
    const ok = airtally(["eval", '=LEN(REPT("ab",16383))&"/"&ISERROR(REPT("ab",16384))']);
    // 100 000 texts of 32 761 characters joined: refused when the running length passes the cap, not after a 3 GB join.
    const joined = airtally(["eval", '=_xlfn.TEXTJOIN(",",TRUE,REPT("a",32760)&_xlfn.SEQUENCE(100000))']);
    const grown = airtally(["eval", '=LEN(SUBSTITUTE(REPT("a",32767),"a","aaaa"))']);
    expect([r.code, r.out.startsWith("#VALUE!"), r.peakMB < 300, ok.out.trim()]).toEqual([1, true, true, "32766/TRUE"]);
    expect([joined.out.startsWith("#VALUE!"), joined.peakMB < 400, grown.out.startsWith("#VALUE!"), grown.peakMB < 300]).toEqual([true, true, true, true]);
  });

  it("MAX, MIN, SUM and COUNTA over 200 000 cells are correct, no stack overflow", async () => {
    const n = 200_000;
    const file = path.join(dir, "aggregates.xlsx");
    let max = -Infinity;
    let min = Infinity;
    let sum = 0;
    const value = (i: number) => ((i * 7919) % 200_003) - 100_000;
    for (let i = 1; i <= n; i++) {
      const v = value(i);
      max = Math.max(max, v);
      min = Math.min(min, v);
      sum += v;
    }
    const aggregates = `<c r="B1"><f>MAX(A1:A${n})</f></c><c r="C1"><f>MIN(A1:A${n})</f></c><c r="D1"><f>SUM(A1:A${n})</f></c><c r="E1"><f>COUNTA(A1:A${n})</f></c>`;
    await streamedBook(file, n, (r) => `<c r="A${r}"><v>${value(r)}</v></c>${r === 1 ? aggregates : ""}`);
    const out = path.join(dir, "aggregates-out.xlsx");
    const res = airtally(["recalc", file, "--quiet", "--out", out]);
    const sheet = (await partsOf(out)).get("xl/worksheets/sheet1.xml")!.toString("utf8");
    const cached = ["B1", "C1", "D1", "E1"].map((a) => Number(new RegExp(`<c r="${a}"[^>]*><f>[^<]*</f><v>([^<]*)</v>`).exec(sheet)?.[1]));
    expect([res.code, /stack/i.test(res.out + res.err), cached]).toEqual([0, false, [max, min, sum, n]]);
  }, 120_000);

  it("prints a 1 000 000-constant sheet without a stack overflow (exit 0)", async () => {
    const n = 1_000_000;
    const file = path.join(dir, "million-constants.xlsx");
    await streamedBook(file, n / 2, (r) => `<c r="A${r}"><v>${r}</v></c><c r="B${r}"><v>${r % 7}</v></c>`);
    const res = airtally(["recalc", file], 300_000);
    report("1 000 000 constants printed", res);
    const lines = res.out.split("\n");
    expect([res.code, /stack/i.test(res.err), lines.filter((l) => /^\d+\s+\|/.test(l)).length, lines.includes(`${n / 2} | ${n / 2} | ${n / 2 % 7}`)]).toEqual([0, false, n / 2, true]);
  }, 300_000);

  it("a cycle through a spill is #CYCLE!, counted, and exits 3", async () => {
    const file = path.join(dir, "spill-cycle.xlsx");
    // A1 spills A1:A3; B1 reads A3, a cell of that spill; A1 reads B1.
    await writeXlsx(file, { sheets: [{ name: "S", cells: [{ ref: "A1", formula: "_xlfn.SEQUENCE(3)*B1" }, { ref: "B1", formula: "A3+1" }] }] });
    const r = airtally(["recalc", file]);
    const summary = /(\d+) circular references/.exec(r.out);
    // One circular reference (A1 → B1 → A3, a cell of A1's spill), counted once.
    expect([r.code, /#CYCLE!/.test(r.out), Number(summary?.[1])]).toEqual([3, true, 1]);
  });

  it("a zip with no workbook part is refused (exit 2)", () => {
    const file = path.join(dir, "no-workbook.xlsx");
    rawZip(file, [{ name: "readme.txt", data: Buffer.from("not a workbook") }]);
    const r = airtally(["recalc", file]);
    expect(r.code).toBe(2);
  });

  it("writes only the host's error codes into --out (unsupported functions are #NAME?, a cycle has no cached value)", async () => {
    const file = path.join(dir, "errors.xlsx");
    const out = path.join(dir, "errors-out.xlsx");
    await writeXlsx(file, {
      sheets: [
        {
          name: "S",
          cells: [
            { ref: "A1", formula: "OFFSET(B1,1,1)", cached: 5 },
            { ref: "A2", formula: "_xlfn.NOSUCHFUNCTION(1)", cached: 5 },
            { ref: "A3", formula: "1/0" },
            { ref: "A4", formula: "A5", cached: 5 },
            { ref: "A5", formula: "A4", cached: 5 },
            { ref: "A6", formula: "AIRTALLY.RATE(\"nonsense\")" },
          ],
        },
      ],
    });
    const r = airtally(["recalc", file, "--out", out]);
    const sheet = (await partsOf(out)).get("xl/worksheets/sheet1.xml")!.toString("utf8");
    const cell = (ref: string) => new RegExp(`<c r="${ref}"[^>]*>.*?</c>`).exec(sheet)?.[0] ?? "";
    const written = [...sheet.matchAll(/<c\b[^>]*\bt="e"[^>]*>(?:<f[^>]*>[^<]*<\/f>|<f[^>]*\/>)?<v>([^<]*)<\/v>/g)].map((m) => m[1]);
    expect([r.code, written.filter((e) => !EXCEL_ERRORS.has(e)), cell("A1").includes("<v>#NAME?</v>"), cell("A2").includes("<v>#NAME?</v>"), cell("A3").includes("<v>#DIV/0!</v>"), /<v>/.test(cell("A4"))]).toEqual([3, [], true, true, true, false]);
  });

  it("exit codes are README's: 0 all values, 1 error cells, 2 usage, 3 a circular reference", async () => {
    const book = (cells: FixtureBook["sheets"][0]["cells"]) => ({ sheets: [{ name: "S", cells }] });
    const files = ["ok", "err", "cyc"].map((n) => path.join(dir, `exit-${n}.xlsx`));
    await writeXlsx(files[0], book([{ ref: "A1", value: 1 }, { ref: "A2", formula: "A1+1" }]));
    await writeXlsx(files[1], book([{ ref: "A1", formula: "1/0" }]));
    await writeXlsx(files[2], book([{ ref: "A1", formula: "A2" }, { ref: "A2", formula: "A1" }, { ref: "A3", formula: "1/0" }]));
    const codes = [...files.map((f) => airtally(["recalc", f]).code), airtally(["recalc"]).code, airtally(["frobnicate"]).code, airtally(["eval", "=1+1"]).code, airtally(["eval", "=1/0"]).code];
    expect(codes).toEqual([0, 1, 3, 2, 2, 0, 1]);
  });
});
