import { describeEvent } from '../model/describe-event.js';
import type { SessionEvent } from '../model/events.js';
import { fit } from '../text/cells.js';
import { line, type Line } from './styled-line.js';

/** An undo names the grain it took back when that grain is still among the recent events. */
function describeRecent(e: SessionEvent, events: readonly SessionEvent[]): string {
  if (e.type !== 'undo') return describeEvent(e);
  const g = events.find((x) => x.seq === e.of);
  return g?.type === 'grain' ? `undo of #${e.of} ${g.cf ? 'cf. ' : ''}${g.taxon} (t${g.traverse})` : describeEvent(e);
}

/** The last events, newest first; "★" marks the grain that brought a new type into the count. */
export function recentLines(events: readonly SessionEvent[], room: number, width: number, firstSeen: Readonly<Record<string, number>>, isType: (taxon: string) => boolean): Line[] {
  const shown = events.slice(-Math.max(0, room)).reverse();
  return [
    line('Last recorded', { bold: true }),
    ...shown.map((e) => {
      const isNew = e.type === 'grain' && firstSeen[e.taxon] === e.seq && isType(e.taxon);
      return line(fit(`#${e.seq}${isNew ? '★' : ' '}${describeRecent(e, events)}${isNew ? ' new' : ''}`, width), { bold: isNew });
    }),
  ];
}
