import { DspError } from '../dsp/errors';
import { accumulatePowerStats, createPowerStats, summarisePowerStats, type PowerSummary } from '../dsp/level/powerStats';
import { MAX_IN_MEMORY_SAMPLES } from '../dsp/waveform/waveformGenerator';
import { decodeCsvIq } from './csvIq';
import { decodeIq } from './iqCodecs';
import { bytesPerSample, datatypeInfo, samplesInBytes, type IqDatatype } from './iqDatatypes';
import { parseIqSidecar } from './iqSidecar';
import { parseSigmfMeta } from './sigmfMeta';
import { createSha512, type Sha512 } from './sha512';
import { parseWavHeader } from './wav';

/**
 * Reading IQ files back with full validation. First a container's header or metadata becomes an `IqSource` (what the
 * data should be); then `createIqDataReader` checks the bytes as they stream past: whole samples, declared length,
 * no NaN/Inf, SHA-512. Every problem is a DspError INVALID_FILE whose message names the file and what is wrong, and
 * whose details.problem says which check failed.
 */
export interface IqSource {
  readonly container: 'sigmf' | 'raw' | 'wav' | 'csv';
  /** Data file name (for messages). */
  readonly dataName: string;
  readonly metaName?: string | undefined;
  readonly datatype: IqDatatype;
  readonly dataFileBytes: number;
  readonly dataOffsetBytes: number;
  readonly dataLengthBytes: number;
  readonly numSamples: number;
  readonly sampleRateHz: number | undefined;
  /** SHA-512 of the whole data file, when the metadata gives one. */
  readonly sha512Hex: string | undefined;
  readonly centerFrequencyHz: number | undefined;
  readonly description: string | undefined;
  /** Our namespace's fields (config, scaling, export, num_samples), when present. */
  readonly crestline: Readonly<Record<string, unknown>>;
  readonly formatLabel: string;
  readonly warnings: readonly string[];
}

/** SigMF: `.sigmf-meta` text plus the size of `.sigmf-data`. */
export function describeSigmfSource(metaText: string, metaName: string, dataName: string, dataFileBytes: number): IqSource {
  const meta = parseSigmfMeta(metaText, metaName);
  const numSamples = samplesInBytes(meta.datatype, dataFileBytes, dataName);
  const declared = meta.crestline.num_samples;
  if (typeof declared === 'number' && declared !== numSamples) {
    throw lengthError(dataName, numSamples, declared, metaName);
  }
  return {
    container: 'sigmf',
    dataName,
    metaName,
    datatype: meta.datatype,
    dataFileBytes,
    dataOffsetBytes: 0,
    dataLengthBytes: dataFileBytes,
    numSamples,
    sampleRateHz: meta.sampleRateHz,
    sha512Hex: meta.sha512Hex,
    centerFrequencyHz: meta.centerFrequencyHz,
    description: meta.description,
    crestline: meta.crestline,
    formatLabel: `SigMF ${meta.version}, ${meta.datatype} (${datatypeInfo(meta.datatype).description})`,
    warnings: meta.warnings,
  };
}

/** Raw interleaved IQ with our JSON sidecar. */
export function describeRawSource(sidecarText: string, sidecarName: string, dataName: string, dataFileBytes: number): IqSource {
  const s = parseIqSidecar(sidecarText, sidecarName);
  if (s.container !== 'raw') throw new DspError('INVALID_FILE', `${sidecarName}: describes a ${s.container} file, not raw IQ.`, { problem: 'sidecar' });
  const datatype = s.datatype as IqDatatype;
  const numSamples = samplesInBytes(datatype, dataFileBytes, dataName);
  if (numSamples !== s.numSamples) throw lengthError(dataName, numSamples, s.numSamples, sidecarName);
  return fromSidecar(s, 'raw', datatype, sidecarName, dataName, dataFileBytes, 0, dataFileBytes, numSamples, `raw ${datatype} (${datatypeInfo(datatype).description})`);
}

