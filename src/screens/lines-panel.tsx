import { Box, Text } from 'ink';

/** A panel of prepared lines, its first line the title. */
export function LinesPanel({ lines, width }: { lines: readonly string[]; width: number }) {
  return (
    <Box flexDirection="column" width={width}>
      {lines.map((line, i) => (
        <Text key={i} bold={i === 0}>
          {line}
        </Text>
      ))}
    </Box>
  );
}
