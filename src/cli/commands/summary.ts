import { resolve } from 'node:path';
import { UsageError } from '../../errors.js';
import { GROUPS } from '../../keymap/groups.js';
import { readLevel } from '../../session/session-files.js';
import { levelTable } from '../../stats/level-table.js';
import { ci, fit, plural, pct, right } from '../../text/cells.js';
import { parseFlags } from '../parse-flags.js';

export function summaryCommand(args: string[]): number {
  const { values, positionals } = parseFlags('summary', args, { json: { type: 'boolean', default: false } });
  if (positionals.length !== 1) throw new UsageError('exine summary: give one session FILE (see exine summary --help)');
  const { state, warnings } = readLevel(resolve(positionals[0] as string));
  for (const w of warnings) process.stderr.write(`exine: ${w}\n`);
  const table = levelTable(state);
  const h = state.header;
  if (values.json) {
    const out = {
      level: h.level,
      depth: h.depth,
      site: h.site,
      core: h.core,
      slide: h.slide,
      analyst: h.analyst,
      keymap: state.keymap.name,
      pollenSum: table.pollenSum,
      grains: table.grains,
      types: table.rows.filter((r) => r.count > 0).length,
      targetSum: state.rules.targetSum,
      targetReached: table.pollenSum >= state.rules.targetSum,
      traverses: state.traverse,
      sittings: state.sitting,
      closedCleanly: state.closed,
      finishedAt: state.finishedAt,
      groups: table.groupTotals,
      taxa: table.rows.map((r) => ({
        key: r.key,
        taxon: r.taxon,
        group: r.group,
        inSum: r.inSum,
        count: r.count,
        basis: r.basis,
        percent: r.percent,
        ciLow: r.ciLow,
        ciHigh: r.ciHigh,
      })),
    };
    process.stdout.write(`${JSON.stringify(out, null, 2)}\n`);
    return 0;
  }
  const where = [h.site, h.core].filter(Boolean).join(' ');
  const lines = [
    `${where ? `${where} · ` : ''}level ${h.level}${h.depth === null ? '' : ` (depth ${h.depth})`} · slide ${h.slide ?? '–'}${h.analyst ? ` · ${h.analyst}` : ''}`,
    state.finishedAt ? `finished ${state.finishedAt.slice(0, 10)}` : 'not finished yet (counting in progress)',
    `pollen sum ${table.pollenSum} of target ${state.rules.targetSum}${table.pollenSum >= state.rules.targetSum ? ' (reached)' : ''} · ${plural(table.grains, 'grain')} · ${plural(state.traverse, 'traverse')} · ${plural(state.sitting, 'sitting')}`,
    `groups: ${GROUPS.filter((g) => table.groupTotals[g] > 0 || table.sumGroups.includes(g))
      .map((g) => `${g} ${table.groupTotals[g]}${table.sumGroups.includes(g) ? '' : '*'}`)
      .join(' · ')}`,
    '',
    `${fit('taxon', 22)} ${fit('group', 14)} ${right('count', 6)} ${right('%', 6)}  95% CI (Wilson)`,
    ...table.rows
      .filter((r) => r.count > 0)
      .map((r) => `${fit(r.taxon, 22)} ${fit(r.group, 14)} ${right(String(r.count), 6)} ${right(pct(r.percent), 6)}  ${ci(r.ciLow, r.ciHigh)}${r.inSum ? '' : ' *'}`),
    '',
    '* outside the pollen sum: percent of the sum plus its own group',
  ];
  process.stdout.write(`${lines.join('\n')}\n`);
  return 0;
}
