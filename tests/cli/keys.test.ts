import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

describe('exine keys new, edit and --card', () => {
  it('new never replaces a file without --force, edit never changes a bundled keymap, both need a terminal', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'mine.json'), '{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"}}}');
    const again = await runExine(['keys', 'new', 'mine.json'], dir);
    expect([again.code, oneLine(again)]).toEqual([1, 'exine: mine.json already exists; add --force to replace it, or change it with exine keys edit mine.json']);
    const bundled = await runExine(['keys', 'edit', 'keypad'], dir);
    expect(bundled.code).toBe(2);
    expect(oneLine(bundled)).toMatch(/keypad is a bundled keymap and is never changed/);
    const noTty = await runExine(['keys', 'new', 'other.json'], dir);
    expect([noTty.code, oneLine(noTty)]).toEqual([1, 'exine keys new: needs an interactive terminal (standard input is not a TTY); run it in a terminal window']);
    const bad = await runExine(['keys', 'edit', 'nowhere.json'], dir);
    expect(oneLine(bad)).toMatch(/keymap nowhere\.json: cannot be read \(ENOENT\)/);
  });

  it('--card writes an SVG or a text card, atomically, and not over a file without --force', async () => {
    const dir = tempDir();
    const svg = await runExine(['keys', 'keypad', '--card', 'card.svg', '--paper', 'letter'], dir);
    expect(svg.stdout).toBe('card.svg: key card of Upland one-hand keypad (LETTER landscape; print at 100%)\n');
    expect(readFileSync(join(dir, 'card.svg'), 'utf8')).toMatch(/viewBox="0 0 279.4 215.9"/);
    const txt = await runExine(['keys', 'keypad', '--card', 'card.txt'], dir);
    expect(txt.code).toBe(0);
    expect(readFileSync(join(dir, 'card.txt'), 'utf8')).toMatch(/\+ M\s*\n.*Lycopodium/);
    expect((await runExine(['keys', 'keypad', '--card', 'card.svg'], dir)).code).toBe(1);
    expect((await runExine(['keys', 'keypad', '--card', 'card.svg', '--force'], dir)).code).toBe(0);
    expect(oneLine(await runExine(['keys', 'keypad', '--card', 'card.pdf'], dir))).toMatch(/--card must end in \.svg .* or \.txt/);
    expect(oneLine(await runExine(['keys', 'keypad', '--card', 'c.svg', '--paper', 'a3'], dir))).toMatch(/--paper must be a4 or letter, not "a3"/);
  });
});

describe('exine keys new in a folder that cannot take it', () => {
  it('says so before anything is typed', async () => {
    const dir = tempDir();
    const run = await runExine(['keys', 'new', 'no/such/mire.json'], dir);
    expect([run.code, oneLine(run)]).toEqual([1, 'exine: cannot write no/such/mire.json: its folder does not exist']);
  });
});