/** Raw interleaved IQ with no sidecar: the caller says what it holds. */
export function describeBareRawSource(datatype: IqDatatype, sampleRateHz: number, dataName: string, dataFileBytes: number): IqSource {
  checkedBareRate(sampleRateHz);
  const numSamples = samplesInBytes(datatype, dataFileBytes, dataName);
  return {
    container: 'raw',
    dataName,
    datatype,
    dataFileBytes,
    dataOffsetBytes: 0,
    dataLengthBytes: dataFileBytes,
    numSamples,
    sampleRateHz,
    sha512Hex: undefined,
    centerFrequencyHz: undefined,
    description: undefined,
    crestline: {},
    formatLabel: `raw ${datatype} (${datatypeInfo(datatype).description}), no sidecar`,
    warnings: [`${dataName}: no sidecar; format and rate as given on the command line, nothing to verify them against.`],
  };
}

function checkedBareRate(sampleRateHz: number): number {
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
    throw new DspError('INVALID_CONFIG', `rate: ${sampleRateHz} is not a positive, finite sample rate in Hz.`, { field: 'rate' });
  }
  return sampleRateHz;
}

/** WAV: the first bytes of the file (header), its size, and our sidecar when there is one. */
export function describeWavSource(
  headBytes: Uint8Array,
  dataName: string,
  dataFileBytes: number,
  sidecar?: { readonly text: string; readonly name: string },
): IqSource {
  const wav = parseWavHeader(headBytes, dataFileBytes, dataName);
  const label = `WAV 2-channel ${wav.datatype === 'ci16_le' ? 'PCM16' : 'float32'}`;
  const trailing = dataFileBytes - wav.dataOffsetBytes - wav.dataLengthBytes;
  const warnings = trailing > 0 ? [`${dataName}: ${trailing} bytes follow the data chunk (ignored).`] : [];
  if (!sidecar) {
    return {
      container: 'wav',
      dataName,
      datatype: wav.datatype,
      dataFileBytes,
      dataOffsetBytes: wav.dataOffsetBytes,
      dataLengthBytes: wav.dataLengthBytes,
      numSamples: wav.numSamples,
      sampleRateHz: wav.sampleRateHz,
      sha512Hex: undefined,
      centerFrequencyHz: undefined,
      description: undefined,
      crestline: {},
      formatLabel: label,
      warnings,
    };
  }
  const s = parseIqSidecar(sidecar.text, sidecar.name);
  if (s.container !== 'wav' || s.datatype !== wav.datatype) {
    throw new DspError('INVALID_FILE', `${sidecar.name}: describes ${s.container} ${s.datatype}, but ${dataName} is ${label}.`, { problem: 'sidecar' });
  }
  if (s.numSamples !== wav.numSamples) throw lengthError(dataName, wav.numSamples, s.numSamples, sidecar.name);
  if (Math.round(s.sampleRateHz) !== wav.sampleRateHz) {
    throw new DspError('INVALID_FILE', `${sidecar.name}: rate ${s.sampleRateHz} Hz does not match the WAV header's ${wav.sampleRateHz} Hz.`, {
      problem: 'sample-rate',
    });
  }
  const src = fromSidecar(s, 'wav', wav.datatype, sidecar.name, dataName, dataFileBytes, wav.dataOffsetBytes, wav.dataLengthBytes, wav.numSamples, label);
  return { ...src, warnings: [...warnings, ...src.warnings] };
}

function fromSidecar(
  s: ReturnType<typeof parseIqSidecar>,
  container: IqSource['container'],
  datatype: IqDatatype,
  sidecarName: string,
  dataName: string,
  dataFileBytes: number,
  dataOffsetBytes: number,
  dataLengthBytes: number,
  numSamples: number,
  label: string,
): IqSource {
  const crestline: Record<string, unknown> = {};
  if (s.config !== undefined) crestline.config = s.config;
  if (s.scaling !== undefined) crestline.scaling = s.scaling;
  if (s.export !== undefined) crestline.export = s.export;
  return {
    container,
    dataName,
    metaName: sidecarName,
    datatype,
    dataFileBytes,
    dataOffsetBytes,
    dataLengthBytes,
    numSamples,
    sampleRateHz: s.sampleRateHz,
    sha512Hex: s.sha512?.toLowerCase(),
    centerFrequencyHz: s.centerFrequencyHz,
    description: s.description,
    crestline,
    formatLabel: label,
    warnings: [],
  };
}

function lengthError(dataName: string, actual: number, declared: number, metaName: string): DspError {
  const problem = actual < declared ? 'truncated' : 'length';
  return new DspError(
    'INVALID_FILE',
    `${dataName}: holds ${actual} samples but ${metaName} says ${declared}${actual < declared ? ': the data file is truncated' : ''}.`,
    { problem, actual, declared },
  );
}

