import { inPollenSum } from '../keymap/keymap.js';
import type { GrainChain, LevelCounts } from './level-counts.js';
import { rarefy } from './rarefaction.js';

export interface SaturationCurve {
  /** Grains of the pollen sum counted. */
  readonly grains: number;
  /** Types of the sum found after n grains, for n = 0 … grains (observed[0] = 0): a step line. */
  readonly observed: readonly number[];
  /** E(S_n) of the present counts (Hurlbert 1971) at the grain numbers in `at`. */
  readonly expected: readonly number[];
  readonly at: readonly number[];
  readonly sinceNewType: number;
}

/**
 * Types found against grains counted, in the order they were counted, beside the
 * rarefaction expectation of the counts as they stand (Birks & Line 1992 for
 * pollen). `points` sample the expectation, enough for the width of a plot.
 */
export function saturationCurve(state: LevelCounts, points = 60): SaturationCurve {
  const sumGrains: { seq: number; taxon: string }[] = [];
  for (let s = state.stack; s; s = s.below) if (inPollenSum(state.keymap, s.taxon)) sumGrains.push({ seq: s.seq, taxon: s.taxon });
  sumGrains.reverse();
  const observed = [0];
  let types = 0;
  for (const g of sumGrains) {
    if (state.firstSeen[g.taxon] === g.seq) types++;
    observed.push(types);
  }
  return withExpected(state, observed, points);
}

function withExpected(state: LevelCounts, observed: readonly number[], points: number): SaturationCurve {
  const counts = Object.entries(state.counts)
    .filter(([taxon]) => inPollenSum(state.keymap, taxon))
    .map(([, c]) => c);
  const n = observed.length - 1;
  const at = n === 0 ? [] : [...new Set(Array.from({ length: Math.min(points, n) }, (_, i) => Math.max(1, Math.round(((i + 1) * n) / Math.min(points, n)))))];
  const expected = at.map((k) => rarefy(counts, k, false)?.expected ?? 0);
  return { grains: n, observed, expected, at, sinceNewType: state.sinceNewType };
}

/**
 * saturationCurve for a screen that redraws after every key: it keeps the grains of the last
 * state it saw and, since the fold shares the unchanged bottom of the stack between states,
 * walks the new stack only down to the first grain it already holds. A grain costs one step,
 * an undo a few; a void or restore rebuilds from the grain it touched (a property test holds
 * it equal to saturationCurve after any sequence). The `observed` it returns is its own
 * array: read it before the next call.
 */
export class LiveSaturationCurve {
  /** The grains held, oldest first: their seqs rise, as the stack's fall from its top. */
  private nodes: GrainChain[] = [];
  /** As in SaturationCurve: observed[k] is the types among the first k grains of the sum in `nodes`. */
  private observed: number[] = [0];
  private inSum: boolean[] = [];
  private readonly seen = new Map<string, number>();
  private keymap: LevelCounts['keymap'] | null = null;

  curve(state: LevelCounts, points = 60): SaturationCurve {
    if (state.keymap !== this.keymap) this.reset(state.keymap);
    if (this.nodes.length === 0) {
      this.build(state.stack);
      return withExpected(state, this.observed, points);
    }
    const fresh: GrainChain[] = [];
    let s = state.stack;
    let held = -1;
    while (s && (held = this.heldAt(s)) < 0) {
      fresh.push(s);
      s = s.below;
    }
    this.truncate(s ? held + 1 : 0);
    for (let i = fresh.length - 1; i >= 0; i--) this.push(fresh[i] as GrainChain);
    return withExpected(state, this.observed, points);
  }

  /** Where this very node is held, or -1: found by its seq, so no index of 100,000 nodes is kept. */
  private heldAt(node: GrainChain): number {
    let lo = 0;
    let hi = this.nodes.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const m = this.nodes[mid] as GrainChain;
      if (m.seq === node.seq) return m === node ? mid : -1;
      if (m.seq < node.seq) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  }

  private reset(keymap: LevelCounts['keymap']): void {
    this.keymap = keymap;
    this.truncate(0);
  }

  private truncate(length: number): void {
    while (this.nodes.length > length) {
      const node = this.nodes.pop() as GrainChain;
      if (this.inSum.pop()) {
        this.observed.pop();
        const left = (this.seen.get(node.taxon) as number) - 1;
        if (left === 0) this.seen.delete(node.taxon);
        else this.seen.set(node.taxon, left);
      }
    }
  }

  /**
   * The first call (a resumed level of 100,000 grains): the stack read into place in one pass
   * and the curve in another, with one lookup of a taxon per grain; the same arrays push makes.
   */
  private build(stack: GrainChain | null): void {
    const keymap = this.keymap as LevelCounts['keymap'];
    for (let s = stack; s; s = s.below) this.nodes.push(s);
    this.nodes.reverse();
    const taxa = new Map<string, { sum: boolean; grains: number }>();
    let types = 0;
    for (const node of this.nodes) {
      let taxon = taxa.get(node.taxon);
      if (taxon === undefined) taxa.set(node.taxon, (taxon = { sum: inPollenSum(keymap, node.taxon), grains: 0 }));
      this.inSum.push(taxon.sum);
      if (!taxon.sum) continue;
      if (taxon.grains++ === 0) types++;
      this.observed.push(types);
    }
    for (const [name, taxon] of taxa) if (taxon.grains > 0) this.seen.set(name, taxon.grains);
  }

  private push(node: GrainChain): void {
    this.nodes.push(node);
    const sum = inPollenSum(this.keymap as LevelCounts['keymap'], node.taxon);
    this.inSum.push(sum);
    if (!sum) return;
    const before = this.seen.get(node.taxon) ?? 0;
    this.seen.set(node.taxon, before + 1);
    this.observed.push((this.observed.at(-1) as number) + (before === 0 ? 1 : 0));
  }
}
