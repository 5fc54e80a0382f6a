/**
 * CHAR, CODE, UNICHAR, UNICODE and REPT with the host's rules: CHAR and CODE
 * use the Windows-1252 character set ("ANSI", the set the host's function
 * reference names for Windows; LibreOffice's CHAR converts from the same code
 * page), UNICHAR and UNICODE code points; every result is capped at the
 * host's 32 767 characters per cell (#VALUE!), checked before the text is
 * built so REPT("a",1E9) costs nothing.
 */
import { MAX_TEXT } from "./evaluate";
import { NA, VALUE, type Value } from "./values";

/**
 * Windows-1252 bytes 0x80–0x9F (Unicode's published mapping, MAPPINGS/VENDORS/MICSFT/WINDOWS/CP1252.TXT);
 * the five unassigned bytes keep their C1 code points, as the WHATWG Encoding standard decodes them.
 * Written out because Node's TextDecoder("windows-1252") decodes these bytes as Latin-1.
 */
const HIGH_1252 = "\u20ac\u0081\u201a\u0192\u201e\u2026\u2020\u2021\u02c6\u2030\u0160\u2039\u0152\u008d\u017d\u008f\u0090\u2018\u2019\u201c\u201d\u2022\u2013\u2014\u02dc\u2122\u0161\u203a\u0153\u009d\u017e\u0178";
/** The 256 characters of Windows-1252 by byte: Latin-1 except 0x80–0x9F. */
const WINDOWS_1252 = Array.from({ length: 256 }, (_, i) => (i >= 0x80 && i <= 0x9f ? HIGH_1252[i - 0x80] : String.fromCharCode(i))).join("");
const BYTE_OF = new Map([...WINDOWS_1252].map((c, i) => [c, i]));

export function char(n: number): Value {
  const k = Math.trunc(n);
  return k < 1 || k > 255 ? VALUE(`CHAR takes a code from 1 to 255, not ${n}`) : WINDOWS_1252[k];
}

/** The code of the first character; one outside Windows-1252 is 63 ("?"), as the host converts it. */
export function code(s: string): Value {
  if (s === "") return VALUE("CODE of empty text");
  return BYTE_OF.get(String.fromCodePoint(s.codePointAt(0)!)) ?? 63;
}

export function unichar(n: number): Value {
  const k = Math.trunc(n);
  if (k < 1 || k > 0x10ffff) return VALUE(`UNICHAR takes a code point from 1 to 1114111, not ${n}`);
  if (k >= 0xd800 && k <= 0xdfff) return NA(`UNICHAR: ${k} is a surrogate, not a character`);
  return String.fromCodePoint(k);
}

export function unicode(s: string): Value {
  return s === "" ? VALUE("UNICODE of empty text") : s.codePointAt(0)!;
}

export function rept(s: string, n: number): Value {
  const k = Math.trunc(n);
  if (k < 0) return VALUE(`REPT: the count ${n} is negative`);
  if (s.length * k > MAX_TEXT) return VALUE(`REPT: the text would be ${s.length * k} characters; the limit is ${MAX_TEXT}`);
  return s.repeat(k);
}