/** Options of a data check. */
export interface ReadOptions {
  /** Accept a SHA-512 mismatch (reported as a warning) instead of failing. */
  readonly ignoreChecksum?: boolean | undefined;
  readonly createHasher?: (() => Pick<Sha512, 'update' | 'digestHex'>) | undefined;
  /** Keep the decoded samples (up to MAX_IN_MEMORY_SAMPLES). */
  readonly keepSamples?: boolean | undefined;
}

/** What the data check found. */
export interface IqReadResult {
  readonly numSamples: number;
  readonly sha512Hex: string;
  readonly checksum: 'verified' | 'absent' | 'mismatch-ignored';
  readonly summary: PowerSummary;
  /** Integer formats: samples with I or Q at the type's most negative or most positive code (possibly clipped). */
  readonly fullScaleSamples: number | undefined;
  readonly iq: Float64Array | undefined;
  readonly warnings: readonly string[];
}

/** Streaming check of a data file's bytes, fed in order from the first byte of the file. */
export interface IqDataReader {
  push(fileBytes: Uint8Array): void;
  finish(): IqReadResult;
}

export function createIqDataReader(source: IqSource, options: ReadOptions = {}): IqDataReader {
  if (source.container === 'csv') throw new DspError('INTERNAL', 'CSV files are read whole with readCsvSource.');
  const hasher = options.createHasher ? options.createHasher() : createSha512();
  const stats = createPowerStats();
  const size = bytesPerSample(source.datatype);
  const info = datatypeInfo(source.datatype);
  if (options.keepSamples && source.numSamples > MAX_IN_MEMORY_SAMPLES) {
    throw new DspError('INVALID_FILE', `${source.dataName}: ${source.numSamples} samples are more than the ${MAX_IN_MEMORY_SAMPLES} held in memory.`, {
      problem: 'size',
    });
  }
  const kept = options.keepSamples ? new Float64Array(2 * source.numSamples) : undefined;
  const carry = new Uint8Array(size);
  let carryLen = 0;
  let fileOffset = 0;
  let sampleIndex = 0;
  let fullScale = 0;
  const dataEnd = source.dataOffsetBytes + source.dataLengthBytes;

  const consume = (bytes: Uint8Array): void => {
    const iq = decodeIq(source.datatype, bytes);
    if (info.kind === 'float') {
      for (let i = 0; i < iq.length; i++) {
        if (!Number.isFinite(iq[i]!)) {
          const s = sampleIndex + Math.floor(i / 2);
          throw new DspError(
            'INVALID_FILE',
            `${source.dataName}: sample ${s} has a non-finite ${i % 2 === 0 ? 'I' : 'Q'} value (${iq[i]}); IQ files must hold finite numbers.`,
            { problem: 'nan', sampleIndex: s },
          );
        }
      }
    } else {
      const lo = (info.minCode - info.zeroCode) / info.fullScaleCode;
      const hi = (info.maxCode - info.zeroCode) / info.fullScaleCode;
      for (let i = 0; i < iq.length; i += 2) {
        const a = iq[i]!;
        const b = iq[i + 1]!;
        if (a === lo || a === hi || b === lo || b === hi) fullScale++;
      }
    }
    accumulatePowerStats(stats, iq);
    if (kept) kept.set(iq, 2 * sampleIndex);
    sampleIndex += iq.length / 2;
  };

  return {
    push(fileBytes) {
      hasher.update(fileBytes);
      const start = fileOffset;
      fileOffset += fileBytes.length;
      const from = Math.max(start, source.dataOffsetBytes);
      const to = Math.min(fileOffset, dataEnd);
      if (to <= from) return;
      let region = fileBytes.subarray(from - start, to - start);
      if (carryLen > 0) {
        const take = Math.min(size - carryLen, region.length);
        carry.set(region.subarray(0, take), carryLen);
        carryLen += take;
        region = region.subarray(take);
        if (carryLen < size) return;
        consume(carry);
        carryLen = 0;
      }
      const whole = region.length - (region.length % size);
      if (whole > 0) consume(region.subarray(0, whole));
      if (whole < region.length) {
        carry.set(region.subarray(whole));
        carryLen = region.length - whole;
      }
    },
    finish() {
      if (fileOffset !== source.dataFileBytes || sampleIndex !== source.numSamples) {
        throw new DspError(
          'INVALID_FILE',
          `${source.dataName}: read ${fileOffset} bytes (${sampleIndex} samples) but expected ${source.dataFileBytes} bytes (${source.numSamples} samples): the file changed or is truncated.`,
          { problem: 'truncated' },
        );
      }
      const sha512Hex = hasher.digestHex();
      const warnings = [...source.warnings];
      let checksum: IqReadResult['checksum'] = 'absent';
      if (source.sha512Hex !== undefined) {
        if (source.sha512Hex === sha512Hex) checksum = 'verified';
        else if (options.ignoreChecksum) {
          checksum = 'mismatch-ignored';
          warnings.push(`${source.dataName}: SHA-512 does not match ${source.metaName ?? 'the metadata'} (ignored on request).`);
        } else {
          throw new DspError(
            'INVALID_FILE',
            `${source.dataName}: SHA-512 ${sha512Hex.slice(0, 16)}… does not match ${sha512Short(source.sha512Hex)} in ${source.metaName ?? 'the metadata'}: the data is corrupted or was changed (override with --ignore-checksum).`,
            { problem: 'checksum' },
          );
        }
      }
      return {
        numSamples: sampleIndex,
        sha512Hex,
        checksum,
        summary: summarisePowerStats(stats),
        fullScaleSamples: info.kind === 'float' ? undefined : fullScale,
        iq: kept,
        warnings,
      };
    },
  };
}

