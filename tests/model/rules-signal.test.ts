import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { NO_RULES, DEFAULT_RULES } from '../../src/rules/rule-set.js';
import type { KeyPress } from '../../src/input/key-press.js';
import { TINY_KEYMAP, newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const keys = (text: string): KeyPress[] => [...text].map((c) => (c === '\x7f' ? { kind: 'backspace' } : { kind: 'char', char: c }) as KeyPress);

function session(targetSum = 5) {
  const level = newLevelFile(tempDir(), 'l.jsonl', TINY_KEYMAP, { ...NO_RULES, targetSum });
  return { path: level.path, session: new CountingSession(level.writer, level.state) };
}

const eventsOf = (path: string) => scanLog(readFileSync(path)).events;

const signals = (path: string) =>
  eventsOf(path).filter((e) => e.type === 'rules-met' || e.type === 'rules-unmet').map((e) => [e.type, (e as { sum: number }).sum]);

describe('the rules-met event', () => {
  it('is recorded right after the grain that meets the set, with the sum at that moment, and only once', () => {
    const { path, session: s } = session(5);
    s.pressAll(keys('aaaa'));
    expect(signals(path)).toEqual([]);
    s.pressAll(keys('b'));
    expect(signals(path)).toEqual([['rules-met', 5]]);
    s.pressAll(keys('abab'));
    s.shutdown();
    expect(signals(path)).toEqual([['rules-met', 5]]);
    const events = eventsOf(path);
    const met = events.findIndex((e) => e.type === 'rules-met');
    expect(events[met - 1]).toMatchObject({ type: 'grain', taxon: 'Betula' });
    expect(events[met]).toMatchObject({ grains: 5, met: ['target'] });
  });

  it('inside a burst that crosses the target, sits at the crossing grain, not at the end of the burst', () => {
    const { path, session: s } = session(5);
    s.pressAll(keys('aaaaaaaa'));
    s.shutdown();
    const events = eventsOf(path);
    const met = events.find((e) => e.type === 'rules-met')!;
    const grainsBefore = events.filter((e) => e.type === 'grain' && e.seq < met.seq).length;
    expect(grainsBefore).toBe(5);
  });

  it('an undo that un-meets the set records rules-unmet; meeting it again records rules-met again', () => {
    const { path, session: s } = session(3);
    s.pressAll(keys('aaa'));
    s.pressAll(keys('\x7f'));
    expect(s.getSnapshot().state.rulesMet).toBe(false);
    s.pressAll(keys('b'));
    s.shutdown();
    expect(signals(path)).toEqual([['rules-met', 3], ['rules-unmet', 2], ['rules-met', 3]]);
    const state = readLevel(path).state;
    expect(state.firstRulesMet!.seq).toBeLessThan(state.lastRulesMet!.seq);
  });

  it('grains outside the pollen sum never meet a target sum', () => {
    const { path, session: s } = session(2);
    s.pressAll(keys('ssslla'));
    s.shutdown();
    expect(signals(path)).toEqual([]);
  });

  it('a rule change on resume is recorded, and meets the set at once when the count already satisfies it', () => {
    const { path, session: s } = session(10);
    s.pressAll(keys('aaaaaa'));
    s.shutdown();
    const opened = resumeLevel(path, { rules: { ...DEFAULT_RULES, targetSum: 6 } });
    opened.writer.close();
    const tail = eventsOf(path).slice(-3);
    expect(tail.map((e) => e.type)).toEqual(['sitting', 'rules', 'rules-met']);
    expect(opened.notices.join()).toMatch(/stop rules changed from pollen sum 10 to pollen sum 6/);
    expect(opened.state.rulesMet).toBe(true);
  });

  it('resume with the same rules records nothing new', () => {
    const { path, session: s } = session(10);
    s.pressAll(keys('a'));
    s.shutdown();
    resumeLevel(path, { rules: { ...NO_RULES, targetSum: 10 } }).writer.close();
    expect(eventsOf(path).at(-1)!.type).toBe('sitting');
  });
});
