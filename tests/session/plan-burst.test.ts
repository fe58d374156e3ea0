import { describe, expect, it } from 'vitest';
import { splitKeys } from '../../src/input/key-press.js';
import type { OpenEvent } from '../../src/session/events.js';
import { foldEvents } from '../../src/session/fold.js';
import { FINISH_PROMPT, planBurst } from '../../src/session/plan-burst.js';
import { TINY_KEYMAP, openPayload } from '../helpers/levels.js';

const start = foldEvents({ ...openPayload(), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent, TINY_KEYMAP, []);
const plan = (text: string, confirming = false) => planBurst(start, confirming, splitKeys(text, {}));

describe('planning a burst of keys', () => {
  it('predicts seq numbers so an undo in the burst names the grain typed just before it', () => {
    expect(plan('ab\x7f\t').payloads).toEqual([
      { type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' },
      { type: 'grain', taxon: 'Betula', traverse: 1, key: 'b' },
      { type: 'undo', of: 3 },
      { type: 'traverse', traverse: 2 },
    ]);
  });

  it('grains after a traverse key in the same burst belong to the new traverse', () => {
    expect(plan('a\t\tc').payloads.at(-1)).toEqual({ type: 'grain', taxon: 'Corylus', traverse: 3, key: 'c' });
  });

  it('stops at Ctrl-C and drops what follows', () => {
    const p = plan('a\x03bb');
    expect([p.payloads.length, p.quit]).toEqual([1, true]);
  });

  it('asks before finishing, and the answer may come in the same burst', () => {
    expect(plan('a\x06')).toMatchObject({ confirmingFinish: true, quit: false, message: { text: FINISH_PROMPT } });
    expect(plan('\x06y').payloads).toEqual([{ type: 'finish' }]);
    expect(plan('y', true)).toMatchObject({ quit: true, payloads: [{ type: 'finish' }] });
    expect(plan('ab', true)).toMatchObject({ quit: false, confirmingFinish: false, payloads: [{ type: 'grain', taxon: 'Betula', traverse: 1, key: 'b' }] });
  });

  it('says what it could not do and records nothing for it', () => {
    expect(plan('\x7f')).toMatchObject({ payloads: [], message: { text: 'nothing to undo' } });
    expect(plan('Z').message?.text).toMatch(/not in the keymap/);
    expect(plan('').message).toBeUndefined();
  });
});
