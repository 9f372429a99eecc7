import { readFileSync } from 'node:fs';
import { DspError, type DspErrorCode } from '../dsp/errors';

/**
 * Reads a whole UTF-8 file; any failure (missing, a directory, no permission) becomes a DspError
 * `Cannot read WHAT "PATH": reason`, so the CLI prints it and exits with code 2.
 * @param what names the file for the person at the prompt, e.g. 'configuration file', 'the AM/AM table'
 * @param code INVALID_CONFIG for a configuration, INVALID_FILE for data files
 */
export function readTextFile(path: string, what: string, code: DspErrorCode): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (err) {
    throw new DspError(code, `Cannot read ${what} "${path}": ${(err as Error).message}`);
  }
}
