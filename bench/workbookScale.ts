/**
 * Section 6 of `npm run bench`: how the command line scales. A generated
 * site budget (test/cli/support/bigBook.ts: area, a 10 % margin, ROUNDUP of
 * survey days, whole-column totals; shared formulas as a filled-down column
 * is saved) of 10^3 … 10^6 rows, each recalculated by `airtally recalc
 * --quiet` in a fresh process: wall seconds and peak resident memory (the
 * child's own process.resourceUsage().maxRSS). Then MIXSHARE over three
 * 100 000-row ranges, in process (issue 14 target: under 1 s, linear in the
 * ranges). Rows are info, not targets, except the MIXSHARE line.
 */
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { HEAP_MB } from "../src/cli/zip";
import { budgetBook } from "../test/cli/support/bigBook";

const ROOT = path.resolve(__dirname, "..");

function runChild(args: string[]): { code: number | null; seconds: number; peakMB: number } {
  const script = `require("tsx/cjs/api").register();
const { main } = require(${JSON.stringify(path.join(ROOT, "src/cli/main.ts"))});
main(process.argv.slice(1)).then((code) => { process.stderr.write("PEAK_RSS_KB=" + process.resourceUsage().maxRSS + "\\n"); process.exitCode = code; });`;
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [`--max-old-space-size=${HEAP_MB}`, "-e", script, ...args], { cwd: ROOT, encoding: "utf8", maxBuffer: 1 << 26 });
  const m = /PEAK_RSS_KB=(\d+)/.exec(r.stderr ?? "");
  return { code: r.status, seconds: (performance.now() - t0) / 1000, peakMB: m ? Number(m[1]) / 1024 : NaN };
}

export async function workbookScale(): Promise<boolean> {
  const sizes = (process.env.BENCH_SCALE_ROWS ?? "1000,10000,100000,1000000").split(",").map(Number);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-bench-"));
  console.log("\n6. Scale: `airtally recalc --quiet` on a generated budget (fresh process per size; 2 formulas per row)");
  console.log("   rows        seconds   peak MB   exit");
  try {
    for (const rows of sizes) {
      const file = path.join(dir, `budget-${rows}.xlsx`);
      await budgetBook(file, rows, true);
      const r = runChild(["recalc", file, "--quiet"]);
      console.log(`   ${String(rows).padEnd(10)}  ${r.seconds.toFixed(2).padStart(7)}   ${r.peakMB.toFixed(0).padStart(7)}   ${r.code}`);
      fs.rmSync(file);
    }
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
  return mixShareLinear();
}

/** MIXSHARE(links, counts, demands) over three ranges of n rows, timed in this process, for n and 10 n. */
function mixShareLinear(): boolean {
  const { loadAirtally } = require("../src/cli/bundle") as typeof import("../src/cli/bundle");
  const { recalc } = require("../src/cli/engine") as typeof import("../src/cli/engine");
  const functions = loadAirtally(path.join(ROOT, "dist"));
  const rates = [6, 9, 12, 18, 24, 36, 48, 54];
  const time = (n: number) => {
    const cells: { row: number; col: number; value?: string | number; formula?: string }[] = [];
    for (let r = 1; r <= n; r++) cells.push({ row: r, col: 1, value: `OFDM ${rates[r % 8]}Mbps 5GHz` }, { row: r, col: 2, value: 1 + (r % 3) }, { row: r, col: 3, value: 0.01 });
    cells.push({ row: 1, col: 5, formula: `AIRTALLY.MIXSHARE(A1:A${n},B1:B${n},C1:C${n})` });
    const t0 = performance.now();
    const res = recalc({ sheets: [{ name: "S", cells }] }, functions);
    const ms = performance.now() - t0;
    const v = res.sheets[0].peek(1, 5)?.value;
    return { ms, ok: typeof v === "number" };
  };
  time(1000); // warm-up
  const small = time(10_000);
  const big = time(100_000);
  const pass = big.ok && big.ms < 1000;
  console.log(`   MIXSHARE over 3 × 10 000 rows: ${small.ms.toFixed(0)} ms; over 3 × 100 000 rows: ${big.ms.toFixed(0)} ms (whole recalculation; ×${(big.ms / small.ms).toFixed(1)} for 10× the rows); target < 1 s: ${pass ? "PASS" : "FAIL"}`);
  return pass;
}
