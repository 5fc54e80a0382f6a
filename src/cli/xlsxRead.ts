/**
 * A streaming reader of .xlsx packages into the engine's workbook model.
 * Parts come from zip.ts (bounded inflation); sheet XML is parsed by saxes
 * (ISC, a streaming XML parser) as it inflates, so a sheet of a million rows
 * never sits in memory as text or as a DOM, and a far-corner cell is one
 * entry. DOCTYPE (and with it entity declarations) is refused; formulas that
 * reference another workbook become #REF! cells (external links are never
 * opened).
 */
import * as path from "path";
import { SaxesParser, type SaxesTagPlain } from "saxes";
import { parseAddress, parseArea, type Area } from "./address";
import { cellFormatCodes, STYLE_LIMITS } from "./cellFormats";
import type { InputBook, InputCell, InputName, InputTable, Value } from "./engine";
import { decodeXstring } from "./xstring";
import { openPackage, RefusedInput, type ZipPackage } from "./zip";

export interface SheetPart {
  name: string;
  part: string;
}

export interface LoadedBook {
  book: InputBook;
  /** Where each sheet lives in the package (for --out). */
  parts: SheetPart[];
  workbookPart: string;
  pkg: ZipPackage;
}

function parser(part: string): SaxesParser {
  const p = new SaxesParser({ position: false });
  p.on("doctype", () => {
    throw new RefusedInput(`refused: part ${part} has a DOCTYPE (entity declarations are not read)`);
  });
  return p;
}

/** Run a SAX pass over one part. */
async function sax(pkg: ZipPackage, part: string, on: (p: SaxesParser) => void): Promise<void> {
  const p = parser(part);
  let failure: unknown;
  p.on("error", (e) => {
    failure ??= e;
  });
  on(p);
  await pkg.stream(part, (text) => {
    if (failure) throw failure;
    p.write(text);
  });
  p.close();
  if (failure) throw failure instanceof RefusedInput ? failure : new Error(`part ${part} is not well-formed XML: ${(failure as Error).message}`);
}

const local = (name: string) => name.slice(name.indexOf(":") + 1);

/** Relationship targets of a part, by id, as package paths. */
async function relationships(pkg: ZipPackage, part: string): Promise<Map<string, { target: string; type: string }>> {
  const dir = path.posix.dirname(part);
  const relsPart = path.posix.join(dir, "_rels", `${path.posix.basename(part)}.rels`);
  const out = new Map<string, { target: string; type: string }>();
  if (!pkg.has(relsPart)) return out;
  await sax(pkg, relsPart, (p) =>
    p.on("opentag", (t) => {
      if (local(t.name) !== "Relationship") return;
      const a = t.attributes as Record<string, string>;
      if (a.TargetMode === "External") return;
      const target = a.Target.startsWith("/") ? a.Target.slice(1) : path.posix.normalize(path.posix.join(dir, a.Target));
      out.set(a.Id, { target, type: a.Type ?? "" });
    }),
  );
  return out;
}

/** Excel's serial date (1900 system) of an ISO date text (t="d" cells). */
function serialOfIso(text: string): number {
  const ms = Date.parse(/Z|[+-]\d\d:?\d\d$/.test(text) ? text : `${text}Z`);
  return ms / 86400000 + 25569;
}

async function sharedStrings(pkg: ZipPackage, part: string | undefined): Promise<string[]> {
  const out: string[] = [];
  if (!part || !pkg.has(part)) return out;
  let current = "";
  let inT = false;
  let phonetic = 0;
  await sax(pkg, part, (p) => {
    p.on("opentag", (t) => {
      const n = local(t.name);
      if (n === "si") current = "";
      else if (n === "t") inT = true;
      else if (n === "rPh") phonetic++;
    });
    p.on("text", (text) => {
      if (inT && !phonetic) current += text;
    });
    p.on("closetag", (t) => {
      const n = local(t.name);
      if (n === "t") inT = false;
      else if (n === "rPh") phonetic--;
      else if (n === "si") out.push(decodeXstring(current));
    });
  });
  return out;
}

/**
 * The number format code of each cell-format index (the s= of a cell), from
 * the styles part: numFmts (custom codes by id) and cellXfs (each entry's
 * numFmtId). Entries past STYLE_LIMITS are not kept (their cells print as General).
 */
async function cellFormatsOf(pkg: ZipPackage, part: string | undefined): Promise<(string | undefined)[]> {
  if (!part || !pkg.has(part)) return [];
  const custom = new Map<number, string>();
  const xfIds: number[] = [];
  let inCellXfs = false;
  await sax(pkg, part, (p) => {
    p.on("opentag", (t) => {
      const a = t.attributes as Record<string, string>;
      const n = local(t.name);
      if (n === "cellXfs") inCellXfs = true;
      else if (n === "numFmt" && custom.size < STYLE_LIMITS.maxCellFormats && (a.formatCode ?? "").length <= STYLE_LIMITS.maxCodeLength) {
        const id = Number(a.numFmtId);
        if (Number.isInteger(id) && a.formatCode !== undefined) custom.set(id, a.formatCode);
      } else if (n === "xf" && inCellXfs && xfIds.length < STYLE_LIMITS.maxCellFormats) xfIds.push(Number(a.numFmtId ?? 0));
    });
    p.on("closetag", (t) => {
      if (local(t.name) === "cellXfs") inCellXfs = false;
    });
  });
  return cellFormatCodes(xfIds, custom);
}

