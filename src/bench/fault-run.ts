import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ExineError } from '../errors.js';
import { openForCounting } from '../cli/commands/count.js';
import { main } from '../cli/main.js';
import { parseFlags } from '../cli/parse-flags.js';
import { readLevel, resumeLevel } from '../session/session-files.js';
import { UNSEEN } from '../text/visible.js';
import { baseLevel, chained, type FaultCase } from './fault-cases.js';

const BIN = resolve(fileURLToPath(import.meta.url), '../../../bin/exine.cjs');
/** A run slower than this counts as a hang. */
export const HANG_MS = 5000;

export type Outcome = 'accepted' | 'refused' | 'not-one-line' | 'stack-trace' | 'hang' | 'unreadable' | 'raw-control';
export interface Verdict {
  readonly outcome: Outcome;
  readonly detail: string;
}

const FAILURES: readonly Outcome[] = ['not-one-line', 'stack-trace', 'hang', 'unreadable', 'raw-control'];
export const isFailure = (v: Verdict) => FAILURES.includes(v.outcome);

const UNSEEN_ALL = new RegExp(UNSEEN.source, 'gu');
/** Characters a terminal acts on, other than the line breaks of the output. */
const rawControl = (text: string) => [...text.matchAll(UNSEEN_ALL)].some((m) => m[0] !== '\n' && !(m[0] === '\r' && text[(m.index ?? 0) + 1] === '\n'));

const ok = (detail = ''): Verdict => ({ outcome: 'accepted', detail });
const worst = (verdicts: readonly Verdict[]): Verdict => verdicts.find(isFailure) ?? verdicts.find((v) => v.outcome === 'refused') ?? ok();

/** The CLI in-process, on a terminal (so CSV is escaped too), timed. */
async function runMain(args: readonly string[], cwd: string): Promise<Verdict> {
  let stdout = '';
  let stderr = '';
  const t0 = performance.now();
  let code: number;
  const tty = { isTTY: true };
  try {
    code = await main([...args], {
      stdin: { isTTY: false },
      stdout: { ...tty, write: (t: string) => (stdout += t) },
      stderr: { ...tty, write: (t: string) => (stderr += t) },
      env: { ...process.env, NO_COLOR: '1' },
      cwd,
    });
  } catch (error) {
    return { outcome: 'stack-trace', detail: `exine ${args.join(' ')} threw ${(error as Error)?.stack?.split('\n').slice(0, 2).join(' ') ?? String(error)}` };
  }
  const ms = performance.now() - t0;
  if (ms > HANG_MS) return { outcome: 'hang', detail: `exine ${args.join(' ')} took ${Math.round(ms)} ms` };
  if (rawControl(stdout + stderr)) return { outcome: 'raw-control', detail: `exine ${args.join(' ')} printed a control character` };
  if (/^\s+at /m.test(stderr)) return { outcome: 'stack-trace', detail: stderr.slice(0, 300) };
  if (code !== 0 && (!stderr.trim() || stderr.split('\n').slice(0, -1).some((l) => !l.trim()) || ![1, 2].includes(code))) {
    return { outcome: 'not-one-line', detail: `exine ${args.join(' ')} exit ${code}: ${JSON.stringify(stderr.slice(0, 300))}` };
  }
  return code === 0 ? ok() : { outcome: 'refused', detail: stderr.trim() };
}

/** The same command line through the real program: a stack trace or a hang shows here even if main() hid it. */
export const childRetries = { count: 0 };

