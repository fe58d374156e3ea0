import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { tempDir } from '../helpers/temp-dir.js';
import { TINY_KEYMAP, grain, openPayload, sessionText } from '../helpers/levels.js';
import { withKey } from '../../src/keymap/keymap.js';

const body = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula'), grain('Betula', 1, 'b')]);
const lastLine = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula'), grain('Betula', 1, 'b'), grain('Corylus')]).slice(body.length);

describe('resuming a level', () => {
  it('restores counts and traverse, and records a new sitting', () => {
    const dir = tempDir();
    const path = join(dir, 'l.jsonl');
    writeFileSync(path, sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'traverse', traverse: 2 }, grain('Betula', 2), { type: 'close' }]));
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.state.counts).toEqual({ Alnus: 1, Betula: 1 });
    expect(opened.state.traverse).toBe(2);
    expect(opened.state.sitting).toBe(2);
    expect(opened.notices).toEqual([]);
    const after = readLevel(path).state;
    expect(after.recent.at(-1)).toMatchObject({ type: 'sitting', sitting: 2 });
  });

  it('tells the analyst when the last sitting did not close cleanly', () => {
    const path = join(tempDir(), 'l.jsonl');
    writeFileSync(path, body);
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.notices.join()).toMatch(/not closed cleanly/);
  });

  it('records a changed target as a rules event', () => {
    const path = join(tempDir(), 'l.jsonl');
    writeFileSync(path, body);
    const opened = resumeLevel(path, { rules: { ...DEFAULT_RULES, targetSum: 300 } });
    opened.writer.close();
    expect(opened.state.rules.targetSum).toBe(300);
    expect(readLevel(path).state.recent.at(-1)).toMatchObject({ type: 'rules', rules: { targetSum: 300 } });
  });

  it('repairs a torn last line cut at every byte offset: backup kept, nothing earlier lost', () => {
    for (let cut = 1; cut < lastLine.length; cut++) {
      const dir = tempDir();
      const path = join(dir, 'l.jsonl');
      const torn = body + lastLine.slice(0, cut);
      writeFileSync(path, torn);
      const opened = resumeLevel(path);
      opened.writer.close();
      expect(opened.state.counts, `cut ${cut}`).toEqual({ Alnus: 1, Betula: 2 });
      expect(opened.notices[0], `cut ${cut}`).toMatch(/line 6 is incomplete.*bytes cut off and kept in l\.jsonl\.cut-.*\.bak/);
      const backups = readdirSync(dir).filter((f) => f.endsWith('.bak'));
      expect(backups.length).toBe(1);
      expect(readFileSync(join(dir, backups[0] as string), 'utf8')).toBe(lastLine.slice(0, cut));
      const now = readFileSync(path, 'utf8');
      expect(now.startsWith(body)).toBe(true);
      const scan = scanLog(Buffer.from(now));
      expect([scan.tail, scan.corruption]).toEqual([null, null]);
      expect(scan.events.slice(5).map((e) => e.type)).toEqual(['repair', 'sitting']);
    }
  });

  it('repairs a torn line of non-ASCII text cut inside a multi-byte character, at every byte', () => {
    const keymap = withKey(TINY_KEYMAP, 'e', { taxon: 'Æsculus—type', group: 'trees' });
    const head = sessionText([openPayload(keymap), grain('Æsculus—type', 1, 'e'), { type: 'note', text: 'cf. Tilia, très abîmé 🌲', grain: 2, stage: null }]);
    const full = sessionText([openPayload(keymap), grain('Æsculus—type', 1, 'e'), { type: 'note', text: 'cf. Tilia, très abîmé 🌲', grain: 2, stage: null }, grain('Æsculus—type', 1, 'e')]);
    const headBytes = Buffer.from(head);
    const tail = Buffer.from(full).subarray(headBytes.length);
    for (let cut = 1; cut < tail.length; cut++) {
      const path = join(tempDir(), 'l.jsonl');
      writeFileSync(path, Buffer.concat([headBytes, tail.subarray(0, cut)]));
      const opened = resumeLevel(path);
      opened.writer.close();
      expect(opened.state.counts, `cut ${cut}`).toEqual({ 'Æsculus—type': 1 });
      expect(readFileSync(path).subarray(0, headBytes.length).equals(headBytes)).toBe(true);
      expect(scanLog(readFileSync(path)).corruption).toBeNull();
    }
  });

  it('finds an invalid byte inside a line as damage', () => {
    const path = join(tempDir(), 'l.jsonl');
    const bytes = Buffer.from(body);
    const at = bytes.indexOf('"taxon":"Betula","traverse"') + 9;
    bytes[at] = 0xff;
    writeFileSync(path, bytes);
    expect(() => resumeLevel(path)).toThrow(/line 4 is not valid UTF-8: its bytes were changed after it was written/);
  });

  it('refuses a file with damage before its end and changes nothing', () => {
    const path = join(tempDir(), 'l.jsonl');
    const edited = body.replace('"taxon":"Alnus","traverse"', '"taxon":"Pinus","traverse"');
    writeFileSync(path, edited);
    expect(() => resumeLevel(path)).toThrow(/line 3 does not match its hash.*nothing was changed/);
    expect(readFileSync(path, 'utf8')).toBe(edited);
    expect(readdirSync(join(path, '..'))).toEqual(['l.jsonl']);
  });
});
