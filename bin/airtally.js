#!/usr/bin/env node
/*
 * The airtally command: runs src/cli/main.ts through tsx (TypeScript without a
 * build step), in a child node with the V8 heap bounded (src/cli/zip.ts
 * HEAP_MB) so memory stays near the documented 1 GB instead of the heap
 * growing with garbage; the input limits keep what is live below that bound.
 */
"use strict";
const HEAP_MB = 896;
if (!process.execArgv.some((a) => a.startsWith("--max-old-space-size"))) {
  const { spawnSync } = require("child_process");
  const r = spawnSync(process.execPath, [`--max-old-space-size=${HEAP_MB}`, __filename, ...process.argv.slice(2)], { stdio: "inherit" });
  process.exit(r.status ?? (r.signal ? 128 + (require("os").constants.signals[r.signal] ?? 1) : 2));
}
require("tsx/cjs/api").register();
const { main } = require("../src/cli/main.ts");
main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
