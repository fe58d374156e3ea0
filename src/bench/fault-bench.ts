import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { flagCases, keymapCases, sessionCases, type FaultCase } from './fault-cases.js';
import { addVerdict, childRetries, emptyTally, runFaultCase, type FaultTally } from './fault-run.js';

const KINDS: readonly [string, () => fc.Arbitrary<FaultCase>][] = [
  ['session files', sessionCases],
  ['keymaps', keymapCases],
  ['flags', flagCases],
];

/**
 * The long fault run: `cases` hostile inputs of each kind through the CLI in
 * process, every `childEvery`-th also through the real program. Every count
 * after "refused" should be zero.
 */
export async function benchFaults(cases: number, seed = Number(process.env.EXINE_FAULT_SEED ?? 7), childEvery = 25): Promise<string[]> {
  const root = mkdtempSync(join(tmpdir(), 'exine-bench-faults-'));
  const started = Date.now();
  const lines: string[] = [];
  const total: FaultTally = emptyTally();
  try {
    for (const [name, arbitrary] of KINDS) {
      const t = emptyTally();
      let i = 0;
      for (const c of fc.sample(arbitrary(), { numRuns: cases, seed })) {
        const child = i++ % childEvery === 0;
        const v = await runFaultCase(c, root, child);
        addVerdict(t, v, child);
        addVerdict(total, v, child);
        if (i % 250 === 0) process.stderr.write(`faults: ${name} ${i} cases, ${total.stackTraces + total.notOneLine + total.hangs + total.unreadable + total.rawControl} failures so far\n`);
      }
      lines.push(`    ${name.padEnd(14)} ${row(t)}`);
    }
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
  const s = ((Date.now() - started) / 1000).toFixed(0);
  return [
    `(g) fault run: hostile session files, keymaps and flags through the CLI (${s} s; EXINE_FAULT_CASES sets the cases per kind, seed ${seed})`,
    `    ${''.padEnd(14)} cases  accepted refused · not one line  stack traces  hangs >5 s  made unreadable  raw control chars   (goal: 0 from "not one line" on)`,
    ...lines,
    `    ${'all'.padEnd(14)} ${row(total)}`,
    `    of these, ${total.childRuns} also ran through the real program (${childRetries.count} started again after a 5 s timeout on the busy machine; a hang is a timeout twice)`,
    ...total.examples.map((e) => `    ! ${e}`),
  ];
}

function row(t: FaultTally): string {
  const n = (v: number, w: number) => String(v).padStart(w);
  return `${n(t.cases, 5)}  ${n(t.accepted, 8)} ${n(t.refused, 7)} · ${n(t.notOneLine, 12)}  ${n(t.stackTraces, 12)}  ${n(t.hangs, 10)}  ${n(t.unreadable, 15)}  ${n(t.rawControl, 17)}`;
}
