import { existsSync } from 'node:fs';
import { basename, join, resolve } from 'node:path';
import { ExineError } from '../../errors.js';
import { CORE_FILE } from '../../core/core-file.js';
import { readCoreFolder } from '../../core/read-core.js';
import { coreMatrix, TAXA_COLUMNS, taxaRows } from '../../export/core-matrix.js';
import { toCsv } from '../../export/csv-text.js';
import { exportRefusal, nameFiles } from '../../export/export-guards.js';
import { LONG_COLUMNS, longRows, NOTE_COLUMNS, noteRows, orderLevels, type ExportLevel } from '../../export/level-export.js';
import { mergeSynonyms } from '../../export/merge-synonyms.js';
import { plural } from '../../text/cells.js';
import { refuseOwnInput } from '../../io/same-file.js';
import { writeData, type Io } from '../io.js';
import { deliver, type ExportFlags } from './export.js';

/** Beside the matrix out.csv, its taxa and their groups: out.taxa.csv. */
export const taxaFileOf = (out: string) => `${out.replace(/\.csv$/i, '')}.taxa.csv`;

/**
 * A core folder's export: its levels in depth order, guarded (one core, each
 * session once, finished levels that met their rules), synonyms merged and the
 * merges said on stderr and listed in the taxa table.
 */
export function exportCore(dir: string, values: ExportFlags, io: Io): number {
  const format = values.format ?? 'wide';
  if (format === 'wide' && values.out !== undefined && existsSync(taxaFileOf(resolve(io.cwd, values.out))) && !values.force) {
    throw new ExineError(`${taxaFileOf(values.out)} already exists; add --force to replace it and ${values.out}`);
  }
  const core = readCoreFolder(dir);
  const unreadable = core.levels.filter((l) => !l.state);
  if (unreadable.length) {
    throw new ExineError(`exine export: ${nameFiles(unreadable.map((l) => l.file))} cannot be read (${unreadable[0]?.error}); exine verify shows why, and nothing was exported`);
  }
  if (values.out !== undefined) {
    // core.json is read too, and the wide matrix writes its taxa table beside the output.
    const inputs = [...core.levels.map((l) => l.path), join(resolve(io.cwd, dir), CORE_FILE)];
    refuseOwnInput('export', values.out, inputs, io.cwd);
    if (format === 'wide') refuseOwnInput('export', taxaFileOf(values.out), inputs, io.cwd);
  }
  if (core.levels.length === 0) throw new ExineError(`exine export: ${dir} has no level yet; count one with exine count ${dir} --depth D`);
  for (const l of core.levels) for (const w of l.warnings) io.stderr.write(`exine: ${w}\n`);
  const levels: ExportLevel[] = core.levels.map((l) => ({ state: l.state as NonNullable<typeof l.state>, source: l.file }));
  const refusal = exportRefusal(levels, {
    core: { site: core.config.site, core: core.config.core },
    mixedCores: values['mixed-cores'] === true,
    includeUnfinished: values['include-unfinished'] === true,
  });
  if (refusal) throw new ExineError(`exine export: ${refusal}`);

  // Synonyms merged level by level; what was merged is said once per pair.
  const said = new Map<string, { levels: number; grains: number; groupChange: string | null }>();
  const mergedFrom = new Map<string, string[]>();
  const merged = levels.map((l) => {
    const { state, merges } = mergeSynonyms(l.state, core.config.synonyms);
    for (const m of merges) {
      const key = `${m.from}\u0000${m.to}`;
      const before = said.get(key) ?? { levels: 0, grains: 0, groupChange: m.groupChange ? `${m.groupChange.from} → ${m.groupChange.to}` : null };
      said.set(key, { ...before, levels: before.levels + 1, grains: before.grains + m.grains });
      const list = mergedFrom.get(m.to) ?? [];
      if (!list.includes(m.from)) mergedFrom.set(m.to, [...list, m.from]);
    }
    return { state, source: l.source };
  });
  for (const [key, m] of said) {
    const [from, to] = key.split('\u0000');
    io.stderr.write(`exine: merged ${from} into ${to} (synonym in core.json): ${plural(m.grains, 'grain')} in ${plural(m.levels, 'level')}${m.groupChange ? `; its grains now count as ${m.groupChange.split(' → ')[1]}, not ${m.groupChange.split(' → ')[0]}` : ''}\n`);
  }

  const what = plural(levels.length, 'level');
  if (format === 'long' || format === 'notes') {
    deliver(io, values, format === 'long' ? toCsv(LONG_COLUMNS, longRows(orderLevels(merged))) : toCsv(NOTE_COLUMNS, noteRows(merged)), what);
    return 0;
  }
  const matrix = coreMatrix(merged, { values: values.values === 'percent' ? 'percent' : 'counts', summaryGroups: core.config.summaryGroups, mergedFrom });
  const taxaCsv = toCsv(TAXA_COLUMNS, taxaRows(matrix.taxa));
  if (format === 'taxa') {
    deliver(io, values, taxaCsv, `the taxa of ${what}`);
    return 0;
  }
  const csv = toCsv(matrix.columns, matrix.rows);
  if (values.out === undefined) {
    writeData(io.stdout, csv);
    io.stderr.write(`exine: ${what}; each taxon's group: exine export ${basename(dir)} --format taxa (written beside the matrix with --out)\n`);
    return 0;
  }
  deliver(io, values, csv, what);
  deliver(io, { out: taxaFileOf(values.out), force: values.force }, taxaCsv, `each taxon's group and the synonyms merged`);
  return 0;
}
