import { describeRules, normalRules } from '../rules/rule-set.js';
import type { SessionEvent } from './events.js';

/** One short line per event, for the recent-events list and reports. */
export function describeEvent(event: SessionEvent): string {
  switch (event.type) {
    case 'open':
      return `level ${event.level} opened`;
    case 'grain':
      return `${event.cf ? 'cf. ' : ''}${event.taxon} (t${event.traverse})`;
    case 'undo':
      return `undo of #${event.of}`;
    case 'traverse':
      return `traverse ${event.traverse} started`;
    case 'traverse-undo':
      return `back to traverse ${event.traverse} (undo of #${event.of})`;
    case 'reopen':
      return `finished level reopened: ${event.reason}`;
    case 'note':
      return `note${event.grain === null ? '' : ` on #${event.grain}`}${event.stage ? ` @${event.stage.x},${event.stage.y}` : ''}: ${event.text}`;
    case 'taxon':
      return `new type ${event.taxon} (${event.group}) on key ${event.key}`;
    case 'sitting':
      return `sitting ${event.sitting} started`;
    case 'rules':
      return `rules now: ${describeRules(normalRules(event.rules))}${event.spike ? ' (spike data recorded)' : ''}`;
    case 'rules-met':
      return `stop rules met (sum ${event.sum})`;
    case 'rules-unmet':
      return `stop rules no longer met (sum ${event.sum})`;
    case 'void':
      return event.grain !== null ? `void of #${event.grain}: ${event.reason}` : `void of traverse ${event.traverse}: ${event.reason}`;
    case 'restore':
      return `restore of void #${event.of}: ${event.reason}`;
    case 'repair':
      return `tail repaired (${event.cutBytes} bytes cut)`;
    case 'slide':
      return `slide ${event.slide} from traverse ${event.traverse}`;
    case 'close':
      return 'sitting closed';
    case 'finish':
      return 'level finished';
    default:
      return event satisfies never;
  }
}

