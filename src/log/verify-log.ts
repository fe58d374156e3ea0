import { closedAfter } from '../model/event-kinds.js';
import { plural } from '../text/cells.js';
import type { LogScan } from './scan-log.js';

export interface Verdict {
  readonly intact: boolean;
  /** One line for the person who asked. */
  readonly summary: string;
  readonly warnings: readonly string[];
}

/** Judge a scanned session file: any damage is a failure here, even the kind `count` may repair. */
export function verdictOf(name: string, scan: LogScan): Verdict {
  const damage = scan.corruption ?? scan.tail;
  const warnings: string[] = [];
  let previous = '';
  for (const event of scan.events) {
    if (previous && event.at < previous) {
      warnings.push(`line ${event.seq}: time ${event.at} is earlier than the line before (${previous}); the clock was changed?`);
    }
    previous = event.at;
  }
  if (damage) {
    const kept = scan.lines;
    return { intact: false, summary: `${name}: ${damage.message} (${plural(kept, 'line')} before it ${kept === 1 ? 'is' : 'are'} intact)`, warnings };
  }
  const closed = scan.events.reduce((c, e) => closedAfter(c, e.type), false);
  return {
    intact: true,
    summary: `${name}: intact, ${scan.lines} lines, chain verified, last hash ${scan.lastHash}${closed ? '' : '; not closed cleanly (the last sitting was stopped or is still open)'}`,
    warnings,
  };
}
