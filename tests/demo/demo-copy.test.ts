import { appendFileSync, mkdirSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEMO_DIR, DEMO_LEVEL } from '../../src/cli/commands/demo.js';
import { demoFolder, freshDemoCopy } from '../../src/demo/demo-copy.js';
import { resumeLevel } from '../../src/session/session-files.js';
import { tempDir } from '../helpers/temp-dir.js';

const BUNDLED = join(DEMO_DIR, DEMO_LEVEL);

describe('the demo copy', () => {
  it('lives in one folder per user under the temp folder, replaced whole on every run', () => {
    const tmp = tempDir();
    const copy = freshDemoCopy(BUNDLED, tmp);
    expect(copy).toBe(join(demoFolder(tmp), DEMO_LEVEL));
    expect(demoFolder(tmp)).toMatch(new RegExp(`^${tmp}/exine-demo-[\\w.-]+$`));
    // What the last run left: grains counted on, and a repair's backup beside the copy.
    appendFileSync(copy, '{"seq":9999');
    writeFileSync(`${copy}.cut-2026-01-01.bak`, 'x');
    expect(freshDemoCopy(BUNDLED, tmp)).toBe(copy);
    expect(readFileSync(copy).equals(readFileSync(BUNDLED))).toBe(true);
    // The whole core comes along (core.json and every level), and nothing else.
    const bundledCore = readdirSync(DEMO_DIR).filter((f) => f === 'core.json' || f.endsWith('.jsonl')).sort();
    expect(bundledCore).toContain('core.json');
    expect(bundledCore.length).toBeGreaterThan(3);
    expect(readdirSync(demoFolder(tmp)).sort()).toEqual(bundledCore);
    expect(readdirSync(tmp)).toHaveLength(1);
  });

  it('is not replaced while an exine still counts it', () => {
    const tmp = tempDir();
    const copy = freshDemoCopy(BUNDLED, tmp);
    const counting = resumeLevel(copy);
    try {
      const before = readFileSync(copy);
      expect(() => freshDemoCopy(BUNDLED, tmp)).toThrow(new RegExp(`${DEMO_LEVEL} is already open in exine process ${process.pid}`));
      expect(readFileSync(copy).equals(before)).toBe(true);
    } finally {
      counting.writer.close();
    }
  });

  it('never writes through a link someone else put under its name', () => {
    const tmp = tempDir();
    const elsewhere = join(tmp, 'elsewhere');
    mkdirSync(elsewhere);
    symlinkSync(elsewhere, demoFolder(tmp));
    expect(() => freshDemoCopy(BUNDLED, tmp)).toThrow(/exine-demo-.* is not a folder of yours; remove it, or point TMPDIR at another folder/);
    expect(readdirSync(elsewhere)).toEqual([]);
  });
});
