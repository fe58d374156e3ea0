import { vi } from 'vitest';

/** How long a test waits for a condition: generous for a busy machine; only a failing test waits it out. */
export const WAIT = { timeout: 10_000, interval: 5 } as const;

/** Resolves once `check` stops throwing; fails with its last error after WAIT.timeout. Tests wait for conditions, never for a time. */
export const until = <T>(check: () => T): Promise<T> => vi.waitFor(check, WAIT);
