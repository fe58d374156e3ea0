// One racer of the lock race: waits for the start time, tries to take the lock of a
// session file, and, while holding it, records its stay in a shared journal so that
// two holders at once show up as overlapping stays.
import { appendFileSync } from 'node:fs';
import { SessionLock } from '../log/session-lock.js';

const [sessionPath, startAt, journal] = process.argv.slice(2) as [string, string, string];
while (Date.now() < Number(startAt)) {
  // spin: every racer starts within the same millisecond or two
}
try {
  const lock = SessionLock.acquire(sessionPath);
  appendFileSync(journal, `+${process.pid}\n`);
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 30);
  appendFileSync(journal, `-${process.pid}\n`);
  lock.release();
  process.stdout.write('won\n');
} catch (error) {
  process.stdout.write(`refused ${(error as Error).message}\n`);
}
