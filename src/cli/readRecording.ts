import { existsSync, readFileSync } from 'node:fs';
import { DspError } from '../dsp/errors';
import { createIqDataReader, describeBareRawSource, describeSigmfSource, type IqSource } from '../io/importIq';
import { MAX_META_BYTES } from '../io/sigmfMeta';
import { regularFileSizeBytes, sigmfPathsOf } from './iqFileAccess';
import { createNodeSha512 } from './nodeHash';

/** An IQ recording read whole for analysis: samples (full scale ±1.0 for integer types) and what the metadata said. */
export interface Recording {
  readonly iq: Float64Array;
  readonly source: IqSource;
  readonly warnings: readonly string[];
}

/**
 * Reads a SigMF recording given as BASE, BASE.sigmf-data or BASE.sigmf-meta, through src/io's readers (every datatype
 * they decode; length, core:sha512 and finite-sample checks included). A data file without .sigmf-meta is read as
 * cf32_le at `fallbackRateHz`, with a warning.
 * @throws DspError INVALID_FILE naming the file and the problem
 */
export function readRecording(path: string, fallbackRateHz: number): Recording {
  const pair = sigmfPathsOf(path);
  const metaPath = pair.metaPath;
  const dataPath = existsSync(pair.dataPath) ? pair.dataPath : path;
  const size = fileSize(dataPath);
  const warnings: string[] = [];
  let source: IqSource;
  if (existsSync(metaPath)) {
    if (fileSize(metaPath) > MAX_META_BYTES) throw new DspError('INVALID_FILE', `${metaPath}: more than ${MAX_META_BYTES} bytes of metadata.`);
    source = describeSigmfSource(readFileSync(metaPath, 'utf8'), metaPath, dataPath, size);
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
