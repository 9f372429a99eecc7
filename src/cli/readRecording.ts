import { existsSync, readFileSync } from 'node:fs';
import { DspError } from '../dsp/errors';
import { createIqDataReader, describeBareRawSource, type IqSource } from '../io/importIq';
import { hasSigmfSuffix, regularFileSizeBytes, sigmfPathsOf } from './iqFileAccess';
import { createNodeSha512 } from './nodeHash';
import { bareRawDatatype, readIqFile } from './readIqFile';

/** An IQ recording read whole for analysis: samples (full scale ±1.0 for integer types) and what the metadata said. */
export interface Recording {
  readonly iq: Float64Array;
  readonly source: IqSource;
  readonly warnings: readonly string[];
}

/** What to assume for a file that has no metadata of its own (`--raw-format`, `--rate`). */
export interface RecordingOptions {
  readonly rawFormat?: string | undefined;
  readonly rateHz?: number | undefined;
}

/**
 * Reads a recording whole, in any format `generate` writes, through src/io's readers (length, SHA-512 and
 * finite-sample checks included):
 * - SigMF, given as BASE, BASE.sigmf-data or BASE.sigmf-meta. A .sigmf-data without .sigmf-meta is read as
 *   `--raw-format` at `--rate` when given, else as cf32_le at `fallbackRateHz`, with a warning.
 * - Anything else goes to `readIqFile` (raw .iq with its .iq.json sidecar, .wav, .csv, or a raw file without
 *   sidecar when `options.rawFormat` and `options.rateHz` say what it holds).
 * @throws DspError INVALID_FILE naming the file and the problem; INVALID_CONFIG for a bad --raw-format / missing --rate
 */
export function readRecording(path: string, fallbackRateHz: number, options: RecordingOptions = {}): Recording {
  const pair = sigmfPathsOf(path);
  if (!hasSigmfSuffix(path) && !existsSync(pair.dataPath) && !existsSync(pair.metaPath)) {
    const { source, result } = readIqFile(path, { keepSamples: true, rawFormat: options.rawFormat, rateHz: options.rateHz });
    return { iq: result.iq!, source, warnings: result.warnings };
  }
  const metaPath = pair.metaPath;
  // A SigMF pair is read as inspect reads it; only a data file without its metadata needs the fallbacks below.
  if (existsSync(metaPath)) {
    const { source, result } = readIqFile(metaPath, { keepSamples: true });
    return { iq: result.iq!, source, warnings: result.warnings };
  }
  const dataPath = existsSync(pair.dataPath) ? pair.dataPath : path;
  const size = fileSize(dataPath);
  const warnings: string[] = [];
  let source: IqSource;
  if (options.rawFormat !== undefined) {
    source = describeBareRawSource(bareRawDatatype(options.rawFormat, options.rateHz), options.rateHz!, dataPath, size);
  } else if (!Number.isFinite(fallbackRateHz)) {
    throw new DspError('INVALID_FILE', `No ${metaPath} found beside ${dataPath}: give --config (then it is read as cf32_le at the configuration's rate), or --raw-format and --rate.`, {
      problem: 'missing',
    });
  } else {
    warnings.push(`No ${metaPath} found: reading ${dataPath} as cf32_le at the configuration's sample rate.`);
    source = describeBareRawSource('cf32_le', fallbackRateHz, dataPath, size);
  }
  const reader = createIqDataReader(source, { keepSamples: true, createHasher: createNodeSha512 });
  reader.push(new Uint8Array(readFileSync(dataPath)));
  const result = reader.finish();
  return { iq: result.iq!, source, warnings: [...warnings, ...result.warnings] };
}

function fileSize(path: string): number {
  return regularFileSizeBytes(path, (reason) => new DspError('INVALID_FILE', `Cannot read IQ file "${path}": ${reason}`));
}
