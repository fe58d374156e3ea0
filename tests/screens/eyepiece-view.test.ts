import { copyFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { EventPayload, SessionEvent } from '../../src/model/events.js';
import { applyEvents } from '../../src/model/fold.js';
import type { LevelState } from '../../src/model/level-state.js';
import { MIN_COLUMNS, MIN_ROWS } from '../../src/screens/count-layout.js';
import { countScreenView, type CountScreenView } from '../../src/screens/count-view.js';
import { textOf } from '../../src/screens/styled-line.js';
import { sumLines } from '../../src/screens/sum-panel.js';
import { taxa, totalsLines } from '../../src/screens/totals-table.js';
import { readLevel } from '../../src/session/session-files.js';
import { levelTable } from '../../src/stats/level-table.js';
import { tempDir } from '../helpers/temp-dir.js';

function demo(): LevelState {
  const path = join(tempDir(), 'demo.jsonl');
  copyFileSync(new URL('../../demo-sessions/km1-084cm.jsonl', import.meta.url), path);
  return readLevel(path).state;
}

const after = (state: LevelState, payloads: readonly EventPayload[]) =>
  applyEvents(state, payloads.map((p, i) => ({ ...p, seq: state.lastSeq + 1 + i, at: state.lastAt }) as SessionEvent));

function view(state: LevelState, columns = 80, rows = 24): CountScreenView {
  return countScreenView({ snapshot: { state, message: null, notice: null, readOnly: null, closed: false, mode: null, misses: 0 }, columns, rows, now: Date.parse(state.lastAt), rareThreshold: 2, breakMinutes: null });
}

const tableOf = (v: CountScreenView) => (v.main.kind === 'panels' ? v.main.table.lines.map(textOf) : []);

describe('the row just counted stays on screen', () => {
  for (const [columns, rows] of [[80, 24], [80, 16], [140, 45]] as const) {
    it(`at ${columns}x${rows}: a key whose row was below the fold shows its row with ◀, the marker row stays, the hidden rows are counted`, () => {
      const base = demo();
      // v is Nymphaea: no grain yet, its row is hidden at 80x24.
      expect(tableOf(view(base, columns, rows)).some((l) => /Nymphaea/.test(l))).toBe(columns >= 140);
      const counted = after(base, [{ type: 'grain', taxon: 'Nymphaea', traverse: base.traverse, key: 'v' }]);
      const lines = tableOf(view(counted, columns, rows));
      expect(lines.find((l) => /Nymphaea/.test(l))).toMatch(/v\s+Nymphaea\s+aquat\s+1 .*◀$/);
      expect(lines.some((l) => /Lycopodium/.test(l))).toBe(true);
      expect(lines.length).toBeLessThanOrEqual(rows);
      const hidden = lines.at(-1) as string;
      if (columns < 140) {
        const m = /^… (\d+) taxa hidden, (\d+|none) counted/.exec(hidden);
        expect(m).not.toBeNull();
        // Every hidden row with grains is said: the shown ones and those add up to every counted taxon.
        const countedTaxa = levelTable(counted).rows.filter((r) => r.count > 0).length;
        const shownCounted = lines.slice(1, -1).filter((l) => !/\s0\s+0\.0\s/.test(l)).length;
        expect(shownCounted + (m![2] === 'none' ? 0 : Number(m![2]))).toBe(countedTaxa);
      }
    });
  }

  it('the marker key: the marker row is shown and marked; a rule verdict after the grain does not take the mark away', () => {
    const base = demo();
    const counted = after(base, [
      { type: 'grain', taxon: 'Lycopodium (exotic marker)', traverse: base.traverse, key: '.' },
      { type: 'rules-unmet', sum: 236, grains: 260 },
    ]);
    expect(tableOf(view(counted)).find((l) => /Lycopodium/.test(l))).toMatch(/◀$/);
  });

  it('says "1 taxon", not "1 taxa"', () => {
    expect([taxa(1), taxa(2)]).toEqual(['1 taxon', '2 taxa']);
    // One row short of room: two rows give way to the line that says so.
    const table = levelTable(demo());
    const lines = totalsLines(table, table.rows.length - 1, null, 18).map(textOf);
    expect(lines.at(-1)).toMatch(/^… 2 taxa hidden, none counted yet/);
  });

  it('a cf. grain shows in its row as "cf1" beside the name', () => {
    const base = demo();
    const counted = after(base, [{ type: 'grain', taxon: 'Betula', traverse: base.traverse, key: 'b', cf: true }]);
    expect(tableOf(view(counted)).find((l) => /Betula/.test(l))).toMatch(/^b\s+Betula\s+cf1 tree\s+30 /);
  });
});

describe('small terminals', () => {
  it(`below ${MIN_COLUMNS} x ${MIN_ROWS} the screen is one line that says the size it needs`, () => {
    expect(view(demo(), 60, 20).tooSmall).toBe(`terminal too small: at least ${MIN_COLUMNS} x ${MIN_ROWS} (this one is 60 x 20). Make the window larger; keys still count, Ctrl-C saves and quits.`);
    expect(view(demo(), 80, 11).tooSmall).toMatch(/^terminal too small/);
    expect(view(demo(), 80, 24).tooSmall).toBeNull();
    expect(view(demo(), MIN_COLUMNS, MIN_ROWS).tooSmall).toBeNull();
  });

  it('at 80x24 no line is longer than the screen, and the table and the side column fit side by side', () => {
    const v = view(demo());
    if (v.main.kind !== 'panels') throw new Error('panels expected');
    expect(v.main.table.width + 2 + v.main.sideWidth).toBeLessThanOrEqual(80);
    for (const l of [...v.heading, v.keys]) expect([...textOf(l)].length).toBeLessThanOrEqual(80);
  });

  it('the sum panel gives every group label one width, so the counts stand in one column', () => {
    const table = levelTable(demo());
    const whole = sumLines(table, 300, 33).slice(2).map(textOf);
    const ends = whole.map((l) => /^\S+(?: \S+)*\s+\d+/.exec(l)?.[0].length);
    expect(new Set(ends).size).toBe(1);
    const compact = sumLines(table, 300, 22, true).slice(2).map(textOf);
    for (const l of compact) expect(l).toMatch(/^(\S{5}\s+\d+[ *]){1,2}$/);
  });
});

describe('messages at 80 columns', () => {
  it('the status takes the lines its words wrap to, so a long notice on opening is not cut', async () => {
    const { statusArea, wrappedHeight } = await import('../../src/screens/count-lines.js');
    expect(wrappedHeight('aaa bbb ccc', 7)).toBe(2);
    expect(wrappedHeight('aaa bbb', 7)).toBe(1);
    const notice = 'a line at the end of the file was torn (the program was stopped while writing it): 212 bytes cut off and kept in km1-084cm.jsonl.cut-20261102T091500Z · took over a stale lock (pid 4242 on lab-pc, not running)';
    const area = statusArea({ state: demo(), message: null, notice, readOnly: null, closed: false, mode: null, misses: 0 }, 80);
    expect(area.height).toBe(wrappedHeight(`On opening: ${notice}`, 80));
    expect(area.height).toBeGreaterThan(3);
  });
});
