/**
 * Memo caches bounded by size as well as entries (issue 16), measured on the
 * built bundle: a child node process (`--expose-gc`) loads dist/functions.js
 * in a bare vm context, measures the heap after a full collection, calls
 * RATE, TXTIME and SATURATE with 2048 distinct 100 000-character link texts
 * (valid ones padded with spaces, and unknown tokens), drops its own
 * references, collects again and reports what the bundle still holds. The
 * texts alone are 2048 × 100 000 one-byte characters ≈ 205 MB; a control run
 * in the same child keeps the texts in an array, to show the measurement
 * sees them.
 */
import { spawnSync } from "child_process";
import * as path from "path";
import { DIST } from "./loadBundle";

const TEXTS = 2048;
const TEXT_CHARS = 100_000;
const MB = 1024 * 1024;

const CHILD = `
const fs = require("fs"), vm = require("vm");
class SpreadsheetError extends Error { constructor(code, message) { super(message); this.code = code; } }
const fns = new Map();
vm.runInContext(fs.readFileSync(${JSON.stringify(path.join(DIST, "functions.js"))}, "utf8"),
  vm.createContext({ CustomFunctions: { associate: (id, f) => fns.set(id, f), Error: SpreadsheetError, ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A" } } }));
const heap = () => { gc(); gc(); return process.memoryUsage().heapUsed; };
const call = (id, ...args) => { try { return fns.get(id)(...args); } catch (e) { return e; } };
function text(i) {
  const pad = " ".repeat(${TEXT_CHARS} - "HE MCS9 2SS 80MHz 5GHz".length);
  // even: a valid link padded with spaces (distinct by where the padding sits); odd: an unknown token
  return i % 2 === 0 ? "HE MCS9" + pad.slice(0, i) + " 2SS 80MHz" + pad.slice(i) + " 5GHz" : "x".repeat(${TEXT_CHARS} - 8) + String(i).padStart(8, "0");
}
function run(keep) {
  const kept = [];
  let answered = 0;
  for (let i = 0; i < ${TEXTS}; i++) {
    const t = text(i);
    if (t.length !== ${TEXT_CHARS}) throw new Error("text " + i + " has " + t.length + " characters");
    for (const r of [call("RATE", t), call("TXTIME", t, 1500), call("SATURATE", t, 4, 1500)]) if (r !== undefined) answered++;
    if (keep) kept.push(t);
  }
  return { kept, answered };
}
const before = heap();
const measured = run(false);
const afterBundle = heap();
const control = run(true);
const afterControl = heap();
process.stdout.write(JSON.stringify({ before, afterBundle, afterControl, answered: measured.answered, keptTexts: control.kept.length }));
`;

describe("memo caches under long link texts (built bundle, measured heap)", () => {
  it(`hold a few MB, not ${TEXTS} × ${TEXT_CHARS} characters, after ${TEXTS} distinct long link texts`, () => {
    const child = spawnSync(process.execPath, ["--expose-gc", "--max-old-space-size=1024", "-e", CHILD], { encoding: "utf8", timeout: 120_000 });
    expect(child.stderr).toBe("");
    const r = JSON.parse(child.stdout) as { before: number; afterBundle: number; afterControl: number; answered: number; keptTexts: number };
    expect(r.answered).toBe(3 * TEXTS); // every call answered (a number or an error), none threw past the wrapper
    const retainedMB = (r.afterBundle - r.before) / MB;
    const controlMB = (r.afterControl - r.afterBundle) / MB;
    console.log(`heap held by the bundle's memos after ${TEXTS} texts: ${retainedMB.toFixed(1)} MB; control (texts kept): ${controlMB.toFixed(1)} MB`);
    // The control shows the heap measure sees the texts: ≈ 2048 × 100 000 bytes.
    expect(controlMB).toBeGreaterThan((TEXTS * TEXT_CHARS) / MB / 2);
    // Bound: link texts over 1024 characters are never memoised; the rest is the memos' fixed bounds.
    expect(retainedMB).toBeLessThan(16);
  });
});
