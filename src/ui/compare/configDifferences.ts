/**
 * What differs between two configurations, field by field, after the schema's defaults are applied
 * (so `{}` and `{ "modulation": "qpsk" }` are the same). Pure; uses the zod schema only.
 */
import { checkConfigSchema } from '../../config/schemaIssues';

export interface ConfigDifference {
  /** Dotted path ("allocation.numRb", "data.source"). */
  path: string;
  baseline: unknown;
  value: unknown;
}

function flatten(value: unknown, prefix: string, out: Map<string, unknown>): void {
  if (value !== null && typeof value === 'object') {
    const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
    if (entries.length === 0) out.set(prefix, Array.isArray(value) ? [] : {});
    for (const [key, child] of entries) flatten(child, prefix === '' ? key : `${prefix}.${key}`, out);
    return;
  }
  out.set(prefix, value);
}

/** Differences of `config` from `baseline`, in the schema's field order; null when either is invalid. */
export function configDifferences(baseline: unknown, config: unknown): ConfigDifference[] | null {
  const a = checkConfigSchema(baseline).config;
  const b = checkConfigSchema(config).config;
  if (a === undefined || b === undefined) return null;
  const flatA = new Map<string, unknown>();
  const flatB = new Map<string, unknown>();
  flatten(a, '', flatA);
  flatten(b, '', flatB);
  const paths = [...new Set([...flatA.keys(), ...flatB.keys()])];
  return paths.filter((path) => flatA.get(path) !== flatB.get(path)).map((path) => ({ path, baseline: flatA.get(path), value: flatB.get(path) }));
}

/** A short text for a difference: "waveform: dft-s-ofdm → ofdm". */
export function describeDifference(difference: ConfigDifference): string {
  const show = (v: unknown) => (v === undefined ? '—' : typeof v === 'string' ? v : JSON.stringify(v));
  return `${difference.path}: ${show(difference.baseline)} → ${show(difference.value)}`;
}
