import { copyFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { fileAuditSource } from '../../src/audit/read-audit.js';
import { START_UI, type AuditUi } from '../../src/screens/audit-keys.js';
import { auditRooms, auditScreenView, scrollWindow } from '../../src/screens/audit-view.js';
import { textOf } from '../../src/screens/styled-line.js';
import type { EventPayload } from '../../src/model/events.js';
import { TINY_KEYMAP, grain, openPayload, timedSessionText } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };
const SIZE = { columns: 80, rows: 24 };

function readOf(entries: readonly (readonly [EventPayload, number])[]) {
  const path = join(tempDir(), 'l.jsonl');
  writeFileSync(path, timedSessionText(entries));
  return fileAuditSource(path, OPTIONS).read();
}

/**
 * A closed level, 09:00 on: traverse 1 "aab" with the b undone (seq 3–6),
 * traverse 2 "cco" (seq 8–10), then a void of grain 4 made in the audit (seq 12).
 */
const LEVEL: readonly (readonly [EventPayload, number])[] = [
  [openPayload(TINY_KEYMAP), 0],
  [{ type: 'sitting', sitting: 1 }, 1_000],
  [grain('Alnus', 1, 'a'), 5_000],
  [grain('Alnus', 1, 'a'), 9_000],
  [grain('Betula', 1, 'b'), 14_000],
  [{ type: 'undo', of: 5 }, 15_000],
  [{ type: 'traverse', traverse: 2 }, 20_000],
  [grain('Corylus', 2, 'c'), 25_000],
  [grain('Corylus', 2, 'c'), 31_000],
  [grain('Poaceae', 2, 'o'), 38_000],
  [{ type: 'close' }, 40_000],
  [{ type: 'void', grain: 4, traverse: null, reason: 'slipped' }, 60_000],
];

const ui = (over: Partial<AuditUi>): AuditUi => ({ ...START_UI, ...over });

