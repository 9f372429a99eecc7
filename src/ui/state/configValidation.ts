/**
 * Schema check of the form's draft on the main thread: zod only, no engine code, so a bad value is
 * marked at its field at once and never reaches the worker. Cross-field rules (grid limits, DFT
 * sizes) are checked by the worker's parseWaveformConfig; its issues arrive in the same shape.
 */
import { checkConfigSchema, type ConfigIssue, TOP_LEVEL_PATH } from '../../config/schemaIssues';

/** The form's working copy: WaveformConfigInput-shaped, but it may hold values the schema rejects. */
export type ConfigDraft = Readonly<Record<string, unknown>>;

export { TOP_LEVEL_PATH };

/** Issues the schema finds in `draft` (empty when the draft may go to the engine). */
export function checkDraftAgainstSchema(draft: ConfigDraft): ConfigIssue[] {
  return checkConfigSchema(draft).issues;
}

/** Issues by dotted path; several on one path are joined. */
export function issuesByPath(issues: readonly ConfigIssue[]): Record<string, string> {
  const byPath: Record<string, string> = {};
  for (const { path, message } of issues) byPath[path] = byPath[path] === undefined ? message : `${byPath[path]}; ${message}`;
  return byPath;
}

/** The message for a form field: issues at `key` itself or below it ("allocation" shows "allocation.numRb"). */
export function fieldMessage(fieldErrors: Readonly<Record<string, string>>, key: string): string | undefined {
  const messages = Object.entries(fieldErrors)
    .filter(([path]) => path === key || path.startsWith(`${key}.`))
    .map(([, message]) => message);
  return messages.length > 0 ? messages.join('; ') : undefined;
}

/** Issues no listed form field shows, for a summary under the form. */
export function unplacedIssues(fieldErrors: Readonly<Record<string, string>>, fieldKeys: readonly string[]): string[] {
  return Object.entries(fieldErrors)
    .filter(([path]) => !fieldKeys.some((key) => path === key || path.startsWith(`${key}.`)))
    .map(([path, message]) => `${path}: ${message}`);
}
