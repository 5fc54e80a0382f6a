/**
 * The core as a consumer of the library runs it: src/core bundled into one
 * CommonJS file by esbuild (scope-hoisted, like the add-in's webpack bundle)
 * and required. Running the TypeScript sources through tsx instead would
 * time tsx's module interop — every call between core modules goes through
 * an export getter — rather than the core.
 */
import { buildSync } from "esbuild";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";

export type Core = typeof import("../src/core/index");

export function loadCoreLibrary(): Core {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-core-"));
  const outfile = path.join(dir, "core.js");
  buildSync({
    entryPoints: [path.resolve(__dirname, "../src/core/index.ts")],
    bundle: true,
    format: "cjs",
    platform: "neutral",
    target: "es2019",
    outfile,
    logLevel: "error",
  });
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const core = require(outfile) as Core;
  fs.rmSync(dir, { recursive: true, force: true });
  return core;
}
