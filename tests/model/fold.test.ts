import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { EventPayload, OpenEvent, SessionEvent } from '../../src/model/events.js';
import { applyEvent, foldEvents } from '../../src/model/fold.js';
import { decide } from '../../src/session/command-event.js';
import { resolveKey } from '../../src/keymap/resolve-key.js';
import { splitRaw } from '../../src/input/key-press.js';
import { RECENT_EVENTS, type LevelState } from '../../src/model/level-state.js';
import { NO_RULES, type RuleSet } from '../../src/rules/rule-set.js';
import { TINY_KEYMAP, grain, openPayload } from '../helpers/levels.js';

const at = (i: number) => new Date(Date.UTC(2026, 10, 2, 9, 0, i)).toISOString();
const open = { ...openPayload(), seq: 1, at: at(0) } as OpenEvent;

function given(payloads: EventPayload[]): LevelState {
  const events = payloads.map((p, i) => ({ ...p, seq: i + 2, at: at(i + 1) }) as SessionEvent);
  return foldEvents(open, TINY_KEYMAP, events);
}

describe('the fold of a level', () => {
  it('counts grains per taxon', () => {
    const s = given([grain('Alnus'), grain('Alnus'), grain('Betula'), grain('Sphagnum')]);
    expect(s.counts).toEqual({ Alnus: 2, Betula: 1, Sphagnum: 1 });
    expect(s.grains).toBe(4);
  });

  it('an undo cancels the grain it names, and only that one', () => {
    const s = given([grain('Alnus'), grain('Betula'), { type: 'undo', of: 3 }]);
    expect(s.counts).toEqual({ Alnus: 1 });
    expect(s.stack?.seq).toBe(2);
    expect(s.undos).toBe(1);
  });

  it('an undo of an old grain removes it from the middle of the stack', () => {
    const s = given([grain('Alnus'), grain('Betula'), grain('Corylus'), { type: 'undo', of: 2 }]);
    expect(s.counts).toEqual({ Betula: 1, Corylus: 1 });
    expect([s.stack?.taxon, s.stack?.below?.taxon, s.stack?.below?.below]).toEqual(['Corylus', 'Betula', null]);
  });

  it('an undo of a grain that is not counted changes no count and is reported', () => {
    const s = given([grain('Alnus'), { type: 'undo', of: 2 }, { type: 'undo', of: 2 }, { type: 'undo', of: 99 }]);
    expect(s.counts).toEqual({});
    expect(s.ignored).toEqual([4, 5]);
  });

  it('follows traverses, sittings, rule changes and a clean close', () => {
    const s = given([
      { type: 'sitting', sitting: 1 },
      grain('Alnus', 1),
      { type: 'traverse', traverse: 2 },
      grain('Betula', 2),
      { type: 'close' },
    ]);
    expect(s.traverse).toBe(2);
    expect(s.stack?.traverse).toBe(2);
    expect(s.sitting).toBe(1);
    expect(s.closed).toBe(true);
    const later = applyEvent(s, { type: 'sitting', sitting: 2, seq: 7, at: at(7) });
    expect([later.closed, later.sitting, later.sittingStartedAt]).toEqual([false, 2, at(7)]);
    // A format-1 rules event carried the target alone; it reads as a full rule set.
    const changed = applyEvent(later, { type: 'rules', rules: { targetSum: 300 } as RuleSet, seq: 8, at: at(8) } as SessionEvent);
    expect(changed.rules).toEqual({ ...NO_RULES, targetSum: 300 });
    expect(changed.spike).toBeNull();
  });

  it('keeps a window of recent events', () => {
    const s = given(Array.from({ length: 30 }, () => grain('Alnus')));
    expect(s.recent.length).toBe(RECENT_EVENTS);
    expect(s.recent.at(-1)?.seq).toBe(31);
  });

  it('does not change the state it was given', () => {
    const s = given([grain('Alnus')]);
    const copy = JSON.stringify({ counts: s.counts, grains: s.grains, recent: s.recent.length });
    applyEvent(s, { ...grain('Alnus'), seq: 3, at: at(3) } as SessionEvent);
    expect(JSON.stringify({ counts: s.counts, grains: s.grains, recent: s.recent.length })).toBe(copy);
  });

  it('property: any key sequence gives the counts of a plain stack model (fast-check)', () => {
    const keys = fc.array(fc.constantFrom('a', 'b', 'c', 's', 'l', 'x', '\x7f', '\t'), { maxLength: 300 });
    fc.assert(
      fc.property(keys, (presses) => {
        let state = foldEvents(open, TINY_KEYMAP, []);
        const model: string[] = [];
        // What undo takes back: the last grain that counts, or a traverse change made after it.
        const done: ('grain' | 'tab')[] = [];
        let traverses = 1;
        for (const press of splitRaw(presses.join(''))) {
          const d = decide(state, resolveKey(TINY_KEYMAP, press));
          if (d.kind === 'record') state = applyEvent(state, { ...d.payload, seq: state.lastSeq + 1, at: at(state.lastSeq + 1) } as SessionEvent);
          if (press.kind === 'char' && TINY_KEYMAP.keys[press.char]) {
            model.push(TINY_KEYMAP.keys[press.char]!.taxon);
            done.push('grain');
          }
          if (press.kind === 'backspace') {
            const last = done.pop();
            if (last === 'grain') model.pop();
            if (last === 'tab') traverses--;
          }
          if (press.kind === 'tab') {
            traverses++;
            done.push('tab');
          }
        }
        const expected: Record<string, number> = {};
        for (const t of model) expected[t] = (expected[t] ?? 0) + 1;
        expect(state.counts).toEqual(expected);
        expect(state.grains).toBe(model.length);
        expect(state.traverse).toBe(traverses);
      }),
    );
  });
});

