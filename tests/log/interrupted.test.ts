import { existsSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { repairTail } from '../../src/log/repair-tail.js';
import { scanLog } from '../../src/log/scan-log.js';
import { nodeWriterFs } from '../../src/log/session-writer.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { createLevel, readLevel, resumeLevel } from '../../src/session/session-files.js';
import { startChild } from '../helpers/child.js';
import { grain, openPayload, sessionText, TINY_KEYMAP } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';
import { fillDisk, tinyDisk } from '../helpers/tiny-disk.js';

const CREATE_CHILD = fileURLToPath(new URL('../fixtures/create-child.mjs', import.meta.url));
const INFO = { level: 'I-1', depth: 1, site: null, core: null, slide: null, analyst: null };

/** A level of a few grains whose last line was torn by a crash. */
function tornLevel(dir: string): string {
  const path = join(dir, 'level.jsonl');
  const text = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula'), grain('Corylus')]);
  writeFileSync(path, text.slice(0, -40));
  return path;
}

describe('creating a level exists whole or not at all', () => {
  it('a write or sync that fails leaves no file at all, and no temporary file', () => {
    for (const fail of ['writeSync', 'fsyncSync'] as const) {
      const dir = tempDir();
      const path = join(dir, 'new.jsonl');
      const ops = { ...nodeWriterFs, [fail]: () => { throw Object.assign(new Error('EIO'), { code: 'EIO' }); } };
      expect(() => createLevel(path, { info: INFO, keymap: TINY_KEYMAP, rules: DEFAULT_RULES, spike: null }, { ops })).toThrow();
      expect(readdirSync(dir)).toEqual([]);
    }
  });

  it('killed at random moments while creating (real processes), the file is either absent or whole', async () => {
    const dir = tempDir();
    let whole = 0;
    let absent = 0;
    for (let round = 0; round < 12; round++) {
      const path = join(dir, `k-${round}.jsonl`);
      const child = startChild([CREATE_CHILD, path]);
      await new Promise((r) => setTimeout(r, 40 + ((round * 37) % 120)));
      child.proc.kill('SIGKILL');
      await child.exited();
      if (!existsSync(path)) {
        absent++;
        continue;
      }
      // Present: line 1 is whole (the sitting line may or may not have followed it).
      const scan = scanLog(readFileSync(path));
      expect(scan.corruption).toBeNull();
      expect(scan.lines).toBeGreaterThanOrEqual(1);
      whole++;
    }
    expect(whole + absent).toBe(12);
    expect(readdirSync(dir).filter((n) => n.includes('.new-'))).toEqual([]);
  }, 60_000);

  it('an empty file left by an older exine says what to do', () => {
    const path = join(tempDir(), 'empty.jsonl');
    writeFileSync(path, '');
    expect(() => resumeLevel(path)).toThrow(/the file is empty: it holds no level \(an older exine stopped while creating it\); delete it and count the level again/);
  });
});

describe('a repair that is stopped halfway', () => {
  it('a backup that no repair event names is found, recorded and reported at the next open', () => {
    const path = tornLevel(tempDir());
    const bytes = readFileSync(path);
    const scan = scanLog(bytes);
    // The cut and the backup happen; the process stops before the repair event is written.
    const cut = repairTail(path, scan.tail!, new Date('2026-11-03T08:00:00.000Z'));
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.notices.join(' ')).toMatch(new RegExp(`found ${cut.backup.replace(/\./g, '\\.')} \\(${cut.cutBytes} bytes cut off by a repair that was stopped before it was recorded\\)`));
    expect(opened.state.repairBackups).toEqual([cut.backup]);
    // Recorded once: the open after that says nothing more about it.
    const again = resumeLevel(path);
    again.writer.close();
    expect(again.notices.join(' ')).not.toMatch(/found/);
  });

  it('never takes a backup name already used, and never writes through a link', () => {
    const dir = tempDir();
    const path = tornLevel(dir);
    const stamp = '2026-11-03T08-00-00-000Z';
    writeFileSync(join(dir, `level.jsonl.cut-${stamp}.bak`), 'an older backup\n');
    const target = join(dir, 'elsewhere.txt');
    writeFileSync(target, 'not to be touched\n');
    symlinkSync(target, join(dir, `level.jsonl.cut-${stamp}-2.bak`));
    const bytes = readFileSync(path);
    const cut = repairTail(path, scanLog(bytes).tail!, new Date('2026-11-03T08:00:00.000Z'));
    expect(cut.backup).toBe(`level.jsonl.cut-${stamp}-3.bak`);
    expect(readFileSync(join(dir, `level.jsonl.cut-${stamp}.bak`), 'utf8')).toBe('an older backup\n');
    expect(readFileSync(target, 'utf8')).toBe('not to be touched\n');
    expect(readFileSync(join(dir, cut.backup)).length).toBe(cut.cutBytes);
  });
});

// A real full disk: a 64 KiB tmpfs (root only, as on the project's machines and CI; skipped elsewhere).
describe('a disk too full for the repair backup', () => {
  const disk = tinyDisk('exine-full-repair-');

  it('says so in one line, leaves no 0-byte backup, and changes nothing', (ctx) => {
    if (!disk.mounted()) ctx.skip();
    const mountPoint = disk.dir;
    const path = join(mountPoint, 'level.jsonl');
    const payloads = [openPayload(), { type: 'sitting' as const, sitting: 1 }, ...Array.from({ length: 60 }, () => grain('Alnus'))];
    const text = sessionText(payloads);
    writeFileSync(path, `${text}${'x'.repeat(12_000)}`);
    const fills = fillDisk(mountPoint);
    // Room for the lock file (one page), none for the 12 KB backup.
    rmSync(join(mountPoint, 'fill-0'));
    rmSync(join(mountPoint, `fill-${fills - 1}`), { force: true });
    const before = readFileSync(path);
    expect(() => resumeLevel(path)).toThrow(/^cannot repair .*level\.jsonl: saving its damaged tail to level\.jsonl\.cut-.*\.bak failed \(the disk is full\); nothing was changed, the file is as it was$/);
    expect(readdirSync(mountPoint).filter((n) => n.endsWith('.bak') || n.endsWith('.lock'))).toEqual([]);
    expect(readFileSync(path).equals(before)).toBe(true);
    expect(statSync(path).size).toBe(before.length);
    expect(readLevel(path).state.grains).toBe(60);
  });
});
