/**
 * Cell text as a package stores it (ECMA-376 Part 1, §22.9.2.19 ST_Xstring):
 * a character XML 1.0 cannot hold (most C0 controls, U+FFFE/U+FFFF) or
 * would not read back (CR, which XML turns into a line feed) is
 * written `_xHHHH_`, and a literal `_x` that would read as such an escape is
 * written `_x005F_x`. Reading decodes both, so a cell holding ESC reaches the
 * engine as ESC (and the terminal as an escaped \x1b, src/cli/table.ts).
 */
const ESCAPE = /_x([0-9A-Fa-f]{4})_/g;

export function decodeXstring(stored: string): string {
  return stored.includes("_x") ? stored.replace(ESCAPE, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16))) : stored;
}

export function encodeXstring(text: string): string {
  return text
    .replace(/_x(?=[0-9A-Fa-f]{4}_)/g, "_x005F_x")
    .replace(/[\u0000-\u0008\u000B-\u001F\uFFFE\uFFFF]/g, (c) => `_x${c.charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}_`);
}
