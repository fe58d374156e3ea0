import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadKeymap } from '../keymap/load-keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';
import { FORMAT_VERSION, type EventPayload } from '../model/events.js';
import { readLevel, resumeLevel } from '../session/session-files.js';
import { seededRandom } from '../demo/seeded-random.js';
import { fmt, ms, ratio, summarise } from './stats.js';

export function bigSession(events: number): string {
  const { keymap } = loadKeymap('temperate-lowland');
  const keys = Object.entries(keymap.keys);
  const random = seededRandom(7);
  const out: string[] = [];
  let prev = '';
  let traverse = 1;
  const start = Date.parse('2026-11-01T08:00:00.000Z');
  for (let seq = 1; seq <= events; seq++) {
    let payload: EventPayload;
    if (seq === 1) {
      payload = { type: 'open', format: FORMAT_VERSION, session: 'b'.repeat(32), level: 'bench', depth: 1, site: null, core: null, slide: null, analyst: null, keymap, rules: DEFAULT_RULES, spike: null };
    } else if (seq % 60 === 0) payload = { type: 'traverse', traverse: ++traverse };
    else if (seq % 97 === 0 && (seq - 1) % 60 !== 0) payload = { type: 'undo', of: seq - 1 };
    else {
      const [key, b] = keys[Math.floor(random() * keys.length)] as [string, { taxon: string }];
      payload = { type: 'grain', taxon: b.taxon, traverse, key };
    }
    const { line, hash } = encodeLine(payload, { seq, at: new Date(start + seq * 2000).toISOString() }, prev);
    prev = hash;
    out.push(line);
  }
  return `${out.join('\n')}\n`;
}

/** Medians of each function's times, the functions taking turns round after round, after one untimed round. */
function timeInTurns(runs: number, fns: readonly (() => void)[]): number[] {
  const samples: number[][] = fns.map(() => []);
  for (let i = 0; i <= runs; i++) {
    fns.forEach((fn, j) => {
      const t0 = process.hrtime.bigint();
      fn();
      // The first round warms up what each runs, and collects the garbage of making the file.
      if (i > 0) samples[j]?.push(ms(process.hrtime.bigint() - t0));
    });
  }
  return samples.map((s) => summarise(s).median);
}

/** Resuming a large session beside reading and JSON.parse-ing the same file line by line, in turns. */
export function benchResume(events = 100_000, runs = 5): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    const path = join(dir, 'big.jsonl');
    writeFileSync(path, bigSession(events));
    const [baseline, read, resume] = timeInTurns(runs, [
      () => {
        const text = readFileSync(path, 'utf8');
        let n = 0;
        for (const line of text.split('\n')) if (line) n += (JSON.parse(line) as { seq: number }).seq > 0 ? 1 : 0;
        if (n < events) throw new Error('short read');
      },
      () => {
        readLevel(path);
      },
      () => {
        resumeLevel(path).writer.close();
      },
    ]) as [number, number, number];
    return [
      `(b) resuming a ${events.toLocaleString('en')}-event session (${(readFileSync(path).length / 1e6).toFixed(1)} MB), median of ${runs} rounds in turns`,
      `    read + JSON.parse per line  ${fmt(baseline)}`,
      `    exine read (verify + fold)  ${fmt(read)}   ${ratio(read, baseline)}`,
      `    exine resume (lock, verify, fold, new sitting) ${fmt(resume)}   ${ratio(resume, baseline)}   (goal: at most 2x)`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
