import type { Verdict } from '../log/verify-log.js';
import { formatDuration } from '../text/durations.js';
import type { LevelState } from '../model/level-state.js';
import { slideCounts, slideNames } from '../model/slides.js';
import { fit, plural, right } from '../text/cells.js';
import { perMinute } from '../text/numbers.js';
import { localClock, localDateTime } from '../text/local-time.js';
import { describeCell, POOLED } from './evenness.js';
import { describeCorrection, timelineBar, type LevelAudit, type TraverseRow } from './level-audit.js';

/** Local date and time with the zone: the file keeps UTC, the analyst reads the clock on the wall. */
const day = (iso: string | null) => (iso ? localDateTime(iso) : '–');

/** The evenness test in words, a few lines. */
export function evennessLines(audit: LevelAudit): string[] {
  const ev = audit.evenness;
  if (!ev.ok) return [`Evenness across traverses: not tested (${ev.reason}).`];
  const { result, pooledTaxa, mergedTraverses, flagged, taxa } = ev.test;
  const lines = [
    `Evenness across traverses (χ² test of homogeneity, ${taxa.length} types × ${ev.test.columns.length} traverses): X² = ${result.statistic.toFixed(2)}, df = ${result.df}, p = ${result.p < 0.001 ? result.p.toExponential(1) : result.p.toFixed(3)}${result.p < 0.05 ? ': the types are NOT spread alike across traverses' : ': no sign that the types are spread unevenly'}.`,
  ];
  lines.push(`  types tested: ${taxa.join(', ')}`);
  if (pooledTaxa.length) lines.push(`  ${plural(pooledTaxa.length, 'rare type')} pooled as "${POOLED}" so that expected counts are large enough (Cochran 1954).`);
  if (mergedTraverses.length) lines.push(`  small traverses merged: ${mergedTraverses.map((c) => c.join('+')).join(', ')}.`);
  for (const cell of flagged) lines.push(`  ${describeCell(cell)}`);
  if (flagged.length) lines.push('  (with many cells, about 1 in 20 passes ±2 by chance alone)');
  return lines;
}

/** The new types of a traverse, other groups apart; or that it is empty. */
function traverseNews(t: TraverseRow): string {
  if (t.empty) return t.takenBack ? `empty: the change to it was taken back (#${t.takenBack})` : 'empty: no grain recorded';
  return [t.newTypes.join(', '), t.newOthers.length ? `other groups: ${t.newOthers.join(', ')}` : ''].filter(Boolean).join(' · ');
}

/** The cf. grains that count, by taxon, with the traverses they are in. */
function cfLines(audit: LevelAudit): string[] {
  const byTaxon = new Map<string, { n: number; traverses: number[] }>();
  for (const t of audit.traverses) {
    for (const [taxon, n] of t.cf) {
      const entry = byTaxon.get(taxon) ?? { n: 0, traverses: [] };
      entry.n += n;
      entry.traverses.push(t.traverse);
      byTaxon.set(taxon, entry);
    }
  }
  const total = [...byTaxon.values()].reduce((a, e) => a + e.n, 0);
  if (total === 0) return ['cf. grains: none'];
  return [
    `cf. grains (${total}; each counts with its taxon)`,
    ...[...byTaxon.entries()].map(([taxon, e]) => `  ${taxon}: ${e.n} cf. (traverse${e.traverses.length === 1 ? '' : 's'} ${e.traverses.join(', ')})`),
  ];
}

/** A finished level counted on: when, and why. */
function reopenLines(audit: LevelAudit): string[] {
  const reopens = audit.traverses.flatMap((t) => t.events).filter((e) => e.type === 'reopen');
  return reopens.length ? [`Reopened after finishing (${reopens.length})`, ...reopens.map((e) => `  #${e.seq} ${day(e.at)}: "${e.reason}"`), ''] : [];
}

/** Grains per slide, when the level was counted on more than one. */
function slideLines(state: LevelState): string[] {
  if (state.slides.length < 2) return [];
  return ['', 'Slides', ...slideCounts(state).map((s) => `  ${fit(s.slide ?? '–', Math.max(12, ...slideNames(state).map((n) => [...n].length)))}  from traverse ${right(String(s.firstTraverse), 3)}  ${plural(s.grains, 'grain')}`)];
}

