import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { FileSource } from '../io/byte-source.js';
import type { Keymap } from '../keymap/keymap.js';
import type { ParsedEvent } from './event-schema.js';
import { SCAN_LIMITS, type ScanLimits } from './line-reader.js';
import { scanLog, type LogScan } from './scan-log.js';

/** What the hash worker is given. */
export interface HashJob {
  readonly fd: number;
  readonly size: number;
  readonly limits: ScanLimits;
  /** Int32 [state, line]: state 0 while it works, 1 done (line: first bad hash, 0 for none), -1 failed. */
  readonly verdict: SharedArrayBuffer;
}

export interface ParallelScanOptions {
  /** Files smaller than this are hashed in line: starting a worker costs more than their hashes. */
  readonly minBytes?: number;
  /** The worker's script (the built hash-worker.js beside this module, by default). */
  readonly workerUrl?: URL;
  readonly limits?: ScanLimits;
  /** Told how the hashes were checked: in line, by the worker, or by reading again after it. */
  readonly report?: (how: 'in-line' | 'worker' | 'read-again') => void;
}

export const PARALLEL_MIN_BYTES = 4 * 1024 * 1024;
// Far past any hashing (25 MB takes about 50 ms here): a worker that failed before it could answer is
// waited for this long at most, and then the file is read the plain way.
const workerWaitMs = (bytes: number) => 2000 + bytes / 10_000;

/**
 * Whether a scan that took the hashes as claimed stands: no line it relied on,
 * up to and with the line where it stopped, has a bad hash. `badLine` is 0 when
 * no line has one.
 */
export function claimedScanStands(scan: LogScan, badLine: number): boolean {
  const stop = (scan.corruption ?? scan.tail)?.line ?? Number.POSITIVE_INFINITY;
  return badLine === 0 || badLine > stop;
}

function startHashWorker(source: FileSource, options: ParallelScanOptions): Int32Array | null {
  const url = options.workerUrl ?? new URL('./hash-worker.js', import.meta.url);
  if (url.protocol !== 'file:' || !existsSync(fileURLToPath(url))) return null;
  const job: HashJob = { fd: source.fd, size: source.size, limits: options.limits ?? SCAN_LIMITS, verdict: new SharedArrayBuffer(8) };
  try {
    // Not this process's flags (--input-type, --cpu-prof … would stop or burden it); a worker that fails is
    // answered for by the plain reading, never by an error thrown later.
    const worker = new Worker(url, { workerData: job, execArgv: [] });
    worker.on('error', () => {});
    worker.unref();
  } catch {
    return null;
  }
  return new Int32Array(job.verdict);
}

/**
 * Read a session file as scanLog does, with its hashes, a third of the work,
 * checked in a worker thread while this thread parses, checks and folds. The
 * result is always the one scanLog gives: when the worker finds a bad hash in
 * a line this reading relied on, or cannot run, the file is read again as
 * scanLog reads it. `start` gives the event sink of one reading (a fresh one
 * for a second reading). A small file, or a machine of one core, is read
 * the plain way.
 */
export function scanInParallel(
  source: FileSource,
  start: () => ((event: ParsedEvent, keymap: Keymap) => void) | undefined,
  options: ParallelScanOptions = {},
): LogScan {
  const limits = options.limits ?? SCAN_LIMITS;
  const parallel = source.size >= (options.minBytes ?? PARALLEL_MIN_BYTES) && availableParallelism() > 1;
  const verdict = parallel ? startHashWorker(source, options) : null;
  if (verdict) {
    const scan = scanLog(source, start(), limits, { claimedHashes: true });
    Atomics.wait(verdict, 0, 0, workerWaitMs(source.size));
    if (Atomics.load(verdict, 0) === 1 && claimedScanStands(scan, verdict[1] as number)) {
      options.report?.('worker');
      return scan;
    }
  }
  options.report?.(verdict ? 'read-again' : 'in-line');
  return scanLog(source, start(), limits);
}
