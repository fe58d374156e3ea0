import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { BIN, timeCommand } from './first-frame.js';
import { bigSession } from './resume.js';
import { fmt, ratio, summarise } from './stats.js';

type Row = { label: string; args: string[]; goal: number };

/**
 * CPU time of this process's finished children, in ms (Linux, /proc/self/stat cutime + cstime, in
 * ticks of 10 ms). On a shared machine wall times stretch with the load; CPU times much less.
 */
function childrenCpuMs(): number {
  try {
    const fields = readFileSync('/proc/self/stat', 'utf8').split(') ')[1]?.split(' ') ?? [];
    return (Number(fields[13]) + Number(fields[14])) * 10;
  } catch {
    return Number.NaN;
  }
}

function timed(args: string[], dir: string, cpu: number[]): number {
  const c0 = childrenCpuMs();
  const t = timeCommand(args, dir);
  cpu.push(childrenCpuMs() - c0);
  return t;
}

const mean = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

/** Commands without a screen, from start to exit, beside a bare `node -e 0` in the same rounds. */
export function benchStartUp(runs = 9): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    writeFileSync(join(dir, 'l1k.jsonl'), bigSession(1000));
    const rows: Row[] = [
      { label: 'exine --help', args: ['--help'], goal: 1.5 },
      { label: 'exine verify (1,000 events)', args: ['verify', 'l1k.jsonl'], goal: 1.5 },
      { label: 'exine keys temperate-lowland', args: ['keys', 'temperate-lowland'], goal: 1.5 },
      { label: 'exine summary (1,000 events)', args: ['summary', 'l1k.jsonl'], goal: 2 },
      { label: 'exine export (1,000 events)', args: ['export', 'l1k.jsonl'], goal: 2 },
      { label: 'exine audit --plain (1,000 events)', args: ['audit', '--plain', 'l1k.jsonl'], goal: 2 },
    ];
    const bare: number[] = [];
    const bareCpu: number[] = [];
    const times = rows.map(() => [] as number[]);
    const cpus = rows.map(() => [] as number[]);
    timeCommand([BIN, '--help'], dir); // page cache
    for (let i = 0; i < runs; i++) {
      bare.push(timed(['-e', '0'], dir, bareCpu));
      rows.forEach((row, k) => times[k]?.push(timed([BIN, ...row.args], dir, cpus[k] as number[])));
    }
    const b = summarise(bare).median;
    const bc = mean(bareCpu);
    return [
      `(g) start to exit of commands without a screen, median of ${runs}, interleaved with the baseline`,
      `    bare node start                       ${fmt(b)}   CPU ${fmt(bc)} (mean)`,
      ...rows.map((row, k) => {
        const t = summarise(times[k] ?? []).median;
        const c = mean(cpus[k] ?? []);
        return `    ${row.label.padEnd(37)} ${fmt(t)}   ${ratio(t, b)}   CPU ${ratio(c, bc)}   (goal: at most ${row.goal}x)`;
      }),
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** audit --plain against summary of the same 100,000-event file: the audit must stay linear in events. */
export function benchAuditScale(runs = 3, events = 100_000): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    writeFileSync(join(dir, 'big.jsonl'), bigSession(events));
    const summary: number[] = [];
    const audit: number[] = [];
    for (let i = 0; i < runs; i++) {
      summary.push(timeCommand([BIN, 'summary', 'big.jsonl'], dir));
      audit.push(timeCommand([BIN, 'audit', '--plain', 'big.jsonl'], dir));
    }
    const s = summarise(summary).median;
    const a = summarise(audit).median;
    return [
      `(h) audit --plain of ${events.toLocaleString('en')} events, median of ${runs}, interleaved`,
      `    exine summary (same file)     ${fmt(s)}`,
      `    exine audit --plain           ${fmt(a)}   ${ratio(a, s)}   (goal: at most 2x)`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
