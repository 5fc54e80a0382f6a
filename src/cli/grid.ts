/**
 * Sparse storage of one sheet's cells: a map of columns, each an array
 * indexed by row. A column filled from the top is a plain packed array (fast,
 * small); a lone far-corner cell makes its column a dictionary-mode array,
 * one entry, so XFD1048576 costs what A1 costs. (A single map keyed by
 * row × 16384 + column needs keys past 2^31, which are boxed heap numbers:
 * three times the memory and time on a million-row sheet.)
 */
export class Grid<T> {
  private readonly cols = new Map<number, T[]>();
  private readonly counts = new Map<number, number>();
  size = 0;

  get(row: number, col: number): T | undefined {
    const a = this.cols.get(col);
    return a === undefined ? undefined : a[row];
  }

  has(row: number, col: number): boolean {
    return this.get(row, col) !== undefined;
  }

  set(row: number, col: number, v: T): void {
    let a = this.cols.get(col);
    if (!a) {
      a = [];
      this.cols.set(col, a);
    }
    if (a[row] === undefined) {
      this.size++;
      this.counts.set(col, (this.counts.get(col) ?? 0) + 1);
    }
    a[row] = v;
  }

  delete(row: number, col: number): void {
    const a = this.cols.get(col);
    if (a && a[row] !== undefined) {
      (a as (T | undefined)[])[row] = undefined;
      this.size--;
      this.counts.set(col, this.counts.get(col)! - 1);
    }
  }

  /** Visit every cell (column by column); sparse columns are walked by their keys, not their length. */
  forEach(visit: (row: number, col: number, v: T) => void): void {
    for (const [col, a] of this.cols) {
      const n = this.counts.get(col)!;
      if (n * 8 < a.length) {
        for (const k in a) {
          const v = a[k as unknown as number];
          if (v !== undefined) visit(Number(k), col, v);
        }
      } else for (let r = 0; r < a.length; r++) if (a[r] !== undefined) visit(r, col, a[r]);
    }
  }

  /** Values of every cell. */
  values(): T[] {
    const out: T[] = [];
    this.forEach((_r, _c, v) => out.push(v));
    return out;
  }
}
