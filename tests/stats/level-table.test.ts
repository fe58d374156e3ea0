import { describe, expect, it } from 'vitest';
import type { Keymap } from '../../src/keymap/keymap.js';
import type { EventPayload, OpenEvent, SessionEvent } from '../../src/model/events.js';
import { foldEvents } from '../../src/model/fold.js';
import { levelTable } from '../../src/stats/level-table.js';
import { TINY_KEYMAP, grain, openPayload } from '../helpers/levels.js';

function table(payloads: EventPayload[], keymap: Keymap = TINY_KEYMAP) {
  const open = { ...openPayload(keymap), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent;
  const events = payloads.map((p, i) => ({ ...p, seq: i + 2, at: '2026-11-02T09:00:01.000Z' }) as SessionEvent);
  return levelTable(foldEvents(open, keymap, events));
}
const times = (n: number, taxon: string) => Array.from({ length: n }, () => grain(taxon));

describe('the level table', () => {
  it('takes percentages of the pollen sum, and of sum + own group outside it (common practice)', () => {
    const t = table([...times(60, 'Alnus'), ...times(40, 'Poaceae'), ...times(25, 'Sphagnum'), ...times(10, 'Lycopodium')]);
    expect(t.pollenSum).toBe(100);
    expect(t.grains).toBe(135);
    const by = Object.fromEntries(t.rows.map((r) => [r.taxon, r]));
    expect(by.Alnus).toMatchObject({ inSum: true, basis: 100, percent: 60 });
    expect(by.Sphagnum).toMatchObject({ inSum: false, basis: 125, percent: 20 });
    expect(by.Lycopodium!.basis).toBe(110);
    expect(t.groupTotals).toMatchObject({ trees: 60, herbs: 40, spores: 25, markers: 10, shrubs: 0 });
  });

  it('follows the keymap\'s own pollen sum', () => {
    const treesOnly: Keymap = { ...TINY_KEYMAP, groups: TINY_KEYMAP.groups.map((g) => (g.name === 'shrubs' || g.name === 'herbs' ? { ...g, role: 'outside' as const } : g)), sum: ['trees'] };
    const t = table([...times(30, 'Alnus'), ...times(10, 'Betula'), ...times(10, 'Corylus')], treesOnly);
    expect(t.pollenSum).toBe(40);
    const corylus = t.rows.find((r) => r.taxon === 'Corylus')!;
    expect(corylus).toMatchObject({ inSum: false, basis: 50, percent: 20 });
  });

  it('has no percentage while its basis is empty, and an interval from 0 otherwise', () => {
    const empty = table([]);
    expect(empty.rows.every((r) => r.percent === null && r.ciLow === null)).toBe(true);
    const t = table(times(20, 'Alnus'));
    const betula = t.rows.find((r) => r.taxon === 'Betula')!;
    // 0 of 20: Newcombe (1998) Wilson upper limit 0.1611. [pub]
    expect(betula.ciLow).toBe(0);
    expect(betula.ciHigh).toBeCloseTo(16.11, 2);
  });

  it('lists rows by group in a fixed order, keymap order within a group, and keeps a taxon the keymap lacks', () => {
    const t = table([grain('Sphagnum'), grain('Tilia'), grain('Alnus')]);
    expect(t.rows.map((r) => r.taxon)).toEqual(['Alnus', 'Betula', 'Corylus', 'Poaceae', 'Sphagnum', 'Lycopodium', 'Tilia']);
    expect(t.rows.at(-1)).toMatchObject({ key: null, group: 'other', count: 1 });
  });
});
