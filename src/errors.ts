/** Exit codes of the exine command, in one place. */
export const EXIT = { ok: 0, failure: 1, usage: 2 } as const;

/** An expected failure: printed as one line, never with a stack trace. */
export class ExineError extends Error {
  constructor(
    message: string,
    readonly exitCode: number = EXIT.failure,
  ) {
    super(message);
    this.name = 'ExineError';
  }
}

/** Bad flags or arguments: exit code 2. */
export class UsageError extends ExineError {
  constructor(message: string) {
    super(message, EXIT.usage);
    this.name = 'UsageError';
  }
}