describe('the fold, replayed or applied one event at a time', () => {
  it('property: folding all events at once equals applying them one by one (fast-check)', () => {
    const payload = fc.oneof(
      fc.constantFrom('Alnus', 'Betula', 'Sphagnum').map((t) => grain(t)),
      fc.integer({ min: 2, max: 60 }).map((of): EventPayload => ({ type: 'undo', of })),
      fc.integer({ min: 1, max: 9 }).map((traverse): EventPayload => ({ type: 'traverse', traverse })),
      fc.constant<EventPayload>({ type: 'close' }),
      fc.constant<EventPayload>({ type: 'finish' }),
    );
    fc.assert(
      fc.property(fc.array(payload, { maxLength: 60 }), (ps) => {
        const events = ps.map((p, i) => ({ ...p, seq: i + 2, at: at(i + 1) }) as SessionEvent);
        let stepwise = foldEvents(open, TINY_KEYMAP, []);
        for (const e of events) stepwise = applyEvent(stepwise, e);
        expect(foldEvents(open, TINY_KEYMAP, events)).toEqual(stepwise);
      }),
      { numRuns: 300 },
    );
  });
});

/** First grain of each type among the grains still counted, given oldest first. */
function firstSeenModel(counted: readonly { seq: number; taxon: string }[]): Record<string, number> {
  const first: Record<string, number> = {};
  for (const g of counted) first[g.taxon] ??= g.seq;
  return first;
}

/** Grains of the sum counted since the last grain of a type new to the sum, from grains given oldest first. */
function plateauModel(counted: readonly { seq: number; taxon: string }[], inSum: ReadonlySet<string>): number {
  const seen = new Set<string>();
  let since = 0;
  for (const g of counted.filter((c) => inSum.has(c.taxon))) {
    since = seen.has(g.taxon) ? since + 1 : 0;
    seen.add(g.taxon);
  }
  return since;
}

describe('when each type entered the count, and the plateau', () => {
  it('property: first-seen grains and grains since the last new type of the sum match a plain model (fast-check)', () => {
    // Sphagnum (spores) and Lycopodium (markers) are outside the sum: they never start or extend a plateau.
    const payload = fc.oneof(
      { weight: 4, arbitrary: fc.constantFrom('Alnus', 'Betula', 'Corylus', 'Poaceae', 'Sphagnum', 'Lycopodium').map((t) => grain(t)) },
      { weight: 1, arbitrary: fc.integer({ min: 2, max: 80 }).map((of): EventPayload => ({ type: 'undo', of })) },
    );
    const inSum = new Set(['Alnus', 'Betula', 'Corylus', 'Poaceae']);
    fc.assert(
      fc.property(fc.array(payload, { maxLength: 80 }), (ps) => {
        const events = ps.map((p, i) => ({ ...p, seq: i + 2, at: at(i + 1) }) as SessionEvent);
        const state = foldEvents(open, TINY_KEYMAP, events);
        // Model: the grains still counted, oldest first.
        const counted: { seq: number; taxon: string }[] = [];
        for (const e of events) {
          if (e.type === 'grain') counted.push({ seq: e.seq, taxon: e.taxon });
          if (e.type === 'undo') {
            const i = counted.findIndex((g) => g.seq === e.of);
            if (i >= 0) counted.splice(i, 1);
          }
        }
        expect(state.firstSeen).toEqual(firstSeenModel(counted));
        expect(state.sinceNewType).toBe(plateauModel(counted, inSum));
      }),
      { numRuns: 500 },
    );
  });
});

