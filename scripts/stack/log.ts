/** Console helpers for the start and test scripts. Library code never exits: it throws StackError. */
export function log(message: string): void {
  console.log(`[stallpoint] ${message}`);
}

/** A start-up step that cannot go on; the top-level handler prints it, cleans up and exits. */
export class StackError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StackError';
  }
}

export function fail(message: string): never {
  throw new StackError(message);
}

/** The message to print for an error that ended a run (no stack trace for the expected kinds). */
export function describeError(err: unknown): string {
  if (err instanceof StackError) return err.message;
  const e = err as NodeJS.ErrnoException;
  if (e && typeof e === 'object' && 'message' in e) return e.name === 'ConfigError' ? e.message : (e.stack ?? e.message);
  return String(err);
}
