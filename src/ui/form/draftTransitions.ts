/**
 * What else changes in the draft when one field changes, so the form never keeps a value that only
 * meant something for the old choice (e.g. the NR spacing after switching to LTE). Pure; the
 * resulting draft is checked by the schema like any other.
 */
import type { ConfigDraft } from '../state/configValidation';
import { readAtPath, writeAtPath } from './draftPath';

/** Research numerology offered when the user picks standard "custom" (any values the schema allows). */
export const CUSTOM_NUMEROLOGY_START = { fftSize: 1024, numRb: 50, cpLengthSamples: 72 } as const;

function withDataSource(draft: ConfigDraft, source: unknown): ConfigDraft {
  const previous = (draft.data ?? {}) as { seed?: unknown; hex?: unknown };
  if (source === 'random') return { ...draft, data: { source, seed: previous.seed ?? 1 } };
  if (source === 'bits') return { ...draft, data: { source, hex: previous.hex ?? 'A5F0' } };
  return { ...draft, data: { source } };
}

/**
 * The draft after the user set `path` to `value` (`undefined` removes the key so the schema default
 * applies), with the fields the change makes meaningless removed.
 */
export function applyFieldChange(draft: ConfigDraft, path: string, value: unknown): ConfigDraft {
  if (path === 'data.source') return withDataSource(draft, value);
  if (path === 'amplifier.model') {
    // Each model has its own parameters (the schema's union is strict): keep only the drive.
    const previous = (draft.amplifier ?? {}) as { backoffReference?: unknown; backoffDb?: unknown };
    const next: Record<string, unknown> = { model: value };
    if (previous.backoffReference !== undefined) next.backoffReference = previous.backoffReference;
    if (previous.backoffDb !== undefined) next.backoffDb = previous.backoffDb;
    return { ...draft, amplifier: next };
  }
  let next = writeAtPath(draft, path, value);
  if (path === 'standard' && value !== draft.standard) {
    next = writeAtPath(next, 'subcarrierSpacingKHz', undefined);
    if (value === 'custom') next = writeAtPath(next, 'custom', readAtPath(draft, 'custom') ?? { ...CUSTOM_NUMEROLOGY_START });
    else next = writeAtPath(next, 'custom', undefined);
  }
  if (path === 'link' && value === 'downlink' && next.waveform === 'dft-s-ofdm') next = writeAtPath(next, 'waveform', undefined);
  if (path === 'mapping' && value !== 'interleaved') {
    next = writeAtPath(writeAtPath(next, 'interleaveFactor', undefined), 'combOffset', undefined);
  }
  return next;
}
