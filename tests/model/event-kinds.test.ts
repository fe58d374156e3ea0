import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { readForAudit } from '../../src/audit/read-audit.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { EVENT_ROLES } from '../../src/model/event-kinds.js';
import type { EventPayload, EventType } from '../../src/model/events.js';
import { readLevel } from '../../src/session/session-files.js';
import { grain, openPayload, sessionText } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

/** A sitting that closed cleanly after three grains and a void of the third. */
const CLOSED_LEVEL: EventPayload[] = [
  openPayload(),
  { type: 'sitting', sitting: 1 },
  grain('Alnus'),
  grain('Betula'),
  grain('Corylus'),
  { type: 'void', grain: 5, traverse: null, reason: 'pressed c for b' },
  { type: 'close' },
];

/**
 * One event of each kind appended after that clean close, and whether the last
 * sitting still reads as closed (written out by hand, not read off the table):
 * a correction, or the verdict it brings, is made after the sitting and does not reopen it.
 */
const AFTER_CLOSE: { readonly [K in EventType]: readonly [EventPayload, boolean] | null } = {
  open: null, // only line 1 may open a level: the reader refuses another
  sitting: [{ type: 'sitting', sitting: 2 }, false],
  grain: [grain('Alnus'), false],
  undo: [{ type: 'undo', of: 4 }, false],
  traverse: [{ type: 'traverse', traverse: 2 }, false],
  // Points at a traverse line, which this level has none of: the traverse-undo tests (fold, audit) cover it.
  'traverse-undo': null,
  reopen: [{ type: 'reopen', reason: 'two more traverses for Tilia' }, false],
  note: [{ type: 'note', text: 'folded grain', grain: 3, stage: null }, false],
  taxon: [{ type: 'taxon', taxon: 'Quercus', group: 'trees', key: 'q' }, false],
  rules: [{ type: 'rules', rules: DEFAULT_RULES, spike: null }, false],
  repair: [{ type: 'repair', damage: 'a torn last line', line: 8, cutBytes: 12, backup: 'level.jsonl.cut-1' }, false],
  slide: [{ type: 'slide', slide: 'B', traverse: 2 }, false],
  close: [{ type: 'close' }, true],
  finish: [{ type: 'finish' }, true],
  void: [{ type: 'void', grain: 3, traverse: null, reason: 'a spore, not Alnus' }, true],
  restore: [{ type: 'restore', of: 6, reason: 'it was Corylus after all' }, true],
  'rules-met': [{ type: 'rules-met', sum: 2, grains: 2, met: ['target'] }, true],
  'rules-unmet': [{ type: 'rules-unmet', sum: 2, grains: 2 }, true],
};

const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };

describe('one table of event kinds for the fold, verify and the audit', () => {
  it('gives every kind of event a role', () => {
    expect(Object.keys(EVENT_ROLES).sort()).toEqual(Object.keys(AFTER_CLOSE).sort());
  });

  for (const [type, case_] of Object.entries(AFTER_CLOSE)) {
    if (!case_) continue;
    const [payload, closed] = case_;
    it(`after a clean close, a "${type}" event leaves the last sitting ${closed ? 'closed' : 'open'} in all three`, () => {
      const dir = tempDir();
      const path = join(dir, 'level.jsonl');
      writeFileSync(path, sessionText([...CLOSED_LEVEL, payload]));
      const { scan, state, audit, verdict } = readForAudit(path, OPTIONS);
      expect(scan.corruption).toBeNull();
      expect(state.closed).toBe(closed);
      expect(verdict.summary.includes('not closed cleanly')).toBe(!closed);
      expect(audit.sittings.at(-1)?.closedCleanly).toBe(closed);
      // And the way `exine count` reads it at resume.
      expect(readLevel(path).state.closed).toBe(closed);
    });
  }

  it('keeps a correction and its verdict out of the counting time, but not a verdict met while counting', () => {
    const minute = 60_000;
    const text = sessionText([...CLOSED_LEVEL, { type: 'void', grain: 3, traverse: null, reason: 'a spore' }, { type: 'rules-unmet', sum: 1, grains: 1 }], Date.parse('2026-11-02T09:00:00.000Z'), minute);
    const dir = tempDir();
    writeFileSync(join(dir, 'level.jsonl'), text);
    const { audit } = readForAudit(join(dir, 'level.jsonl'), { ...OPTIONS, gapMs: 10 * minute });
    // Counting runs from the sitting (line 2) to the close (line 7): five minutes; the two later lines add nothing.
    expect(audit.countingMs).toBe(5 * minute);
    expect(audit.lastAt).toBe(new Date(Date.parse('2026-11-02T09:00:00.000Z') + 6 * minute).toISOString());
  });
});
