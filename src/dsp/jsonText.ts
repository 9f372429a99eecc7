import { DspError, type DspErrorCode } from './errors';

/**
 * Parses JSON text; a syntax error becomes a DspError "SOURCE: not valid JSON (reason)." with the caller's code.
 * The one JSON reader of configurations, sidecars, SigMF metadata and shard files, so they word it alike.
 * @param sourceName names the file or text for the person reading the message, e.g. 'Configuration file "cfg.json"'
 * @param code INVALID_CONFIG for a configuration, INVALID_FILE for data files
 * @param details kept on the error, e.g. `{ problem: 'json' }` where a reader documents its problems
 */
export function parseJsonText(text: string, sourceName: string, code: DspErrorCode, details?: Record<string, unknown>): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (err) {
    throw new DspError(code, `${sourceName}: not valid JSON (${(err as Error).message}).`, details);
  }
}
