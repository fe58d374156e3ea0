import type { LevelState, SlideSpan } from './level-state.js';

/** The slide a grain (or note) of this seq was counted on: the last slide that started before it. */
export function slideOf(slides: readonly SlideSpan[], seq: number): string | null {
  let lo = 0;
  let hi = slides.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if ((slides[mid] as SlideSpan).seq < seq) lo = mid;
    else hi = mid - 1;
  }
  return slides[lo]?.slide ?? null;
}

export interface SlideCounts {
  readonly slide: string | null;
  /** Grains still counted that were found on this slide. */
  readonly grains: number;
  readonly counts: Readonly<Record<string, number>>;
  readonly firstTraverse: number;
}

/**
 * The grains still counted, slide by slide, in the order the slides were used. A
 * slide named twice (counting went back to it) is one entry.
 */
export function slideCounts(state: Pick<LevelState, 'slides' | 'stack'>): SlideCounts[] {
  const out = new Map<string | null, { slide: string | null; grains: number; counts: Record<string, number>; firstTraverse: number }>();
  for (const s of state.slides) if (!out.has(s.slide)) out.set(s.slide, { slide: s.slide, grains: 0, counts: {}, firstTraverse: s.traverse });
  for (let g = state.stack; g; g = g.below) {
    const entry = out.get(slideOf(state.slides, g.seq));
    if (!entry) continue;
    entry.grains++;
    entry.counts[g.taxon] = (entry.counts[g.taxon] ?? 0) + 1;
  }
  return [...out.values()];
}

/** The slide names in order of use, "–" for an unnamed one. */
export const slideNames = (state: Pick<LevelState, 'slides'>): string[] => [...new Set(state.slides.map((s) => s.slide ?? '–'))];

/** The slide traverse `t` was counted on: the last slide whose first traverse is at or before it. */
export function slideOfTraverse(slides: readonly SlideSpan[], t: number): string | null {
  let found: string | null = slides[0]?.slide ?? null;
  for (const s of slides) if (s.traverse <= t) found = s.slide;
  return found;
}
