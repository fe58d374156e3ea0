import { basename, resolve } from 'node:path';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS, type AuditOptions } from '../../audit/level-audit.js';
import { plainReport } from '../../audit/plain-report.js';
import { readForAudit } from '../../audit/read-audit.js';
import { UsageError } from '../../errors.js';
import { drawLiveOnThisTerminal } from '../interactive-terminal.js';
import type { Io } from '../io.js';
import { parseFlags, positiveInteger } from '../parse-flags.js';
import { requireTerminal } from './count.js';

const OPTIONS = {
  plain: { type: 'boolean', default: false },
  'double-press': { type: 'string' },
  gap: { type: 'string' },
} as const;

export async function auditCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseFlags('audit', args, OPTIONS);
  if (positionals.length !== 1) throw new UsageError('exine audit: give one session FILE (see exine audit --help)');
  const path = resolve(io.cwd, positionals[0] as string);
  const options: AuditOptions = {
    doublePressMs: positiveInteger('audit', 'double-press', values['double-press']) ?? DEFAULT_DOUBLE_PRESS_MS,
    gapMs: (positiveInteger('audit', 'gap', values.gap) ?? DEFAULT_GAP_MS / 60_000) * 60_000,
  };
  const read = readForAudit(path, options);
  if (values.plain) {
    io.stdout.write(plainReport(basename(path), read.state, read.audit, read.verdict));
    return 0;
  }
  requireTerminal('audit', io);
  drawLiveOnThisTerminal();
  const { runAuditScreen } = await import('../../screens/run-audit-screen.js');
  return runAuditScreen(path, options);
}