function runChild(args: readonly string[], cwd: string): Verdict {
  const spawn = () => spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: 'utf8', timeout: HANG_MS, stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, NO_COLOR: '1' } });
  let r = spawn();
  // On a shared machine a node start alone can take seconds: a hang is one that happens twice.
  if (r.error || r.signal) {
    childRetries.count++;
    r = spawn();
  }
  if (r.error || r.signal) return { outcome: 'hang', detail: `child exine ${args.join(' ')}: ${r.error?.message ?? r.signal} twice`};
  if (/^\s+at /m.test(r.stderr) || ![0, 1, 2].includes(r.status ?? -1)) return { outcome: 'stack-trace', detail: `child exine ${args.join(' ')}: ${r.stderr.slice(0, 300)}` };
  return r.status === 0 ? ok() : { outcome: 'refused', detail: r.stderr.trim() };
}

/** An in-process step (open, resume, read): an ExineError is a refusal in one line; anything else is a stack trace. */
function attempt<T>(what: string, fn: () => T): { value: T } | { verdict: Verdict } {
  const t0 = performance.now();
  try {
    const value = fn();
    const ms = performance.now() - t0;
    return ms > HANG_MS ? { verdict: { outcome: 'hang', detail: `${what} took ${Math.round(ms)} ms` } } : { value };
  } catch (error) {
    if (!(error instanceof ExineError)) return { verdict: { outcome: 'stack-trace', detail: `${what}: ${(error as Error)?.stack?.split('\n').slice(0, 2).join(' ') ?? String(error)}` } };
    if (error.message.includes('\n')) return { verdict: { outcome: 'not-one-line', detail: `${what}: ${error.message.slice(0, 300)}` } };
    return { verdict: { outcome: 'refused', detail: error.message } };
  }
}

const readable = (path: string) => {
  try {
    readLevel(path);
    return true;
  } catch {
    return false;
  }
};

/** Open a level for counting as `count` does (without the screen), close it, and check that it still reads. */
function openAndClose(path: string, open: () => ReturnType<typeof resumeLevel>, wasReadable: boolean): Verdict {
  const opened = attempt(`open ${path}`, open);
  if ('verdict' in opened) {
    if (wasReadable && !readable(path)) return { outcome: 'unreadable', detail: `a refused open left ${path} unreadable (${opened.verdict.detail})` };
    return opened.verdict;
  }
  opened.value.writer.close();
  const read = attempt(`read ${path}`, () => readLevel(path));
  if ('verdict' in read) return { outcome: 'unreadable', detail: `exine wrote ${path} and then could not read it: ${read.verdict.detail}` };
  return ok();
}

const COUNT_OPTIONS = Object.fromEntries(
  ['keymap', 'level', 'depth', 'site', 'core', 'slide', 'analyst', 'target', 'precision', 'precision-share', 'precision-taxa', 'coverage', 'plateau', 'markers', 'conc-error', 'rule-mode', 'min-sum', 'tablets', 'per-tablet', 'per-tablet-sd', 'volume', 'mass', 'accumulation-rate'].map((f) => [f, { type: 'string' as const }]),
);

async function sessionCase(c: Extract<FaultCase, { kind: 'session' }>, dir: string, child: boolean): Promise<Verdict[]> {
  const path = join(dir, 'l.jsonl');
  writeFileSync(path, c.bytes);
  const before = readable(path);
  const args = [...c.args, 'l.jsonl'];
  const verdicts = [await runMain(args, dir)];
  if (child) verdicts.push(runChild(args, dir));
  verdicts.push(openAndClose(path, () => resumeLevel(path), before));
  // After a repair the level reads again; a second open must find nothing more to do.
  if (readable(path)) verdicts.push(openAndClose(path, () => resumeLevel(path), true));
  return verdicts;
}

async function keymapCase(c: Extract<FaultCase, { kind: 'keymap' }>, dir: string, child: boolean): Promise<Verdict[]> {
  writeFileSync(join(dir, 'km.json'), c.bytes);
  const verdicts = [await runMain(['keys', 'km.json'], dir)];
  if (child) verdicts.push(runChild(['keys', 'km.json'], dir));
  const path = join(dir, 'new.jsonl');
  verdicts.push(openAndClose(path, () => openForCounting(path, { keymap: 'km.json' }, () => {}, {}, dir), false));
  if (readable(path)) verdicts.push(openAndClose(path, () => resumeLevel(path), true));
  return verdicts;
}

