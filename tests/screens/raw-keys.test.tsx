import { describe, expect, it } from 'vitest';
import { countScreen } from '../helpers/count-screen.js';
import { newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

// Through Ink itself: its input parser reads "\x1ba" as one Alt+a press; the screen must still see Esc and a.
describe('an Esc and a key in one chunk, on the counting screen', () => {
  it('counts the key after an Esc: a Esc a is two grains', async () => {
    const s = await countScreen(newLevelFile(tempDir()));
    await s.type('a\x1ba');
    await expect.poll(() => s.session.getSnapshot().state.counts).toEqual({ Alnus: 2 });
    s.unmount();
  });

  it('an Esc typed in a note cancels it, and the keys after it count again', async () => {
    const s = await countScreen(newLevelFile(tempDir()));
    await s.type('a\rfolded\x1bbb');
    await expect.poll(() => s.session.getSnapshot().state.counts).toEqual({ Alnus: 1, Betula: 2 });
    expect(s.session.getSnapshot().state.notes).toEqual([]);
    s.unmount();
  });
});
