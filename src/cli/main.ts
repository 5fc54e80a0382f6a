/**
 * airtally — Airtally without Excel.
 *
 *   airtally recalc BOOK.xlsx [--out OUT.xlsx] [--sheet NAME]... [--quiet | --csv] [--width N]
 *   airtally eval '=AIRTALLY.RATE("HE MCS11 2SS 80MHz")'
 *
 * Exit codes (also in README and `airtally --help`):
 *   0 every formula has a value; 1 some cells are errors; 2 usage, file or
 *   build problem; 3 the workbook has a circular reference.
 */
import * as fs from "fs";
import * as path from "path";
import { DEFAULT_DIST, loadAirtally, type AirtallyFunction } from "./bundle";
import { CLI_CAUTION, speaksOfPower } from "./caution";
import { evaluateFormula, isCellError, Recalc, type Value } from "./engine";
import { CellFormats } from "./cellFormats";
import { capped, errorList, formatValue, printable, printCsv, printSheet, TERMINAL_CELL_WIDTH } from "./table";
import { loadPackage, type LoadedBook } from "./xlsxRead";
import { sameFile, writePackage } from "./xlsxWrite";
import { RefusedInput, ZIP_LIMITS } from "./zip";

export const EXIT = { ok: 0, cellErrors: 1, usage: 2, cycle: 3 } as const;

export const HELP = `airtally — recalculate Airtally workbooks without Excel

Usage:
  airtally recalc BOOK.xlsx [--out OUT.xlsx] [--sheet NAME]... [--quiet | --csv] [--width N]
      Evaluate every formula (native and AIRTALLY.*) in dependency order and
      print each sheet as a table, then every error cell with its message.
      Numbers print with their cells' number formats (0%, 0.0, #,##0, "$"0.00,
      sections); dates, times, fractions and conditions print as General.
      --out      write a copy with the recalculated values cached in it
      --sheet    print only this sheet (repeatable; all are still computed)
      --quiet    print only the errors
      --csv      print the sheets as CSV (RFC 4180, values as displayed; a
                 "# Sheet: NAME" line before each when there are several);
                 the summary, errors and caution go to stderr
      --width N  cut text cells wider than N characters with "…" (default
                 ${TERMINAL_CELL_WIDTH} on a terminal; when stdout is not a terminal, never cut)
  airtally eval FORMULA
      Evaluate one formula, e.g. airtally eval '=AIRTALLY.RATE("HE MCS11 2SS 80MHz")'
  airtally --help

AIRTALLY.* calls run the built add-in (dist/functions.js; set AIRTALLY_DIST
to use another build). A saved workbook may spell them _xldudf_AIRTALLY_NAME;
both forms are read.

Exit codes:
  0  every formula has a value
  1  some cells are errors (#VALUE!, #N/A, #SPILL!, ...; listed with messages)
  2  usage error, unreadable or refused file (limits below), --out not writable
     or the input itself, or the add-in is not built
  3  the workbook has a circular reference (#CYCLE!, listed per cell)
  128+signal  interrupted (130 Ctrl-C, 143 SIGTERM); a partial --out is removed

Limits (a workbook past one is refused with exit code 2, naming the part):
  a part inflating past ${ZIP_LIMITS.maxPartBytes / 1048576} MiB, all parts past ${ZIP_LIMITS.maxTotalBytes / 1048576} MiB,
  a compression ratio over ${ZIP_LIMITS.maxRatio}:1 (parts over ${ZIP_LIMITS.ratioFloorBytes / 1048576} MiB), more than ${ZIP_LIMITS.maxEntries} parts,
  any DOCTYPE. Formulas reading other workbooks are #REF! cells.

${CLI_CAUTION}
`;

export interface Io {
  out: (text: string) => void;
  err: (text: string) => void;
  /** Whether err is a terminal (progress lines only then); default: process.stderr.isTTY. */
  isTTY?: boolean;
  /** Whether out is a terminal (text cells cut to a width only then); default: process.stdout.isTTY. */
  outIsTTY?: boolean;
}

const defaultIo: Io = { out: (t) => process.stdout.write(t), err: (t) => process.stderr.write(t) };

function distDir(): string {
  return process.env.AIRTALLY_DIST ? path.resolve(process.env.AIRTALLY_DIST) : DEFAULT_DIST;
}

function formatResult(v: Value | Value[][]): string {
  if (Array.isArray(v)) return v.map((row) => row.map((v) => formatValue(v)).join("\t")).join("\n");
  if (isCellError(v)) return `${v.error}${v.message ? ` ${capped(printable(v.message))}` : ""}`;
  return formatValue(v);
}

