import { statSync } from 'node:fs';
import { basename } from 'node:path';
import { ExineError } from '../errors.js';
import { withSessionFile } from '../io/session-file-source.js';
import { scanInParallel } from '../log/parallel-scan.js';
import { verdictOf } from '../log/verify-log.js';
import type { OpenEvent, RestorePayload, SessionEvent, VoidPayload } from '../model/events.js';
import { foldEvents } from '../model/fold.js';
import { correctLevel } from '../session/session-files.js';
import type { AuditSource } from './audit-source.js';
import { auditLevel, type AuditOptions } from './level-audit.js';

/** Everything the audit shows, read without a lock and without changing the file. */
export function readForAudit(path: string, options: AuditOptions) {
  const scan = withSessionFile(path, (source) => scanInParallel(source, () => undefined));
  if (scan.corruption || !scan.keymap) {
    throw new ExineError(`${path}: ${scan.corruption?.message}; it cannot be audited until that is explained (exine verify ${path})`);
  }
  const events = scan.events as readonly SessionEvent[];
  const state = foldEvents(events[0] as OpenEvent, scan.keymap, events);
  const verdict = verdictOf(basename(path), scan);
  // Only the last line incomplete: most often a line another exine is writing at this moment.
  const writing = scan.tail !== null && scan.corruption === null;
  return { scan, events, state, verdict, writing, audit: auditLevel(events, state, options) };
}


/** The audit screen's view of a session file: read without a lock, re-read when it grows, corrected by short locked appends. */
export function fileAuditSource(path: string, options: AuditOptions): AuditSource {
  let seen = '';
  const stamp = () => {
    const s = statSync(path);
    return `${s.size}:${s.mtimeMs}`;
  };
  return {
    read: () => {
      seen = stamp();
      return readForAudit(path, options);
    },
    changed: () => stamp() !== seen,
    correct: (payload: VoidPayload | RestorePayload) => {
      correctLevel(path, payload);
    },
  };
}
