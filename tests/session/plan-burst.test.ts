import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { splitRaw } from '../../src/input/key-press.js';
// Ink's own parser (not exported by the package): the screens see its events.
import { createInputParser } from '../../node_modules/ink/build/input-parser.js';
import type { OpenEvent, SessionEvent } from '../../src/model/events.js';
import { applyEvents, foldEvents } from '../../src/model/fold.js';
import { FINISH_PROMPT, planBurst } from '../../src/session/plan-burst.js';
import { TINY_KEYMAP, openPayload } from '../helpers/levels.js';

const start = foldEvents({ ...openPayload(), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent, TINY_KEYMAP, []);
const plan = (text: string, confirming = false) => planBurst(start, confirming ? { kind: 'confirm-finish' } : null, splitRaw(text));

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
    expect(plan('a\x06')).toMatchObject({ mode: { kind: 'confirm-finish' }, quit: false, message: { text: FINISH_PROMPT } });
    expect(plan('\x06y').payloads).toEqual([{ type: 'finish' }]);
    expect(plan('y', true)).toMatchObject({ quit: true, payloads: [{ type: 'finish' }] });
    expect(plan('ab', true)).toMatchObject({ quit: false, mode: null, payloads: [{ type: 'grain', taxon: 'Betula', traverse: 1, key: 'b' }] });
  });

  it('says what it could not do and records nothing for it', () => {
    expect(plan('\x7f')).toMatchObject({ payloads: [], message: { text: 'nothing to undo' } });
    expect(plan('Z').message?.text).toMatch(/not in the keymap/);
    expect(plan('').message).toBeUndefined();
  });

  it('the note key opens a line tied to the last grain; taxon keys type text and count nothing', () => {
    const p = plan('ab\rcf. Alnus @12.5,88 \r');
    expect(p.payloads).toEqual([
      { type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' },
      { type: 'grain', taxon: 'Betula', traverse: 1, key: 'b' },
      { type: 'note', text: 'cf. Alnus', grain: 3, stage: { x: 12.5, y: 88 } },
    ]);
    expect(p.mode).toBeNull();
    expect(p.message?.text).toBe('note recorded on #3 Betula');
  });

  it('a note still being typed stays open across bursts; Escape cancels it and records nothing', () => {
    const open = plan('a\rhal');
    expect(open.mode).toEqual({ kind: 'note', grain: 2, taxon: 'Alnus', text: 'hal' });
    expect(open.payloads).toHaveLength(1);
    const cancelled = planBurst(start, open.mode, splitRaw('f\x7f\x1baa'));
    expect(cancelled.payloads).toEqual([
      { type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' },
      { type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' },
    ]);
  });

  it('a new type gets the next free key, is recorded, and its grain counted', () => {
    const p = plan('=Ilex aquifolium, shr\r');
    expect(p.payloads).toEqual([
      { type: 'taxon', taxon: 'Ilex aquifolium', group: 'shrubs', key: 'A' },
      { type: 'grain', taxon: 'Ilex aquifolium', traverse: 1, key: 'A' },
    ]);
    expect(p.message?.text).toBe('new type Ilex aquifolium (shrubs) on key A: one grain counted');
    // Its key counts it from then on, in the same burst too.
    expect(plan('=Ilex, shrubs\rAA').payloads.filter((e) => e.type === 'grain')).toHaveLength(3);
  });

  it('a new type without a group, or with a name already on a key, says so', () => {
    const p = plan('=Ilex\r');
    expect(p.payloads).toEqual([]);
    expect(p.mode).toEqual({ kind: 'new-type', text: 'Ilex' });
    expect(p.message?.text).toMatch(/add its group after a comma: trees, shrubs/);
    expect(plan('=Alnus, trees\r').payloads).toEqual([{ type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' }]);
  });

  it('the help opens with ? and any key closes it, counting nothing', () => {
    const p = plan('?a');
    expect(p.payloads).toEqual([]);
    expect(p.mode).toBeNull();
    expect(plan('?').mode).toEqual({ kind: 'help' });
    expect(plan('?\x03').quit).toBe(true);
  });
});


describe('bursts split anywhere', () => {
  /**
   * Each chunk the terminal delivers goes through Ink's own input parser, which
   * splits it at escape sequences and holds a trailing Esc until the read is over;
   * each of its events reaches the screen as one call, planned and folded in turn
   * as the session does, the mode carried from one to the next.
   */
  function run(chunks: readonly string[]) {
    const parser = createInputParser();
    const events: string[] = [];
    for (const chunk of chunks) {
      events.push(...parser.push(chunk));
      const pending = parser.flushPendingEscape();
      if (pending) events.push(pending);
    }
    let state = start;
    let mode: ReturnType<typeof planBurst>['mode'] = null;
    const payloads: unknown[] = [];
    for (const text of events) {
      const p = planBurst(state, mode, splitRaw(text));
      const stamped = p.payloads.map((e, i) => ({ ...e, seq: state.lastSeq + 1 + i, at: state.lastAt }) as SessionEvent);
      state = applyEvents(state, stamped);
      payloads.push(...p.payloads);
      mode = p.mode;
      if (p.quit) break;
    }
    return { payloads, counts: state.counts, notes: state.notes.map((n) => [n.grain, n.text, n.stage]), mode };
  }

  /** The keys one at a time, each its own read: what the analyst typed, with no chunking at all. */
  const oneByOne = (text: string) => run([...text]);

  it('property: the same keys give the same events however the terminal chunks them, Esc and every input mode included (fast-check)', () => {
    // Enter opens a note, = a new type, ? the help, Ctrl-F the finish question; Esc cancels; y answers.
    const key = fc.constantFrom('a', 'b', 's', 'l', '\r', '=', '\x1b', '\x1b', '\x7f', '\t', 'x', ',', ' ', 'h', '@', '1', '?', 'A', '\x06', 'y', 'q');
    fc.assert(
      fc.property(fc.array(key, { maxLength: 60 }), fc.array(fc.integer({ min: 0, max: 60 }), { maxLength: 8 }), (keys, cuts) => {
        const text = keys.join('');
        const points = [...new Set(cuts.map((c) => Math.min(c, text.length)))].sort((x, y) => x - y);
        const bursts: string[] = [];
        let from = 0;
        for (const p of points) {
          bursts.push(text.slice(from, p));
          from = p;
        }
        bursts.push(text.slice(from));
        // A terminal never delivers an empty chunk (an empty input is a special key of its own).
        const expected = oneByOne(text);
        expect(run(bursts.filter(Boolean))).toEqual(expected);
        expect(run([text])).toEqual(expected);
      }),
      { numRuns: 500 },
    );
  });

  it('an Esc and a key in one read are two keys: q Esc q counts two grains, and Esc still cancels a note', () => {
    const grains = (r: ReturnType<typeof run>) => r.payloads.filter((p) => (p as { type: string }).type === 'grain').length;
    expect(grains(run(['a\x1ba']))).toBe(2);
    const note = run(['a\rtext\x1ba']);
    expect(note.notes).toEqual([]);
    expect(grains(note)).toBe(2);
  });
});
