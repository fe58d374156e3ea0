import { Box, useApp } from 'ink';
import { useEffect, useRef, useState } from 'react';
import { builderKey, type BuilderUi } from './keymap-builder-keys.js';
import { builderLines } from './keymap-builder-view.js';
import { StyledLines } from './styled-text.js';
import { useTerminalSize } from './terminal-size.js';
import { themeFor } from './theme.js';
import { useRawKeys } from './use-raw-keys.js';

/** The keymap builder: keys go through the pure reducer (keymap-builder-keys.ts); `onDone` gets the result. */
export function KeymapBuilder({ start, file, onDone, columns, rows }: { start: BuilderUi; file: string; onDone: (ui: BuilderUi) => void; columns?: number; rows?: number }) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const theme = themeFor();
  const [ui, setUi] = useState(start);
  // Keys are applied to this, never to a value captured at the last render: Ink hands several keys to one callback.
  const uiRef = useRef(start);
  useRawKeys((presses) => {
    for (const press of presses) uiRef.current = builderKey(uiRef.current, press);
    setUi(uiRef.current);
  });
  useEffect(() => {
    if (ui.done) {
      onDone(ui);
      exit();
    }
  }, [ui, onDone, exit]);
  return (
    <Box flexDirection="column">
      <StyledLines lines={builderLines(ui, file, columns ?? terminal.columns, rows ?? terminal.rows)} theme={theme} />
    </Box>
  );
}
