import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import { terminalJson, terminalText } from '../../src/cli/io.js';
import { UNSEEN } from '../../src/text/visible.js';
import { grain, openPayload, sessionText, TINY_KEYMAP } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

// What a crafted level or keymap could make a terminal do: write the clipboard (OSC 52),
// set the title, clear the screen, ring the bell, start a C1 control sequence, turn text around.
const HOSTILE = '\x1b]52;c;aGk=\x07\x1b]0;owned\x07\x1b[2J\x07\u009b31m\u202e\u2066\x7f\r';
const UNSEEN_ALL = new RegExp(UNSEEN.source, 'gu');

/** Characters a terminal would act on, other than the line breaks the output is made of. */
const raw = (text: string) => [...text.matchAll(UNSEEN_ALL)].filter((m) => m[0] !== '\n' && !(m[0] === '\r' && text[(m.index ?? 0) + 1] === '\n')).map((m) => m[0]);

async function run(args: string[], cwd: string, tty = false) {
  let stdout = '';
  let stderr = '';
  const code = await main(args, {
    stdin: { isTTY: false },
    stdout: { isTTY: tty, write: (t: string) => (stdout += t) },
    stderr: { isTTY: tty, write: (t: string) => (stderr += t) },
    env: process.env,
    cwd,
  });
  return { code, stdout, stderr };
}

function hostileLevel(dir: string, name = 'l.jsonl'): string {
  const keymap = { ...TINY_KEYMAP, name: `km${HOSTILE}`, keys: { ...TINY_KEYMAP.keys, a: { taxon: `Alnus${HOSTILE}`, group: 'trees' as const } } };
  const text = sessionText([
    openPayload(keymap, { site: `Mere${HOSTILE}`, level: `L${HOSTILE}`, slide: `S${HOSTILE}`, analyst: `A${HOSTILE}` }),
    { type: 'sitting', sitting: 1 },
    grain(`Alnus${HOSTILE}`, 1, 'a'),
    grain('Betula'),
    { type: 'note', grain: 3, text: `cf.${HOSTILE}`, stage: null },
  ]);
  writeFileSync(join(dir, name), text);
  return text;
}

describe('plain output never passes a control character from a file to the terminal', () => {
  it.each([
    [['summary', 'l.jsonl']],
    [['audit', '--plain', 'l.jsonl']],
    [['export', 'l.jsonl', '--format', 'notes']],
    [['export', 'l.jsonl', '--format', 'wide']],
    [['export', 'l.jsonl']],
  ])('exine %j on a terminal escapes them, visibly', async (args) => {
    const dir = tempDir();
    hostileLevel(dir);
    const r = await run(args, dir, true);
    expect(r.code).toBe(0);
    expect(raw(r.stdout + r.stderr)).toEqual([]);
    expect(r.stdout).toContain('\\u{1b}]52;c;aGk=\\u{7}');
  });

  it('summary and audit --plain escape them also when stdout is a file (they are reports, not data)', async () => {
    const dir = tempDir();
    hostileLevel(dir);
    for (const args of [['summary', 'l.jsonl'], ['audit', '--plain', 'l.jsonl']]) expect(raw((await run(args, dir)).stdout)).toEqual([]);
  });

  it('summary --json writes JSON escapes: safe to print, and the values read back as recorded', async () => {
    const dir = tempDir();
    hostileLevel(dir);
    const r = await run(['summary', 'l.jsonl', '--json'], dir, true);
    expect(raw(r.stdout)).toEqual([]);
    expect(JSON.parse(r.stdout)).toMatchObject({ site: `Mere${HOSTILE}`, level: `L${HOSTILE}` });
  });

  it('CSV to a pipe or a file keeps the data as recorded; to a terminal it is escaped', async () => {
    const dir = tempDir();
    hostileLevel(dir);
    const piped = await run(['export', 'l.jsonl'], dir, false);
    expect(piped.stdout).toContain(`Mere${HOSTILE}`);
    expect((await run(['export', 'l.jsonl', '--out', 'l.csv'], dir, true)).code).toBe(0);
    expect(readFileSync(join(dir, 'l.csv'), 'utf8')).toBe(piped.stdout);
    const shown = await run(['export', 'l.jsonl'], dir, true);
    expect(shown.stdout.split('\r\n').length).toBe(piped.stdout.split('\r\n').length);
    expect(raw(shown.stdout)).toEqual([]);
  });

  it('file names in verify, error lines and warnings are escaped', async () => {
    const dir = tempDir();
    const name = `l${HOSTILE}.jsonl`;
    const text = hostileLevel(dir, name);
    const ok = await run(['verify', name], dir, true);
    expect(ok.code).toBe(0);
    expect(raw(ok.stdout)).toEqual([]);
    expect(ok.stdout).toContain('l\\u{1b}]52');
    // A torn last line: a warning naming the file; a changed line: an error naming it.
    writeFileSync(join(dir, name), `${text}{"seq":6,"t`);
    const torn = await run(['summary', name], dir, true);
    expect(torn.stderr).toMatch(/incomplete/);
    expect(raw(torn.stderr + torn.stdout)).toEqual([]);
    writeFileSync(join(dir, name), text.replace('"Betula"', '"Betulx"'));
    for (const args of [['verify', name], ['summary', name], ['export', name], ['audit', '--plain', name]]) {
      const bad = await run(args, dir, true);
      expect(bad.code).toBe(1);
      expect(raw(bad.stderr)).toEqual([]);
      expect(bad.stderr).toContain('l\\u{1b}]52');
    }
  });

  it('keys: a keymap copy with such names is refused in an escaped line, and so is a crafted file name', async () => {
    const dir = tempDir();
    const keymap = { ...TINY_KEYMAP, name: `km${HOSTILE}` };
    writeFileSync(join(dir, 'km.json'), JSON.stringify(keymap));
    const refused = await run(['keys', 'km.json'], dir, true);
    expect(refused.code).not.toBe(0);
    expect(raw(refused.stderr)).toEqual([]);
    writeFileSync(join(dir, `km${HOSTILE}.json`), JSON.stringify(TINY_KEYMAP));
    const missing = await run(['keys', `km${HOSTILE}.json`, '--add-types', `none${HOSTILE}.jsonl`], dir, true);
    expect(raw(missing.stderr + missing.stdout)).toEqual([]);
    expect(missing.stderr).toContain('\\u{1b}');
  });
});

describe('the escapes themselves', () => {
  it('terminalText keeps LF and CRLF, escapes a lone CR and everything else unseen', () => {
    expect(terminalText('a\nb\r\nc\rd\x1b[2J\u202e')).toBe('a\nb\r\nc\\u{d}d\\u{1b}[2J\\u{202e}');
    expect(terminalText('Ilex aquifolium · ±3.5%')).toBe('Ilex aquifolium · ±3.5%');
  });

  it('terminalJson writes JSON escapes that parse back to the same string, astral format characters included', () => {
    const value = { s: `x\u0085\u202e\u{e0001}\u200by` };
    const json = terminalJson(JSON.stringify(value, null, 2));
    expect(raw(json)).toEqual([]);
    expect(JSON.parse(json)).toEqual(value);
  });
});
