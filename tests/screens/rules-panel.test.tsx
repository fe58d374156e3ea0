import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { NO_RULES, type RuleSet } from '../../src/rules/rule-set.js';
import type { Spike } from '../../src/stats/concentration.js';
import { TINY_KEYMAP, newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';
import { bells, countScreen, tick } from '../helpers/count-screen.js';

async function screen(rules: Partial<RuleSet>, { bell = true, spike = null as Spike | null, columns = 80, rows = 24 } = {}) {
  return countScreen(newLevelFile(tempDir(), 'level.jsonl', TINY_KEYMAP, { ...NO_RULES, ...rules }, spike), { bell, columns, rows });
}

describe('stop rules on the counting screen', () => {
  it('with a target of 20 the banner appears at the 20th grain of the sum and not before; rules-met is in the file', async () => {
    const s = await screen({ targetSum: 20 });
    await s.type('a'.repeat(10) + 'ssll' + 'b'.repeat(9));
    expect(s.session.getSnapshot().state.counts).toMatchObject({ Alnus: 10, Betula: 9 });
    expect(s.frame()).not.toMatch(/STOP RULES MET/);
    expect(s.frame()).toMatch(/Pollen sum 19 \/ 20/);
    await s.type('c');
    expect(s.frame()).toMatch(/STOP RULES MET at pollen sum 20 · you may stop: Ctrl-F finishes, or count on/);
    // Counting goes on after the signal.
    await s.type('o');
    expect(s.frame()).toMatch(/Pollen sum 21 \/ 20/);
    s.session.shutdown();
    const events = scanLog(readFileSync(s.path)).events;
    const met = events.filter((e) => e.type === 'rules-met');
    expect(met).toHaveLength(1);
    expect(met[0]).toMatchObject({ sum: 20, grains: 24 });
  });

  it('rings three bells when the set is met, and none with the bell off', async () => {
    const on = await screen({ targetSum: 3 });
    await on.type('aa');
    // One bell so far: Alnus was a new type.
    expect(bells(on.frames)).toBe(1);
    await on.type('a');
    await tick(400);
    expect(bells(on.frames)).toBe(4);
    await on.type('aa');
    await tick(400);
    expect(bells(on.frames)).toBe(4);
    on.session.shutdown();

    const off = await screen({ targetSum: 3 }, { bell: false });
    await off.type('aaa');
    await tick(400);
    expect(off.frame()).toMatch(/STOP RULES MET/);
    expect(bells(off.frames)).toBe(0);
    off.session.shutdown();
  });

  it('an undo below the target takes the banner away; the next grain brings it back', async () => {
    const s = await screen({ targetSum: 3 });
    await s.type('aaa');
    expect(s.frame()).toMatch(/STOP RULES MET/);
    await s.type('\x7f');
    expect(s.frame()).not.toMatch(/STOP RULES MET/);
    await s.type('b');
    expect(s.frame()).toMatch(/STOP RULES MET at pollen sum 3/);
    s.session.shutdown();
  });

  it('the rules panel shows each rule converging: precision and markers with grains still needed', async () => {
    const s = await screen(
      { precision: { halfWidth: 10, share: 20, taxa: null }, markers: 4, mode: 'all' },
      { spike: { tablets: 1, perTablet: 10000, perTabletSd: null, volume: 1, mass: null, accumulationRate: null } },
    );
    expect(s.frame()).toMatch(/Stop if all/);
    expect(s.frame()).toMatch(/±10 ≥20% –\/10\s+\?/);
    await s.type('aabbl');
    const early = /±10 ≥20% ([\d.]+)\/10\s+\+(\d+)/.exec(s.frame());
    expect(early).not.toBeNull();
    expect(s.frame()).toMatch(/markers 1\/4\s+\+12/);
    expect(s.frame()).toMatch(/conc 40\.0k\/cm³ ±\d+%/);
    await s.type('ab'.repeat(50) + 'lll');
    const later = /±10 ≥20% ([\d.]+)\/10\s+met/.exec(s.frame());
    expect(later).not.toBeNull();
    expect(Number(later![1])).toBeLessThan(Number(early![1]));
    expect(s.frame()).toMatch(/markers 4\/4\s+met/);
    expect(s.frame()).toMatch(/STOP RULES MET at pollen sum 104/);
    s.session.shutdown();
  });
});