function sha512Short(hex: string): string {
  return `${hex.slice(0, 16)}…`;
}

/**
 * CSV: the whole text, with an optional sidecar. Returns the source and the checked read.
 * @param bareRateHz sample rate of a CSV without sidecar, as the user gave it (ignored when there is a sidecar)
 */
export function readCsvSource(
  bytes: Uint8Array,
  dataName: string,
  sidecar?: { readonly text: string; readonly name: string },
  options: ReadOptions = {},
  bareRateHz?: number,
): { source: IqSource; result: IqReadResult } {
  const iq = decodeCsvIq(new TextDecoder('utf-8', { fatal: false }).decode(bytes), dataName);
  const numSamples = iq.length / 2;
  let s: ReturnType<typeof parseIqSidecar> | undefined;
  if (sidecar) {
    s = parseIqSidecar(sidecar.text, sidecar.name);
    if (s.container !== 'csv') throw new DspError('INVALID_FILE', `${sidecar.name}: describes a ${s.container} file, not CSV.`, { problem: 'sidecar' });
    if (s.numSamples !== numSamples) throw lengthError(dataName, numSamples, s.numSamples, sidecar.name);
  }
  const source: IqSource = s
    ? fromSidecar(s, 'csv', 'cf64_le', sidecar!.name, dataName, bytes.length, 0, bytes.length, numSamples, 'CSV (I,Q per line)')
    : {
        container: 'csv',
        dataName,
        datatype: 'cf64_le',
        dataFileBytes: bytes.length,
        dataOffsetBytes: 0,
        dataLengthBytes: bytes.length,
        numSamples,
        sampleRateHz: bareRateHz === undefined ? undefined : checkedBareRate(bareRateHz),
        sha512Hex: undefined,
        centerFrequencyHz: undefined,
        description: undefined,
        crestline: {},
        formatLabel: 'CSV (I,Q per line), no sidecar',
        warnings: [
          bareRateHz === undefined
            ? `${dataName}: no sidecar; the sample rate is not known.`
            : `${dataName}: no sidecar; rate as given on the command line, nothing to verify it against.`,
        ],
      };
  const hasher = options.createHasher ? options.createHasher() : createSha512();
  const sha512Hex = hasher.update(bytes).digestHex();
  const warnings = [...source.warnings];
  let checksum: IqReadResult['checksum'] = 'absent';
  if (source.sha512Hex !== undefined) {
    if (source.sha512Hex === sha512Hex) checksum = 'verified';
    else if (options.ignoreChecksum) checksum = 'mismatch-ignored';
    else {
      throw new DspError('INVALID_FILE', `${dataName}: SHA-512 does not match ${source.metaName}: the data is corrupted or was changed (override with --ignore-checksum).`, {
        problem: 'checksum',
      });
    }
  }
  const stats = accumulatePowerStats(createPowerStats(), iq);
  return {
    source,
    result: { numSamples, sha512Hex, checksum, summary: summarisePowerStats(stats), fullScaleSamples: undefined, iq: options.keepSamples ? iq : undefined, warnings },
  };
}
