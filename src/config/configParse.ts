import type { z } from 'zod';
import { DspError } from '../dsp/errors';
import { validateWaveformConfig } from '../dsp/waveform/waveformPlan';
import { waveformConfigSchema, type WaveformConfig } from './schema';

/** One problem with a configuration, at a dotted field path ("allocation.0.numRb"). */
export interface ConfigIssue {
  readonly path: string;
  readonly message: string;
}

/**
 * Validates `input` against the schema and the cross-field rules of the standards.
 * @throws DspError INVALID_CONFIG naming every bad field; `details.issues` lists them for the form.
 */
export function parseWaveformConfig(input: unknown): WaveformConfig {
  const parsed = waveformConfigSchema.safeParse(input);
  if (!parsed.success) {
    const issues = parsed.error.issues.map(describeIssue);
    throw new DspError('INVALID_CONFIG', `Invalid configuration: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}.`, {
      issues,
    });
  }
  try {
    validateWaveformConfig(parsed.data);
  } catch (err) {
    if (err instanceof DspError && (err.code === 'INVALID_CONFIG' || err.code === 'UNSUPPORTED_SIZE')) {
      const field = typeof err.details?.field === 'string' ? err.details.field : '(configuration)';
      throw new DspError(err.code, err.message, { ...err.details, issues: [{ path: field, message: err.message }] });
    }
    throw err;
  }
  return parsed.data;
}

/** The default configuration: LTE 20 MHz uplink DFT-s-OFDM QPSK, full allocation, PN9, 14 symbols, oversampling 1. */
export function defaultWaveformConfig(): WaveformConfig {
  return parseWaveformConfig({});
}

/** Parses JSON text; a syntax error becomes INVALID_CONFIG naming `sourceName`. */
export function parseWaveformConfigJson(text: string, sourceName = 'configuration'): WaveformConfig {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    throw new DspError('INVALID_CONFIG', `${sourceName} is not valid JSON: ${(err as Error).message}`);
  }
  return parseWaveformConfig(json);
}

function describeIssue(issue: z.core.$ZodIssue): ConfigIssue {
  const path = issue.path.length > 0 ? issue.path.map(String).join('.') : '(top level)';
  if (issue.code === 'unrecognized_keys') {
    return { path, message: `unknown field${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `"${k}"`).join(', ')}` };
  }
  return { path, message: issue.message };
}
