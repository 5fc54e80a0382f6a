/**
 * Memo caches bounded by entries and by the characters of their keys
 * (STYLE.md: module state only as bounded caches; issue 16). A cache keyed by
 * text a user typed is bounded by size as well as count: 2048 entries of
 * 100 000-character link texts would otherwise hold about 200 MB.
 *
 * - A key longer than `longestKeyChars` is never stored (the answer is
 *   computed again on each call — correct, only slower, for text no sheet
 *   repeats), so one huge text cannot flush the whole memo either.
 * - Otherwise the oldest entries are dropped (first in, first out, as the
 *   Map keeps insertion order) until both the entry count and the total key
 *   characters fit.
 * Values must be small and bounded on their own (a parsed Link, a number
 * table, an error whose message echoes at most ECHO_MAX_CHARS of the input).
 *
 *   const m = new BoundedMemo<number>("example", 2, 10, 5);
 *   m.set("abc", 1); m.set("defgh", 2); m.set("ijklm", 3);   // "abc" dropped: 3 + 5 + 5 > 10
 *   m.get("abc") → undefined;  m.get("ijklm") → 3
 */
import { detachedCopy } from "./args";

export interface MemoStats {
  readonly name: string;
  readonly entries: number;
  /** Sum of the lengths (UTF-16 code units) of the keys held. */
  readonly keyChars: number;
  readonly maxEntries: number;
  readonly maxKeyChars: number;
  readonly longestKeyChars: number;
}

/** Every memo of the core, for memoStats(). */
const registry: BoundedMemo<unknown>[] = [];

export class BoundedMemo<V> {
  private readonly entries = new Map<string, V>();
  private keyChars = 0;

  /** longestKeyChars must not exceed maxKeyChars, so a stored key always fits on its own. */
  constructor(
    readonly name: string,
    readonly maxEntries: number,
    readonly maxKeyChars: number,
    readonly longestKeyChars: number,
  ) {
    registry.push(this as BoundedMemo<unknown>);
  }

  get(key: string): V | undefined {
    return this.entries.get(key);
  }

  /** Remember `value` under `key`, unless the key is longer than `longestKeyChars`. */
  set(key: string, value: V): void {
    if (key.length > this.longestKeyChars) return;
    const previous = this.entries.get(key);
    if (previous !== undefined) this.entries.delete(key);
    else this.keyChars += key.length;
    // A key may be a substring viewing a much larger input (args.ts detachedCopy): store a copy of its own.
    this.entries.set(detachedCopy(key), value);
    if (this.entries.size > this.maxEntries || this.keyChars > this.maxKeyChars) this.evict();
  }

  /** Drop the oldest entries until both bounds hold. */
  private evict(): void {
    for (const oldest of this.entries.keys()) {
      if (this.entries.size <= this.maxEntries && this.keyChars <= this.maxKeyChars) return;
      this.entries.delete(oldest);
      this.keyChars -= oldest.length;
    }
  }

  clear(): void {
    this.entries.clear();
    this.keyChars = 0;
  }

  stats(): MemoStats {
    return { name: this.name, entries: this.entries.size, keyChars: this.keyChars, maxEntries: this.maxEntries, maxKeyChars: this.maxKeyChars, longestKeyChars: this.longestKeyChars };
  }
}

/** Size of every memo the core holds (tests and diagnostics). */
export function memoStats(): MemoStats[] {
  return registry.map((m) => m.stats());
}
