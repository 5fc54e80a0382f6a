/**
 * LibreOffice Calc headless as the reference engine: convert a workbook to
 * .xlsx with a private user profile whose setting makes Calc recalculate
 * every formula on load (OOXMLRecalcMode = 0, "always"), then read the values
 * it stored. Tests also write deliberately wrong cached values, so a value
 * Calc did not recompute is caught.
 */
import { execFileSync, spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import type { Value } from "../../../src/cli/engine";
import { loadPackage } from "../../../src/cli/xlsxRead";

/** The soffice binary, or undefined (with the reason) when LibreOffice is not installed. */
export function findSoffice(): { bin?: string; why?: string } {
  for (const bin of ["soffice", "libreoffice"]) {
    const r = spawnSync(bin, ["--version"], { encoding: "utf8" });
    if (r.status === 0) return { bin };
  }
  return { why: "LibreOffice (soffice) is not installed: apt-get install -y libreoffice-calc-nogui (.ci/run does this)" };
}

const PROFILE_SETTINGS = `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
`;

/** Recalculate `file` with LibreOffice; returns the path of the workbook it wrote. */
export function recalcWithLibreOffice(bin: string, file: string): string {
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-lo-"));
  const profile = path.join(work, "profile");
  fs.mkdirSync(path.join(profile, "user"), { recursive: true });
  fs.writeFileSync(path.join(profile, "user", "registrymodifications.xcu"), PROFILE_SETTINGS);
  const outDir = path.join(work, "out");
  execFileSync(bin, [`-env:UserInstallation=file://${profile}`, "--headless", "--norestore", "--convert-to", "xlsx", "--outdir", outDir, file], { stdio: "pipe", timeout: 180_000 });
  const out = path.join(outDir, path.basename(file).replace(/\.[^.]+$/, "") + ".xlsx");
  if (!fs.existsSync(out)) throw new Error(`LibreOffice wrote nothing for ${file}`);
  return out;
}

/** Every stored cell value (constants and formulas' cached results), by "Sheet!row,col". */
export async function storedValues(file: string): Promise<Map<string, Value>> {
  const loaded = await loadPackage(file);
  loaded.pkg.close();
  const out = new Map<string, Value>();
  for (const s of loaded.book.sheets) for (const c of s.cells) if (c.value !== undefined) out.set(`${s.name}!${c.row},${c.col}`, c.value);
  return out;
}

/** Same value within 1e-9 relative for numbers, same code for errors, same text and logical values. */
export function sameValue(a: Value | undefined, b: Value | undefined): boolean {
  const norm = (v: Value | undefined) => (v === undefined || v === null ? "" : v);
  const x = norm(a);
  const y = norm(b);
  if (typeof x === "number" && typeof y === "number") return Math.abs(x - y) <= 1e-9 * Math.max(1, Math.abs(y));
  if (typeof x === "object" && typeof y === "object") return x.error === y.error;
  return x === y;
}