async function runRecalc(args: string[], io: Io, functions: Map<string, AirtallyFunction>): Promise<number> {
  let file: string | undefined;
  let outFile: string | undefined;
  const only: string[] = [];
  let quiet = false;
  let csv = false;
  let width: number | undefined;
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === "--out" || a === "--sheet") {
      const v = args[++i];
      if (!v || v.startsWith("--")) return usage(io, `${a} needs a value`);
      if (a === "--out") outFile = v;
      else only.push(v);
    } else if (a === "--width") {
      const v = args[++i];
      if (!v || !/^\d{1,6}$/.test(v) || Number(v) < 1) return usage(io, "--width needs a whole number of characters, 1 or more");
      width = Number(v);
    } else if (a === "--quiet") quiet = true;
    else if (a === "--csv") csv = true;
    else if (a.startsWith("-")) return usage(io, `unknown option ${a}`);
    else if (!file) file = a;
    else return usage(io, `unexpected argument ${a}`);
  }
  if (!file) return usage(io, "recalc needs a workbook (.xlsx)");
  if (csv && quiet) return usage(io, "--csv and --quiet exclude each other (--quiet prints no sheets)");
  if (csv && width !== undefined) return usage(io, "--width applies to tables; CSV is never cut");
  if (!fs.existsSync(file)) {
    io.err(`airtally: no such file: ${printable(file)}\n`);
    return EXIT.usage;
  }
  if (outFile && sameFile(file, outFile)) {
    io.err(`airtally: --out ${printable(outFile)} is the input workbook; choose another file (the input is never overwritten)\n`);
    return EXIT.usage;
  }
  const onTerminal = io.isTTY ?? (io === defaultIo && !!process.stderr.isTTY);
  const engine = new Recalc(null, functions, {
    progressEvery: 10000,
    onProgress: onTerminal ? (done, total) => io.err(`\rairtally: ${done}/${total} formulas`) : undefined,
  });
  const formats = new CellFormats();
  let loaded: LoadedBook;
  try {
    loaded = await loadPackage(file, {
      sheets: (names) => engine.addSheets(names),
      cell: (i, c) => engine.addCell(i, c),
      numberFormat: quiet ? undefined : (i, row, col, code) => formats.set(i, row, col, code),
    });
  } catch (e) {
    const why = e instanceof Error ? e.message : String(e);
    io.err(e instanceof RefusedInput ? `airtally: ${printable(file)}: ${printable(why)}\n` : `airtally: cannot read ${printable(file)} as an .xlsx workbook: ${printable(why)}\n`);
    return EXIT.usage;
  }
  try {
    const missing = only.filter((n) => !loaded.book.sheets.some((s) => s.name.toUpperCase() === n.toUpperCase()));
    if (missing.length) return usage(io, `no sheet named ${missing.map(printable).join(", ")} (sheets: ${loaded.book.sheets.map((s) => printable(s.name)).join(", ")})`);
    engine.finishLoading(loaded.book.names ?? [], loaded.book.tables ?? []);
    const result = engine.run();
    if (onTerminal && result.formulaCount >= 10000) io.err("\n");
    const shown = result.sheets.map((s, index) => ({ s, index })).filter(({ s }) => !only.length || only.some((n) => n.toUpperCase() === s.name.toUpperCase()));
    if (csv) {
      shown.forEach(({ s, index }, k) => {
        if (shown.length > 1) io.out(`${k ? "\r\n" : ""}# Sheet: ${printable(s.name)}\r\n`);
        printCsv(() => s.each(), io.out, (row, col) => formats.get(index, row, col));
      });
    } else if (!quiet) {
      const outIsTTY = io.outIsTTY ?? (io === defaultIo && !!process.stdout.isTTY);
      const cut = width ?? (outIsTTY ? TERMINAL_CELL_WIDTH : undefined);
      for (const { s, index } of shown) {
        printSheet(s.name, () => s.each(), io.out, { width: cut, formatOf: (row, col) => formats.get(index, row, col) });
        io.out("\n");
      }
    }
    // With --csv, stdout is only CSV: the summary, the errors and the caution go to stderr.
    const report = csv ? io.err : io.out;
    const errors = errorList(result);
    report(`${result.formulaCount} formulas, ${result.errors.length} error cells, ${result.cycles.length} circular references\n`);
    if (errors) report(errors + "\n");
    report(CLI_CAUTION + "\n");
    if (outFile) {
      try {
        await writePackage(loaded, result, outFile);
        io.err(`airtally: wrote ${printable(outFile)}\n`);
      } catch (e) {
        io.err(`airtally: cannot write ${printable(outFile)} (nothing written): ${printable(e instanceof Error ? e.message : String(e))}\n`);
        return EXIT.usage;
      }
    }
    if (result.cycles.length) return EXIT.cycle;
    return result.errors.length ? EXIT.cellErrors : EXIT.ok;
  } finally {
    loaded.pkg.close();
  }
}

function usage(io: Io, message: string): number {
  io.err(`airtally: ${printable(message)}\n\n${HELP}`); // the message may quote what was typed: escaped like any printed text
  return EXIT.usage;
}

/** Run the CLI with arguments (without node and script); returns the exit code, never throws. */
export async function main(argv: string[], io: Io = defaultIo): Promise<number> {
  try {
    const [command, ...rest] = argv;
    if (!command || command === "--help" || command === "-h" || command === "help") {
      io.out(HELP);
      return command ? EXIT.ok : EXIT.usage;
    }
    if (command !== "recalc" && command !== "eval") return usage(io, `unknown command ${command}`);
    let functions: Map<string, AirtallyFunction>;
    try {
      functions = loadAirtally(distDir());
    } catch (e) {
      io.err(`airtally: ${printable(e instanceof Error ? e.message : String(e))}\n`);
      return EXIT.usage;
    }
    if (command === "recalc") return await runRecalc(rest, io, functions);
    if (rest.length !== 1) return usage(io, "eval takes one formula (quote it for the shell)");
    if (rest[0].trim().replace(/^=/, "").trim() === "") return usage(io, "eval needs a formula after =");
    const value = evaluateFormula(rest[0], functions);
    io.out(formatResult(value) + "\n");
    if (speaksOfPower(rest[0])) io.out(CLI_CAUTION + "\n");
    const cells = Array.isArray(value) ? value.flat() : [value];
    if (cells.some((c) => isCellError(c) && c.error === "#CYCLE!")) return EXIT.cycle;
    return cells.some(isCellError) ? EXIT.cellErrors : EXIT.ok;
  } catch (e) {
    io.err(`airtally: unexpected failure: ${(e instanceof Error ? e.stack ?? e.message : String(e)).split("\n").map(printable).join("\n")}\n`);
    return EXIT.usage;
  }
}

if (require.main === module) {
  main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
