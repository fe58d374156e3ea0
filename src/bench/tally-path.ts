import { closeSync, fsyncSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadKeymap } from '../keymap/load-keymap.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';
import { CountingSession } from '../session/counting-session.js';
import { createLevel } from '../session/session-files.js';
import { fmt, ms, ratio, summarise } from './stats.js';

/** Key press → durable append → new state, beside a bare write+fsync of a line of the same length. */
export function benchTallyPath(grains = 2000): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    const { keymap } = loadKeymap('temperate-lowland');
    const opened = createLevel(join(dir, 'level.jsonl'), {
      info: { level: 'bench', depth: 1, site: null, core: null, slide: null, analyst: null },
      keymap,
      rules: DEFAULT_RULES,
    });
    const session = new CountingSession(opened.writer, opened.state);
    const keys = Object.keys(keymap.keys);
    const probe = opened.writer.append({ type: 'grain', taxon: 'Quercus', traverse: 1, key: 'q' });
    const lineLength = JSON.stringify(probe).length + 150;
    const bareFd = openSync(join(dir, 'bare.jsonl'), 'a');
    const line = Buffer.from(`${'x'.repeat(lineLength - 1)}\n`);
    const tally: number[] = [];
    const bare: number[] = [];
    // Interleave blocks so that both see the same disk conditions.
    for (let block = 0; block < grains / 100; block++) {
      for (let i = 0; i < 100; i++) {
        const t0 = process.hrtime.bigint();
        writeSync(bareFd, line, 0, line.length);
        fsyncSync(bareFd);
        bare.push(ms(process.hrtime.bigint() - t0));
      }
      for (let i = 0; i < 100; i++) {
        const char = keys[(block * 100 + i) % keys.length] as string;
        const t0 = process.hrtime.bigint();
        session.press({ kind: 'char', char });
        tally.push(ms(process.hrtime.bigint() - t0));
      }
    }
    closeSync(bareFd);
    const grainsCounted = session.getSnapshot().state.grains;
    session.shutdown();
    if (grainsCounted !== grains + 0) throw new Error(`bench counted ${grainsCounted} grains, expected ${grains}`);
    const t = summarise(tally);
    const b = summarise(bare);
    return [
      `(a) tally path over ${grains} grains (key → fsync'ed append → new state), line ≈ ${lineLength} bytes`,
      `    exine tally      p50 ${fmt(t.p50)}   p99 ${fmt(t.p99)}`,
      `    bare write+fsync p50 ${fmt(b.p50)}   p99 ${fmt(b.p99)}`,
      `    ratio            p50 ${ratio(t.p50, b.p50)}   p99 ${ratio(t.p99, b.p99)}   (goal: at most 1.2x)`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