async function readTable(pkg: ZipPackage, part: string, sheet: string): Promise<InputTable | undefined> {
  let table: InputTable | undefined;
  await sax(pkg, part, (p) =>
    p.on("opentag", (t) => {
      const a = t.attributes as Record<string, string>;
      const n = local(t.name);
      if (n === "table") {
        table = {
          name: a.displayName ?? a.name,
          sheet,
          area: parseArea(a.ref),
          headerRows: a.headerRowCount === undefined ? 1 : Number(a.headerRowCount),
          totalsRows: a.totalsRowCount === undefined ? (a.totalsRowShown === "1" && false ? 1 : 0) : Number(a.totalsRowCount),
          columns: [],
        };
      } else if (n === "tableColumn" && table) table.columns.push(a.name);
    }),
  );
  return table;
}

/** A cell's stored value by its type attribute. */
function cellValue(type: string | undefined, text: string, strings: string[]): Value | undefined {
  switch (type) {
    case "s": {
      const s = strings[Number(text)];
      return s === undefined ? { error: "#REF!", message: `shared string ${text} is missing` } : s;
    }
    case "str":
    case "inlineStr":
      return decodeXstring(text);
    case "b":
      return text === "1" || text.toLowerCase() === "true";
    case "e":
      return { error: text };
    case "d":
      return serialOfIso(text);
    default: {
      if (text === "") return undefined;
      const n = Number(text);
      return Number.isFinite(n) ? n : { error: "#VALUE!", message: `stored number ${text.slice(0, 20)} is not a number` };
    }
  }
}

