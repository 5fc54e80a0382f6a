/**
 * CHAR and CODE over the Windows-1252 character set, the set the host's CHAR
 * reference names for Windows (from memory), checked against an independent
 * decoder: Python's cp1252 codec (the mapping Unicode publishes as
 * MAPPINGS/VENDORS/MICSFT/WINDOWS/CP1252.TXT). LibreOffice on Linux cannot
 * check the bytes over 127 (it decodes them as UTF-8; test/cli/support/
 * coverageBook.ts "CHAR above 127"), so the 128 high bytes are checked here.
 */
import { spawnSync } from "child_process";
import { evaluateFormula } from "../../src/cli/engine";

const python = spawnSync("python3", ["-c", "import sys, json; print(json.dumps([bytes([b]).decode('cp1252', errors='replace') for b in range(128, 256)]))"], { encoding: "utf8" });
const reference: string[] | undefined = python.status === 0 ? JSON.parse(python.stdout) : undefined;
const none = new Map();

(reference ? describe : describe.skip)("CHAR and CODE against Python's cp1252 codec", () => {
  it("CHAR(b) is the cp1252 character of every byte 128–255 that cp1252 assigns", () => {
    const wrong = reference!.flatMap((ch, i) => (ch === "\ufffd" || evaluateFormula(`=CHAR(${128 + i})`, none) === ch ? [] : [128 + i]));
    expect(wrong).toEqual([]);
  });

  it("CODE of each of those characters gives its byte back; a character outside the set is 63", () => {
    const wrong = reference!.flatMap((ch, i) => (ch === "\ufffd" || evaluateFormula(`=CODE("${ch}")`, none) === 128 + i ? [] : [128 + i]));
    expect([wrong, evaluateFormula('=CODE("\u0101")', none)]).toEqual([[], 63]);
  });
});

if (!reference) console.log(`SKIPPED: python3 not available (${python.error?.message ?? python.stderr})`);
