/**
 * Bounded memos (src/core/memo.ts, issue 16): by entries, by the characters
 * of their keys, and never a key over its longest bound. The link-text and
 * link-facts memos are checked through memoStats after real parses.
 */
import { BoundedMemo, memoStats, parseLink, rateMbps } from "../../src/core";

describe("BoundedMemo", () => {
  it("drops the oldest entry when the entry count is over its bound", () => {
    const m = new BoundedMemo<number>("test entries", 2, 1000, 100);
    m.set("a", 1);
    m.set("b", 2);
    m.set("c", 3);
    expect([m.get("a"), m.get("b"), m.get("c")]).toEqual([undefined, 2, 3]);
    expect(m.stats()).toMatchObject({ entries: 2, keyChars: 2 });
  });

  it("drops the oldest entries until the key characters fit (3 + 5 + 5 > 10)", () => {
    const m = new BoundedMemo<number>("test chars", 100, 10, 5);
    m.set("abc", 1);
    m.set("defgh", 2);
    m.set("ijklm", 3);
    expect([m.get("abc"), m.get("defgh"), m.get("ijklm")]).toEqual([undefined, 2, 3]);
    expect(m.stats()).toMatchObject({ entries: 2, keyChars: 10 });
  });

  it("never stores a key longer than its longest-key bound, and keeps what it held", () => {
    const m = new BoundedMemo<number>("test longest", 100, 1000, 5);
    m.set("abc", 1);
    m.set("abcdef", 2);
    expect([m.get("abc"), m.get("abcdef")]).toEqual([1, undefined]);
    expect(m.stats()).toMatchObject({ entries: 1, keyChars: 3 });
  });

  it("counts a key set twice once", () => {
    const m = new BoundedMemo<number>("test again", 100, 1000, 100);
    m.set("abc", 1);
    m.set("abc", 2);
    expect(m.get("abc")).toBe(2);
    expect(m.stats()).toMatchObject({ entries: 1, keyChars: 3 });
  });
});

describe("the link memos under long distinct texts", () => {
  const stats = (name: string) => memoStats().find((s) => s.name === name)!;
  // 3000 distinct valid texts of 900 characters each: 2 700 000 key characters offered.
  const sp = (n: number) => " ".repeat(n);
  // Three runs of spaces, the first two set by i, the third filling the text to 900: "HE MCS9" "2SS" "80MHz" "5GHz" are 19 characters.
  const texts = Array.from({ length: 3000 }, (_, i) => {
    const [a, b] = [1 + (i % 400), 1 + Math.floor(i / 400)];
    return `HE MCS9${sp(a)}2SS${sp(b)}80MHz${sp(900 - 19 - a - b)}5GHz`;
  });

  it("the texts are distinct, 900 characters long and valid", () => {
    expect(new Set(texts).size).toBe(texts.length);
    expect(texts.every((t) => t.length === 900)).toBe(true);
    expect(parseLink(texts[0]).text).toBe("HE MCS9 2SS 80MHz GI0.8 5GHz");
  });

  it.each(["link text", "link facts"])("%s holds no more key characters than its bound", (name) => {
    for (const t of texts) rateMbps(t);
    const s = stats(name);
    expect(s.keyChars).toBeLessThanOrEqual(s.maxKeyChars);
    expect(s.entries).toBeLessThanOrEqual(s.maxEntries);
    expect(s.entries).toBeGreaterThan(0);
  });

  it("does not memoise a text over 1024 characters", () => {
    const expected = rateMbps("HE MCS9 2SS 20MHz 5GHz");
    const before = stats("link text");
    const huge = `HE MCS9 2SS${" ".repeat(5000)}5GHz`;
    expect(rateMbps(huge)).toBe(expected);
    const after = stats("link text");
    expect([after.entries, after.keyChars]).toEqual([before.entries, before.keyChars]); // nothing added, nothing dropped
  });
});
