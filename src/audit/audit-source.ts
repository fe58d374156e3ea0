import type { Verdict } from '../log/verify-log.js';
import type { RestorePayload, VoidPayload } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';
import type { LevelAudit } from './level-audit.js';

export interface AuditRead {
  readonly state: LevelState;
  readonly audit: LevelAudit;
  readonly verdict: Verdict;
  /** True when only the last line is incomplete: it is being written, or a crash cut it (exine count repairs it). */
  readonly writing?: boolean;
}

/** Where the audit screen reads from and writes corrections to; the CLI reads the file, tests may do the same. */
export interface AuditSource {
  read(): AuditRead;
  /** Has the file changed since the last read? Polled once a second. */
  changed(): boolean;
  correct(payload: VoidPayload | RestorePayload): void;
}
