import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { scanLog } from '../log/scan-log.js';
import { resumeLevel } from '../session/session-files.js';
import { baseLevel, chained } from './fault-cases.js';
import { seededRandom } from '../demo/seeded-random.js';

export interface DamageFigures {
  tornCases: number;
  /** Repaired with the cut bytes kept, exactly, in a backup and every whole line before kept. */
  tornRepaired: number;
  nulCases: number;
  nulRepaired: number;
  flips: number;
  /** Flips reported as damage on the line that holds the flipped byte. */
  flipsOnRightLine: number;
  /** Flips the reader took for an intact file (the promise: 0). */
  flipsUnseen: number;
}

/** Open the damaged file as `count` would; true when it was repaired exactly. */
function repairsExactly(root: string, bytes: Buffer, goodBytes: number, goodGrains: number): boolean {
  const dir = mkdtempSync(join(root, 'case-'));
  const path = join(dir, 'l.jsonl');
  writeFileSync(path, bytes);
  try {
    const opened = resumeLevel(path);
    opened.writer.close();
    const backups = readdirSync(dir).filter((n) => n.endsWith('.bak'));
    const backup = backups.length === 1 ? readFileSync(join(dir, backups[0] as string)) : null;
    return opened.state.grains === goodGrains && backup !== null && backup.equals(bytes.subarray(goodBytes)) && readFileSync(path).subarray(0, goodBytes).equals(bytes.subarray(0, goodBytes));
  } catch {
    return false;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * The damage a crash or a disk does, measured on a level of 60 grains: the last three
 * lines cut at every byte, NUL padding after each of them, and random single-bit flips.
 */
export function measureDamage(flips: number, seed = 3): DamageFigures & { lines: number } {
  const payloads = [...baseLevel(), ...Array.from({ length: 50 }, () => ({ type: 'grain' as const, taxon: 'Quercus', traverse: 2, key: 'q' }))];
  const bytes = chained(payloads);
  const starts: number[] = [0];
  for (let i = 0; i < bytes.length; i++) if (bytes[i] === 10) starts.push(i + 1);
  const lineStarts = starts.slice(0, -1);
  const grainsBefore = (line: number) => payloads.slice(0, line).filter((p) => p.type === 'grain').length - payloads.slice(0, line).filter((p) => p.type === 'undo').length;
  const root = mkdtempSync(join(tmpdir(), 'exine-bench-damage-'));
  const f: DamageFigures & { lines: number } = { lines: payloads.length,  tornCases: 0, tornRepaired: 0, nulCases: 0, nulRepaired: 0, flips: 0, flipsOnRightLine: 0, flipsUnseen: 0 };
  try {
    const n = lineStarts.length;
    for (let line = n - 3; line < n; line++) {
      const from = lineStarts[line] as number;
      const to = (starts[line + 1] as number) - 1;
      for (let cut = from + 1; cut <= to; cut++) {
        f.tornCases++;
        if (repairsExactly(root, bytes.subarray(0, cut), from, grainsBefore(line))) f.tornRepaired++;
      }
      for (const pad of [1, 7, 512, 4096]) {
        f.nulCases++;
        if (repairsExactly(root, Buffer.concat([bytes.subarray(0, from), Buffer.alloc(pad)]), from, grainsBefore(line))) f.nulRepaired++;
      }
    }
    const random = seededRandom(seed);
    for (let i = 0; i < flips; i++) {
      const at = Math.floor(random() * bytes.length);
      const flipped = Buffer.from(bytes);
      flipped[at] = (flipped[at] as number) ^ (1 << Math.floor(random() * 8));
      const scan = scanLog(flipped);
      const damage = scan.corruption ?? scan.tail;
      f.flips++;
      if (!damage) f.flipsUnseen++;
      // The line that holds the byte; a flipped line end is the end of that line.
      else if (damage.line === starts.filter((s) => s <= at).length) f.flipsOnRightLine++;
    }
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
  return f;
}

export function benchDamage(flips = Number(process.env.EXINE_FLIPS ?? 1000)): string[] {
  const started = Date.now();
  const f = measureDamage(flips);
  const s = ((Date.now() - started) / 1000).toFixed(0);
  return [
    `(i) damage on a level of ${f.lines} lines (${s} s; EXINE_FLIPS sets the bit flips)`,
    `    last three lines cut at every byte: ${f.tornRepaired} of ${f.tornCases} repaired, the cut bytes kept exactly in a backup   (goal: all)`,
    `    NUL padding after each of them:     ${f.nulRepaired} of ${f.nulCases} repaired                                            (goal: all)`,
    `    single-bit flips anywhere:          ${f.flipsOnRightLine} of ${f.flips} found on the line they hit, ${f.flipsUnseen} taken for intact   (goal: all, 0)`,
  ];
}
