import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { grain, openPayload, sessionText } from '../helpers/levels.js';
import { startInPty } from '../helpers/pty.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

function finishedLevel(): { dir: string; path: string } {
  const dir = tempDir();
  const path = join(dir, 'done.jsonl');
  writeFileSync(path, sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula'), { type: 'finish' }]));
  return { dir, path };
}

describe('a finished level', () => {
  it('opens read-only in a real terminal: keys count nothing, and after Ctrl-C the file is byte for byte the same', async () => {
    const { dir, path } = finishedLevel();
    const before = readFileSync(path);
    const t = startInPty(['count', 'done.jsonl'], dir);
    await t.ready(/READ-ONLY: this level is finished/);
    expect(t.output()).toMatch(/FINISHED \d{4}-\d\d-\d\d \d\d:\d\d UTC · read-only/);
    expect(t.output()).toMatch(/read-only: no key counts · Ctrl-C quits/);
    t.type('aab\t\x7f');
    t.type('\x03');
    expect(await t.exited()).toBe(0);
    expect(t.output()).toMatch(/done\.jsonl is finished and was opened read-only; nothing changed \(2 grains, pollen sum 2; last line #5, hash [0-9a-f]{64}\)/);
    expect(readFileSync(path).equals(before)).toBe(true);
    // No lock, backup or marker is left beside it either.
    expect(readdirSync(dir)).toEqual(['done.jsonl']);
  });

  it('--reopen "reason" records a reopen event and counts on; finishing again prints the last hash to write down', async () => {
    const { dir, path } = finishedLevel();
    const t = startInPty(['count', 'done.jsonl', '--reopen', 'two more traverses for Tilia'], dir);
    await t.ready(/Pollen sum 2/);
    t.type('a');
    await t.waitFor(/Pollen sum 3/);
    t.type('\x06');
    await t.waitFor(/Finish this level\?/);
    t.type('y');
    expect(await t.exited()).toBe(0);
    const events = scanLog(readFileSync(path)).events;
    expect(events.slice(5).map((e) => e.type)).toEqual(['sitting', 'reopen', 'grain', 'finish']);
    expect(events[6]).toMatchObject({ type: 'reopen', reason: 'two more traverses for Tilia' });
    const { scan, state } = readLevel(path);
    expect(state.finishedAt).not.toBeNull();
    expect(state.reopens).toBe(1);
    expect(t.output()).toMatch(new RegExp(`finished .*done\\.jsonl: 3 grains, pollen sum 3\\s+last line #${state.lastSeq}, hash ${scan.lastHash} \\(write it down`));
  });

  it('refuses a rule change without --reopen, --reopen on a level that is not finished, and an empty reason, changing nothing', () => {
    const { dir, path } = finishedLevel();
    const before = readFileSync(path);
    const rules = { ...readLevel(path).state.rules, targetSum: 400 };
    expect(() => resumeLevel(path, { rules })).toThrow(/this level is finished; its rules and spike data change only when it is reopened \(add --reopen "reason"\)/);
    expect(() => resumeLevel(path, { reopen: ' ' })).toThrow(/--reopen needs a reason/);
    expect(readFileSync(path).equals(before)).toBe(true);
    const open = join(dir, 'open.jsonl');
    writeFileSync(open, sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'close' }]));
    expect(() => resumeLevel(open, { reopen: 'why' })).toThrow(/this level is not finished, so there is nothing to reopen \(leave out --reopen\)/);
    expect(readdirSync(dir).sort()).toEqual(['done.jsonl', 'open.jsonl']);
  });
});

describe('flags at the eyepiece', () => {
  it('a negative number after a flag gets one honest message', async () => {
    const dir = tempDir();
    const target = await runExine(['count', 'n.jsonl', '--target', '-3'], dir);
    expect([target.code, target.stderr.trim()]).toEqual([2, 'exine count: --target cannot be negative ("-3")']);
    const depth = await runExine(['count', 'n.jsonl', '--depth', '-3'], dir);
    expect(depth.stderr).toMatch(/a negative --depth is written --depth=-3 \(with --allow-negative-depth/);
  });

  it('a negative depth is refused unless --allow-negative-depth', async () => {
    const dir = tempDir();
    const refused = await runExine(['count', 'n.jsonl', '--depth=-3'], dir);
    expect([refused.code, refused.stderr]).toEqual([2, expect.stringMatching(/--depth -3 is below zero; if this core is measured from a datum above the sediment, add --allow-negative-depth/)]);
    // Allowed, it gets as far as asking for a terminal (the test has none); nothing was created.
    const allowed = await runExine(['count', 'n.jsonl', '--depth=-3', '--allow-negative-depth'], dir);
    expect(allowed.stderr).toMatch(/needs an interactive terminal/);
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('the precision rule in words', () => {
  it('summary writes its label whole: "half-width ≤ H points"', async () => {
    const run = await runExine(['summary', new URL('../../demo-sessions/km1-084cm.jsonl', import.meta.url).pathname]);
    expect(run.stdout).toMatch(/^ {2}half-width ≤ 4 points ≥10% +5\.\d+ of 4\.00 /m);
  });
});
