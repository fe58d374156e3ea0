import { appendFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { render } from 'ink';
import { createElement } from 'react';
import { coreFileText, type CoreConfig } from '../core/core-file.js';
import { fileCoreSource } from '../core/core-source.js';
import { levelFileName } from '../core/level-name.js';
import { seededRandom } from '../demo/seeded-random.js';
import { readLevel } from '../session/session-files.js';
import { loadKeymap } from '../keymap/load-keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { FORMAT_VERSION, type EventPayload } from '../model/events.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';
import { CoreTable } from '../screens/core-screen.js';
import { START_CORE_UI } from '../screens/core-view.js';
import { fmt, ratio, summarise } from './stats.js';

/** A level of `grains` grains drawn from a slowly drifting assemblage, as exine writes it. */
function levelText(config: CoreConfig, depth: number, grains: number, random: () => number): { text: string; seq: number; hash: string } {
  const keys = Object.entries(config.keymap.keys).filter(([, b]) => config.keymap.sum.includes(b.group));
  const out: string[] = [];
  let prev = '';
  let seq = 0;
  const start = Date.parse('2026-11-01T08:00:00.000Z') + depth * 86_400_000;
  const push = (payload: EventPayload) => {
    seq++;
    const { line, hash } = encodeLine(payload, { seq, at: new Date(start + seq * 3000).toISOString() }, prev);
    prev = hash;
    out.push(line);
  };
  push({ type: 'open', format: FORMAT_VERSION, session: depth.toString(16).padStart(32, '0'), level: `B ${depth}`, depth, site: config.site, core: config.core, slide: 'A', analyst: 'bench', keymap: config.keymap, rules: config.rules, spike: null, fromCore: { overrides: [] } });
  push({ type: 'sitting', sitting: 1 });
  // Weights shift with depth, so neighbours differ a little and the strips have something to draw.
  const weights = keys.map((_, i) => 1 + ((i * 7 + depth) % 13) / (1 + (i % 5)));
  const total = weights.reduce((a, b) => a + b, 0);
  for (let g = 0, traverse = 1; g < grains; g++) {
    if (g > 0 && g % 60 === 0) push({ type: 'traverse', traverse: ++traverse });
    let r = random() * total;
    let k = 0;
    while (k < keys.length - 1 && (r -= weights[k] as number) > 0) k++;
    const [key, b] = keys[k] as [string, { taxon: string }];
    push({ type: 'grain', taxon: b.taxon, traverse, key });
  }
  push({ type: 'close' });
  return { text: `${out.join('\n')}\n`, seq, hash: prev };
}

/** A core folder of `levels` levels of `grains` grains each, 4 cm apart, with 20 planned depths below; the last seq and hash of each file. */
export function writeBenchCore(dir: string, levels: number, grains: number): Map<string, { seq: number; hash: string }> {
    const { keymap } = loadKeymap('temperate-lowland');
    const config: CoreConfig = { format: 1, site: 'Bench Mere', core: 'BM-1', keymap, rules: DEFAULT_RULES, markerBatch: null, depths: Array.from({ length: levels + 20 }, (_, i) => i * 4), synonyms: {}, summaryGroups: [] };
    writeFileSync(join(dir, 'core.json'), coreFileText(config));
    const random = seededRandom(11);
    const tails = new Map<string, { seq: number; hash: string }>();
    for (let i = 0; i < levels; i++) {
      const depth = i * 4;
      const { text, seq, hash } = levelText(config, depth, grains, random);
      const file = levelFileName(config.core, depth);
      writeFileSync(join(dir, file), text);
      tails.set(file, { seq, hash });
    }
  return tails;
}

/** A stdout Ink can draw on, that notes when it is written. */
function sink(columns: number, rows: number): Writable & { columns: number; rows: number; written: () => Promise<void> } {
  let wake: (() => void) | null = null;
  const w = new Writable({
    write(_chunk, _enc, done) {
      wake?.();
      wake = null;
      done();
    },
  }) as Writable & { columns: number; rows: number; written: () => Promise<void> };
  w.columns = columns;
  w.rows = rows;
  w.written = () => new Promise((r) => (wake = r));
  return w;
}

async function timed(fn: () => Promise<void> | void): Promise<number> {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
}

/** Draw the core table once with Ink and wait for its frame. */
async function drawOnce(model: ReturnType<ReturnType<typeof fileCoreSource>['read']>): Promise<void> {
  const out = sink(80, 24);
  const frame = out.written();
  const instance = render(createElement(CoreTable, { model, ui: START_CORE_UI, columns: 80, rows: 24 }), { stdout: out as unknown as NodeJS.WriteStream, patchConsole: false, exitOnCtrlC: false, debug: true });
  await frame;
  instance.unmount();
}

/** The core view's first frame and a refresh after one level was counted on, beside a bare line-by-line JSON.parse of the same files. */
export async function benchCoreView(levels = 150, grains = 500, runs = 5): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-core-'));
  try {
    const tails = writeBenchCore(dir, levels, grains);
    const files = readdirSync(dir).filter((f) => f.endsWith('.jsonl'));
    const bare = (names: readonly string[]) => {
      let n = 0;
      for (const f of names) for (const l of readFileSync(join(dir, f), 'utf8').split('\n')) if (l) n += (JSON.parse(l) as { seq: number }).seq > 0 ? 1 : 0;
      if (n === 0) throw new Error('nothing read');
    };
    const model = fileCoreSource(dir).read();
    await drawOnce(model); // warm: Ink and React loaded, code compiled
    const parseAll: number[] = [];
    const readAll: number[] = [];
    const frameOnly: number[] = [];
    const first: number[] = [];
    const parseOne: number[] = [];
    const refresh: number[] = [];
    const stillSame: number[] = [];
    const target = files[Math.floor(files.length / 2)] as string;
    for (let r = 0; r < runs; r++) {
      parseAll.push(await timed(() => bare(files)));
      readAll.push(await timed(() => files.forEach((f) => readLevel(join(dir, f)))));
      frameOnly.push(await timed(() => drawOnce(model)));
      const source = fileCoreSource(dir);
      first.push(
        await timed(async () => {
          await drawOnce(source.read());
        }),
      );
      // One level counted on since the last read: ten more grains at its end.
      const before = source.read();
      const tail = tails.get(target) as { seq: number; hash: string };
      let { seq, hash } = tail;
      const more: string[] = [];
      for (let k = 0; k < 10; k++) {
        const { line, hash: h } = encodeLine({ type: 'grain', taxon: 'Alnus glutinosa-type', traverse: 9, key: 'a' }, { seq: ++seq, at: new Date(Date.parse('2027-01-01T00:00:00Z') + seq * 1000).toISOString() }, hash);
        hash = h;
        more.push(line);
      }
      appendFileSync(join(dir, target), `${more.join('\n')}\n`);
      tails.set(target, { seq, hash });
      parseOne.push(await timed(() => bare([target])));
      let after = before;
      // The screen stays mounted across a refresh: it draws the new model in the same Ink instance.
      const out = sink(80, 24);
      let frame = out.written();
      const live = render(createElement(CoreTable, { model: before, ui: START_CORE_UI, columns: 80, rows: 24 }), { stdout: out as unknown as NodeJS.WriteStream, patchConsole: false, exitOnCtrlC: false, debug: true });
      await frame;
      refresh.push(
        await timed(async () => {
          after = source.refresh() ?? before;
          frame = out.written();
          live.rerender(createElement(CoreTable, { model: after, ui: START_CORE_UI, columns: 80, rows: 24 }));
          await frame;
        }),
      );
      live.unmount();
      stillSame.push(after.rows.filter((row, i) => row.file !== null && row === before.rows[i]).length);
    }
    const A = summarise(parseAll).median;
    const F = summarise(frameOnly).median;
    const L = summarise(readAll).median;
    const C = summarise(first).median;
    const P1 = summarise(parseOne).median;
    const R = summarise(refresh).median;
    const rows = model.rows.length;
    return [
      `(g) core view: ${levels} levels of ${grains} grains (+ ${rows - levels} planned depths), 80x24, median of ${runs}`,
      `    bare JSON.parse of every level, line by line  ${fmt(A)}`,
      `    readLevel of every level (chain check + fold)  ${fmt(L)}   ${ratio(L, A)} of the bare parse: what exine count reads too`,
      `    one frame of the core table (Ink)              ${fmt(F)}`,
      `    core view, first frame (read all + draw)       ${fmt(C)}   ${ratio(C, A + F)} of parse + frame (goal ≤ 1.50x)`,
      `    bare JSON.parse of the one level counted on    ${fmt(P1)}`,
      `    refresh after it was counted on (+ redraw)     ${fmt(R)}   ${ratio(R, P1 + F)} of its parse + a first frame; ${ratio(R, C)} of a first frame`,
      `    level rows kept as they were at the refresh    ${Math.min(...stillSame)} of ${levels} (the level counted on is read again alone)`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
