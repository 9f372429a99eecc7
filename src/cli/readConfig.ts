import { parseWaveformConfigJson } from '../config/configParse';
import type { WaveformConfig } from '../config/schema';
import { readTextFile } from './readTextFile';

/** Reads and validates a configuration file; a missing file or bad JSON becomes a DspError naming the path. */
export function readConfigFile(path: string): WaveformConfig {
  const text = readTextFile(path, 'configuration file', 'INVALID_CONFIG');
  return parseWaveformConfigJson(text, `Configuration file "${path}"`);
}
