import { closeSync, fsyncSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadKeymap } from '../keymap/load-keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';
import { CountingSession } from '../session/counting-session.js';
import { createLevel, resumeLevel } from '../session/session-files.js';
import { fmt, ms, ratio, summarise } from './stats.js';

const REPEATS = 5;

/** The same key path with the disk calls replaced by no-ops: what exine itself adds to each key. */
function cpuOnly(dir: string, keys: readonly string[]): { p50: number; p99: number } {
  const { keymap } = loadKeymap('temperate-lowland');
  const path = join(dir, 'cpu.jsonl');
  createLevel(path, { info: { level: 'cpu', depth: 1, site: null, core: null, slide: null, analyst: null }, keymap, rules: DEFAULT_RULES, spike: null }).writer.close();
  const opened = resumeLevel(path, { ops: { writeSync: (_fd, _b, _o, length) => length, fsyncSync: () => {}, ftruncateSync: () => {} } });
  const session = new CountingSession(opened.writer, opened.state);
  const samples: number[] = [];
  for (let i = 0; i < 2300; i++) {
    const t0 = process.hrtime.bigint();
    session.press({ kind: 'char', char: keys[i % keys.length] as string });
    if (i >= 300) samples.push(ms(process.hrtime.bigint() - t0));
  }
  session.shutdown();
  return summarise(samples);
}

/** Key press → durable append → new state, beside a bare write+fsync of a line of the same length. */
export function benchTallyPath(grains = 2000): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    const { keymap } = loadKeymap('temperate-lowland');
    const opened = createLevel(join(dir, 'level.jsonl'), {
      info: { level: 'bench', depth: 1, site: null, core: null, slide: null, analyst: null },
      keymap,
      rules: DEFAULT_RULES,
      spike: null,
    });
    const session = new CountingSession(opened.writer, opened.state);
    const keys = Object.keys(keymap.keys);
    const sample = encodeLine({ type: 'grain', taxon: 'Quercus', traverse: 1, key: 'q' }, { seq: 1000, at: new Date().toISOString() }, 'f'.repeat(64));
    const lineLength = sample.line.length + 1;
    const bareFd = openSync(join(dir, 'bare.jsonl'), 'a');
    const line = Buffer.from(`${'x'.repeat(lineLength - 1)}\n`);
    // Warm up both paths (JIT compilation, page cache) before measuring, as benchmarks usually do.
    for (let i = 0; i < 300; i++) {
      writeSync(bareFd, line, 0, line.length);
      fsyncSync(bareFd);
      session.press({ kind: 'char', char: keys[i % keys.length] as string });
    }
    // Interleave blocks of 100, alternating which goes first, so both see the same disk;
    // repeat the whole run and take the median of each percentile, since a p99 of a
    // 0.1 ms flush moves with whatever else the machine does.
    const runs: { t: ReturnType<typeof summarise>; b: ReturnType<typeof summarise> }[] = [];
    let pressed = 0;
    for (let rep = 0; rep < REPEATS; rep++) {
      const tally: number[] = [];
      const bare: number[] = [];
      const bareBlock = () => {
        for (let i = 0; i < 100; i++) {
          const t0 = process.hrtime.bigint();
          writeSync(bareFd, line, 0, line.length);
          fsyncSync(bareFd);
          bare.push(ms(process.hrtime.bigint() - t0));
        }
      };
      const tallyBlock = () => {
        for (let i = 0; i < 100; i++) {
          const char = keys[pressed++ % keys.length] as string;
          const t0 = process.hrtime.bigint();
          session.press({ kind: 'char', char });
          tally.push(ms(process.hrtime.bigint() - t0));
        }
      };
      for (let block = 0; block < grains / 100; block++) {
        if (block % 2 === 0) {
          bareBlock();
          tallyBlock();
        } else {
          tallyBlock();
          bareBlock();
        }
      }
      runs.push({ t: summarise(tally), b: summarise(bare) });
    }
    const middle = (values: number[]) => summarise(values).median;
    const t = { p50: middle(runs.map((r) => r.t.p50)), p99: middle(runs.map((r) => r.t.p99)) };
    const b = { p50: middle(runs.map((r) => r.b.p50)), p99: middle(runs.map((r) => r.b.p99)) };
    const p99Ratios = runs.map((r) => r.t.p99 / r.b.p99).sort((x, y) => x - y);
    // A burst (key repeat, a paste): 50 keys in one input chunk, beside 50 bare appends.
    const burst: number[] = [];
    const bareBurst: number[] = [];
    const keysOfBurst = Array.from({ length: 50 }, (_, i) => ({ kind: 'char' as const, char: keys[i % keys.length] as string }));
    for (let round = 0; round < 20; round++) {
      let t0 = process.hrtime.bigint();
      for (let i = 0; i < 50; i++) {
        writeSync(bareFd, line, 0, line.length);
        fsyncSync(bareFd);
      }
      bareBurst.push(ms(process.hrtime.bigint() - t0));
      t0 = process.hrtime.bigint();
      session.pressAll(keysOfBurst);
      burst.push(ms(process.hrtime.bigint() - t0));
    }
    closeSync(bareFd);
    const grainsCounted = session.getSnapshot().state.grains;
    session.shutdown();
    const expected = 300 + REPEATS * grains + 1000;
    if (grainsCounted !== expected) throw new Error(`bench counted ${grainsCounted} grains, expected ${expected}`);
    const cpu = cpuOnly(dir, keys);
    const bb = summarise(burst);
    const bbare = summarise(bareBurst);
    return [
      `(a) tally path, key → fsync'ed append → new state: ${REPEATS} runs of ${grains} grains after 300 to warm up, line ≈ ${lineLength} bytes; medians of the runs`,
      `    exine tally      p50 ${fmt(t.p50)}   p99 ${fmt(t.p99)}`,
      `    bare write+fsync p50 ${fmt(b.p50)}   p99 ${fmt(b.p99)}`,
      `    ratio            p50 ${ratio(t.p50, b.p50)}   p99 ${ratio(t.p99, b.p99)} (runs: ${p99Ratios.map((r) => r.toFixed(2)).join(', ')})   (goal: at most 1.2x)`,
      `    exine's own work per key, disk calls stubbed: p50 ${fmt(cpu.p50 * 1000, 'µs')}   p99 ${fmt(cpu.p99 * 1000, 'µs')}`,
      `    a 50-key burst   median ${fmt(bb.median)} (one write, one fsync) beside 50 bare appends ${fmt(bbare.median)}: ${ratio(bb.median, bbare.median)}`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
