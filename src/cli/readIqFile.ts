import { closeSync, existsSync, openSync, readFileSync, readSync } from 'node:fs';
import { DspError } from '../dsp/errors';
import { createIqDataReader, describeBareRawSource, describeRawSource, describeSigmfSource, describeWavSource, readCsvSource, type IqReadResult, type IqSource } from '../io/importIq';
import type { IqDatatype } from '../io/iqDatatypes';
import { MAX_CSV_SAMPLES } from '../io/csvIq';
import { MAX_SIDECAR_BYTES } from '../io/iqSidecar';
import { MAX_META_BYTES } from '../io/sigmfMeta';
import { findSigmfRecording, SIGMF_ARCHIVE_SUFFIX } from '../io/sigmfArchive';
import { listUstarMembers } from '../io/ustar';
import { hasSigmfSuffix, regularFileSizeBytes, sigmfPathsOf } from './iqFileAccess';
import { createNodeSha512 } from './nodeHash';

/** Raw formats that can be read without a sidecar (`--raw-format`). */
export const BARE_RAW_FORMATS: Readonly<Record<string, IqDatatype>> = { f32le: 'cf32_le', i16le: 'ci16_le', i16be: 'ci16_be', i8: 'ci8', u8: 'cu8' };

export interface ReadIqFileOptions {
  readonly ignoreChecksum?: boolean | undefined;
  /** For a raw file without sidecar: its format and rate. */
  readonly rawFormat?: string | undefined;
  readonly rateHz?: number | undefined;
  /** Keep the decoded samples in `result.iq` (for analysis; up to MAX_IN_MEMORY_SAMPLES). */
  readonly keepSamples?: boolean | undefined;
  readonly onProgress?: ((doneBytes: number, totalBytes: number) => void) | undefined;
}

/** Reads and validates an IQ file of any supported kind, streaming its data; returns what it holds. */
export function readIqFile(path: string, options: ReadIqFileOptions = {}): { source: IqSource; result: IqReadResult } {
  const lower = path.toLowerCase();
  if (lower.endsWith(SIGMF_ARCHIVE_SUFFIX)) return readSigmfArchive(path, options);
  if (hasSigmfSuffix(path)) {
    const { metaPath, dataPath } = sigmfPathsOf(path);
    const metaText = readText(metaPath, MAX_META_BYTES, 'SigMF metadata');
    const source = describeSigmfSource(metaText, metaPath, dataPath, fileSize(dataPath, 'SigMF data'));
    return { source, result: streamData(dataPath, source, options) };
  }
  let dataPath = path;
  let sidecarPath: string | undefined;
  if (/\.(iq|wav|csv)\.json$/i.test(path)) {
    dataPath = path.slice(0, -'.json'.length);
    sidecarPath = path;
  } else if (existsSync(`${path}.json`)) {
    sidecarPath = `${path}.json`;
  }
  const dataLower = dataPath.toLowerCase();
  const sidecar = sidecarPath ? { name: sidecarPath, text: readText(sidecarPath, MAX_SIDECAR_BYTES, 'sidecar') } : undefined;
  if (dataLower.endsWith('.wav')) {
    const size = fileSize(dataPath, 'WAV');
    const head = readHead(dataPath, Math.min(size, 1 << 16));
    const source = describeWavSource(head, dataPath, size, sidecar);
    return { source, result: streamData(dataPath, source, options) };
  }
  if (dataLower.endsWith('.csv')) {
    const size = fileSize(dataPath, 'CSV');
    // Longest plausible CSV line for a double pair is ~50 bytes.
    if (size > MAX_CSV_SAMPLES * 64) {
      throw new DspError('INVALID_FILE', `${dataPath}: ${size} bytes is more than a CSV of ${MAX_CSV_SAMPLES} samples can be; CSV is for short records.`, { problem: 'size' });
    }
    const readOptions = { ignoreChecksum: options.ignoreChecksum, createHasher: createNodeSha512, keepSamples: options.keepSamples };
    return readCsvSource(new Uint8Array(readFileSync(dataPath)), dataPath, sidecar, readOptions, options.rateHz);
  }
  if (sidecar) {
    const source = describeRawSource(sidecar.text, sidecar.name, dataPath, fileSize(dataPath, 'raw IQ'));
    return { source, result: streamData(dataPath, source, options) };
  }
  if (options.rawFormat !== undefined) {
    const datatype = bareRawDatatype(options.rawFormat, options.rateHz);
    const source = describeBareRawSource(datatype, options.rateHz!, dataPath, fileSize(dataPath, 'raw IQ'));
    return { source, result: streamData(dataPath, source, options) };
  }
  throw new DspError(
    'INVALID_FILE',
    `${path}: cannot tell the format: expected .sigmf-meta/.sigmf-data, a .sigmf archive, .wav, .csv, or raw .iq with its .iq.json sidecar (for a raw file without sidecar give --raw-format and --rate).`,
    { problem: 'unknown-format' },
  );
}

