const BEL = '\x07';

/**
 * Each signal by ear, as bells at these times (ms after the first). They differ
 * in number and spacing, so the ear tells them apart without a look: one bell is
 * a new type (or a break due), two quick ones a key that counted nothing, three
 * slower ones the stop signal. Gaps of 100 ms and more keep terminals from
 * merging bells into one. BEL moves no cursor, so it can be written beside Ink's output.
 */
export const BELL_PATTERNS = {
  once: [0],
  miss: [0, 100],
  stop: [0, 160, 320],
} as const;

export type BellPattern = keyof typeof BELL_PATTERNS;

/** Write the pattern's bells to `stdout`, each at its time. */
export function ring(stdout: Pick<NodeJS.WriteStream, 'write'>, pattern: BellPattern): void {
  for (const delay of BELL_PATTERNS[pattern]) {
    if (delay === 0) {
      stdout.write(BEL);
      continue;
    }
    const timer = setTimeout(() => stdout.write(BEL), delay);
    timer.unref?.();
  }
}

/** The stop signal: three bells, 160 ms apart. */
export const ringStopSignal = (stdout: NodeJS.WriteStream): void => ring(stdout, 'stop');

/** One bell: a new type, or a break due. */
export const ringOnce = (stdout: NodeJS.WriteStream): void => ring(stdout, 'once');

/** Two quick bells: a key that counted nothing. */
export const ringMiss = (stdout: NodeJS.WriteStream): void => ring(stdout, 'miss');
