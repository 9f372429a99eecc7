import { DspError } from '../dsp/errors';
import { parseJsonText } from '../dsp/jsonText';
import { validateWaveformConfig } from '../dsp/waveform/waveformPlan';
import type { WaveformConfig } from './schema';
import { checkConfigSchema } from './schemaIssues';

export type { ConfigIssue } from './schemaIssues';

/**
 * Validates `input` against the schema and the cross-field rules of the standards.
 * @throws DspError INVALID_CONFIG naming every bad field; `details.issues` lists them for the form.
 */
export function parseWaveformConfig(input: unknown): WaveformConfig {
  const checked = checkConfigSchema(input);
  if (checked.config === undefined) {
    const issues = checked.issues;
    throw new DspError('INVALID_CONFIG', `Invalid configuration: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}.`, {
      issues,
    });
  }
  try {
    validateWaveformConfig(checked.config);
  } catch (err) {
    if (err instanceof DspError && (err.code === 'INVALID_CONFIG' || err.code === 'UNSUPPORTED_SIZE')) {
      const field = typeof err.details?.field === 'string' ? err.details.field : '(configuration)';
      throw new DspError(err.code, err.message, { ...err.details, issues: [{ path: field, message: err.message }] });
    }
    throw err;
  }
  return checked.config;
}

/** The default configuration: LTE 20 MHz uplink DFT-s-OFDM QPSK, full allocation, PN9, 14 symbols, oversampling 1. */
export function defaultWaveformConfig(): WaveformConfig {
  return parseWaveformConfig({});
}

/** Parses JSON text; a syntax error becomes INVALID_CONFIG naming `sourceName`. */
export function parseWaveformConfigJson(text: string, sourceName = 'configuration'): WaveformConfig {
  return parseWaveformConfig(parseJsonText(text, sourceName, 'INVALID_CONFIG'));
}
