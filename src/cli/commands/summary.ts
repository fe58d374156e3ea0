import { resolve } from 'node:path';
import { UsageError } from '../../errors.js';
import { levelSummary, type LevelSummary } from '../../export/level-summary.js';
import { readLevel } from '../../session/session-files.js';
import { ci, fit, plural, pct, right } from '../../text/cells.js';
import { terminalJson, type Io } from '../io.js';
import { localDateTime } from '../../text/local-time.js';
import { parseFlags, positiveInteger } from '../parse-flags.js';

const OPTIONS = {
  json: { type: 'boolean', default: false },
  rarefy: { type: 'string', multiple: true },
} as const;

const fixed = (v: number | null, places: number) => (v === null ? '–' : v.toFixed(places));

function ruleValue(rule: string, v: number | null): string {
  if (v === null) return '–';
  if (rule === 'coverage') return v.toFixed(4);
  if (rule === 'precision') return v.toFixed(2);
  if (rule === 'conc-error') return `${(100 * v).toFixed(1)}%`;
  return String(v);
}

function needText(r: LevelSummary['rules'][number]): string {
  if (r.met) return 'met';
  if (r.grainsNeeded === null) return r.note ?? 'unknown';
  return `about ${r.grainsNeeded} more grains${r.note ? ` (${r.note})` : ''}`;
}

function textReport(s: LevelSummary): string[] {
  const where = [s.site, s.core].filter(Boolean).join(' ');
  const lines = [
    `${where ? `${where} · ` : ''}level ${s.level}${s.depth === null ? '' : ` (depth ${s.depth})`} · ${s.slides.length > 1 ? 'slides' : 'slide'} ${s.slides.map((c) => c.slide ?? '–').join(', ')}${s.analyst ? ` · ${s.analyst}` : ''}`,
    s.finishedAt ? `finished ${localDateTime(s.finishedAt)}` : s.reopens ? 'reopened after finishing; not finished again yet' : 'not finished yet (counting in progress)',
    `pollen sum ${s.pollenSum} · ${plural(s.grains, 'grain')} · ${plural(s.types, 'type')} in the sum · ${plural(s.traverses, 'traverse')} · ${plural(s.sittings, 'sitting')}${s.voided ? ` · ${plural(s.voided, 'grain')} voided in the audit` : ''}`,
    ...(s.slides.length > 1 ? [`by slide: ${s.slides.map((c) => `${c.slide ?? '–'} ${plural(c.grains, 'grain')} (sum ${c.pollenSum}, from traverse ${c.firstTraverse})`).join(' · ')}`] : []),
    `groups: ${s.groupOrder.filter((g) => (s.groups[g] ?? 0) > 0 || s.sumGroups.includes(g))
      .map((g) => `${g} ${s.groups[g]}${s.sumGroups.includes(g) ? '' : '*'}`)
      .join(' · ')}`,
    '',
    `stop rules: ${s.ruleSet} — ${s.met ? 'MET' : s.grainsNeeded === null ? 'not met' : `not met (about ${s.grainsNeeded} more grains)`}`,
    ...s.rules.map((r) => `  ${fit(r.label, Math.max(22, ...s.rules.map((q) => [...q.label].length)))} ${right(ruleValue(r.rule, r.value), 7)} of ${fit(ruleValue(r.rule, r.target), 6)} ${needText(r)}`),
    ...(s.firstMet ? [`  first met at pollen sum ${s.firstMet.sum} (${localDateTime(s.firstMet.at)})`] : []),
    '',
    `coverage ${fixed(s.coverage, 4)} (Chao & Jost 2012) · Good–Turing ${fixed(s.goodTuring, 4)} · grains since a new type ${s.sinceNewType}`,
    s.chao1
      ? `Chao1 richness ${s.chao1.estimate.toFixed(1)} (s.e. ${s.chao1.se.toFixed(1)}, 95% ${s.chao1.low.toFixed(1)}–${s.chao1.high.toFixed(1)}; ${s.chao1.variant})`
      : 'Chao1 richness –',
    ...s.rarefaction.map((r) => (r.expected === null ? `E(S_${r.n}) – (the sum is below ${r.n})` : `E(S_${r.n}) ${r.expected.toFixed(2)} (s.e. ${(r.se as number).toFixed(2)})`)),
  ];
  const c = s.concentration;
  if (c) {
    const unit = c.unit === 'grains/cm3' ? 'grains/cm³' : 'grains/g';
    lines.push(
      c.value === null
        ? `concentration –: no marker counted yet (${s.markers} markers)`
        : `concentration ${Math.round(c.value)} ${unit} (${c.relativeError === null ? 'relative error undefined until pollen is counted' : `±${(100 * c.relativeError).toFixed(1)}%`}, 95% ${Math.round(c.low ?? 0)}–${Math.round(c.high ?? 0)}) from ${s.markers} markers${c.influx === null ? '' : ` · influx ${Math.round(c.influx)} grains/cm²/yr`}`,
    );
  }
  if (s.notes.length || s.addedTypes.length) {
    lines.push(
      `${plural(s.notes.length, 'note')}${s.notes.length ? ' (exine export --format notes lists them)' : ''}${s.addedTypes.length ? ` · added while counting: ${s.addedTypes.join(', ')}` : ''}`,
    );
  }
  lines.push(
    '',
    `${fit('taxon', 22)} ${fit('group', 14)} ${right('count', 6)} ${right('%', 6)}  ${fit('95% Wilson', 12)} ${fit('exact', 12)} simultaneous`,
    ...s.taxa
      .filter((r) => r.count > 0)
      .map(
        (r) =>
          `${fit(r.taxon, 22)} ${fit(r.group, 14)} ${right(String(r.count), 6)} ${right(pct(r.percent), 6)}  ${fit(ci(r.ciLow, r.ciHigh), 12)} ${fit(ci(r.exactLow, r.exactHigh), 12)} ${ci(r.simultaneousLow, r.simultaneousHigh)}${r.inSum ? '' : ' *'}${r.cf ? `  (${r.cf} of them cf.)` : ''}`,
      ),
    '',
    '* outside the pollen sum: percent of the sum plus its own group',
    ...(s.taxa.some((r) => r.cf) ? ['cf.: grains whose identification is probable, not certain; they count with their taxon'] : []),
  );
  return lines;
}

export function summaryCommand(args: string[], io: Io): number {
  const { values, positionals } = parseFlags('summary', args, OPTIONS);
  if (positionals.length !== 1) throw new UsageError('exine summary: give one session FILE (see exine summary --help)');
  const rarefyAt = (values.rarefy ?? []).map((v) => positiveInteger('summary', 'rarefy', v) as number);
  const { state, warnings } = readLevel(resolve(io.cwd, positionals[0] as string));
  for (const w of warnings) io.stderr.write(`exine: ${w}\n`);
  const summary = levelSummary(state, rarefyAt);
  io.stdout.write(values.json ? `${terminalJson(JSON.stringify(summary, null, 2))}\n` : `${textReport(summary).join('\n')}\n`);
  return 0;
}