describe('the audit screen view', () => {
  it('heads with the level, the file’s integrity and totals, evenness, and the flags and corrections', () => {
    const v = auditScreenView(readOf(LEVEL), START_UI, SIZE);
    expect(v.top.slice(0, 4).map(textOf)).toEqual([
      'Audit · Test Mere TM-1 · level T-1 · depth 10 · slide TM1-010-A',
      expect.stringMatching(/^file intact · 4 grains · 2 traverses · 1 sitting · 00:00:\d\d counting · [\d.]+\/min$/),
      expect.stringMatching(/^Evenness/),
      'no flags · 1 correction · f shows them',
    ]);
    expect(v.top[0]?.spans[0]).toMatchObject({ bold: true, tone: 'accent' });
    expect(v.top[1]?.spans[0]?.tone).toBeUndefined();
  });

  it('gives each traverse its slide when the level was counted on more than one', () => {
    const two: (readonly [EventPayload, number])[] = [
      ...LEVEL.slice(0, 11),
      [{ type: 'sitting', sitting: 2 }, 50_000],
      [{ type: 'slide', slide: 'TM1-010-B', traverse: 3 }, 51_000],
      [grain('Alnus', 3, 'a'), 55_000],
    ];
    const v = auditScreenView(readOf(two), START_UI, SIZE);
    expect(textOf(v.top[0]!)).toBe('Audit · Test Mere TM-1 · level T-1 · depth 10 · slides TM1-010-A, TM1-010-B');
    const [title, first, , third] = v.top.slice(4).map(textOf);
    expect(title).toMatch(/ not slide\s*$/);
    expect(first).toMatch(/^▶ {2}1 09:00:05 .* TM1-010-A/);
    expect(third).toMatch(/^ {3}3 09:00:55 .* TM1-010-B/);
    // The column is as wide as the screen allows; an 80-column screen keeps it.
    expect(third!.length).toBeLessThanOrEqual(80);
  });

  it('selects the first traverse and lists its events, with what became of each grain', () => {
    const v = auditScreenView(readOf(LEVEL), START_UI, SIZE);
    const [title, first, second] = v.top.slice(4);
    expect(textOf(title!)).toMatch(/^ {3}# start {8}time grain type/);
    expect(textOf(first!)).toMatch(/^▶ {2}1 09:00:05 /);
    expect(first?.spans[0]).toMatchObject({ inverse: true, bold: true });
    expect(textOf(second!)).toMatch(/^ {3}2 09:00:20 /);
    expect(second?.spans[0]).toMatchObject({ inverse: false, bold: false });
    const body = v.body.lines.map(textOf);
    expect(body[0]).toBe('Traverse 1 · Alnus 1');
    expect(body).toContain('  #4 09:00:09 Alnus (t1) · VOIDED by #12');
    expect(body).toContain('  #5 09:00:14 Betula (t1) · undone');
    expect(v.body.lines.find((l) => textOf(l).includes('VOIDED'))?.spans[0]?.tone).toBe('warning');
    expect(v.body.clip).toBe(true);
  });

  it('with the grains focused, marks the picked event and leaves "›" on its traverse', () => {
    const v = auditScreenView(readOf(LEVEL), ui({ selected: 1, focus: 'grains', grainIndex: 1 }), SIZE);
    const row = v.top.slice(5).find((l) => textOf(l).startsWith('›'));
    expect(row && textOf(row)).toMatch(/^› {2}2 09:00:20/);
    expect(row?.spans[0]).toMatchObject({ inverse: false, bold: true });
    const picked = v.body.lines.filter((l) => textOf(l).startsWith('▶'));
    expect(picked.map(textOf)).toEqual(['▶ #9 09:00:31 Corylus (t2)']);
    expect(picked[0]?.spans[0]?.inverse).toBe(true);
    expect(textOf(v.body.lines[1]!)).toBe('new types: Corylus, Poaceae');
  });

  it('the overview takes the table’s room: sittings with their timeline, then the corrections', () => {
    const read = readOf(LEVEL);
    const v = auditScreenView(read, ui({ overview: true }), SIZE);
    const { tableRoom, detailRoom } = auditRooms(23, 2);
    expect(v.top).toHaveLength(4);
    expect(v.body).toMatchObject({ height: detailRoom + tableRoom + 3, clip: false });
    const body = v.body.lines.map(textOf);
    expect(body[0]).toBe('Sittings, flags and corrections (f: back)');
    expect(body[1]).toMatch(/^sitting 1: 2026-11-02 09:00 UTC–09:00:40 · counting 00:00:\d\d$/);
    expect(body[2]).toMatch(/^ {2}09:00 [█ ░▁-▇·]+ 09:00$/);
    expect(body.at(-1)).toBe('#12 void of grain #4 (Alnus, traverse 1): "slipped"');
  });

  it('asks for a reason in bold, says a refused correction in the error tone', () => {
    const read = readOf(LEVEL);
    const asking = auditScreenView(read, ui({ asking: { payload: { type: 'void', grain: 3, traverse: null }, prompt: 'Void grain #3 (Alnus). Reason: ' }, reason: 'slip' }), SIZE);
    expect(textOf(asking.prompt)).toBe('Void grain #3 (Alnus). Reason: slip█');
    expect(asking.prompt).toMatchObject({ wrap: 'wrap', spans: [{ bold: true }] });
    expect(textOf(asking.keys)).toBe('Enter records the correction · Esc cancels');
    const refused = auditScreenView(read, ui({ message: 'not recorded: the file is open for counting' }), SIZE);
    expect(refused.prompt.spans[0]?.tone).toBe('error');
    expect(textOf(refused.keys)).toMatch(/^↑↓ select · Tab traverses\/grains/);
    expect(auditScreenView(read, START_UI, SIZE).prompt.spans[0]).toMatchObject({ text: ' ', tone: 'warning' });
  });

  it('a last line being written is said so in the heading, not called damage', () => {
    const path = join(tempDir(), 'l.jsonl');
    writeFileSync(path, `${timedSessionText(LEVEL)}{"seq":13,"at":"2026-`);
    const v = auditScreenView(fileAuditSource(path, OPTIONS).read(), START_UI, SIZE);
    expect(textOf(v.top[1]!)).toMatch(/^last line incomplete \(being written\?\) · 4 grains/);
    expect(v.top[1]?.spans[0]?.tone).toBeUndefined();
  });

  it('a clock set back is flagged in the heading and warned of under the panels', () => {
    const v = auditScreenView(readOf([...LEVEL.slice(0, 9), [grain('Poaceae', 2, 'o'), 30_000], ...LEVEL.slice(10)]), START_UI, SIZE);
    expect(textOf(v.top[3]!)).toMatch(/^1 flag to review · /);
    expect(v.top[3]?.spans[0]?.tone).toBe('warning');
    expect(textOf(v.prompt)).toMatch(/^warning: line 10: time 2026-11-02T09:00:30\.000Z is earlier than the line before/);
  });

  it('keeps the selected traverse in the window and fits the terminal: a demo level at 80x24 and 140x45', () => {
    const path = join(tempDir(), 'km1-036cm.jsonl');
    copyFileSync(new URL('../../demo-sessions/km1-036cm.jsonl', import.meta.url), path);
    const read = fileAuditSource(path, OPTIONS).read();
    const n = read.audit.traverses.length;
    for (const size of [SIZE, { columns: 140, rows: 45 }]) {
      const { tableRoom, detailRoom } = auditRooms(size.rows - 1, n);
      const v = auditScreenView(read, ui({ selected: n - 1 }), size);
      const rows = v.top.slice(5);
      expect(rows).toHaveLength(Math.min(n, tableRoom));
      expect(textOf(rows.at(-1)!)).toMatch(new RegExp(`^▶\\s+${n} `));
      // Heading, table, the body's fixed height, two prompt lines and the key line stay under the terminal's height.
      expect(v.top.length + v.body.height + 2 + 1).toBeLessThan(size.rows);
      expect(v.body.height).toBe(detailRoom + 2);
      expect([...textOf(v.top[4]!)]).toHaveLength(size.columns);
    }
  });
});

describe('the scroll window', () => {
  it('shows everything that fits, else keeps the selection near the middle without running past either end', () => {
    const items = Array.from({ length: 10 }, (_, i) => i);
    expect(scrollWindow(items.slice(0, 3), 2, 5)).toEqual({ shown: [0, 1, 2], offset: 0 });
    expect(scrollWindow(items, 0, 4)).toEqual({ shown: [0, 1, 2, 3], offset: 0 });
    expect(scrollWindow(items, 5, 4)).toEqual({ shown: [3, 4, 5, 6], offset: 3 });
    expect(scrollWindow(items, 9, 4)).toEqual({ shown: [6, 7, 8, 9], offset: 6 });
  });
});

describe('the audit prompt at 80 columns', () => {
  it('a long refusal (the lock holder, the lock file) takes a third line instead of being cut; the event list gives that line up', () => {
    const message = `not recorded: /home/analyst/cores/kestrel-mere/km-1/levels/km1-084cm.jsonl is already open in pid 4242 (exine count) on lab-pc-2; close it there first (lock file: km1-084cm.jsonl.lock)`;
    const short = auditScreenView(readOf(LEVEL), START_UI, { columns: 80, rows: 24 });
    const long = auditScreenView(readOf(LEVEL), ui({ message }), { columns: 80, rows: 24 });
    expect([short.promptHeight, long.promptHeight]).toEqual([2, 3]);
    expect(long.body.height).toBe(short.body.height - 1);
    expect(long.body.lines.length).toBeLessThanOrEqual(long.body.height);
  });
});
