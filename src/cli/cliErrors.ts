import { DspError } from '../dsp/errors';
import { ExportCancelledError } from './streamExport';

/** Exit code for a user error (bad configuration, bad file): the message says what to fix. */
export const EXIT_USER_ERROR = 2;
/** Exit code when the user cancelled a run (Ctrl-C), as shells report SIGINT (128 + 2). */
export const EXIT_CANCELLED = 130;

/** Thrown by a command the user cancelled; its message says how far it got. */
export class CancelledError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CancelledError';
  }
}

/** Exit code for an unexpected failure. */
export const EXIT_INTERNAL_ERROR = 1;

/** Prints an error for the person at the terminal and returns the exit code; stack traces only with verbose. */
export function reportCliError(err: unknown, verbose: boolean, stderr: (line: string) => void): number {
  if (err instanceof CancelledError || err instanceof ExportCancelledError) {
    stderr(`crestline: ${err.message}`);
    return EXIT_CANCELLED;
  }
  if (err instanceof DspError && err.code !== 'INTERNAL') {
    stderr(`crestline: ${err.message}`);
    if (verbose && err.stack) stderr(err.stack);
    return EXIT_USER_ERROR;
  }
  const e = err as { code?: string; message?: string; stack?: string };
  if (e && typeof e.code === 'string' && e.code.startsWith('E') && e.message) {
    // Node file-system errors (ENOENT, EACCES…): the path is in the message.
    stderr(`crestline: ${e.message}`);
    if (verbose && e.stack) stderr(e.stack);
    return EXIT_USER_ERROR;
  }
  stderr(`crestline: internal error: ${e?.message ?? String(err)}`);
  if (verbose && e?.stack) stderr(e.stack);
  return EXIT_INTERNAL_ERROR;
}