/** The audit as text, for a lab notebook or an appendix. */
export function plainReport(name: string, state: LevelState, audit: LevelAudit, verdict: Verdict): string {
  const h = state.header;
  const where = [h.site, h.core].filter(Boolean).join(' ');
  // A slide column only for a level counted on more than one slide.
  const several = state.slides.length > 1;
  const slideWidth = Math.max(5, ...slideNames(state).map((n) => [...n].length));
  const lines: string[] = [
    `Audit of ${name}`,
    `${where ? `${where} · ` : ''}level ${h.level}${h.depth === null ? '' : ` · depth ${h.depth}`} · ${state.slides.length > 1 ? 'slides' : 'slide'} ${slideNames(state).join(', ')} · analyst ${h.analyst ?? '–'}`,
    `keymap "${state.keymap.name}" · counted ${day(audit.firstAt)} to ${day(audit.lastAt)} · ${state.finishedAt ? `finished ${day(state.finishedAt)}` : 'not finished'}`,
    // The verdict's own words say intact; damage is said loudly.
    `integrity: ${verdict.intact ? '' : 'DAMAGED: '}${verdict.summary}`,
    ...verdict.warnings.map((w) => `  warning: ${w}`),
    '',
    `${plural(audit.grains, 'grain')} counted · ${plural(audit.traverses.length, 'traverse')} · ${plural(audit.sittings.length, 'sitting')} · counting time ${formatDuration(audit.countingMs)} · ${perMinute(audit.perMinute)} grains/min`,
    '',
    'Sittings',
    ...audit.sittings.flatMap((s) => [
      `  ${right(String(s.sitting), 2)}  ${day(s.start)} – ${localClock(s.end, false)}  counting ${formatDuration(s.countingMs)}  ${plural(s.grains, 'grain')} recorded${s.pauses.length ? `  pauses: ${s.pauses.map((p) => `${Math.round(p.ms / 60_000)} min after #${p.afterSeq}`).join(', ')}` : ''}${s.closedCleanly ? '' : '  (not closed cleanly)'}`,
      `      ${localClock(s.start, false)} ${timelineBar(s, 48)} ${localClock(s.end, false)}`,
    ]),
    ...slideLines(state),
    '',
    'Traverses',
    `  ${right('#', 3)}  ${several ? `${fit('slide', slideWidth)}  ` : ''}${fit('start', 22)}  ${right('time', 8)}  ${right('grains', 6)}  ${right('types', 5)}  ${right('/min', 5)}  ${right('new', 3)}  ${right('undo', 4)}  ${right('void', 4)}  ${right('notes', 5)}  new types`,
    ...audit.traverses.map(
      (t) =>
        `  ${right(String(t.traverse), 3)}  ${several ? `${fit(t.slide ?? '–', slideWidth)}  ` : ''}${fit(day(t.start), 22)}  ${right(formatDuration(t.activeMs), 8)}  ${right(String(t.grains), 6)}  ${right(String(t.types), 5)}  ${right(perMinute(t.perMinute), 5)}  ${right(String(t.newTypes.length), 3)}  ${right(String(t.undos), 4)}  ${right(String(t.voided), 4)}  ${right(String(t.notes), 5)}  ${traverseNews(t)}${t.voidedWhole ? `  VOIDED: ${t.voidedWhole.reason}` : ''}`,
    ),
    '  (types: pollen and spore types, as the counting screen counts them; markers, indeterminables and other taxa are listed apart)',
    '',
    ...cfLines(audit),
    '',
    ...evennessLines(audit),
    '',
    audit.flags.length ? `Flags for review (${audit.flags.length})` : 'Flags for review: none',
    ...audit.flags.map((f) => `  [${f.kind}] ${f.text}`),
    '',
    state.notes.length ? `Notes (${state.notes.length})` : 'Notes: none',
    ...state.notes.map((n) => `  #${n.seq} on ${n.grain === null ? 'the level' : `grain #${n.grain} ${n.taxon ?? '?'}, traverse ${n.traverse ?? '?'}`}${n.stage ? `, stage ${n.stage.x}, ${n.stage.y}` : ''}: ${n.text}`),
    ...(state.addedTypes.length ? [`Types added while counting: ${state.addedTypes.map((t) => `${t} (key ${Object.entries(state.keymap.keys).find(([, b]) => b.taxon === t)?.[0] ?? '?'})`).join(', ')}`] : []),
    '',
    ...reopenLines(audit),
    audit.corrections.length ? `Corrections (${audit.corrections.length})` : 'Corrections: none',
    ...audit.corrections.map((c) => `  #${c.seq} ${day(c.at)}  ${describeCorrection(c)}`),
  ];
  return `${lines.join('\n')}\n`;
}
