import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { NO_RULES, type RuleSet } from '../../src/rules/rule-set.js';
import type { Spike } from '../../src/stats/concentration.js';
import { TINY_KEYMAP, newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';
import { bells, countScreen, until } from '../helpers/count-screen.js';

async function screen(rules: Partial<RuleSet>, { bell = true, spike = null as Spike | null, columns = 80, rows = 24 } = {}) {
  return countScreen(newLevelFile(tempDir(), 'level.jsonl', TINY_KEYMAP, { ...NO_RULES, ...rules }, spike), { bell, columns, rows });
}

describe('stop rules on the counting screen', () => {
  it('with a target of 20 the banner appears at the 20th grain of the sum and not before; rules-met is in the file', async () => {
    const s = await screen({ targetSum: 20 });
    s.type('a'.repeat(10) + 'ssll' + 'b'.repeat(9));
    expect(s.session.getSnapshot().state.counts).toMatchObject({ Alnus: 10, Betula: 9 });
    expect(await s.shows(/Pollen sum 19 \/ 20/)).not.toMatch(/STOP RULES MET/);
    s.type('c');
    await s.shows(/STOP RULES MET at pollen sum 20 · you may stop: Ctrl-F finishes, or count on/);
    // Counting goes on after the signal.
    s.type('o');
    await s.shows(/Pollen sum 21 \/ 20/);
    s.session.shutdown();
    const events = scanLog(readFileSync(s.path)).events;
    const met = events.filter((e) => e.type === 'rules-met');
    expect(met).toHaveLength(1);
    expect(met[0]).toMatchObject({ sum: 20, grains: 24 });
  });

  it('rings three bells when the set is met, and none with the bell off', async () => {
    const on = await screen({ targetSum: 3 });
    on.type('aa');
    // One bell so far: Alnus was a new type.
    await until(() => expect(bells(on.frames)).toBe(1));
    on.type('a');
    await until(() => expect(bells(on.frames)).toBe(4));
    // Met already: more grains ring nothing. A new type's bell after them shows that their effects have run.
    on.type('aa');
    on.type('b');
    await until(() => expect(bells(on.frames)).toBeGreaterThanOrEqual(5));
    expect(bells(on.frames)).toBe(5);
    on.session.shutdown();

    const off = await screen({ targetSum: 3 }, { bell: false });
    off.type('aaa');
    await off.shows(/STOP RULES MET/);
    // A later frame comes after the effects of the one before: a bell would be out by now.
    off.type('b');
    await off.shows(/Pollen sum 4 \/ 3/);
    expect(bells(off.frames)).toBe(0);
    off.session.shutdown();
  });

  it('an undo below the target takes the banner away; the next grain brings it back', async () => {
    const s = await screen({ targetSum: 3 });
    s.type('aaa');
    await s.shows(/STOP RULES MET/);
    s.type('\x7f');
    expect(await s.shows(/Pollen sum 2 \/ 3/)).not.toMatch(/STOP RULES MET/);
    s.type('b');
    await s.shows(/STOP RULES MET at pollen sum 3/);
    s.session.shutdown();
  });

  it('the rules panel shows each rule converging: precision and markers with grains still needed', async () => {
    const s = await screen(
      { precision: { halfWidth: 10, share: 20, taxa: null }, markers: 4, mode: 'all' },
      { spike: { tablets: 1, perTablet: 10000, perTabletSd: null, volume: 1, mass: null, accumulationRate: null } },
    );
    expect(await s.shows(/Stop if all/)).toMatch(/half-width ≤ 10 points\n.*  ≥20% now –\s+\?/);
    s.type('aabbl');
    const first = await s.shows(/markers 1\/4\s+\+12/);
    const early = /≥20% now ([\d.]+)\s+\+(\d+)/.exec(first);
    expect(early).not.toBeNull();
    expect(first).toMatch(/conc 40\.0k\/cm³ ±\d+%/);
    s.type('ab'.repeat(50) + 'lll');
    const then = await s.shows(/markers 4\/4\s+met/);
    const later = /≥20% now ([\d.]+)\s+met/.exec(then);
    expect(later).not.toBeNull();
    expect(Number(later![1])).toBeLessThan(Number(early![1]));
    expect(then).toMatch(/STOP RULES MET at pollen sum 104/);
    s.session.shutdown();
  });
});