/**
 * The datatype `--raw-format` names, for a raw file without sidecar, which also needs `--rate`.
 * @throws DspError INVALID_CONFIG naming --raw-format and the allowed names, or saying --rate is missing
 */
export function bareRawDatatype(rawFormat: string, rateHz: number | undefined): IqDatatype {
  const datatype = BARE_RAW_FORMATS[rawFormat];
  if (!datatype) {
    throw new DspError('INVALID_CONFIG', `--raw-format "${rawFormat}" is not a raw format; allowed: ${Object.keys(BARE_RAW_FORMATS).join(', ')}.`, { field: 'raw-format' });
  }
  if (rateHz === undefined) throw new DspError('INVALID_CONFIG', '--raw-format needs --rate <Hz> as well.', { field: 'rate' });
  return datatype;
}

/**
 * A SigMF archive (`.sigmf`, tar): lists its members from the headers, finds the one Recording, reads its metadata
 * member and streams its data member, with the checks of a SigMF pair. Messages name `ARCHIVE:MEMBER`.
 */
function readSigmfArchive(path: string, options: ReadIqFileOptions): { source: IqSource; result: IqReadResult } {
  const size = fileSize(path, 'SigMF archive');
  const fd = openSync(path, 'r');
  try {
    const readAt = (offsetBytes: number, lengthBytes: number): Uint8Array => {
      const out = new Uint8Array(lengthBytes);
      const n = readSync(fd, out, 0, lengthBytes, offsetBytes);
      return out.subarray(0, n);
    };
    const { meta, data } = findSigmfRecording(listUstarMembers(size, readAt, path), path);
    const metaName = `${path}:${meta.name}`;
    if (meta.sizeBytes > MAX_META_BYTES) throw new DspError('INVALID_FILE', `${metaName}: the SigMF metadata is ${meta.sizeBytes} bytes, more than the ${MAX_META_BYTES} allowed.`, { problem: 'size' });
    const metaText = new TextDecoder('utf-8', { fatal: false }).decode(readAt(meta.dataOffsetBytes, meta.sizeBytes));
    const source = describeSigmfSource(metaText, metaName, `${path}:${data.name}`, data.sizeBytes);
    return { source, result: streamData(path, source, options, { offsetBytes: data.dataOffsetBytes, lengthBytes: data.sizeBytes }) };
  } finally {
    closeSync(fd);
  }
}

/** Streams the data file, or the byte range of it that holds the data (an archive member), through the checks. */
function streamData(dataPath: string, source: IqSource, options: ReadIqFileOptions, range?: { offsetBytes: number; lengthBytes: number }): IqReadResult {
  const reader = createIqDataReader(source, { ignoreChecksum: options.ignoreChecksum, createHasher: createNodeSha512, keepSamples: options.keepSamples });
  const fd = openSync(dataPath, 'r');
  try {
    const chunk = new Uint8Array(4 << 20);
    let done = 0;
    const total = range?.lengthBytes ?? Number.POSITIVE_INFINITY;
    for (;;) {
      const want = Math.min(chunk.length, total - done);
      const n = want <= 0 ? 0 : readSync(fd, chunk, 0, want, range ? range.offsetBytes + done : null);
      if (n === 0) break;
      reader.push(chunk.subarray(0, n));
      done += n;
      options.onProgress?.(done, source.dataFileBytes);
    }
  } finally {
    closeSync(fd);
  }
  return reader.finish();
}

function fileSize(path: string, what: string): number {
  return regularFileSizeBytes(
    path,
    (reason) => new DspError('INVALID_FILE', `${path}: cannot open the ${what} file (${reason}).`, { problem: 'missing' }),
  );
}

function readText(path: string, limit: number, what: string): string {
  const size = fileSize(path, what);
  if (size > limit) throw new DspError('INVALID_FILE', `${path}: the ${what} file is ${size} bytes, more than the ${limit} allowed.`, { problem: 'size' });
  return readFileSync(path, 'utf8');
}

function readHead(path: string, length: number): Uint8Array {
  const fd = openSync(path, 'r');
  try {
    const out = new Uint8Array(length);
    const n = readSync(fd, out, 0, length, 0);
    return out.subarray(0, n);
  } finally {
    closeSync(fd);
  }
}
