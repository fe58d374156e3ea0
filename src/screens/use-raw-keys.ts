import { useStdin } from 'ink';
import { useEffect, useRef } from 'react';
import { splitRaw, type KeyPress } from '../input/key-press.js';

/**
 * Keys as the terminal sent them, every one once and in order. Ink's useInput
 * reads an Esc and the key after it as one Alt+key press (and drops the Esc, or
 * the key), so the screens listen to Ink's raw input events instead: the same
 * single reader of stdin, before Ink's key parsing.
 */
export function useRawKeys(handler: (keys: KeyPress[]) => void): void {
  const { setRawMode, internal_eventEmitter: events } = useStdin();
  const latest = useRef(handler);
  latest.current = handler;
  useEffect(() => {
    setRawMode(true);
    return () => setRawMode(false);
  }, [setRawMode]);
  useEffect(() => {
    const onInput = (data: string) => latest.current(splitRaw(data));
    events.on('input', onInput);
    return () => {
      events.removeListener('input', onInput);
    };
  }, [events]);
}
