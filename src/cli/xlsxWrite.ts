/**
 * `--out`: a copy of the original package with the recalculated values as the
 * formulas' cached results. Every part is copied unchanged (same inflated
 * bytes) except the sheet parts, where only cells' cached values change (and
 * a spill's anchor formula is marked as an array formula over the cells it
 * filled, with those cells' values added), and workbook.xml, which asks Excel
 * to recalculate on open. Sheets are rewritten row by row as they stream, so
 * memory stays bounded by the largest row. The file is written to a temporary
 * name in the output's folder and renamed into place; on any failure the
 * temporary file is removed and nothing at the output path changes.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { Transform } from "stream";
import { StringDecoder } from "string_decoder";
import yazl from "yazl";
import { address, areaText, parseAddress } from "./address";
import { isCellError, type RecalcResult, type Value } from "./engine";
import { EXCEL_ERRORS } from "./formula/functions";
import type { LoadedBook } from "./xlsxRead";
import { encodeXstring } from "./xstring";
import { RefusedInput } from "./zip";

interface Patch {
  value: Value;
  /** A formula cell (its <f> stays); otherwise a spilled value cell. */
  formula: boolean;
  /** For a dynamic spill's anchor: the range to declare as an array formula. */
  arrayRef?: string;
}

const COLS = 16384;
const STOP_SIGNALS: NodeJS.Signals[] = ["SIGINT", "SIGTERM", "SIGHUP"];

