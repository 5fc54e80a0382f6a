/**
 * The command run in a child process, as a user runs it: under the heap bound
 * bin/airtally.js sets, its peak resident memory reported by the child itself
 * at exit (process.resourceUsage().maxRSS).
 */
import { spawnSync } from "child_process";
import { createHash } from "crypto";
import * as fs from "fs";
import * as path from "path";
import { HEAP_MB } from "../../../src/cli/zip";

export const ROOT = path.resolve(__dirname, "../../..");
const MiB = 1 << 20;

export interface Run {
  code: number | null;
  out: string;
  err: string;
  peakMB: number;
  seconds: number;
}

export function airtally(args: string[], timeoutMs = 120_000): Run {
  const script = `require("tsx/cjs/api").register();
const { main } = require(${JSON.stringify(path.join(ROOT, "src/cli/main.ts"))});
main(process.argv.slice(1)).then((code) => { process.stderr.write("\\nPEAK_RSS_KB=" + process.resourceUsage().maxRSS + "\\n"); process.exitCode = code; });`;
  const t0 = Date.now();
  const r = spawnSync(process.execPath, [`--max-old-space-size=${HEAP_MB}`, "-e", script, ...args], { cwd: ROOT, encoding: "utf8", timeout: timeoutMs, maxBuffer: 256 * MiB });
  const m = /PEAK_RSS_KB=(\d+)/.exec(r.stderr ?? "");
  return { code: r.status, out: r.stdout ?? "", err: (r.stderr ?? "").replace(/\nPEAK_RSS_KB=\d+\n/, ""), peakMB: m ? Number(m[1]) / 1024 : Infinity, seconds: (Date.now() - t0) / 1000 };
}

export const sha = (f: string) => createHash("sha256").update(fs.readFileSync(f)).digest("hex");

export function report(name: string, r: Run): void {
  console.log(`${name}: exit ${r.code}, peak ${r.peakMB.toFixed(0)} MB, ${r.seconds.toFixed(1)} s${r.err ? `; ${r.err.trim().split("\n")[0]}` : ""}`);
}
