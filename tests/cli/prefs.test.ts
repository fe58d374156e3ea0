import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openForCounting, screenOptions } from '../../src/cli/commands/count.js';
import { DEFAULT_PREFS } from '../../src/prefs/pref-values.js';
import { readPreferences } from '../../src/prefs/preferences.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const env = () => ({ EXINE_CONFIG_DIR: tempDir() });

describe('exine prefs', () => {
  it('shows the defaults, sets and unsets values, in an isolated config folder', async () => {
    const e = env();
    const shown = await runExine(['prefs'], undefined, e);
    expect(shown.code).toBe(0);
    expect(shown.stdout).toMatch(/^bell\s+on\s+default/m);
    expect(shown.stdout).toMatch(/^break\s+50\s+default/m);
    expect(shown.stdout).toMatch(new RegExp(`stored in ${e.EXINE_CONFIG_DIR}/config\\.json`));
    expect((await runExine(['prefs', 'set', 'break', 'off'], undefined, e)).stdout).toBe('break = off\n');
    expect((await runExine(['prefs', 'set', 'analyst', 'R.', 'Fern'], undefined, e)).stdout).toBe('analyst = R. Fern\n');
    expect((await runExine(['prefs', 'set', 'rare', '3'], undefined, e)).code).toBe(0);
    const again = (await runExine(['prefs'], undefined, e)).stdout;
    expect(again).toMatch(/^break\s+off\s+set/m);
    expect(again).toMatch(/^analyst\s+R\. Fern\s+set/m);
    expect(JSON.parse(readFileSync(join(e.EXINE_CONFIG_DIR, 'config.json'), 'utf8'))).toEqual({ break: null, analyst: 'R. Fern', rare: 3 });
    await runExine(['prefs', 'unset', 'rare'], undefined, e);
    expect((await runExine(['prefs'], undefined, e)).stdout).toMatch(/^rare\s+2\s+default/m);
  });

  it('lines its columns up, a long analyst name shown whole', async () => {
    const e = env();
    await runExine(['prefs', 'set', 'analyst', 'Dr. Somebody With A Very Long Name'], undefined, e);
    const lines = (await runExine(['prefs'], undefined, e)).stdout.split('\n').filter((l) => /^(bell|rare|break|keymap|analyst) /.test(l));
    expect(lines).toHaveLength(5);
    expect(lines.find((l) => l.startsWith('analyst'))).toMatch(/Dr\. Somebody With A Very Long Name\s+set\s/);
    const column = (l: string) => l.search(/ (set|default) {2}/);
    expect(new Set(lines.map(column)).size).toBe(1);
    const help = (l: string) => l.search(/(set {4}|default)  \S/);
    expect(new Set(lines.map(help)).size).toBe(1);
  });

  it.each([
    [['prefs', 'set', 'bell', 'loud'], /bell must be on or off, not "loud"/],
    [['prefs', 'set', 'rare', '0'], /rare must be a whole number from 1 to 100/],
    [['prefs', 'set', 'colour', 'red'], /unknown preference "colour" \(one of bell, rare, break, keymap, analyst\)/],
    [['prefs', 'frobnicate'], /unknown action "frobnicate"/],
  ])('exine %j is a usage error, and nothing is stored', async (args, message) => {
    const e = env();
    const run = await runExine(args, undefined, e);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toMatch(message);
    expect(existsSync(join(e.EXINE_CONFIG_DIR, 'config.json'))).toBe(false);
  });

  it('a hand-edited file with a bad value is refused, never cleared', async () => {
    const e = env();
    writeFileSync(join(e.EXINE_CONFIG_DIR, 'config.json'), '{"rare": "many"}');
    const run = await runExine(['prefs'], undefined, e);
    expect(run.code).toBe(1);
    expect(oneLine(run)).toMatch(/preferences cannot be read: .*fix or delete the file/);
    expect(readFileSync(join(e.EXINE_CONFIG_DIR, 'config.json'), 'utf8')).toBe('{"rare": "many"}');
  });

  it('a keymap preference is checked when set and kept as an absolute path', async () => {
    const e = env();
    const dir = tempDir();
    writeFileSync(join(dir, 'mine.json'), '{"name":"Mine","keys":{"q":{"taxon":"Quercus","group":"trees"}}}');
    const run = await runExine(['prefs', 'set', 'keymap', 'mine.json'], dir, e);
    expect(run.stdout).toBe(`keymap = ${join(dir, 'mine.json')}\n`);
    const missing = await runExine(['prefs', 'set', 'keymap', 'nope.json'], dir, e);
    expect(missing.code).toBe(1);
    expect(oneLine(missing)).toMatch(/keymap nope\.json: no such file/);
    expect((await runExine(['prefs', 'set', 'keymap', 'keypad'], dir, e)).stdout).toBe('keymap = keypad\n');
  });

  it('flags override preferences, preferences override the defaults', () => {
    const prefs = { ...DEFAULT_PREFS, bell: false, rare: 4, break: 30 };
    expect(screenOptions(DEFAULT_PREFS, {})).toEqual({ bell: true, rareThreshold: 2, breakMinutes: 50 });
    expect(screenOptions(prefs, {})).toEqual({ bell: false, rareThreshold: 4, breakMinutes: 30 });
    expect(screenOptions(prefs, { rare: '1', break: 'off' })).toEqual({ bell: false, rareThreshold: 1, breakMinutes: null });
    expect(screenOptions(DEFAULT_PREFS, { quiet: true })).toMatchObject({ bell: false });
    expect(() => screenOptions(DEFAULT_PREFS, { rare: 'few' })).toThrow(/--rare must be a whole number from 1 to 100/);
  });

  it('the keymap and analyst preferences apply to new levels', async () => {
    const e = env();
    await runExine(['prefs', 'set', 'analyst', 'R. Fern'], undefined, e);
    await runExine(['prefs', 'set', 'keymap', 'keypad'], undefined, e);
    const { prefs } = readPreferences(e);
    expect(prefs).toMatchObject({ analyst: 'R. Fern', keymap: 'keypad' });
    const opened = openForCounting(join(tempDir(), 'new.jsonl'), {}, () => {}, prefs);
    opened.writer.close();
    expect([opened.state.header.analyst, opened.state.keymap.name]).toEqual(['R. Fern', 'Upland one-hand keypad']);
    // A flag wins over the preference.
    const flagged = openForCounting(join(tempDir(), 'new.jsonl'), { analyst: 'K. Other' }, () => {}, prefs);
    flagged.writer.close();
    expect(flagged.state.header.analyst).toBe('K. Other');
  });
});
