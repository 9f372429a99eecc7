import type { z } from 'zod';
import { waveformConfigSchema, type WaveformConfig } from './schema';

/** One problem with a configuration, at a dotted field path ("allocation.0.numRb"). */
export interface ConfigIssue {
  readonly path: string;
  readonly message: string;
}

/** Path shown for problems of the object itself (unknown keys). */
export const TOP_LEVEL_PATH = '(top level)';

/**
 * Schema-only check (zod, no engine code), so the UI can mark a field on the main thread at once.
 * Cross-field rules of the standards are checked by parseWaveformConfig.
 */
export function checkConfigSchema(input: unknown): { config: WaveformConfig; issues: [] } | { config: undefined; issues: ConfigIssue[] } {
  const parsed = waveformConfigSchema.safeParse(input);
  if (parsed.success) return { config: parsed.data, issues: [] };
  return { config: undefined, issues: parsed.error.issues.map(describeIssue) };
}

function describeIssue(issue: z.core.$ZodIssue): ConfigIssue {
  const path = issue.path.length > 0 ? issue.path.map(String).join('.') : TOP_LEVEL_PATH;
  if (issue.code === 'unrecognized_keys') {
    return { path, message: `unknown field${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `"${k}"`).join(', ')}` };
  }
  return { path, message: issue.message };
}
