/**
 * A minimal .xlsx package writer for tests (ECMA-376 Part 1 SpreadsheetML
 * parts, zipped with yazl): sheets with numbers, inline text, logical values,
 * errors and formulas (optionally array formulas over a range and a wrong
 * cached value, to prove a reader recomputes), defined names with workbook or
 * sheet scope, and tables. Written by hand so a test controls exactly what
 * the file stores (`_xlfn.` prefixes, `[#This Row]`, localSheetId).
 */
import * as fs from "fs";
import yazl from "yazl";
import { parseAddress } from "../../../src/cli/address";

export interface FixtureCell {
  ref: string;
  value?: number | string | boolean;
  error?: string;
  /** Formula text without "=", in the stored form. */
  formula?: string;
  /** Store the formula as an array formula over this range. */
  array?: string;
  /** A cached value written with the formula (a deliberately wrong one proves recalculation). */
  cached?: number;
}

export interface FixtureTable {
  name: string;
  ref: string;
  columns: string[];
}

export interface FixtureSheet {
  name: string;
  cells: FixtureCell[];
  tables?: FixtureTable[];
}

export interface FixtureBook {
  sheets: FixtureSheet[];
  names?: { name: string; text: string; scope?: number }[];
}

export const xml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"';
const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";

function cellXml(c: FixtureCell): string {
  const r = `r="${c.ref}"`;
  if (c.formula !== undefined) {
    const f = c.array ? `<f t="array" ref="${c.array}">${xml(c.formula)}</f>` : `<f>${xml(c.formula)}</f>`;
    return `<c ${r}>${f}${c.cached !== undefined ? `<v>${c.cached}</v>` : ""}</c>`;
  }
  if (c.error !== undefined) return `<c ${r} t="e"><v>${xml(c.error)}</v></c>`;
  if (typeof c.value === "number") return `<c ${r}><v>${c.value}</v></c>`;
  if (typeof c.value === "boolean") return `<c ${r} t="b"><v>${c.value ? 1 : 0}</v></c>`;
  return `<c ${r} t="inlineStr"><is><t xml:space="preserve">${xml(String(c.value ?? ""))}</t></is></c>`;
}

export function sheetXml(cells: FixtureCell[], tableCount = 0, firstTable = 1): string {
  const rows = new Map<number, FixtureCell[]>();
  for (const c of cells) {
    const { row } = parseAddress(c.ref);
    if (!rows.has(row)) rows.set(row, []);
    rows.get(row)!.push(c);
  }
  const body = [...rows.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([r, cs]) => `<row r="${r}">${cs.sort((a, b) => parseAddress(a.ref).col - parseAddress(b.ref).col).map(cellXml).join("")}</row>`)
    .join("");
  const tables = tableCount ? `<tableParts count="${tableCount}">${Array.from({ length: tableCount }, (_, i) => `<tablePart r:id="rIdT${firstTable + i}"/>`).join("")}</tableParts>` : "";
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet ${NS}><sheetData>${body}</sheetData>${tables}</worksheet>`;
}

/** The parts of a workbook, by path (so hostile tests can alter one before zipping). */
export function workbookParts(book: FixtureBook): Map<string, string> {
  const parts = new Map<string, string>();
  let tableNo = 0;
  const overrides: string[] = [];
  book.sheets.forEach((s, i) => {
    const n = i + 1;
    const first = tableNo + 1;
    parts.set(`xl/worksheets/sheet${n}.xml`, sheetXml(s.cells, s.tables?.length ?? 0, first));
    overrides.push(`<Override PartName="/xl/worksheets/sheet${n}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`);
    if (s.tables?.length) {
      const rels = s.tables.map((t, j) => {
        const id = ++tableNo;
        parts.set(
          `xl/tables/table${id}.xml`,
          `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<table xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" id="${id}" name="${t.name}" displayName="${t.name}" ref="${t.ref}" headerRowCount="1" totalsRowShown="0"><autoFilter ref="${t.ref}"/><tableColumns count="${t.columns.length}">${t.columns.map((c, k) => `<tableColumn id="${k + 1}" name="${xml(c)}"/>`).join("")}</tableColumns><tableStyleInfo name="TableStyleMedium2" showFirstColumn="0" showLastColumn="0" showRowStripes="1" showColumnStripes="0"/></table>`,
        );
        overrides.push(`<Override PartName="/xl/tables/table${id}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.table+xml"/>`);
        return `<Relationship Id="rIdT${first + j}" Type="${REL}/table" Target="../tables/table${id}.xml"/>`;
      });
      parts.set(`xl/worksheets/_rels/sheet${n}.xml.rels`, `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${rels.join("")}</Relationships>`);
    }
  });
  const names = (book.names ?? []).map((n) => `<definedName name="${xml(n.name)}"${n.scope !== undefined ? ` localSheetId="${n.scope}"` : ""}>${xml(n.text)}</definedName>`).join("");
  parts.set(
    "xl/workbook.xml",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook ${NS}><sheets>${book.sheets.map((s, i) => `<sheet name="${xml(s.name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`).join("")}</sheets>${names ? `<definedNames>${names}</definedNames>` : ""}<calcPr calcId="191029"/></workbook>`,
  );
  parts.set(
    "xl/_rels/workbook.xml.rels",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${book.sheets.map((_, i) => `<Relationship Id="rId${i + 1}" Type="${REL}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`).join("")}</Relationships>`,
  );
  parts.set(
    "_rels/.rels",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
  );
  parts.set(
    "[Content_Types].xml",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>${overrides.join("")}</Types>`,
  );
  return parts;
}

/** Zip parts (strings or streams of generated text) into a package file. */
export function zipParts(file: string, parts: Map<string, string | NodeJS.ReadableStream>): Promise<void> {
  const zip = new yazl.ZipFile();
  const order = ["[Content_Types].xml", "_rels/.rels", ...[...parts.keys()].filter((k) => k !== "[Content_Types].xml" && k !== "_rels/.rels")];
  for (const name of order) {
    const p = parts.get(name)!;
    if (typeof p === "string") zip.addBuffer(Buffer.from(p, "utf8"), name);
    else zip.addReadStream(p, name);
  }
  zip.end();
  return new Promise((resolve, reject) => {
    const out = fs.createWriteStream(file);
    zip.outputStream.pipe(out).on("close", () => resolve()).on("error", reject);
  });
}

export function writeXlsx(file: string, book: FixtureBook): Promise<void> {
  return zipParts(file, workbookParts(book));
}
