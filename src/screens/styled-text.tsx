import { Box, Text } from 'ink';
import type { Line, Panel, Span } from './styled-line.js';
import type { Theme } from './theme.js';
// Every text drawn passes here: names from a keymap or level from elsewhere cannot act on the terminal.
import { visible } from '../text/visible.js';

function styleOf(span: Span, theme: Theme) {
  const { bold, inverse, tone } = span;
  return {
    ...(bold === undefined ? {} : { bold }),
    ...(inverse === undefined ? {} : { inverse }),
    ...(tone === undefined ? {} : tone === 'dim' ? { dimColor: theme.dim } : { color: theme[tone] }),
  };
}

const plain = (span: Span) => !span.bold && !span.inverse && span.tone === undefined;

/** One line of a view: a Text, with a nested Text for each span that carries a style of its own. */
export function StyledText({ line, theme }: { line: Line; theme: Theme }) {
  const [only, ...more] = line.spans;
  if (only && more.length === 0) {
    return (
      <Text wrap={line.wrap} {...styleOf(only, theme)}>
        {visible(only.text)}
      </Text>
    );
  }
  return (
    <Text wrap={line.wrap}>
      {line.spans.map((s, i) =>
        plain(s) ? (
          visible(s.text)
        ) : (
          <Text key={i} {...styleOf(s, theme)}>
            {visible(s.text)}
          </Text>
        ),
      )}
    </Text>
  );
}

export function StyledLines({ lines, theme }: { lines: readonly Line[]; theme: Theme }) {
  return lines.map((l, i) => <StyledText key={i} line={l} theme={theme} />);
}

export function PanelBox({ panel, theme }: { panel: Panel; theme: Theme }) {
  return (
    <Box flexDirection="column" width={panel.width} {...(panel.height === undefined ? {} : { height: panel.height })}>
      <StyledLines lines={panel.lines} theme={theme} />
    </Box>
  );
}
