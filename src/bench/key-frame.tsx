import { EventEmitter } from 'node:events';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadKeymap } from '../keymap/load-keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { FORMAT_VERSION, type EventPayload } from '../model/events.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';
import { SCREEN_RENDER } from '../screens/render-options.js';
import { fmt, summarise } from './stats.js';

/** A session of an open line and `grains` grains, a traverse every 60 lines. */
function grainsSession(grains: number): string {
  const { keymap } = loadKeymap('temperate-lowland');
  const keys = Object.entries(keymap.keys);
  const out: string[] = [];
  let prev = '';
  let traverse = 1;
  let seq = 0;
  const push = (payload: EventPayload) => {
    seq++;
    const { line, hash } = encodeLine(payload, { seq, at: new Date(Date.parse('2026-11-01T08:00:00.000Z') + seq * 2000).toISOString() }, prev);
    prev = hash;
    out.push(line);
  };
  push({ type: 'open', format: FORMAT_VERSION, session: 'k'.repeat(32), level: 'bench', depth: 1, site: null, core: null, slide: null, analyst: null, keymap, rules: DEFAULT_RULES, spike: null });
  for (let g = 0; g < grains; g++) {
    if (g > 0 && g % 60 === 0) push({ type: 'traverse', traverse: ++traverse });
    const [key, b] = keys[(g * 7919) % keys.length] as [string, { taxon: string }];
    push({ type: 'grain', taxon: b.taxon, traverse, key });
  }
  return `${out.join('\n')}\n`;
}

/** A terminal for Ink in this process: keys written in, frames recorded with their time. */
class FakeStdin extends EventEmitter {
  readonly isTTY = true;
  private data: string | null = null;
  write(data: string): void {
    this.data = data;
    this.emit('readable');
    this.emit('data', data);
  }
  read(): string | null {
    const d = this.data;
    this.data = null;
    return d;
  }
  setEncoding(): void {}
  setRawMode(): void {}
  resume(): void {}
  pause(): void {}
  ref(): void {}
  unref(): void {}
}

class FakeStdout extends EventEmitter {
  readonly isTTY = true;
  readonly columns = 100;
  readonly rows = 30;
  private waiter: ((frame: string) => void) | null = null;
  write(chunk: string): boolean {
    const w = this.waiter;
    if (w && chunk.includes('Pollen sum')) {
      this.waiter = null;
      w(chunk);
    }
    return true;
  }
  nextFrame(): Promise<string> {
    return new Promise((resolve) => {
      this.waiter = resolve;
    });
  }
}

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * A key typed to its frame written by Ink's real renderer (React in production), at three sizes,
 * with the disk calls stubbed (exine's own work) and real (write + fsync). Keys are 40 ms apart,
 * slower than Ink's 30 frames a second, as an analyst types.
 */
export async function benchKeyFrame(sizes = [1000, 20_000, 100_000], keys = 150, disks: readonly ('stubbed' | 'real')[] = ['stubbed', 'real'], build = 'the bundle users run'): Promise<string[]> {
  // Before React loads (from dist/); in the bundle its build is chosen when bundling.
  Object.assign(process.env, { NODE_ENV: 'production' });
  delete process.env.CI;
  const { render } = await import('ink');
  const { createElement } = (await import('react')).default;
  const { CountScreen } = await import('../screens/count-screen.js');
  const { CountingSession } = await import('../session/counting-session.js');
  const { resumeLevel } = await import('../session/session-files.js');
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  const lines = [`(i) a key to its frame written (real Ink render, 100x30, ${build}), ${keys} keys 40 ms apart at each size`];
  try {
    const keymapKeys = Object.keys(loadKeymap('temperate-lowland').keymap.keys);
    for (const size of sizes) {
      for (const disk of disks) {
        const path = join(dir, `k${size}-${disk}.jsonl`);
        writeFileSync(path, grainsSession(size));
        const stub = { writeSync: (_fd: number, _b: NodeJS.ArrayBufferView, _o?: number | null, length?: number | null) => length ?? 0, fsyncSync: () => {}, ftruncateSync: () => {} };
        const opened = disk === 'stubbed' ? resumeLevel(path, { ops: stub as never }) : resumeLevel(path);
        const session = new CountingSession(opened.writer, opened.state, opened.notices, opened.unconfirmed);
        const stdin = new FakeStdin();
        const stdout = new FakeStdout();
        const first = stdout.nextFrame();
        const instance = render(createElement(CountScreen, { session, bell: false, rareThreshold: 2, breakMinutes: null }), {
          stdin: stdin as never,
          stdout: stdout as never,
          stderr: stdout as never,
          ...SCREEN_RENDER,
        });
        await first;
        await pause(100);
        const samples: number[] = [];
        const cpu: number[] = [];
        for (let i = 0; i < keys; i++) {
          const frame = stdout.nextFrame();
          const t0 = performance.now();
          const c0 = process.cpuUsage();
          stdin.write(keymapKeys[i % keymapKeys.length] as string);
          await frame;
          samples.push(performance.now() - t0);
          const c = process.cpuUsage(c0);
          cpu.push((c.user + c.system) / 1000);
          await pause(40);
        }
        instance.unmount();
        session.shutdown();
        const s = summarise(samples);
        const c = summarise(cpu);
        lines.push(`    ${size.toLocaleString('en').padStart(7)} grains, disk ${disk.padEnd(7)}  p50 ${fmt(s.p50)}   p99 ${fmt(s.p99)}   (CPU p50 ${fmt(c.p50)})   (goal: p50 within 16.7 ms, p99 within 33 ms)`);
      }
    }
    return lines;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
