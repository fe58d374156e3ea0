import { linkSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { refuseOwnInput } from '../../src/io/same-file.js';
import { writeCore } from '../helpers/core-json.js';
import { grain, openPayload, sessionText } from '../helpers/levels.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

function levelIn(dir: string): string {
  writeFileSync(join(dir, 'l.jsonl'), sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula')]));
  return readFileSync(join(dir, 'l.jsonl'), 'utf8');
}

// Every command that writes a file refuses to write over one it reads, whatever the flags.
describe('an output that is one of the inputs', () => {
  it.each([
    ['the same name', (_dir: string) => 'l.jsonl'],
    ['a hard link', (dir: string) => (linkSync(join(dir, 'l.jsonl'), join(dir, 'hard.csv')), 'hard.csv')],
    ['a symlink', (dir: string) => (symlinkSync('l.jsonl', join(dir, 'soft.csv')), 'soft.csv')],
    ['a path with a detour', (_dir: string) => './sub/../l.jsonl'],
  ])('export --out %s --force: one line, exit 2, the session file untouched', async (_name, outOf) => {
    const dir = tempDir();
    const before = levelIn(dir);
    writeFileSync(join(dir, 'other.jsonl'), before);
    const out = outOf(dir);
    const names = readdirSync(dir).sort();
    const run = await runExine(['export', 'other.jsonl', 'l.jsonl', '--out', out, '--force'], dir);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toMatch(new RegExp(`exine export: the output ${out.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} is one of the files it reads.*nothing was changed`));
    expect(readFileSync(join(dir, 'l.jsonl'), 'utf8')).toBe(before);
    expect(readdirSync(dir).sort()).toEqual(names);
  });

  it('export to a new file or another existing one with --force still works', async () => {
    const dir = tempDir();
    levelIn(dir);
    writeFileSync(join(dir, 'old.csv'), 'x\n');
    expect((await runExine(['export', 'l.jsonl', '--out', 'old.csv', '--force'], dir)).code).toBe(0);
    expect(readFileSync(join(dir, 'old.csv'), 'utf8')).toMatch(/^level,/);
  });

  it('keys --add-types refuses a keymap that is the session it reads', async () => {
    const dir = tempDir();
    const before = levelIn(dir);
    linkSync(join(dir, 'l.jsonl'), join(dir, 'km.json'));
    const run = await runExine(['keys', 'km.json', '--add-types', 'l.jsonl'], dir);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toMatch(/exine keys: the output .*km\.json is one of the files it reads \(l\.jsonl is the same file\)/);
    expect(readFileSync(join(dir, 'l.jsonl'), 'utf8')).toBe(before);
  });

  it('keys from-list refuses an --out that is its list, and keys --card one that is its keymap, --force or not', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'taxa.txt'), 'Pinus, trees\nBetula, trees\n');
    const list = await runExine(['keys', 'from-list', 'taxa.txt', '--out', './taxa.txt', '--force'], dir);
    expect(list.code).toBe(2);
    expect(oneLine(list)).toMatch(/exine keys from-list: the output \.\/taxa\.txt is one of the files it reads \(taxa\.txt is the same file\)/);
    expect(readFileSync(join(dir, 'taxa.txt'), 'utf8')).toBe('Pinus, trees\nBetula, trees\n');
    const keymap = '{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"}}}';
    writeFileSync(join(dir, 'km.txt'), keymap);
    const card = await runExine(['keys', 'km.txt', '--card', 'km.txt', '--force'], dir);
    expect(card.code).toBe(2);
    expect(oneLine(card)).toMatch(/exine keys: the output km\.txt is one of the files it reads/);
    expect(readFileSync(join(dir, 'km.txt'), 'utf8')).toBe(keymap);
  });

  it('a core export refuses to write over the core.json it reads, --force or not', async () => {
    const dir = tempDir();
    writeCore(dir);
    const before = readFileSync(join(dir, 'core.json'), 'utf8');
    const run = await runExine(['export', '.', '--out', 'core.json', '--force'], dir);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toMatch(/exine export: the output core\.json is one of the files it reads/);
    expect(readFileSync(join(dir, 'core.json'), 'utf8')).toBe(before);
  });

  it('the helper lets through an output that does not exist yet or is another file', () => {
    const dir = tempDir();
    levelIn(dir);
    writeFileSync(join(dir, 'b.csv'), '');
    expect(() => refuseOwnInput('export', 'new.csv', ['l.jsonl'], dir)).not.toThrow();
    expect(() => refuseOwnInput('export', 'b.csv', ['l.jsonl'], dir)).not.toThrow();
    expect(() => refuseOwnInput('export', 'l.jsonl', ['b.csv', 'l.jsonl'], dir)).toThrow(/is one of the files it reads/);
  });
});
