import type { CoreModel } from './core-model.js';
import { suggestionText } from './next-words.js';

/** What `exine core DIR --json` prints: every row, the distances, flags, suggestion and strips. */
export function coreJson(model: CoreModel) {
  const { config, rows, next, strips } = model;
  return {
    dir: model.dir,
    site: config.site,
    core: config.core,
    levels: rows.map((r) => ({
      depth: r.depth,
      file: r.file,
      status: r.status,
      pollenSum: r.pollenSum,
      grains: r.grains,
      targetSum: r.targetSum,
      rules: r.rulesText,
      grainsNeeded: r.grainsNeeded,
      markers: r.markers,
      concentration: r.concentration,
      sittings: r.sittings,
      countingMs: r.countingMs,
      analyst: r.analyst,
      lastAt: r.lastAt,
      integrity: r.integrity,
      slides: r.slides,
      outside: r.outside,
      odd: r.depth !== null && r.shares !== null && next.odd.some((o) => o.depth === r.depth),
    })),
    distance: 'squared chord of pollen-sum proportions (Overpeck, Webb & Prentice 1985)',
    distances: next.distances,
    median: next.median,
    threshold: next.threshold,
    odd: next.odd,
    suggestion: { ...next.suggestion, text: suggestionText(next) },
    strips: strips.map((s) => ({ name: s.name, group: s.group, max: s.max, mean: s.mean, percent: s.values })),
  };
}
