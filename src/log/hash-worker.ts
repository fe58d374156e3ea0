import { readSync } from 'node:fs';
import { workerData } from 'node:worker_threads';
import type { ByteSource } from '../io/byte-source.js';
import { firstBadHash } from './hash-check.js';
import type { HashJob } from './parallel-scan.js';

// Runs in a worker thread: checks every line's hash of the file the scan reads, through the same
// open file (a descriptor is shared by the threads of a process), and reports in shared memory,
// which the scanning thread waits on without an event loop.
const job = workerData as HashJob;
const verdict = new Int32Array(job.verdict);
// A worker stopped before it could answer still answers, so the scan never waits it out.
process.on('exit', () => {
  if (Atomics.compareExchange(verdict, 0, 0, -1) === 0) Atomics.notify(verdict, 0);
});
try {
  const source: ByteSource = { size: job.size, read: (into, offset, length, position) => readSync(job.fd, into, offset, length, position) };
  verdict[1] = firstBadHash(source, job.limits);
  Atomics.store(verdict, 0, 1);
} catch {
  Atomics.store(verdict, 0, -1);
}
Atomics.notify(verdict, 0);
