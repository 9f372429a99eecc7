import type { WaveformConfig } from '../config/schema';
import { DspError } from '../dsp/errors';
import { validateLevelSpec, type LevelSpec } from '../dsp/level/levelScale';
import { resampledLengthSamples } from '../dsp/resample/polyphaseResampler';
import { designResampler, type ResamplerDesign } from '../dsp/resample/resamplerDesign';
import { planFrequencyShift, type FrequencyShiftPlan } from '../dsp/resample/frequencyShift';
import { gridSubcarrierFrequencyHz } from '../dsp/waveform/subcarrierLayout';
import { hasTransmitterChain } from '../dsp/transmitter/transmitterChain';
import { MAX_IN_MEMORY_SAMPLES } from '../dsp/waveform/waveformGenerator';
import { createWaveformPlan, type WaveformPlan } from '../dsp/waveform/waveformPlan';
import { exportFormatInfo, type ExportFormatInfo } from './exportFormats';
import { defaultLevelFor, parseExportOptions, type ExportOptions, type ExportOptionsInput } from './exportOptions';
import { bytesPerSample } from './iqDatatypes';
import { MAX_CSV_SAMPLES } from './csvIq';
import { encodeWavHeader, wavHeaderRateHz } from './wav';

/** Largest export, in samples (2^33: 64 GiB of cf32). */
export const MAX_EXPORT_SAMPLES = 2 ** 33;

/** Everything an export will do, resolved and checked before any sample is generated. Plain data. */
export interface ExportPlan {
  readonly config: WaveformConfig;
  readonly options: ExportOptions;
  readonly format: ExportFormatInfo;
  readonly waveformPlan: WaveformPlan;
  readonly level: LevelSpec;
  /** The waveform's own rate (oversampling included). */
  readonly nativeRateHz: number;
  /** The file's rate: exactly nativeRateHz · L / M. */
  readonly sampleRateHz: number;
  readonly resampler: ResamplerDesign | undefined;
  readonly nativeSamplesPerPeriod: number;
  /** Samples of one copy of the record in the file. */
  readonly periodSamples: number;
  readonly repeat: number;
  readonly numSamples: number;
  readonly shift: FrequencyShiftPlan | undefined;
  readonly centerFrequencyHz: number | undefined;
  /** Allocated band at baseband after the frequency offset, Hz (edges of the outermost data subcarriers ± Δf/2). */
  readonly occupiedBandHz: { readonly lowerHz: number; readonly upperHz: number };
  /** Symbols after which the waveform's CP pattern, slots and (NR with a carrier) §5.4 phases repeat. */
  readonly loopUnitSymbols: number;
  /** True when the file wraps onto itself without a seam (whole loop units, whole resampled length, periodic offset). */
  readonly seamlessLoop: boolean;
  /** Header bytes before the samples (WAV), else 0. */
  readonly headerBytes: number;
  /** Data file size in bytes; undefined for CSV (text of varying width). */
  readonly dataFileBytes: number | undefined;
  readonly warnings: readonly string[];
  /**
   * True when the configuration has transmitter blocks (PAPR reduction, windowing, impairments, amplifier): they act on
   * the whole record (the amplifier's drive is found on the signal itself), so the record is generated in memory once.
   */
  readonly transmitterChain: boolean;
}

/**
 * Resolves an export: waveform plan, output rate and resampler, frequency offset, loop checks, sizes.
 * @throws DspError INVALID_CONFIG for bad options (named field) or an export no format can hold
 */
