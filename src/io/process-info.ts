import { readFileSync } from 'node:fs';

interface ProcStat {
  readonly state: string;
  readonly startTicks: string;
}

function procStat(pid: number): ProcStat | null {
  try {
    const text = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) may hold spaces and parentheses: split after the last ")".
    const fields = text.slice(text.lastIndexOf(')') + 2).split(' ');
    return { state: fields[0] ?? '', startTicks: fields[19] ?? '' };
  } catch {
    return null;
  }
}

/** When a process started, as an opaque token that changes if its pid is reused; null where /proc is missing. */
export function processStartToken(pid: number): string | null {
  return procStat(pid)?.startTicks ?? null;
}

/**
 * Whether a process is running. A killed process can linger as a zombie, for
 * which kill(pid, 0) still succeeds: that counts as dead.
 */
export function isProcessRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
  return procStat(pid)?.state !== 'Z';
}