/** One sheet part, streamed: constants, formulas (shared ones point at their first cell), array ranges. */
async function readSheet(
  pkg: ZipPackage,
  part: string,
  strings: string[],
  emit: (c: InputCell) => void,
  formats?: { codes: (string | undefined)[]; at: (row: number, col: number, code: string) => void },
): Promise<{ tableParts: string[] }> {
  const tableParts: string[] = [];
  const shared = new Map<string, { formula: string; host: { row: number; col: number } }>();
  let row = 0;
  let col = 0;
  let inCell = false;
  let type: string | undefined;
  let style: string | undefined;
  let text = "";
  let formula: string | undefined;
  let fAttrs: Record<string, string> | undefined;
  let capture: "v" | "f" | "t" | undefined;
  let valueText = "";
  let formulaText = "";
  await sax(pkg, part, (p) => {
    p.on("opentag", (t: SaxesTagPlain) => {
      const n = local(t.name);
      const a = t.attributes as Record<string, string>;
      switch (n) {
        case "row":
          row = a.r ? Number(a.r) : row + 1;
          col = 0;
          break;
        case "c":
          if (a.r) {
            const at = parseAddress(a.r);
            row = at.row;
            col = at.col;
          } else col++;
          if (row > 1048576 || col > 16384 || row < 1) throw new RefusedInput(`refused: part ${part} has a cell at row ${row}, column ${col}, outside the sheet's 1048576 × 16384 grid`);
          inCell = true;
          type = a.t;
          style = a.s;
          valueText = "";
          formulaText = "";
          formula = undefined;
          fAttrs = undefined;
          break;
        case "v":
          capture = "v";
          break;
        case "f":
          capture = "f";
          fAttrs = a;
          formula = "";
          break;
        case "t":
          if (inCell) capture = "t";
          break;
        case "tablePart":
          tableParts.push(a["r:id"] ?? Object.entries(a).find(([k]) => local(k) === "id")?.[1] ?? "");
          break;
      }
    });
    p.on("text", (t) => {
      if (capture === "v" || capture === "t") valueText += t;
      else if (capture === "f") formulaText += t;
    });
    p.on("closetag", (t) => {
      const n = local(t.name);
      if (n === "v" || n === "f" || n === "t") {
        capture = undefined;
        return;
      }
      if (n !== "c") return;
      inCell = false;
      if (formats && style !== undefined) {
        const code = formats.codes[Number(style)];
        if (code !== undefined) formats.at(row, col, code); // also for an empty styled cell: a spill may fill it
      }
      const cell: InputCell = { row, col };
      if (formula !== undefined) {
        const f = fAttrs ?? {};
        if (f.t === "shared" && f.si !== undefined) {
          if (formulaText.trim() !== "") shared.set(f.si, { formula: formulaText, host: { row, col } });
          const master = shared.get(f.si);
          if (master) {
            cell.formula = master.formula;
            if (master.host.row !== row || master.host.col !== col) cell.formulaHost = master.host;
          } else cell.formula = "#REF!";
        } else cell.formula = formulaText;
        if (f.t === "array" && f.ref) cell.arrayRange = parseArea(f.ref);
        if (/\[\d+\]/.test(cell.formula.replace(/"(?:[^"]|"")*"/g, ""))) cell.refused = "the formula reads another workbook; external links are not followed";
      }
      const v = cellValue(type, valueText, strings);
      if (v !== undefined) cell.value = v;
      if (cell.formula !== undefined || cell.value !== undefined) emit(cell);
      text = "";
    });
  });
  void text;
  return { tableParts };
}

/** Read an .xlsx package: sheets, defined names (workbook and sheet scope), tables. Throws RefusedInput for what the limits refuse. */
/** Where a streaming caller takes cells as they are read (the book's sheets then hold no cells). */
export interface CellSink {
  sheets(names: string[]): void;
  cell(sheetIndex: number, cell: InputCell): void;
  /** When given, the styles part is read and each cell with a number format other than General is reported. */
  numberFormat?(sheetIndex: number, row: number, col: number, code: string): void;
}

export async function loadPackage(file: string, sink?: CellSink): Promise<LoadedBook> {
  const pkg = await openPackage(file);
  try {
    const root = await relationships(pkg, "");
    const officeDoc = [...root.values()].find((r) => /officeDocument$/.test(r.type))?.target ?? "xl/workbook.xml";
    if (!pkg.has(officeDoc)) throw new RefusedInput(`the package has no workbook part (${officeDoc}); it is not an .xlsx workbook`);
    const rels = await relationships(pkg, officeDoc);
    const sheetList: { name: string; rid: string }[] = [];
    const names: InputName[] = [];
    let nameAttrs: Record<string, string> | undefined;
    let nameText = "";
    await sax(pkg, officeDoc, (p) => {
      p.on("opentag", (t) => {
        const a = t.attributes as Record<string, string>;
        const n = local(t.name);
        if (n === "sheet") sheetList.push({ name: a.name, rid: a["r:id"] ?? Object.entries(a).find(([k]) => local(k) === "id")?.[1] ?? "" });
        else if (n === "definedName") {
          nameAttrs = a;
          nameText = "";
        }
      });
      p.on("text", (t) => {
        if (nameAttrs) nameText += t;
      });
      p.on("closetag", (t) => {
        if (local(t.name) !== "definedName" || !nameAttrs) return;
        const scope = nameAttrs.localSheetId !== undefined ? sheetList[Number(nameAttrs.localSheetId)]?.name : undefined;
        if (!/^_xlnm\./i.test(nameAttrs.name)) names.push({ name: nameAttrs.name, formula: /\[\d+\]/.test(nameText) ? "#REF!" : nameText, scope });
        nameAttrs = undefined;
      });
    });
    const sstPart = [...rels.values()].find((r) => /sharedStrings$/.test(r.type))?.target;
    const strings = await sharedStrings(pkg, sstPart);
    const onFormat = sink?.numberFormat?.bind(sink);
    const formatCodes = onFormat ? await cellFormatsOf(pkg, [...rels.values()].find((r) => /\/styles$/.test(r.type))?.target) : [];
    const book: InputBook = { sheets: [], names, tables: [] };
    const parts: SheetPart[] = [];
    const worksheets = sheetList.filter((s) => {
      const rel = rels.get(s.rid);
      return rel && /worksheet$/.test(rel.type) && pkg.has(rel.target); // not chart or dialog sheets
    });
    sink?.sheets(worksheets.map((s) => s.name));
    for (const [index, s] of worksheets.entries()) {
      const rel = rels.get(s.rid)!;
      const cells: InputCell[] = [];
      const formats = onFormat && formatCodes.length ? { codes: formatCodes, at: (row: number, col: number, code: string) => onFormat(index, row, col, code) } : undefined;
      const { tableParts } = await readSheet(pkg, rel.target, strings, sink ? (c) => sink.cell(index, c) : (c) => cells.push(c), formats);
      book.sheets.push({ name: s.name, cells });
      parts.push({ name: s.name, part: rel.target });
      if (tableParts.length) {
        const sheetRels = await relationships(pkg, rel.target);
        for (const id of tableParts) {
          const tp = sheetRels.get(id);
          if (tp && pkg.has(tp.target)) {
            const t = await readTable(pkg, tp.target, s.name);
            if (t) book.tables!.push(t);
          }
        }
      }
    }
    if (!book.sheets.length) throw new RefusedInput("the workbook has no worksheet");
    return { book, parts, workbookPart: officeDoc, pkg };
  } catch (e) {
    pkg.close();
    throw e;
  }
}