describe('voids and restores', () => {
  it('property: counts follow a model of grains, undos, voids of grains and traverses, and restores (fast-check)', () => {
    const payload = fc.oneof(
      { weight: 5, arbitrary: fc.tuple(fc.constantFrom('Alnus', 'Betula', 'Corylus'), fc.integer({ min: 1, max: 3 })).map(([t, tr]) => grain(t, tr)) },
      { weight: 1, arbitrary: fc.integer({ min: 2, max: 60 }).map((of): EventPayload => ({ type: 'undo', of })) },
      { weight: 1, arbitrary: fc.integer({ min: 2, max: 60 }).map((g): EventPayload => ({ type: 'void', grain: g, traverse: null, reason: 'r' })) },
      { weight: 1, arbitrary: fc.integer({ min: 1, max: 3 }).map((t): EventPayload => ({ type: 'void', grain: null, traverse: t, reason: 'r' })) },
      { weight: 1, arbitrary: fc.integer({ min: 2, max: 60 }).map((of): EventPayload => ({ type: 'restore', of, reason: 'r' })) },
    );
    fc.assert(
      fc.property(fc.array(payload, { maxLength: 60 }), (ps) => {
        const events = ps.map((p, i) => ({ ...p, seq: i + 2, at: at(i + 1) }) as SessionEvent);
        const state = foldEvents(open, TINY_KEYMAP, events);
        // Model: grain seq -> taxon/traverse, with the set that counts now.
        const grains = new Map<number, { taxon: string; traverse: number }>();
        const counting = new Set<number>();
        const voids = new Map<number, number[]>();
        for (const e of events) {
          if (e.type === 'grain') {
            grains.set(e.seq, e);
            counting.add(e.seq);
          } else if (e.type === 'undo') {
            // An undo acts only on a grain that counts.
            counting.delete(e.of);
          } else if (e.type === 'void') {
            const hit = [...counting].filter((g) => (e.grain !== null ? g === e.grain : grains.get(g)!.traverse === e.traverse));
            if (hit.length) {
              voids.set(e.seq, hit);
              for (const g of hit) counting.delete(g);
            }
          } else if (e.type === 'restore' && voids.has(e.of)) {
            for (const g of voids.get(e.of)!) counting.add(g);
            voids.delete(e.of);
          }
        }
        const expected: Record<string, number> = {};
        for (const g of counting) expected[grains.get(g)!.taxon] = (expected[grains.get(g)!.taxon] ?? 0) + 1;
        expect(state.counts).toEqual(expected);
        expect(state.grains).toBe(counting.size);
        expect(Object.keys(state.voids).map(Number).sort((a, b) => a - b)).toEqual([...voids.keys()].sort((a, b) => a - b));
        // The stack stays ordered newest first.
        const seqs: number[] = [];
        for (let st = state.stack; st; st = st.below) seqs.push(st.seq);
        expect(seqs).toEqual([...counting].sort((a, b) => b - a));
        // A void or restore works first appearances and the plateau out again from the grains left.
        const counted = [...counting].sort((a, b) => a - b).map((seq) => ({ seq, taxon: grains.get(seq)!.taxon }));
        expect(state.firstSeen).toEqual(firstSeenModel(counted));
        expect(state.sinceNewType).toBe(plateauModel(counted, new Set(['Alnus', 'Betula', 'Corylus'])));
      }),
      { numRuns: 500 },
    );
  });

  it('a correction leaves "closed cleanly" as it was', () => {
    const s = given([grain('Alnus'), { type: 'close' }, { type: 'void', grain: 2, traverse: null, reason: 'double press' }]);
    expect(s.closed).toBe(true);
    expect(s.counts).toEqual({});
  });
});

