import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { DspError } from '../dsp/errors';
import { decodeCf32Le } from '../io/cf32';

/** An IQ recording read for analysis: samples as doubles plus what the metadata said. */
export interface Recording {
  readonly iq: Float64Array;
  readonly datatype: string;
  readonly sampleRateHz: number | undefined;
  readonly dataPath: string;
  readonly metaPath: string | undefined;
  readonly warnings: string[];
}

/** Decoders by SigMF datatype: whatever src/io provides (cf32_le at least). */
const DECODERS: Readonly<Record<string, (bytes: Uint8Array) => Float64Array>> = {
  cf32_le: decodeCf32Le,
};

/** Bytes per complex sample of each datatype the decoders know. */
const BYTES_PER_SAMPLE: Readonly<Record<string, number>> = { cf32_le: 8 };

/**
 * Reads a SigMF recording given as BASE, BASE.sigmf-data or BASE.sigmf-meta. Without a .sigmf-meta the data file is read
 * as cf32_le (with a warning). Checks the datatype, the length, core:sha512 when present and that every sample is finite.
 * @throws DspError INVALID_FILE naming the file and the problem
 */
export function readRecording(path: string): Recording {
  const base = path.replace(/\.sigmf-(data|meta)$/, '');
  const dataPath = existsSync(`${base}.sigmf-data`) ? `${base}.sigmf-data` : path;
  const metaPath = existsSync(`${base}.sigmf-meta`) ? `${base}.sigmf-meta` : undefined;
  const warnings: string[] = [];
  let datatype = 'cf32_le';
  let sampleRateHz: number | undefined;
  let sha512: string | undefined;
  if (metaPath) {
    let meta: { global?: Record<string, unknown> };
    try {
      meta = JSON.parse(readFileSync(metaPath, 'utf8')) as typeof meta;
    } catch (err) {
      throw new DspError('INVALID_FILE', `${metaPath} is not valid JSON: ${(err as Error).message}`);
    }
    const global = meta.global ?? {};
    if (typeof global['core:datatype'] !== 'string') throw new DspError('INVALID_FILE', `${metaPath}: global.core:datatype is missing.`);
    datatype = global['core:datatype'];
    if (typeof global['core:sample_rate'] === 'number') sampleRateHz = global['core:sample_rate'];
    if (typeof global['core:sha512'] === 'string') sha512 = global['core:sha512'];
  } else {
    warnings.push(`No ${base}.sigmf-meta found: reading ${dataPath} as cf32_le at the configuration's sample rate.`);
  }
  const decode = DECODERS[datatype];
  if (!decode) {
    throw new DspError('INVALID_FILE', `${metaPath ?? dataPath}: datatype "${datatype}" cannot be read; supported: ${Object.keys(DECODERS).join(', ')}.`);
  }
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(dataPath);
  } catch (err) {
    throw new DspError('INVALID_FILE', `Cannot read IQ file "${dataPath}": ${(err as Error).message}`);
  }
  const width = BYTES_PER_SAMPLE[datatype]!;
  if (bytes.byteLength === 0 || bytes.byteLength % width !== 0) {
    throw new DspError('INVALID_FILE', `${dataPath}: ${bytes.byteLength} bytes is not a whole number of ${datatype} samples (${width} bytes each).`);
  }
  if (sha512 !== undefined && createHash('sha512').update(bytes).digest('hex') !== sha512.toLowerCase()) {
    throw new DspError('INVALID_FILE', `${dataPath}: the data does not match core:sha512 in ${metaPath}; the file is damaged or from another recording.`);
  }
  const iq = decode(bytes);
  for (let i = 0; i < iq.length; i++) {
    if (!Number.isFinite(iq[i]!)) throw new DspError('INVALID_FILE', `${dataPath}: sample ${Math.floor(i / 2)} is not a finite number.`);
  }
  return { iq, datatype, sampleRateHz, dataPath, metaPath, warnings };
}
