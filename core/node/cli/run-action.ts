import { SpectrumReadError } from '../../spectrum/spectrum.js';
import { UsageError } from './usage-error.js';

/** Exit codes of every subcommand. */
export const EXIT_OK = 0;
export const EXIT_SOME_FAILED = 1;
export const EXIT_USAGE_OR_UNREADABLE = 2;

/**
 * Wraps a subcommand so that expected failures (unreadable input, usage mistakes, file-system
 * errors) end as one line on stderr and exit code 2, never a stack trace.
 */
export function runAction<A extends unknown[]>(action: (...args: A) => Promise<number | void> | number | void) {
  return async (...args: A): Promise<void> => {
    try {
      const code = await action(...args);
      process.exitCode = typeof code === 'number' ? code : EXIT_OK;
    } catch (err) {
      // A reader that stopped early (| head) closed the pipe: say so in words, exit 1 (not every
      // input got its row).
      if (isClosedPipe(err)) {
        process.stderr.write('zvet: the reader of the output stopped (broken pipe, EPIPE): the rest was not written\n');
        process.exitCode = EXIT_SOME_FAILED;
        return;
      }
      process.stderr.write(`zvet: ${describeFailure(err)}\n`);
      process.exitCode = EXIT_USAGE_OR_UNREADABLE;
    }
  };
}

export function isClosedPipe(err: unknown): boolean {
  return (err as NodeJS.ErrnoException)?.code === 'EPIPE';
}

/** One line describing why something failed, without a stack trace. */
export function describeFailure(err: unknown): string {
  if (err instanceof SpectrumReadError || err instanceof UsageError) return err.message;
  const e = err as NodeJS.ErrnoException;
  if (e && typeof e.code === 'string' && typeof e.path === 'string') {
    const why: Record<string, string> = {
      ENOENT: 'no such file or folder',
      EACCES: 'permission denied',
      EPERM: 'operation not permitted',
      EISDIR: 'is a folder, not a file',
      ENOTDIR: 'not a folder',
      ENOSPC: 'the disk is full',
      EROFS: 'the file system is read-only',
    };
    return `${e.path}: ${why[e.code] ?? e.code}`;
  }
  return e instanceof Error ? e.message.split('\n')[0] : String(err);
}
