import { Box, useApp } from 'ink';
import { useEffect, useRef, useState } from 'react';
import type { AuditRead, AuditSource } from '../audit/audit-source.js';
import type { RestorePayload, VoidPayload } from '../model/events.js';
import { auditKey, START_UI, type AuditUi, type AuditView } from './audit-keys.js';
import { auditScreenView, keyViewOf } from './audit-view.js';
import { StyledLines, StyledText } from './styled-text.js';
import { useTerminalSize } from './terminal-size.js';
import { themeFor } from './theme.js';
import { useRawKeys } from './use-raw-keys.js';

/** "void of grain #12", "void of traverse 3", "restore of void #20": for the message after recording. */
function correctionWords(c: VoidPayload | RestorePayload): string {
  if (c.type === 'restore') return `restore of void #${c.of}`;
  return c.grain !== null ? `void of grain #${c.grain}` : `void of traverse ${c.traverse}`;
}

/** The audit screen: keys go through the pure reducer (audit-keys.ts), corrections to the source, and the view (audit-view.ts) is drawn. */
export function AuditScreen({ source, columns, rows, pollMs = 1000 }: { source: AuditSource; columns?: number; rows?: number; pollMs?: number }) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const theme = themeFor();
  const [read, setRead] = useState<AuditRead>(() => source.read());
  const [ui, setUi] = useState<AuditUi>(START_UI);
  // Keys are applied to these, never to values captured at the last render; the key view is made once per read.
  const viewRef = useRef<AuditView | null>(null);
  viewRef.current ??= keyViewOf(read);
  const uiRef = useRef(ui);
  const adopt = (next: AuditRead) => {
    viewRef.current = keyViewOf(next);
    setRead(next);
  };

  // Follow the file while another exine counts it.
  useEffect(() => {
    const timer = setInterval(() => {
      try {
        if (source.changed()) adopt(source.read());
      } catch (error) {
        uiRef.current = { ...uiRef.current, message: `could not re-read the file: ${(error as Error).message}` };
        setUi(uiRef.current);
      }
    }, pollMs);
    timer.unref?.();
    return () => clearInterval(timer);
  }, [source, pollMs]);

  useRawKeys((presses) => {
    for (const press of presses) {
      let next = auditKey(uiRef.current, press, viewRef.current as AuditView);
      if (next.pending) {
        try {
          source.correct(next.pending);
          adopt(source.read());
          next = { ...next, pending: null, message: `recorded: ${correctionWords(next.pending)}, "${next.pending.reason}"` };
        } catch (error) {
          next = { ...next, pending: null, message: `not recorded: ${(error as Error).message}` };
        }
      }
      uiRef.current = next;
      if (next.quit) {
        setUi(next);
        exit();
        return;
      }
    }
    setUi(uiRef.current);
  });

  const view = auditScreenView(read, ui, { columns: columns ?? terminal.columns, rows: rows ?? terminal.rows }, viewRef.current.statusOf);
  return (
    <Box flexDirection="column" width={view.width} height={view.height}>
      <StyledLines lines={view.top} theme={theme} />
      <Box flexDirection="column" height={view.body.height} {...(view.body.clip ? { overflow: 'hidden' as const } : {})}>
        <StyledLines lines={view.body.lines} theme={theme} />
      </Box>
      <Box height={view.promptHeight} overflow="hidden">
        <StyledText line={view.prompt} theme={theme} />
      </Box>
      <StyledText line={view.keys} theme={theme} />
    </Box>
  );
}
