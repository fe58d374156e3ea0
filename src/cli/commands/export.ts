import { existsSync } from 'node:fs';
import { basename, resolve } from 'node:path';
import { ExineError, UsageError } from '../../errors.js';
import { toCsv } from '../../export/csv-text.js';
import { LONG_COLUMNS, longRows, NOTE_COLUMNS, noteRows, orderLevels, wideTable, type ExportLevel } from '../../export/level-export.js';
import { refuseOwnInput } from '../../io/same-file.js';
import { writeFileAtomic } from '../../io/write-atomic.js';
import { plural } from '../../text/cells.js';
import { readLevel } from '../../session/session-files.js';
import { writeData, type Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';

const OPTIONS = {
  format: { type: 'string', default: 'long' },
  out: { type: 'string' },
  force: { type: 'boolean', default: false },
} as const;

export function exportCommand(args: string[], io: Io): number {
  const { values, positionals } = parseFlags('export', args, OPTIONS);
  if (positionals.length === 0) throw new UsageError('exine export: give at least one session FILE (see exine export --help)');
  if (values.format !== 'long' && values.format !== 'wide' && values.format !== 'notes') {
    throw new UsageError(`exine export: --format must be long, wide or notes, not "${values.format}"`);
  }
  const out = values.out === undefined ? null : resolve(io.cwd, values.out);
  if (values.out !== undefined) refuseOwnInput('export', values.out, positionals, io.cwd);
  if (out && existsSync(out) && !values.force) throw new ExineError(`${values.out} already exists; add --force to replace it`);
  const levels: ExportLevel[] = positionals.map((file) => {
    const { state, warnings } = readLevel(resolve(io.cwd, file));
    for (const w of warnings) io.stderr.write(`exine: ${w}\n`);
    return { state, source: basename(file) };
  });
  const csv =
    values.format === 'wide'
      ? (({ columns, rows }) => toCsv(columns, rows))(wideTable(levels))
      : values.format === 'notes'
        ? toCsv(NOTE_COLUMNS, noteRows(levels))
        : toCsv(LONG_COLUMNS, longRows(orderLevels(levels)));
  if (out) {
    writeFileAtomic(out, csv, values.force === true);
    io.stderr.write(`exine: wrote ${plural(levels.length, 'level')} to ${values.out}\n`);
  } else writeData(io.stdout, csv);
  return 0;
}
