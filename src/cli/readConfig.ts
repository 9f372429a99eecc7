import { readFileSync } from 'node:fs';
import { parseWaveformConfigJson } from '../config/configParse';
import type { WaveformConfig } from '../config/schema';
import { DspError } from '../dsp/errors';

/** Reads and validates a configuration file; a missing file or bad JSON becomes a DspError naming the path. */
export function readConfigFile(path: string): WaveformConfig {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    throw new DspError('INVALID_CONFIG', `Cannot read configuration file "${path}": ${(err as Error).message}`);
  }
  return parseWaveformConfigJson(text, `Configuration file "${path}"`);
}