function escapeXml(s: string): string {
  // XML 1.0 has no place for most control characters: they are kept as the package's _xHHHH_ escapes.
  return encodeXstring(s).replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** Cached value markup: the t attribute and the <v>/<is> element. No cached value for our #CYCLE! (not an Excel code). */
function valueMarkup(v: Value, formula: boolean): { t?: string; body: string } {
  if (v === null) return { body: "" };
  if (isCellError(v)) return !EXCEL_ERRORS.has(v.error) ? { body: "" } : { t: "e", body: `<v>${escapeXml(v.error)}</v>` }; // our #CYCLE! is not a file code
  if (typeof v === "number") return { body: `<v>${String(v)}</v>` };
  if (typeof v === "boolean") return { t: "b", body: `<v>${v ? 1 : 0}</v>` };
  return formula ? { t: "str", body: `<v>${escapeXml(v)}</v>` } : { t: "inlineStr", body: `<is><t xml:space="preserve">${escapeXml(v)}</t></is>` };
}

function openTagWithout(tag: string, drop: string[]): string {
  let t = tag;
  for (const a of drop) t = t.replace(new RegExp(`\\s${a}="[^"]*"`, "g"), "");
  return t;
}

/** One <c> element rewritten with a new cached value. */
function patchCell(cellXml: string, p: Patch): string {
  const open = /^<c\b[^>]*?(\/?)>/.exec(cellXml)!;
  const selfClosing = open[1] === "/";
  const inner = selfClosing ? "" : cellXml.slice(open[0].length, cellXml.length - "</c>".length);
  let f = /<f\b[^>]*?(?:\/>|>[\s\S]*?<\/f>)/.exec(inner)?.[0] ?? "";
  if (p.arrayRef && f && !/\bt="shared"/.test(f)) f = openTagWithout(f.replace(/^<f\b/, "<f"), ["t", "ref"]).replace(/^<f\b/, `<f t="array" ref="${p.arrayRef}"`);
  const m = valueMarkup(p.value, p.formula && f !== "");
  let tag = openTagWithout(open[0].replace(/\/?>$/, ""), ["t"]);
  if (m.t) tag += ` t="${m.t}"`;
  return `${tag}>${f}${m.body}</c>`;
}

function newCell(row: number, col: number, p: Patch): string {
  const m = valueMarkup(p.value, false);
  return `<c r="${address(row, col)}"${m.t ? ` t="${m.t}"` : ""}>${m.body}</c>`;
}

/** Rewrites one sheet part's rows as its text streams through. */
class SheetPatcher extends Transform {
  private buf = "";
  private readonly decoder = new StringDecoder("utf8");
  private lastRow = 0;
  private done = false;
  private readonly pendingRows: number[];

  /** `patch`: the new content of a cell (undefined: leave it); `spilled`: per row, the columns a spill filled. */
  constructor(
    private readonly patch: (row: number, col: number) => Patch | undefined,
    private readonly spilled: Map<number, number[]>,
  ) {
    super();
    this.pendingRows = [...spilled.keys()].sort((a, b) => a - b);
  }

  override _transform(chunk: Buffer, _enc: string, cb: (e?: Error | null) => void): void {
    try {
      this.buf += this.decoder.write(chunk);
      this.pump(false);
      cb();
    } catch (e) {
      cb(e as Error);
    }
  }

  override _flush(cb: (e?: Error | null) => void): void {
    try {
      this.buf += this.decoder.end();
      this.pump(true);
      if (this.buf) this.push(this.buf);
      this.buf = "";
      cb();
    } catch (e) {
      cb(e as Error);
    }
  }

  private send(text: string): void {
    if (text) this.push(Buffer.from(text, "utf8"));
  }

  /** Rows that only spills fill (absent from the file) with numbers below `before`. */
  private synthesizedRows(before: number): string {
    let out = "";
    while (this.pendingRows.length && this.pendingRows[0] < before) {
      const r = this.pendingRows.shift()!;
      const cols = [...this.spilled.get(r)!].sort((a, b) => a - b);
      out += `<row r="${r}">${cols.map((c) => newCell(r, c, this.patch(r, c)!)).join("")}</row>`;
    }
    return out;
  }

  private pump(final: boolean): void {
    let pos = 0;
    const b = this.buf;
    // Where sheetData ends in this buffer (searched once per chunk, not once per row).
    const close = b.indexOf("</sheetData>");
    const empty = b.indexOf("<sheetData/>");
    for (;;) {
      if (this.done) {
        this.send(b.slice(pos));
        pos = b.length;
        break;
      }
      const i = b.indexOf("<row", pos);
      if (empty >= pos && (i < 0 || empty < i)) {
        this.send(b.slice(pos, empty) + `<sheetData>${this.synthesizedRows(Infinity)}</sheetData>`);
        pos = empty + "<sheetData/>".length;
        this.done = true;
        continue;
      }
      if (close >= pos && (i < 0 || close < i)) {
        this.send(b.slice(pos, close) + this.synthesizedRows(Infinity));
        pos = close;
        this.done = true;
        continue;
      }
      if (i < 0) {
        const keep = final ? b.length : Math.max(pos, b.length - 16);
        this.send(b.slice(pos, keep));
        pos = keep;
        break;
      }
      const tagEnd = b.indexOf(">", i);
      if (tagEnd < 0) break;
      const selfClosing = b[tagEnd - 1] === "/";
      const end = selfClosing ? tagEnd + 1 : b.indexOf("</row>", tagEnd);
      if (end < 0) break;
      const rowEnd = selfClosing ? end : end + "</row>".length;
      this.send(b.slice(pos, i) + this.patchRow(b.slice(i, rowEnd), b.slice(i, tagEnd + 1)));
      pos = rowEnd;
    }
    this.buf = b.slice(pos);
    if (this.buf.length > 64 * 1024 * 1024) throw new RefusedInput("refused: a sheet row is longer than 64 MiB");
  }

  private patchRow(rowXml: string, openTag: string): string {
    const rm = /\sr="(\d+)"/.exec(openTag);
    const row = rm ? Number(rm[1]) : this.lastRow + 1;
    this.lastRow = row;
    const before = this.synthesizedRows(row);
    const spilledCols = this.spilled.get(row);
    if (spilledCols) {
      const idx = this.pendingRows.indexOf(row);
      if (idx >= 0) this.pendingRows.splice(idx, 1);
    }
    const selfClosing = openTag.endsWith("/>");
    const inner = selfClosing ? "" : rowXml.slice(openTag.length, rowXml.length - "</row>".length);
    const left = new Set(spilledCols ?? []);
    const out: string[] = [];
    let col = 0;
    let rest = inner;
    const cellRe = /<c\b[^>]*?(?:\/>|>[\s\S]*?<\/c>)/g;
    let m: RegExpExecArray | null;
    let last = 0;
    const pieces: { col: number; xml: string }[] = [];
    while ((m = cellRe.exec(inner))) {
      const text = m[0];
      const r = /^<c\b[^>]*?\sr="([A-Z]+\d+)"/.exec(text);
      col = r ? parseAddress(r[1]).col : col + 1;
      const p = this.patch(row, col);
      left.delete(col);
      pieces.push({ col, xml: (inner.slice(last, m.index) || "") + (p ? patchCell(text, p) : text) });
      last = m.index + text.length;
    }
    rest = inner.slice(last);
    for (const c of left) pieces.push({ col: c, xml: newCell(row, c, this.patch(row, c)!) });
    pieces.sort((a, b) => a.col - b.col);
    for (const piece of pieces) out.push(piece.xml);
    const open = selfClosing ? openTag.replace(/\/>$/, ">") : openTag;
    return `${before}${open}${out.join("")}${rest}</row>`;
  }
}

/** workbook.xml with fullCalcOnLoad="1" on calcPr, so Excel recomputes on open. */
function patchWorkbook(xml: string): string {
  if (/<calcPr\b/.test(xml)) return xml.replace(/<calcPr\b([^>]*?)(\/?)>/, (_m, attrs: string, slash: string) => `<calcPr${attrs.replace(/\sfullCalcOnLoad="[^"]*"/, "")} fullCalcOnLoad="1"${slash}>`);
  const after = /<\/definedNames>/.test(xml) ? "</definedNames>" : "</sheets>";
  return xml.replace(after, `${after}<calcPr fullCalcOnLoad="1"/>`);
}

/** What to write for each cell of one sheet, looked up as the sheet streams (no copy of the results). */
function patcherFor(result: RecalcResult, sheet: string): SheetPatcher {
  const s = result.sheets.find((x) => x.name === sheet)!;
  const arrays = new Map<number, Map<number, string>>();
  for (const sp of result.spills) {
    if (sp.sheet !== sheet || sp.stored) continue;
    if (!arrays.has(sp.anchor.row)) arrays.set(sp.anchor.row, new Map());
    arrays.get(sp.anchor.row)!.set(sp.anchor.col, areaText(sp.area));
  }
  const spilled = new Map<number, number[]>();
  for (const [r, c] of s.spilledCells()) {
    if (!spilled.has(r)) spilled.set(r, []);
    spilled.get(r)!.push(c);
  }
  const patch = (row: number, col: number): Patch | undefined => {
    const c = s.peek(row, col);
    if (!c || c.kind === "constant") return undefined;
    return { value: c.value, formula: c.kind === "formula", arrayRef: c.kind === "formula" ? arrays.get(row)?.get(col) : undefined };
  };
  return new SheetPatcher(patch, spilled);
}

/** True when two paths name the same file (also through symbolic and hard links). */
export function sameFile(a: string, b: string): boolean {
  try {
    const x = fs.statSync(a);
    const y = fs.statSync(b);
    return x.dev === y.dev && x.ino === y.ino;
  } catch {
    return path.resolve(a) === path.resolve(b);
  }
}

/** Write the recalculated copy atomically. Throws (with the temporary file removed) on any failure. */
export async function writePackage(loaded: LoadedBook, result: RecalcResult, outFile: string): Promise<void> {
  const pkg = loaded.pkg;
  const dir = path.dirname(path.resolve(outFile));
  const tmp = path.join(dir, `.${path.basename(outFile)}.${process.pid}.${Date.now().toString(36)}.tmp`);
  const sheetOf = new Map(loaded.parts.map((p) => [p.part, p.name]));
  const zip = new yazl.ZipFile();
  const out = fs.createWriteStream(tmp, { flags: "wx" });
  const cleanup = () => {
    try {
      fs.unlinkSync(tmp);
    } catch {
      /* already gone */
    }
  };
  // Interrupted: remove the partial file, then exit as the signal would have (128 + its number).
  // `on`, not `once`: a second signal (Ctrl-C reaches both bin/airtally.js, which forwards it, and
  // this process) must not find the default action restored before the file is removed.
  const onSignal = (signal: NodeJS.Signals) => {
    cleanup();
    process.exit(128 + (os.constants.signals[signal] ?? 1));
  };
  for (const s of STOP_SIGNALS) process.on(s, onSignal);
  try {
    const finished = new Promise<void>((resolve, reject) => {
      out.on("close", () => resolve());
      out.on("error", reject);
      zip.outputStream.on("error", reject);
    });
    let writeError: unknown;
    finished.catch((e) => (writeError = e)); // observed now, thrown below: an early failure must not go unhandled
    zip.outputStream.pipe(out);
    const failures: Error[] = [];
    for (const name of pkg.names()) {
      if (name.endsWith("/")) continue;
      const entry = pkg.entry(name);
      // Large parts at deflate level 1: several times faster, a somewhat larger file.
      const level = entry.compressionMethod === 0 ? 0 : entry.uncompressedSize > 16 * 1024 * 1024 ? 1 : 6;
      const opts = { mtime: entry.getLastModDate(), compressionLevel: level };
      if (name === loaded.workbookPart) {
        zip.addBuffer(Buffer.from(patchWorkbook(await pkg.text(name)), "utf8"), name, opts);
        continue;
      }
      const stream = await pkg.bounded(name);
      const body = sheetOf.has(name) ? stream.pipe(patcherFor(result, sheetOf.get(name)!)) : stream;
      stream.on("error", (e) => body.destroy(e));
      zip.addReadStream(body, name, opts);
      await new Promise<void>((resolve) => {
        body.on("end", () => resolve());
        body.on("error", (e) => {
          failures.push(e);
          resolve();
        });
      });
      if (failures.length) throw failures[0];
      if (writeError) throw writeError;
    }
    zip.end();
    await finished;
    if (failures.length) throw failures[0];
    fs.renameSync(tmp, outFile);
  } catch (e) {
    cleanup();
    throw e;
  } finally {
    for (const s of STOP_SIGNALS) process.removeListener(s, onSignal);
  }
}

void COLS;
