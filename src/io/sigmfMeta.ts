import type { WaveformConfig } from '../config/schema';

/** SigMF version written (schema sigmf-schema.json v1.2.x; the core fields used here are unchanged since 1.0). */
export const SIGMF_VERSION = '1.2.0';
/** Our own namespace for the generating configuration and scaling facts. */
export const CRESTLINE_NAMESPACE = 'crestline';

export interface SigmfMetaInput {
  readonly datatype: 'cf32_le' | 'ci16_le' | 'ci8';
  readonly sampleRateHz: number;
  readonly sha512Hex: string;
  readonly description: string;
  readonly recorder: string;
  readonly config: WaveformConfig;
  readonly numSamples: number;
  readonly author?: string | undefined;
  readonly centerFrequencyHz?: number | undefined;
  /** Scaling facts for our namespace: the factor applied to the formula's samples, and levels. */
  readonly scaling: Record<string, unknown>;
}

/**
 * Builds the `.sigmf-meta` object: global (core:datatype, core:sample_rate, core:version, core:sha512,
 * core:description, core:recorder, core:author when given, plus `crestline:*`), one capture at sample 0
 * (core:frequency when a carrier is set) and no annotations. Extensions are declared in core:extensions.
 */
export function buildSigmfMeta(input: SigmfMetaInput): Record<string, unknown> {
  const global: Record<string, unknown> = {
    'core:datatype': input.datatype,
    'core:sample_rate': input.sampleRateHz,
    'core:version': SIGMF_VERSION,
    'core:sha512': input.sha512Hex,
    'core:description': input.description,
    'core:recorder': input.recorder,
    'core:num_channels': 1,
    'core:extensions': [{ name: CRESTLINE_NAMESPACE, version: '1.0.0', optional: true }],
    [`${CRESTLINE_NAMESPACE}:config`]: input.config,
    [`${CRESTLINE_NAMESPACE}:num_samples`]: input.numSamples,
    [`${CRESTLINE_NAMESPACE}:scaling`]: input.scaling,
  };
  if (input.author !== undefined) global['core:author'] = input.author;
  const capture: Record<string, unknown> = { 'core:sample_start': 0 };
  if (input.centerFrequencyHz !== undefined) capture['core:frequency'] = input.centerFrequencyHz;
  return { global, captures: [capture], annotations: [] };
}