export function planExport(config: WaveformConfig, optionsInput: ExportOptionsInput | ExportOptions = {}): ExportPlan {
  const options = parseExportOptions(optionsInput);
  const format = exportFormatInfo(options.format);
  const level = options.level ?? defaultLevelFor(options.format);
  validateLevelSpec(level);
  const waveformPlan = createWaveformPlan(config);
  const warnings: string[] = [...waveformPlan.warnings];
  const transmitterChain = hasTransmitterChain(config);
  if (transmitterChain && waveformPlan.numSamples > MAX_IN_MEMORY_SAMPLES) {
    throw new DspError(
      'INVALID_CONFIG',
      `symbols: with transmitter blocks (paprReduction, windowing, impairments or amplifier) the record is processed in memory, at most ${MAX_IN_MEMORY_SAMPLES} samples; ${config.symbols} symbols give ${waveformPlan.numSamples}. Use fewer symbols and --repeat, or remove those blocks.`,
      { field: 'symbols' },
    );
  }
  const nativeRateHz = waveformPlan.sampleRateHz;
  const numerology = waveformPlan.numerology;
  const scsHz = numerology.subcarrierSpacingHz;

  let maxAbsHz = 0;
  for (let g = 0; g < numerology.numGridSubcarriers; g++) maxAbsHz = Math.max(maxAbsHz, Math.abs(gridSubcarrierFrequencyHz(numerology, g)));
  const gridEdgeHz = maxAbsHz + scsHz / 2;

  let resampler: ResamplerDesign | undefined;
  const wanted = options.sampleRateHz;
  if (wanted !== undefined && Math.abs(wanted - nativeRateHz) > 1e-9 * nativeRateHz) {
    resampler = designResampler({
      inputRateHz: nativeRateHz,
      outputRateHz: wanted,
      passbandEdgeHz: gridEdgeHz,
      passbandRippleDb: options.passbandRippleDb,
      stopbandAttenuationDb: options.stopbandAttenuationDb,
    });
  }
  const sampleRateHz = resampler ? resampler.outputRateHz : nativeRateHz;
  const nativeSamplesPerPeriod = waveformPlan.numSamples;
  const periodSamples = resampler ? resampledLengthSamples(resampler, nativeSamplesPerPeriod) : nativeSamplesPerPeriod;
  let seamlessLoop = true;
  if (resampler && (nativeSamplesPerPeriod * resampler.up) % resampler.down !== 0) {
    seamlessLoop = false;
    warnings.push(
      `The record's ${nativeSamplesPerPeriod} samples × ${resampler.up}/${resampler.down} is not a whole number of samples at ${sampleRateHz} Hz; the file holds ${periodSamples} and will not loop seamlessly. Use a whole number of subframes.`,
    );
  }
  const loopUnitSymbols = loopUnitOf(waveformPlan);
  if (config.symbols % loopUnitSymbols !== 0) {
    seamlessLoop = false;
    warnings.push(
      `symbols: ${config.symbols} is not a whole number of ${loopUnitSymbols}-symbol loop units (slot, CP pattern${waveformPlan.ofdm.symbolPhaseRad.length ? ', §5.4 phase' : ''}); played in a loop the file repeats a partial unit.`,
    );
  }

  let lowerHz = Infinity;
  let upperHz = -Infinity;
  for (const a of waveformPlan.allocations) {
    for (const g of a.dataSubcarriers) {
      const f = gridSubcarrierFrequencyHz(numerology, g);
      lowerHz = Math.min(lowerHz, f - scsHz / 2);
      upperHz = Math.max(upperHz, f + scsHz / 2);
    }
  }

  let shift: FrequencyShiftPlan | undefined;
  if (options.freqOffsetHz !== 0) {
    shift = planFrequencyShift(options.freqOffsetHz, sampleRateHz, periodSamples, !options.exactFreqOffset);
    if (shift.snapped) {
      warnings.push(
        `freqOffsetHz ${shift.requestedHz} Hz was moved to ${shift.appliedHz} Hz, the nearest offset with a whole number of cycles over the ${periodSamples}-sample loop, so the file wraps without a phase step (exactFreqOffset keeps the request).`,
      );
    } else if (!shift.periodic) {
      seamlessLoop = false;
      const cycles = (shift.appliedHz * periodSamples) / sampleRateHz;
      const stepDeg = 360 * (cycles - Math.round(cycles));
      warnings.push(
        `freqOffsetHz ${shift.appliedHz} Hz is not a whole number of cycles over the ${periodSamples}-sample loop: played in a loop the file has a ${stepDeg.toFixed(1)}° phase step at the seam.`,
      );
    }
    lowerHz += shift.appliedHz;
    upperHz += shift.appliedHz;
    const edge = Math.max(Math.abs(gridEdgeHz + shift.appliedHz), Math.abs(-gridEdgeHz + shift.appliedHz));
    if (edge >= sampleRateHz / 2) {
      throw new DspError(
        'INVALID_CONFIG',
        `freqOffsetHz: shifting the ±${gridEdgeHz} Hz grid by ${shift.appliedHz} Hz puts it past the ±${sampleRateHz / 2} Hz Nyquist band of the ${sampleRateHz} Hz file; the offset may be at most ${sampleRateHz / 2 - gridEdgeHz} Hz in size.`,
        { field: 'freqOffsetHz' },
      );
    }
  }

  const numSamples = periodSamples * options.repeat;
  if (numSamples > MAX_EXPORT_SAMPLES) {
    throw new DspError('INVALID_CONFIG', `repeat: ${options.repeat} copies of ${periodSamples} samples exceed the ${MAX_EXPORT_SAMPLES}-sample export limit.`, {
      field: 'repeat',
    });
  }
  if (format.container === 'csv' && numSamples > MAX_CSV_SAMPLES) {
    throw new DspError(
      'INVALID_CONFIG',
      `format: CSV is limited to ${MAX_CSV_SAMPLES} samples and this export has ${numSamples}; use a SigMF, raw or WAV format, or fewer symbols.`,
      { field: 'format' },
    );
  }
  let headerBytes = 0;
  if (format.container === 'wav') {
    headerBytes = encodeWavHeader(format.datatype as 'ci16_le' | 'cf32_le', numSamples, sampleRateHz).length;
    if (wavHeaderRateHz(sampleRateHz) !== sampleRateHz) {
      warnings.push(`The WAV header holds the rate as a whole number: ${wavHeaderRateHz(sampleRateHz)} Hz; the exact ${sampleRateHz} Hz is in the sidecar.`);
    }
  }
  const dataFileBytes = format.container === 'csv' ? undefined : headerBytes + numSamples * bytesPerSample(format.datatype);
  if (format.integer && level.mode === 'formula') {
    warnings.push('level: formula scale in an integer format clips almost every sample; choose --level-dbfs or the default auto level.');
  }
  return {
    config,
    options,
    format,
    waveformPlan,
    level,
    nativeRateHz,
    sampleRateHz,
    resampler,
    nativeSamplesPerPeriod,
    periodSamples,
    repeat: options.repeat,
    numSamples,
    shift,
    centerFrequencyHz: options.centerFrequencyHz ?? config.carrierFrequencyHz,
    occupiedBandHz: { lowerHz, upperHz },
    loopUnitSymbols,
    seamlessLoop,
    headerBytes,
    dataFileBytes,
    warnings,
    transmitterChain,
  };
}

/** lcm of the slot length, the CP pattern period and (NR with a carrier) the per-subframe §5.4 phase period, in symbols. */
function loopUnitOf(plan: WaveformPlan): number {
  const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
  const lcm = (a: number, b: number): number => (a / gcd(a, b)) * b;
  let unit = lcm(plan.numerology.symbolsPerSlot, plan.ofdm.cpLengthsSamples.length);
  if (plan.ofdm.symbolPhaseRad.length > 0) unit = lcm(unit, plan.ofdm.symbolPhaseRad.length);
  return unit;
}
