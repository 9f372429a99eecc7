import { DspError } from '../dsp/errors';
import { resolveLevel, levelNeedsStats, type ResolvedLevel } from '../dsp/level/levelScale';
import { accumulatePowerStats, createPowerStats, summarisePowerStats, type PowerStats, type PowerSummary } from '../dsp/level/powerStats';
import { applyFrequencyShift } from '../dsp/resample/frequencyShift';
import { createCircularResampler, historyLengthSamples } from '../dsp/resample/polyphaseResampler';
import { applyTransmitterChain, type TransmitterReport } from '../dsp/transmitter/transmitterChain';
import { createWaveformGenerator, generateWaveform } from '../dsp/waveform/waveformGenerator';
import { encodeCsvIq } from './csvIq';
import { buildExportMetadata, type ExportReport } from './exportMetadata';
import type { ExportPlan } from './exportPlan';
import { createQuantisationTally, encodeIq } from './iqCodecs';
import { datatypeInfo } from './iqDatatypes';
import { createSha512, type Sha512 } from './sha512';
import { encodeWavHeader } from './wav';

/** Samples the generator is asked for per chunk (about 1 MiB of doubles at the native rate). */
export const EXPORT_CHUNK_SAMPLES = 1 << 16;

/** One step of a running export: a piece of the data file, or how far it has got. */
export type ExportStep =
  | { readonly kind: 'data'; readonly bytes: Uint8Array }
  | { readonly kind: 'progress'; readonly phase: 'analyse' | 'write'; readonly doneSamples: number; readonly totalSamples: number };

/** What an export produced besides the data bytes. */
export interface ExportResult {
  /** Data file name suffix and the metadata file (suffix, UTF-8 text). */
  readonly dataSuffix: string;
  readonly metaSuffix: string;
  readonly metaText: string;
  readonly sha512Hex: string;
  readonly dataBytes: number;
  readonly report: ExportReport;
}

export interface ExportHooks {
  /** Hash implementation (default the pure-TypeScript SHA-512; the CLI passes Node's, which gives the same digest faster). */
  readonly createHasher?: () => Pick<Sha512, 'update' | 'digestHex'>;
}

/**
 * Runs an export as a generator of steps, so a caller can write each chunk as it comes, show progress, and stop at any
 * step (cancel) without anything half-built. Passes:
 *  1. analyse (only when needed): generate the record once — resampled when the rate changes — to measure its power
 *     statistics (for rms / peak / auto levels) and keep its last Q samples, which prime the circular resampler;
 *  2. write, once per copy: generate again (the generator is deterministic), resample, shift, scale, encode, hash.
 * Levels therefore come from the record's own samples at the output rate, streamed or not; the same code path runs
 * for a 1 ms file in the browser and a 1 s file in the CLI, which is why both give byte-identical files.
 */
export function* runExport(plan: ExportPlan, hooks: ExportHooks = {}): Generator<ExportStep, ExportResult, void> {
  const needStats = levelNeedsStats(plan.level);
  const needTail = plan.resampler !== undefined;
  let formulaStats: PowerStats | undefined;
  let tailIq: Float64Array | undefined;
  const analyseTotal = needStats || needTail ? plan.nativeSamplesPerPeriod : 0;
  const total = analyseTotal + plan.numSamples;
  if (needStats || needTail) {
    const analysis = yield* analysePass(plan, needStats, total);
    formulaStats = analysis.stats;
    tailIq = analysis.tailIq;
  }
  const level: ResolvedLevel = resolveLevel(plan.level, formulaStats);
  const hasher = hooks.createHasher ? hooks.createHasher() : createSha512();
  let dataBytes = 0;
  const emit = (bytes: Uint8Array): ExportStep => {
    hasher.update(bytes);
    dataBytes += bytes.length;
    return { kind: 'data', bytes };
  };
  if (plan.format.container === 'wav') {
    yield emit(encodeWavHeader(plan.format.datatype as 'ci16_le' | 'cf32_le', plan.numSamples, plan.sampleRateHz));
  }
  const written = createPowerStats();
  const unscaled = createPowerStats();
  const tally = createQuantisationTally();
  const encoding = datatypeInfo(plan.format.datatype);
  let done = 0;
  for (let copy = 0; copy < plan.repeat; copy++) {
    let inPeriod = 0;
    for (const chunk of outputStream(plan, tailIq)) {
      if (copy === 0 && !formulaStats) accumulatePowerStats(unscaled, chunk);
      if (plan.shift) applyFrequencyShift(plan.shift.shift, chunk, copy * plan.periodSamples + inPeriod, chunk);
      const scale = level.scaleLinear;
      if (scale !== 1) for (let i = 0; i < chunk.length; i++) chunk[i]! *= scale;
      if (copy === 0) accumulatePowerStats(written, chunk);
      let bytes: Uint8Array;
      if (plan.format.container === 'csv') bytes = encodeCsvIq(chunk);
      else bytes = encodeIq(plan.format.datatype, chunk, new Uint8Array(chunk.length * encoding.bytesPerComponent), plan.format.integer ? tally : undefined);
      inPeriod += chunk.length / 2;
      done += chunk.length / 2;
      yield emit(bytes);
      yield { kind: 'progress', phase: 'write', doneSamples: analyseTotal + done, totalSamples: total };
    }
    if (inPeriod !== plan.periodSamples) {
      throw new DspError('INTERNAL', `Export copy ${copy} produced ${inPeriod} samples; ${plan.periodSamples} were planned.`);
    }
  }
  if (plan.dataFileBytes !== undefined && dataBytes !== plan.dataFileBytes) {
    throw new DspError('INTERNAL', `Export wrote ${dataBytes} bytes; ${plan.dataFileBytes} were planned.`);
  }
  const sha512Hex = hasher.digestHex();
  const meta = buildExportMetadata({
    plan,
    level,
    formulaSummary: summarisePowerStats(formulaStats ?? unscaled),
    writtenSummary: summarisePowerStats(written),
    quantisation: plan.format.integer ? tally : undefined,
    sha512Hex,
    dataBytes,
    transmitter: plan.transmitterChain ? transmittedRecord(plan) : undefined,
  });
  return { dataSuffix: plan.format.dataSuffix, metaSuffix: plan.format.metaSuffix, metaText: meta.text, sha512Hex, dataBytes, report: meta.report };
}

