/**
 * Refusal messages are bounded (issue 16), through the built bundle: a
 * user's text is echoed at most ECHO_MAX_CHARS (64) characters, the last one
 * "…" when cut, and no message passes MESSAGE_MAX_CHARS (400). A 1 000 000-
 * character link used to come back in a 1 000 250-character message.
 */
import { call, loadBundle, SpreadsheetError } from "./loadBundle";
import { MESSAGE_MAX_CHARS } from "../../src/functions/errors";
import { ECHO_MAX_CHARS } from "../../src/core/args";

const bundle = loadBundle();
const HUGE = "x".repeat(1_000_000);

function refusal(id: string, ...args: unknown[]): SpreadsheetError {
  const out = call(bundle, id, ...args);
  expect(out).toBeInstanceOf(SpreadsheetError);
  return out as SpreadsheetError;
}

/** The quoted echoes in a message ("…" pieces), for checking their length. */
function echoes(message: string): string[] {
  return [...message.matchAll(/"([^"]*)"/g)].map((m) => m[1]);
}

describe("refusal messages through the bundle", () => {
  it("bounds the stated limits: 64 characters of echo, 400 of message", () => {
    expect([ECHO_MAX_CHARS, MESSAGE_MAX_CHARS]).toEqual([64, 400]);
  });

  it.each([
    ["RATE", "a 1 000 000-character token", [HUGE], "link"],
    ["RATE", "a valid link around a 1 000 000-character token", [`HE MCS9 ${HUGE} 5GHz`], "link"],
    ["TXTIME", "MCS followed by 1 000 000 digits", [`HE MCS${"9".repeat(1_000_000)}`, 1500], "link"],
    ["LINK", "a 1 000 000-character family", [HUGE, 1], "family"],
    ["MPDU", "1 000 000-character mac_options", [1500, HUGE], "mac_options"],
    ["MPDU", "AMSDU= with 1 000 000 digits", [1500, `AMSDU=${"9".repeat(1_000_000)}`], "mac_options"],
    ["ACCESS", "a 1 000 000-character access category", ["HE MCS9 5GHz", 1500, "auto", HUGE], "access"],
    ["MIXSHARE", "a 1 000 000-character link in a range", [[[HUGE]], [[1]], [[1]]], "links"],
  ])("%s with %s: #VALUE! naming its argument in a bounded message", (id, _what, args, name) => {
    const e = refusal(id as string, ...(args as unknown[]));
    expect(e.code).toBe("#VALUE!");
    expect(e.message.startsWith(`${name}:`)).toBe(true);
    expect(e.message.length).toBeLessThanOrEqual(MESSAGE_MAX_CHARS);
    const echoed = echoes(e.message);
    expect(echoed.some((q) => q.length === ECHO_MAX_CHARS && q.endsWith("…"))).toBe(true);
    expect(echoed.every((q) => q.length <= ECHO_MAX_CHARS)).toBe(true);
  });

  it("keeps a short token whole", () => {
    expect(refusal("RATE", "HE MCS9 bogus7 5GHz").message).toMatch(/^link: unknown token "bogus7";/);
  });

  it("never cuts between the two halves of a surrogate pair", () => {
    // 63 ASCII characters then an emoji (two UTF-16 code units) straddling the cut
    const e = refusal("RATE", `${"a".repeat(62)}\u{1F4F6}${"b".repeat(100)}`);
    const echoed = echoes(e.message)[0];
    expect(echoed).toBe(`${"a".repeat(62)}…`);
    expect(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])/.test(e.message)).toBe(false);
  });
});
