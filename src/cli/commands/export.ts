import { existsSync } from 'node:fs';
import { basename, resolve } from 'node:path';
import { ExineError, UsageError } from '../../errors.js';
import { isCoreFolder } from '../../core/read-core.js';
import { toCsv } from '../../export/csv-text.js';
import { exportRefusal } from '../../export/export-guards.js';
import { LONG_COLUMNS, longRows, NOTE_COLUMNS, noteRows, orderLevels, wideTable, type ExportLevel } from '../../export/level-export.js';
import { refuseOwnInput } from '../../io/same-file.js';
import { writeFileAtomic } from '../../io/write-atomic.js';
import { plural } from '../../text/cells.js';
import { readLevel } from '../../session/session-files.js';
import { writeData, type Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';
import { exportCore } from './export-core.js';

const OPTIONS = {
  format: { type: 'string' },
  values: { type: 'string' },
  out: { type: 'string' },
  force: { type: 'boolean', default: false },
  'include-unfinished': { type: 'boolean', default: false },
  'mixed-cores': { type: 'boolean', default: false },
} as const;

export type ExportFlags = ReturnType<typeof parseFlags<typeof OPTIONS>>['values'];

/** Write `csv` to --out (never over a file without --force, atomically) or to stdout. */
export function deliver(io: Io, values: { out?: string | undefined; force?: boolean | undefined }, csv: string, what: string): void {
  if (values.out === undefined) {
    writeData(io.stdout, csv);
    return;
  }
  writeFileAtomic(resolve(io.cwd, values.out), csv, values.force === true);
  io.stderr.write(`exine: wrote ${what} to ${values.out}\n`);
}

export function exportCommand(args: string[], io: Io): number {
  const { values, positionals } = parseFlags('export', args, OPTIONS);
  if (positionals.length === 0) throw new UsageError('exine export: give a core folder DIR or at least one session FILE (see exine export --help)');
  const formats = ['long', 'wide', 'notes', 'taxa'];
  if (values.format !== undefined && !formats.includes(values.format)) {
    throw new UsageError(`exine export: --format must be long, wide, notes or taxa, not "${values.format}"`);
  }
  if (values.values !== undefined && values.values !== 'counts' && values.values !== 'percent') {
    throw new UsageError(`exine export: --values must be counts or percent, not "${values.values}"`);
  }
  const out = values.out === undefined ? null : resolve(io.cwd, values.out);
  if (values.out !== undefined) refuseOwnInput('export', values.out, positionals, io.cwd);
  if (out && existsSync(out) && !values.force) throw new ExineError(`${values.out} already exists; add --force to replace it`);

  const dirs = positionals.filter((p) => isCoreFolder(resolve(io.cwd, p)));
  if (dirs.length > 0) {
    if (positionals.length > 1) throw new UsageError('exine export: give one core folder, or session files, not both or several folders (exine export DIR)');
    return exportCore(resolve(io.cwd, dirs[0] as string), values, io);
  }
  if (values.values !== undefined || values.format === 'taxa') {
    throw new UsageError(`exine export: ${values.values !== undefined ? '--values' : '--format taxa'} is for a core's matrix: exine export DIR (a folder with a core.json)`);
  }
  const levels: ExportLevel[] = positionals.map((file) => {
    const { state, warnings } = readLevel(resolve(io.cwd, file));
    for (const w of warnings) io.stderr.write(`exine: ${w}\n`);
    return { state, source: basename(file) };
  });
  // Files named one by one go out as they stand, finished or not; one core, each session once.
  const refusal = exportRefusal(levels, { core: null, mixedCores: values['mixed-cores'] === true, includeUnfinished: null });
  if (refusal) throw new ExineError(`exine export: ${refusal}`);
  const format = values.format ?? 'long';
  const csv =
    format === 'wide'
      ? (({ columns, rows }) => toCsv(columns, rows))(wideTable(levels))
      : format === 'notes'
        ? toCsv(NOTE_COLUMNS, noteRows(levels))
        : toCsv(LONG_COLUMNS, longRows(orderLevels(levels)));
  deliver(io, values, csv, plural(levels.length, 'level'));
  return 0;
}
