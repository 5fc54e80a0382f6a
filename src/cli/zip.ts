/**
 * Bounded reading of a zip package (an .xlsx): every part is checked against
 * stated limits before it is inflated (its declared size and compression
 * ratio) and again while it inflates (the bytes actually produced), so a zip
 * bomb is refused with a message naming the part and the limit instead of
 * exhausting memory. yauzl (MIT) reads the zip and also checks that a part
 * inflates to exactly its declared size.
 */
import { Transform, type Readable } from "stream";
import { StringDecoder } from "string_decoder";
import yauzl from "yauzl";

/** The limits, as README.md states them. */
export const ZIP_LIMITS = {
  /** Parts in one package. */
  maxEntries: 10_000,
  /** Inflated bytes of one part. */
  maxPartBytes: 512 * 1024 * 1024,
  /** Inflated bytes of all parts read. */
  maxTotalBytes: 1024 * 1024 * 1024,
  /** Inflated ÷ compressed bytes, checked once a part passes `ratioFloorBytes`. */
  maxRatio: 200,
  ratioFloorBytes: 16 * 1024 * 1024,
} as const;

/**
 * Non-empty cells in one workbook. With the heap bound below this keeps the
 * process near 1 GB: a 1 000 000-row budget (4 000 000 cells, half of them
 * formulas) peaks at about 0.9 GB.
 */
export const MAX_CELLS = 5_000_000;
/** The V8 heap bound bin/airtally.js runs the command under (MB). */
export const HEAP_MB = 896;

/** A package the command refuses to read (exit code 2); the message names the part and the limit. */
export class RefusedInput extends Error {}

const mib = (n: number) => `${Math.round(n / 1048576)} MiB`;

export interface ZipPackage {
  names(): string[];
  has(name: string): boolean;
  /** A part's text, streamed to `onText` in pieces (bounded memory). */
  stream(name: string, onText: (text: string) => void): Promise<void>;
  /** A whole (small) part as text. */
  text(name: string): Promise<string>;
  /** A part's inflated bytes as a stream, within the limits. */
  bounded(name: string): Promise<Readable>;
  /** A part's zip entry (its dates and compression method, for copying). */
  entry(name: string): yauzl.Entry;
  close(): void;
  readonly zip: yauzl.ZipFile;
}

function openZip(file: string): Promise<yauzl.ZipFile> {
  return new Promise((resolve, reject) =>
    yauzl.open(file, { lazyEntries: true, autoClose: false, validateEntrySizes: true, decodeStrings: true }, (e, zip) => (e || !zip ? reject(e ?? new Error("cannot open")) : resolve(zip))),
  );
}

export async function openPackage(file: string, limits = ZIP_LIMITS): Promise<ZipPackage> {
  const zip = await openZip(file);
  const entries = new Map<string, yauzl.Entry>();
  try {
    await new Promise<void>((resolve, reject) => {
      zip.on("entry", (e: yauzl.Entry) => {
        if (entries.size >= limits.maxEntries) {
          reject(new RefusedInput(`refused: the package has more than ${limits.maxEntries} parts (limit)`));
          return;
        }
        entries.set(e.fileName.replace(/^\/+/, ""), e);
        zip.readEntry();
      });
      zip.on("end", () => resolve());
      zip.on("error", reject);
      zip.readEntry();
    });
  } catch (e) {
    zip.close();
    throw e;
  }
  let total = 0;
  const check = (name: string, e: yauzl.Entry) => {
    if (e.uncompressedSize > limits.maxPartBytes) throw new RefusedInput(`refused: part ${name} declares ${mib(e.uncompressedSize)} inflated, over the limit of ${mib(limits.maxPartBytes)} per part`);
    const ratio = e.uncompressedSize / Math.max(1, e.compressedSize);
    if (e.uncompressedSize > limits.ratioFloorBytes && ratio > limits.maxRatio)
      throw new RefusedInput(`refused: part ${name} declares a compression ratio of ${Math.round(ratio)}:1, over the limit of ${limits.maxRatio}:1`);
  };
  const openRaw = (name: string): Promise<NodeJS.ReadableStream> => {
    const e = entries.get(name);
    if (!e) throw new RefusedInput(`the package has no part ${name}`);
    check(name, e);
    return new Promise((resolve, reject) => zip.openReadStream(e, (err, s) => (err || !s ? reject(err ?? new Error("cannot read")) : resolve(s))));
  };
  /** The inflated bytes of a part, counted as they come: past a limit the stream fails with RefusedInput. */
  const bounded = async (name: string): Promise<Readable> => {
    const e = entries.get(name)!;
    const raw = await openRaw(name);
    let inflated = 0;
    const counter = new Transform({
      transform(chunk: Buffer, _enc, cb) {
        inflated += chunk.length;
        total += chunk.length;
        if (inflated > limits.maxPartBytes) return cb(new RefusedInput(`refused: part ${name} inflates past ${mib(limits.maxPartBytes)}, the limit per part`));
        if (total > limits.maxTotalBytes) return cb(new RefusedInput(`refused: the parts read inflate past ${mib(limits.maxTotalBytes)} in all (limit), at part ${name}`));
        if (inflated > limits.ratioFloorBytes && inflated / Math.max(1, e.compressedSize) > limits.maxRatio)
          return cb(new RefusedInput(`refused: part ${name} inflates more than ${limits.maxRatio}:1 (limit on the compression ratio)`));
        cb(null, chunk);
      },
    });
    raw.on("error", (err: Error) => counter.destroy(/too many bytes|not enough bytes|invalid|unexpected|bad/i.test(err.message) ? new RefusedInput(`refused: part ${name} is damaged: ${err.message}`) : err));
    counter.on("error", () => (raw as unknown as { destroy(): void }).destroy());
    return (raw as unknown as Readable).pipe(counter);
  };
  const pkg: ZipPackage = {
    zip,
    names: () => [...entries.keys()],
    has: (name) => entries.has(name),
    entry: (name) => entries.get(name)!,
    close: () => zip.close(),
    bounded,
    async stream(name, onText) {
      const s = await bounded(name);
      const decoder = new StringDecoder("utf8");
      await new Promise<void>((resolve, reject) => {
        s.on("data", (chunk: Buffer) => {
          try {
            onText(decoder.write(chunk));
          } catch (err) {
            s.destroy();
            reject(err);
          }
        });
        s.on("error", reject);
        s.on("end", () => {
          try {
            const rest = decoder.end();
            if (rest) onText(rest);
            resolve();
          } catch (err) {
            reject(err);
          }
        });
      });
    },
    async text(name) {
      let out = "";
      await pkg.stream(name, (t) => (out += t));
      return out;
    },
  };
  return pkg;
}