function* analysePass(
  plan: ExportPlan,
  needStats: boolean,
  total: number,
): Generator<ExportStep, { stats: PowerStats | undefined; tailIq: Float64Array | undefined }, void> {
  const stats = needStats ? createPowerStats() : undefined;
  const design = plan.resampler;
  let done = 0;
  if (!design) {
    for (const chunk of nativeStream(plan)) {
      accumulatePowerStats(stats!, chunk);
      done += chunk.length / 2;
      yield { kind: 'progress', phase: 'analyse', doneSamples: done, totalSamples: total };
    }
    return { stats, tailIq: undefined };
  }
  if (!needStats) {
    // Only the tail is needed: the last Q native samples, x[(N − Q + k) mod N] (the whole record when N < Q).
    const q = historyLengthSamples(design);
    const n = plan.nativeSamplesPerPeriod;
    const keep = new Float64Array(2 * Math.min(n, q));
    for (const chunk of nativeStream(plan)) {
      const count = chunk.length / 2;
      if (chunk.length >= keep.length) keep.set(chunk.subarray(chunk.length - keep.length));
      else {
        keep.copyWithin(0, chunk.length);
        keep.set(chunk, keep.length - chunk.length);
      }
      done += count;
      yield { kind: 'progress', phase: 'analyse', doneSamples: done, totalSamples: total };
    }
    const tail = new Float64Array(2 * q);
    for (let k = 0; k < q; k++) {
      const at = n >= q ? k : (((n - q + k) % n) + n) % n;
      tail[2 * k] = keep[2 * at]!;
      tail[2 * k + 1] = keep[2 * at + 1]!;
    }
    return { stats, tailIq: tail };
  }
  const resampler = createCircularResampler(design, plan.nativeSamplesPerPeriod);
  for (const chunk of nativeStream(plan)) {
    accumulatePowerStats(stats!, resampler.push(chunk));
    done += chunk.length / 2;
    yield { kind: 'progress', phase: 'analyse', doneSamples: done, totalSamples: total };
  }
  accumulatePowerStats(stats!, resampler.finish());
  accumulatePowerStats(stats!, resampler.leadingIq());
  return { stats, tailIq: resampler.tailIq() };
}

/** The transmitted record of a plan with transmitter blocks, computed once per plan (it is deterministic: seeded). */
const transmitted = new WeakMap<ExportPlan, { outputIq: Float64Array; report: TransmitterReport; warnings: string[] }>();

function transmittedRecord(plan: ExportPlan): { outputIq: Float64Array; report: TransmitterReport; warnings: string[] } {
  let hit = transmitted.get(plan);
  if (!hit) {
    hit = applyTransmitterChain(generateWaveform(plan.config), plan.config);
    transmitted.set(plan, hit);
  }
  return hit;
}

/** The record at its native rate, in chunks of whole symbols (fresh arrays the caller may modify). */
function* nativeStream(plan: ExportPlan): Generator<Float64Array, void, void> {
  if (plan.transmitterChain) {
    const record = transmittedRecord(plan).outputIq;
    for (let at = 0; at < record.length; at += 2 * EXPORT_CHUNK_SAMPLES) yield record.slice(at, Math.min(record.length, at + 2 * EXPORT_CHUNK_SAMPLES));
    return;
  }
  const generator = createWaveformGenerator(plan.waveformPlan);
  const symbolSamples = plan.waveformPlan.ofdm.ifftSize + Math.max(...plan.waveformPlan.ofdm.cpLengthsSamples);
  const perChunk = Math.max(1, Math.floor(EXPORT_CHUNK_SAMPLES / symbolSamples));
  let remaining = plan.config.symbols;
  while (remaining > 0) {
    const count = Math.min(perChunk, remaining);
    yield generator.generate(count).waveformIq;
    remaining -= count;
  }
}

/** One copy of the record at the output rate, in order (resampled circularly, primed with the record's tail). */
function* outputStream(plan: ExportPlan, tailIq: Float64Array | undefined): Generator<Float64Array, void, void> {
  const design = plan.resampler;
  if (!design) {
    yield* nativeStream(plan);
    return;
  }
  const resampler = createCircularResampler(design, plan.nativeSamplesPerPeriod, tailIq);
  for (const chunk of nativeStream(plan)) {
    const out = resampler.push(chunk);
    if (out.length > 0) yield out;
  }
  const last = resampler.finish();
  if (last.length > 0) yield last;
}

export type { PowerSummary };
