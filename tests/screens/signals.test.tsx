import { render } from 'ink-testing-library';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { screenOptions } from '../../src/cli/commands/count.js';
import { DEFAULT_PREFS } from '../../src/prefs/pref-values.js';
import { BELL_PATTERNS, ring } from '../../src/screens/bell.js';
import { CountScreen } from '../../src/screens/count-screen.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { TINY_KEYMAP, newLevelFile } from '../helpers/levels.js';
import { bells, driveScreen, until } from '../helpers/ink-screen.js';
import { tempDir } from '../helpers/temp-dir.js';

/** Every write with the fake clock's time: what the terminal hears, in order and spacing. */
function listening() {
  const heard: [number, string][] = [];
  return { heard, stdout: { write: (s: string) => heard.push([Date.now(), s]) } };
}

describe('bell patterns', () => {
  afterEach(() => vi.useRealTimers());

  it('one bell for a new type, two 100 ms apart for a miss-key, three 160 ms apart for the stop signal', () => {
    vi.useFakeTimers({ now: 0 });
    for (const [pattern, times] of [['once', [0]], ['miss', [0, 100]], ['stop', [0, 160, 320]]] as const) {
      const { heard, stdout } = listening();
      const start = Date.now();
      ring(stdout as never, pattern);
      vi.advanceTimersByTime(1000);
      expect(heard.map(([t, s]) => [t - start, s])).toEqual(times.map((t) => [t, '\x07']));
    }
    // The ear tells them apart by number: no two patterns ring as many bells.
    const counts = Object.values(BELL_PATTERNS).map((p) => p.length);
    expect(new Set(counts).size).toBe(counts.length);
  });
});

async function screen(bell: boolean) {
  const level = newLevelFile(tempDir(), 'level.jsonl', TINY_KEYMAP);
  const session = new CountingSession(level.writer, level.state, level.notices);
  const ui = await driveScreen(render(<CountScreen session={session} columns={80} rows={24} bell={bell} />));
  return { ...ui, session };
}

describe('a key that counts nothing', () => {
  it('rings twice and flashes the status line in inverse; counting goes on', async () => {
    const s = await screen(true);
    s.type('a');
    // The first grain of a type rings once; wait for it before the miss.
    await until(() => expect(bells(s.frames)).toBe(1));
    s.type('%');
    expect(await s.shows(/✗ key "%" is not in the keymap: nothing counted/)).toMatch(/Pollen sum 1/);
    await until(() => expect(bells(s.frames)).toBe(3));
    expect(s.session.getSnapshot().message).toEqual({ text: 'key "%" is not in the keymap: nothing counted', tone: 'miss' });
    s.type('a');
    await s.shows(/Pollen sum 2/);
    s.session.shutdown();
  });

  it('with --quiet (bell off) the flash stays and no bell is written', async () => {
    const bell = screenOptions(DEFAULT_PREFS, { quiet: true }).bell;
    expect(bell).toBe(false);
    const s = await screen(bell);
    s.type('a%%');
    await s.shows(/✗ key "%" is not in the keymap/);
    s.type('bb');
    await s.shows(/Pollen sum 3/);
    expect(bells(s.frames)).toBe(0);
    expect(s.session.getSnapshot().misses).toBe(2);
    s.session.shutdown();
  });
});
