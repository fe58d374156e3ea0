import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { FORMAT_VERSION } from '../../src/model/events.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';
import { TINY_KEYMAP, grain, openPayload, sessionText } from '../helpers/levels.js';
import * as levelFiles from '../../src/session/session-files.js';

function folderWith(files: Record<string, string>) {
  const dir = tempDir();
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
  return dir;
}

const snapshot = (dir: string) => Object.fromEntries(readdirSync(dir).map((f) => [f, readFileSync(join(dir, f), 'utf8')]));

describe('bad input gets one clear line, the right exit code, and changes nothing', () => {
  const cases: [string, string, RegExp][] = [
    ['malformed JSON', '{"name": "x", "keys": {"q": {"taxon": "Quercus", "group": "trees"},}}', /^exine: keymap bad\.json: line 1: expected a quoted property name/],
    ['a key written twice', '{"name":"x","keys":{\n"q":{"taxon":"Quercus","group":"trees"},\n"q":{"taxon":"Pinus","group":"trees"}}}', /^exine: keymap bad\.json: key "q" is bound twice \(lines 2 and 3\)/],
    ['an unknown group', '{"name":"x","keys":{"q":{"taxon":"Quercus","group":"treez"}}}', /^exine: keymap bad\.json: key "q" has unknown group "treez" \(expected one of trees,/],
    ['a key on a taxon and an action', '{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"}},"actions":{"note":"q"}}', /^exine: keymap bad\.json: key "q" is bound to both taxon "Quercus" and action "note"/],
  ];
  it.each(cases)('keymap with %s: exine keys and exine count refuse it', async (_, text, message) => {
    const dir = folderWith({ 'bad.json': text });
    const keys = await runExine(['keys', 'bad.json'], dir);
    expect(keys.code).toBe(1);
    expect(oneLine(keys)).toMatch(message);
    const count = await runExine(['count', 'new.jsonl', '--keymap', 'bad.json'], dir);
    expect(count.code).toBe(1);
    expect(oneLine(count)).toMatch(message);
    expect(readdirSync(dir)).toEqual(['bad.json']);
  });

  it('an unknown flag is a usage error (exit 2) and creates nothing', async () => {
    const dir = tempDir();
    const run = await runExine(['count', 'new.jsonl', '--traget', '300'], dir);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toBe("exine count: unknown option '--traget' (see exine count --help)");
    expect(readdirSync(dir)).toEqual([]);
  });

  it('bad flag values and unknown commands are usage errors too', async () => {
    const dir = tempDir();
    expect(oneLine(await runExine(['count', 'n.jsonl', '--target', 'lots'], dir))).toMatch(/--target must be a whole number above 0, not "lots"/);
    expect((await runExine(['count', 'n.jsonl', '--depth', 'deep'], dir)).code).toBe(2);
    expect((await runExine(['export', 'x.jsonl', '--format', 'tall'], dir)).code).toBe(2);
    expect((await runExine(['tally'], dir)).code).toBe(2);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a missing file is named', async () => {
    const dir = tempDir();
    for (const command of ['summary', 'export', 'verify']) {
      const run = await runExine([command, 'nowhere.jsonl'], dir);
      expect(run.code).toBe(1);
      expect(oneLine(run)).toMatch(/nowhere\.jsonl: no such session file/);
    }
    expect(oneLine(await runExine(['keys', 'nowhere.json'], dir))).toMatch(/keymap nowhere\.json: no such file \(bundled keymaps: keypad, temperate-lowland\)/);
  });

  it('a file that is not a session file is called that', async () => {
    const dir = folderWith({ 'notes.txt': 'counted 300 grains today\n' });
    const run = await runExine(['summary', 'notes.txt'], dir);
    expect(run.code).toBe(1);
    expect(oneLine(run)).toMatch(/notes\.txt: line 1 is not an exine session line: this is not a session file/);
  });

  it('a session file from a future format version is refused by every command, untouched', async () => {
    const dir = folderWith({ 'future.jsonl': sessionText([{ ...openPayload(), format: FORMAT_VERSION + 1 }, grain('Alnus')]) });
    const before = snapshot(dir);
    for (const args of [['count', 'future.jsonl'], ['summary', 'future.jsonl'], ['export', 'future.jsonl'], ['verify', 'future.jsonl']]) {
      const run = await runExine(args, dir);
      expect(run.code, args.join(' ')).toBe(1);
      expect(oneLine(run)).toMatch(new RegExp(`line 1 is session format ${FORMAT_VERSION + 1}, written by a newer exine \\(this one reads format ${FORMAT_VERSION}\\); update exine`));
    }
    expect(snapshot(dir)).toEqual(before);
  });

  it('a level in a folder that does not exist is refused before anything is written', () => {
    const dir = tempDir();
    const { createLevel } = levelFiles;
    expect(() => createLevel(join(dir, 'no', 'l.jsonl'), { info: { level: 'x', depth: null, site: null, core: null, slide: null, analyst: null }, keymap: TINY_KEYMAP, rules: DEFAULT_RULES, spike: null })).toThrow(
      /cannot create .*l\.jsonl: the folder .*no does not exist/,
    );
    expect(readdirSync(dir)).toEqual([]);
  });

  it('count without a terminal says so and creates nothing', async () => {
    const dir = tempDir();
    const run = await runExine(['count', 'new.jsonl'], dir);
    expect(run.code).toBe(1);
    expect(oneLine(run)).toMatch(/needs an interactive terminal/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('resuming with details that differ from the file is refused, naming both', async () => {
    const dir = folderWith({ 'l.jsonl': sessionText([openPayload(), grain('Alnus')]) });
    const run = await runExine(['count', 'l.jsonl', '--depth', '99'], dir);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toMatch(/records depth 10, not 99/);
    const keymap = await runExine(['count', 'l.jsonl', '--keymap', 'keypad'], dir);
    expect(oneLine(keymap)).toMatch(/was counted with its own keymap "tiny"; resuming always uses that one/);
    expect(readdirSync(dir)).toEqual(['l.jsonl']);
  });

  it('export never overwrites a file without --force', async () => {
    const dir = folderWith({ 'l.jsonl': sessionText([openPayload(), grain('Alnus')]), 'out.csv': 'precious' });
    const run = await runExine(['export', 'l.jsonl', '--out', 'out.csv'], dir);
    expect(run.code).toBe(1);
    expect(oneLine(run)).toBe('exine: out.csv already exists; add --force to replace it');
    expect(readFileSync(join(dir, 'out.csv'), 'utf8')).toBe('precious');
    expect((await runExine(['export', 'l.jsonl', '--out', 'out.csv', '--force'], dir)).code).toBe(0);
    expect(readFileSync(join(dir, 'out.csv'), 'utf8')).toMatch(/^level,depth,/);
    expect(existsSync(join(dir, 'l.jsonl'))).toBe(true);
  });
});