/** Output names kept inside the case's folder: the fuzzer must not write elsewhere. */
const SAFE_OUT = ['o.csv', 'l.jsonl', 'km.json', 'sub/none.csv', ''];

async function flagsCase(c: Extract<FaultCase, { kind: 'flags' }>, dir: string, child: boolean): Promise<Verdict[]> {
  const path = join(dir, 'l.jsonl');
  if (c.existing) writeFileSync(path, chained(baseLevel()));
  if (c.command === 'count') {
    const parsed = attempt('count flags', () => parseFlags('count', [...c.args], COUNT_OPTIONS));
    if ('verdict' in parsed) return [parsed.verdict];
    const flags = parsed.value.values as Record<string, string | undefined>;
    const verdicts = [openAndClose(path, () => openForCounting(path, flags, () => {}, {}, dir), c.existing)];
    // Resumed with the same flags, as a second `exine count` with them would.
    if (readable(path)) verdicts.push(openAndClose(path, () => openForCounting(path, flags, () => {}, {}, dir), true));
    return verdicts;
  }
  mkdirSync(join(dir, 'sub'));
  writeFileSync(join(dir, 'km.json'), JSON.stringify({ name: 'fuzz', keys: { q: { taxon: 'Quercus', group: 'trees' } } }));
  const args = [...c.args];
  for (let i = 0; i < args.length; i++) if (args[i] === '--out') args[i + 1] = SAFE_OUT[(args[i + 1]?.length ?? 0) % SAFE_OUT.length] as string;
  const positional = c.command === 'keys' ? 'km.json' : 'l.jsonl';
  const full = [c.command, positional, ...args.filter((a) => !a.startsWith('--out=') && !a.startsWith('--add-types='))];
  const verdicts = [await runMain(full, dir)];
  if (child) verdicts.push(runChild(full, dir));
  if (!readable(path)) verdicts.push({ outcome: 'unreadable', detail: `exine ${full.join(' ')} left l.jsonl unreadable` });
  return verdicts;
}

/** Run one case in a folder of its own under `root`; the folder is removed after. */
export async function runFaultCase(c: FaultCase, root: string, child = false): Promise<Verdict> {
  const dir = mkdtempSync(join(root, 'case-'));
  try {
    const verdicts = c.kind === 'session' ? await sessionCase(c, dir, child) : c.kind === 'keymap' ? await keymapCase(c, dir, child) : await flagsCase(c, dir, child);
    const v = worst(verdicts);
    return isFailure(v) ? { ...v, detail: `${c.kind} (${c.how}): ${v.detail}` } : v;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export interface FaultTally {
  cases: number;
  accepted: number;
  refused: number;
  childRuns: number;
  notOneLine: number;
  stackTraces: number;
  hangs: number;
  unreadable: number;
  rawControl: number;
  examples: string[];
}

export function emptyTally(): FaultTally {
  return { cases: 0, accepted: 0, refused: 0, childRuns: 0, notOneLine: 0, stackTraces: 0, hangs: 0, unreadable: 0, rawControl: 0, examples: [] };
}

const FIELD: Record<Outcome, keyof Omit<FaultTally, 'examples' | 'cases' | 'childRuns'>> = {
  accepted: 'accepted',
  refused: 'refused',
  'not-one-line': 'notOneLine',
  'stack-trace': 'stackTraces',
  hang: 'hangs',
  unreadable: 'unreadable',
  'raw-control': 'rawControl',
};

export function addVerdict(t: FaultTally, v: Verdict, child: boolean): void {
  t.cases++;
  if (child) t.childRuns++;
  t[FIELD[v.outcome]]++;
  if (isFailure(v) && t.examples.length < 5) t.examples.push(v.detail);
}
