import { Box, Text } from 'ink';
import { describeEvent } from '../session/describe-event.js';
import type { SessionEvent } from '../session/events.js';
import { fit } from '../text/cells.js';

export function RecentEvents({ events, room, width }: { events: readonly SessionEvent[]; room: number; width: number }) {
  const shown = events.slice(-Math.max(0, room)).reverse();
  return (
    <Box flexDirection="column" width={width}>
      <Text bold>Last recorded</Text>
      {shown.map((e) => (
        <Text key={e.seq}>{fit(`#${e.seq} ${describeEvent(e)}`, width)}</Text>
      ))}
    </Box>
  );
}
