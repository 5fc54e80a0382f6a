/**
 * Large and hostile workbooks generated on the fly (never committed): sheet
 * XML streamed into the zip so even a million-row sheet costs the test little
 * memory, and a raw zip writer whose local and central headers can declare
 * sizes that are not true (zip bombs that lie).
 */
import * as fs from "fs";
import { Readable } from "stream";
import * as zlib from "zlib";
import { workbookParts, zipParts, type FixtureBook } from "./writeXlsx";

/**
 * A site budget of `rows` zones: name, area m², a 10 % margin, survey days
 * ROUNDUP(area×1.1/1000), and a total of the days over the whole column.
 * `shared` stores the filled-down formulas as shared formulas (as the host
 * saves a filled column); otherwise each row has its own text.
 */
export async function budgetBook(file: string, rows: number, shared: boolean, expectedDays?: number, extraColumns = 0): Promise<void> {
  const book: FixtureBook = { sheets: [{ name: "Budget", cells: [] }] };
  const parts = new Map<string, string | NodeJS.ReadableStream>(workbookParts(book));
  const head = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>';
  let r = 0;
  const last = rows + 1;
  const sheet = new Readable({
    read() {
      if (r === 0) {
        this.push(head + '<row r="1"><c r="A1" t="inlineStr"><is><t>zone</t></is></c><c r="B1" t="inlineStr"><is><t>area</t></is></c><c r="D1" t="inlineStr"><is><t>days</t></is></c></row>');
        r = 2;
        return;
      }
      if (r > last) {
        // With an expected total, F is 1/(total = expected): #DIV/0! (exit code 1) if the engine's total differs.
        const check = expectedDays === undefined ? "" : `<c r="F${last + 1}"><f>1/(E${last + 1}=${expectedDays})</f></c>`;
        this.push(`<row r="${last + 1}"><c r="D${last + 1}"><f>SUM(D2:D${last})</f></c><c r="E${last + 1}"><f>SUM(D:D)-D${last + 1}</f></c>${check}</row></sheetData></worksheet>`);
        this.push(null);
        return;
      }
      let chunk = "";
      for (let k = 0; k < 2000 && r <= last; k++, r++) {
        const area = 100 + ((r * 7919) % 5000);
        const c = shared ? (r === 2 ? `<f t="shared" ref="C2:C${last}" si="0">B2*1.1</f>` : '<f t="shared" si="0"/>') : `<f>B${r}*1.1</f>`;
        const d = shared ? (r === 2 ? `<f t="shared" ref="D2:D${last}" si="1">ROUNDUP(C2/1000,0)</f>` : '<f t="shared" si="1"/>') : `<f>ROUNDUP(C${r}/1000,0)</f>`;
        let extra = "";
        for (let k = 0; k < extraColumns; k++) extra += `<c r="${String.fromCharCode(71 + k)}${r}"><v>${k}</v></c>`; // G, H, … : plain numbers
        chunk += `<row r="${r}"><c r="A${r}" t="inlineStr"><is><t>Z${r}</t></is></c><c r="B${r}"><v>${area}</v></c><c r="C${r}">${c}</c><c r="D${r}">${d}</c>${extra}</row>`;
      }
      this.push(chunk);
    },
  });
  parts.set("xl/worksheets/sheet1.xml", sheet);
  await zipParts(file, parts);
}

/** Expected total days of budgetBook, summed here in plain arithmetic (decimal rounding via integers: area×11/10000). */
export function budgetDays(rows: number): number {
  let total = 0;
  for (let r = 2; r <= rows + 1; r++) {
    const area = 100 + ((r * 7919) % 5000);
    total += Math.ceil((area * 11) / 10000); // area × 1.1 / 1000 = area × 11 / 10 000, exact in integers
  }
  return total;
}

const crcTable = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const b of buf) c = crcTable[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

export interface RawPart {
  name: string;
  data: Buffer;
  /** Deflated bytes to store instead of deflating `data` (for bombs built in pieces). */
  deflated?: Buffer;
  /** Declare this inflated size in the headers instead of the true one. */
  declaredSize?: number;
  crc?: number;
}

/** A zip (PKWARE APPNOTE 6.3 layout, deflate, no zip64) whose headers say what the test wants. */
export function rawZip(file: string, parts: RawPart[]): void {
  const chunks: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (const p of parts) {
    const name = Buffer.from(p.name, "utf8");
    const body = p.deflated ?? zlib.deflateRawSync(p.data);
    const size = p.declaredSize ?? p.data.length;
    const crc = p.crc ?? crc32(p.data);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(0x0800, 6);
    local.writeUInt16LE(8, 8);
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(body.length, 18);
    local.writeUInt32LE(size, 22);
    local.writeUInt16LE(name.length, 26);
    chunks.push(local, name, body);
    const c = Buffer.alloc(46);
    c.writeUInt32LE(0x02014b50, 0);
    c.writeUInt16LE(20, 4);
    c.writeUInt16LE(20, 6);
    c.writeUInt16LE(0x0800, 8);
    c.writeUInt16LE(8, 10);
    c.writeUInt32LE(crc, 16);
    c.writeUInt32LE(body.length, 20);
    c.writeUInt32LE(size, 24);
    c.writeUInt16LE(name.length, 28);
    c.writeUInt32LE(offset, 42);
    central.push(c, name);
    offset += 30 + name.length + body.length;
  }
  const cd = Buffer.concat(central);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(parts.length, 8);
  end.writeUInt16LE(parts.length, 10);
  end.writeUInt32LE(cd.length, 12);
  end.writeUInt32LE(offset, 16);
  fs.writeFileSync(file, Buffer.concat([...chunks, cd, end]));
}

/**
 * Deflated bytes of `prefix` then `fill` repeated to `total` bytes, built as
 * independent full-flushed deflate blocks of 1 MiB each (valid raw deflate
 * when concatenated) so a multi-gigabyte bomb never exists inflated here.
 */
export function deflatedFill(prefix: string, fill: string, total: number): Buffer {
  const MiB = 1 << 20;
  const piece = Buffer.from(fill.repeat(Math.ceil(MiB / fill.length)).slice(0, MiB));
  const flush = { finishFlush: zlib.constants.Z_FULL_FLUSH, level: 9 };
  const block = zlib.deflateRawSync(piece, flush);
  const out: Buffer[] = [zlib.deflateRawSync(Buffer.from(prefix), flush)];
  let written = prefix.length;
  while (written + MiB <= total) {
    out.push(block);
    written += MiB;
  }
  if (total > written) out.push(zlib.deflateRawSync(piece.subarray(0, total - written), flush));
  out.push(zlib.deflateRawSync(Buffer.alloc(0))); // the final (empty) block
  return Buffer.concat(out);
}
