/** A mistake in how the command was called (exit code 2, one line on stderr). */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}
