const BEL = '\x07';

/**
 * The stop signal by ear: three bells a little apart, so it differs from a single
 * bell and terminals do not merge them into one. BEL moves no cursor, so it can be
 * written beside Ink's output.
 */
export function ringStopSignal(stdout: NodeJS.WriteStream, gapMs = 160): void {
  stdout.write(BEL);
  for (const delay of [gapMs, 2 * gapMs]) {
    const timer = setTimeout(() => stdout.write(BEL), delay);
    timer.unref?.();
  }
}

/** One bell: a new type, or a break due. */
export function ringOnce(stdout: NodeJS.WriteStream): void {
  stdout.write(BEL);
}
