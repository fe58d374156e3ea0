import type { render } from 'ink-testing-library';
import { expect, onTestFinished } from 'vitest';
import { until } from './until.js';

export { until } from './until.js';

type Rendered = ReturnType<typeof render>;

/**
 * An Ink screen from ink-testing-library, driven as a terminal would. Ink reads
 * each write to stdin at once, so keys reach the screen's state as they are typed;
 * frames and effects (bells) follow later. Tests wait for what the screen shows,
 * never for a time.
 */
export async function driveScreen(ui: Rendered) {
  // A screen left mounted would keep its clock ticking for the rest of the worker's files.
  onTestFinished(() => ui.unmount());
  // Ink starts reading keys in an effect after the first frame: keys written before that are lost.
  await until(() => {
    if (ui.stdin.listenerCount('readable') === 0) throw new Error('the screen never started reading keys');
  });
  // A bell is written beside Ink's output, so the screen is the last frame that is not a bell.
  const frame = () => [...ui.frames].reverse().find((f) => f !== '\x07') ?? '';
  return {
    ...ui,
    frame,
    type: (keys: string): void => {
      ui.stdin.write(keys);
    },
    /** The screen, once it matches `pattern`. */
    shows: async (pattern: RegExp): Promise<string> => {
      await until(() => expect(frame()).toMatch(pattern));
      return frame();
    },
  };
}

export const bells = (frames: readonly string[]) => frames.filter((f) => f === '\x07').length;
