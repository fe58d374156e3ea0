/**
 * The columns (traverses) of the evenness table while small ones are merged:
 * a linked list in traverse order, a heap of column totals to find the smallest,
 * and a count of columns by total to judge Cochran's rule, so each merge costs
 * O(rows + log N) instead of rebuilding the table.
 */
export class Columns {
  readonly traverses: number[][];
  readonly totals: number[];
  private readonly prev: number[];
  private readonly next: number[];
  private readonly alive: boolean[];
  private live: number;
  private readonly heap: [number, number][] = [];
  /** Fenwick tree over column totals 0…N: how many live columns have each total. */
  private readonly tree: Int32Array;

  constructor(
    traverses: readonly number[],
    totals: readonly number[],
    private readonly grandTotal: number,
  ) {
    const c = traverses.length;
    this.traverses = traverses.map((t) => [t]);
    this.totals = [...totals];
    this.prev = Array.from({ length: c }, (_, j) => j - 1);
    this.next = Array.from({ length: c }, (_, j) => (j + 1 < c ? j + 1 : -1));
    this.alive = Array(c).fill(true);
    this.live = c;
    this.tree = new Int32Array(grandTotal + 2);
    for (let j = 0; j < c; j++) {
      this.count(this.totals[j] as number, 1);
      this.push(j);
    }
  }

  get size(): number {
    return this.live;
  }

  /** Live columns, in traverse order. */
  order(): number[] {
    const out: number[] = [];
    let j = this.alive.indexOf(true);
    for (; j !== -1; j = this.next[j] as number) out.push(j);
    return out;
  }

  /** Live columns with a total of at most `x`. */
  atMost(x: number): number {
    let n = 0;
    for (let i = Math.min(x, this.grandTotal) + 1; i > 0; i -= i & -i) n += this.tree[i] as number;
    return n;
  }

  /** The smallest total among live columns. */
  smallest(): number {
    return this.totals[this.top()] as number;
  }

  /**
   * Merge the smallest column (the leftmost of equal ones) into a neighbour: the
   * only one at an end, else the smaller of the two (the left one on a tie).
   * Returns [kept, removed]: the caller adds the removed column's counts to the kept one.
   */
  mergeSmallest(): [number, number] {
    const j = this.top();
    const p = this.prev[j] as number;
    const n = this.next[j] as number;
    const k = p === -1 ? n : n === -1 ? p : (this.totals[p] as number) <= (this.totals[n] as number) ? p : n;
    const [a, b] = p === k ? [k, j] : [j, k];
    this.count(this.totals[a] as number, -1);
    this.count(this.totals[b] as number, -1);
    this.totals[a] = (this.totals[a] as number) + (this.totals[b] as number);
    this.traverses[a] = [...(this.traverses[a] as number[]), ...(this.traverses[b] as number[])];
    this.count(this.totals[a] as number, 1);
    this.alive[b] = false;
    this.live--;
    const after = this.next[b] as number;
    this.next[a] = after;
    if (after !== -1) this.prev[after] = a;
    this.push(a);
    return [a, b];
  }

  private count(total: number, delta: number): void {
    for (let i = total + 1; i < this.tree.length; i += i & -i) this.tree[i] = (this.tree[i] as number) + delta;
  }

  /** Heap entries are [total, column]; a column's traverse order is its index order, so ties go to the leftmost. */
  private push(j: number): void {
    const h = this.heap;
    h.push([this.totals[j] as number, j]);
    for (let i = h.length - 1; i > 0; ) {
      const up = (i - 1) >> 1;
      if (!less(h[i] as [number, number], h[up] as [number, number])) break;
      [h[i], h[up]] = [h[up] as [number, number], h[i] as [number, number]];
      i = up;
    }
  }

  /** The live column with the smallest total; stale entries (merged away or grown) are dropped as they surface. */
  private top(): number {
    const h = this.heap;
    for (;;) {
      const [total, j] = h[0] as [number, number];
      if (this.alive[j] && this.totals[j] === total) return j;
      const last = h.pop() as [number, number];
      if (h.length === 0) throw new Error('no live column');
      h[0] = last;
      for (let i = 0; ; ) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < h.length && less(h[l] as [number, number], h[m] as [number, number])) m = l;
        if (r < h.length && less(h[r] as [number, number], h[m] as [number, number])) m = r;
        if (m === i) break;
        [h[i], h[m]] = [h[m] as [number, number], h[i] as [number, number]];
        i = m;
      }
    }
  }
}

const less = (x: readonly [number, number], y: readonly [number, number]) => x[0] < y[0] || (x[0] === y[0] && x[1] < y[1]);
