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
  // Asynchronous, so that a signal sent to this process (kill PID, not only a
  // terminal's Ctrl-C to the whole group) reaches the child, which removes its
  // partial --out file; the exit code is then 128 + the signal's number.
  const { spawn } = require("child_process");
  const child = spawn(process.execPath, [`--max-old-space-size=${HEAP_MB}`, __filename, ...process.argv.slice(2)], { stdio: "inherit" });
  for (const signal of ["SIGINT", "SIGTERM", "SIGHUP"]) process.on(signal, () => child.kill(signal));
  child.on("error", () => process.exit(2));
  child.on("exit", (code, signal) => process.exit(code ?? (signal ? 128 + (require("os").constants.signals[signal] ?? 1) : 2)));
  return;
}
require("tsx/cjs/api").register();
const { main } = require("../src/cli/main.ts");
main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
