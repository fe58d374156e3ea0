import { Box, Text } from 'ink';
import { describeEvent } from '../model/describe-event.js';
import type { SessionEvent } from '../model/events.js';
import { fit } from '../text/cells.js';

/** The last events, newest first; "★" marks the grain that brought a new type into the count. */
export function RecentEvents({ events, room, width, firstSeen, isType }: { events: readonly SessionEvent[]; room: number; width: number; firstSeen: Readonly<Record<string, number>>; isType: (taxon: string) => boolean }) {
  const shown = events.slice(-Math.max(0, room)).reverse();
  return (
    <Box flexDirection="column" width={width}>
      <Text bold>Last recorded</Text>
      {shown.map((e) => {
        const isNew = e.type === 'grain' && firstSeen[e.taxon] === e.seq && isType(e.taxon);
        return <Text key={e.seq} bold={isNew}>{fit(`#${e.seq}${isNew ? '★' : ' '}${describeEvent(e)}${isNew ? ' new' : ''}`, width)}</Text>;
      })}
    </Box>
  );
}
