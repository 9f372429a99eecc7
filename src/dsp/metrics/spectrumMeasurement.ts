import type { WaveformConfig } from '../../config/schema';
import { DspError } from '../errors';
import { createWaveformGenerator } from '../waveform/waveformGenerator';
import { createWaveformPlan } from '../waveform/waveformPlan';
import { aclrPlanFor, aclrSpanHz, computeAclr, type AclrResult } from './aclr';
import { computeOccupiedBandwidth, type OccupiedBandwidth } from './occupiedBandwidth';
import type { SpectralWindowKind } from './spectralWindows';
import { createWelchAccumulator, createWelchPlan, finishWelch, pushWelchSamples, type PowerSpectrum } from './welchPsd';

/** Settings of `measureSpectrum`. */
export interface SpectrumRequest {
  /** Lowest oversampling to use (the statistics' oversampling); raised when the adjacent channels do not fit. */
  readonly oversampling: number;
  /** Default: channel bandwidth / 1000 (20 kHz at 20 MHz). */
  readonly rbwHz?: number | undefined;
  /** Default 'hann'. */
  readonly window?: SpectralWindowKind | undefined;
  /** OFDM symbols of the configured waveform to analyse; default enough for 32 averaged segments, at least 140. */
  readonly symbols?: number | undefined;
}

/** Spectrum, ACLR and occupied bandwidth of the configured waveform (its own data source, cyclic prefixes included). */
export interface SpectrumMeasurement {
  readonly psd: PowerSpectrum;
  readonly aclr: AclrResult;
  readonly occupiedBandwidth: OccupiedBandwidth;
  readonly oversampling: number;
  readonly sampleRateHz: number;
  readonly symbols: number;
  readonly dataSource: string;
  readonly warnings: readonly string[];
}

/** Welch segments the default symbol count aims for. */
const TARGET_SEGMENTS = 32;
/** Default and most symbols analysed, and the sample budget (2^23 samples = 128 MiB of doubles) that caps them. */
const MIN_DEFAULT_SYMBOLS = 140;
const MAX_SPECTRUM_SAMPLES = 1 << 23;

/**
 * Generates the configured waveform and measures its Welch PSD, ACLR per the standard's adjacent channels, and 99 %
 * occupied bandwidth. When the adjacent channels (plus four RBWs of margin) reach beyond ±f_s/2 at the requested
 * oversampling, the waveform is regenerated at the smallest oversampling that holds them, with a warning.
 */
export function measureSpectrum(config: WaveformConfig, request: SpectrumRequest): SpectrumMeasurement {
  const warnings: string[] = [];
  const basePlan = createWaveformPlan({ ...config, oversampling: 1 });
  const numerology = basePlan.numerology;
  const aclrPlan = aclrPlanFor(numerology);
  const rbwHz = request.rbwHz ?? numerology.channelBandwidthHz / 1000;
  const window = request.window ?? 'hann';
  const spanHz = aclrSpanHz(aclrPlan) + 4 * rbwHz;
  let oversampling = request.oversampling;
  const neededOversampling = Math.ceil((2 * spanHz) / numerology.sampleRateHz);
  if (neededOversampling > oversampling) {
    warnings.push(
      `ACLR: the adjacent channels reach ±${mhz(aclrSpanHz(aclrPlan))} MHz, beyond the ±${mhz((numerology.sampleRateHz * oversampling) / 2)} MHz that oversampling ${oversampling} covers; the spectrum waveform was regenerated at oversampling ${neededOversampling} (${mhz(numerology.sampleRateHz * neededOversampling)} Msps).`,
    );
    oversampling = neededOversampling;
  }
  if (oversampling > 16) throw new DspError('UNSUPPORTED_SIZE', `The adjacent channels need oversampling ${oversampling}, more than the 16 the generator offers.`);
  const plan = createWaveformPlan({ ...config, oversampling });
  const welch = createWelchPlan({ sampleRateHz: plan.sampleRateHz, rbwHz, window });
  const samplesPerSymbol = plan.numSamples / config.symbols;
  const maxSymbols = Math.max(1, Math.floor(MAX_SPECTRUM_SAMPLES / samplesPerSymbol));
  let symbols = request.symbols ?? Math.max(MIN_DEFAULT_SYMBOLS, Math.ceil(((TARGET_SEGMENTS + 1) * welch.hopSamples) / samplesPerSymbol));
  if (symbols > maxSymbols) {
    warnings.push(`Spectrum: ${symbols} symbols exceed the ${MAX_SPECTRUM_SAMPLES}-sample budget; ${maxSymbols} analysed.`);
    symbols = maxSymbols;
  }
  const generator = createWaveformGenerator(plan);
  const acc = createWelchAccumulator(welch);
  const chunk = Math.max(1, numerology.symbolsPerSlot);
  for (let done = 0; done < symbols; done += chunk) pushWelchSamples(acc, generator.generate(Math.min(chunk, symbols - done)).waveformIq);
  if (acc.numSegments === 0) {
    throw new DspError(
      'INVALID_CONFIG',
      `Spectrum: ${symbols} symbols hold fewer samples than one ${welch.segmentLength}-point segment for RBW ${rbwHz} Hz; use more spectrum symbols or a wider RBW.`,
      { field: 'rbwHz' },
    );
  }
  if (acc.numSegments < 8) warnings.push(`Spectrum: only ${acc.numSegments} Welch segments were averaged; the PSD is noisy (use more symbols or a wider RBW).`);
  const psd = finishWelch(acc);
  const aclr = computeAclr(psd, aclrPlan);
  for (const v of aclr.values) {
    if (!Number.isFinite(v.aclrDb)) warnings.push(`ACLR ${v.label}: no power reached that channel, so its ratio is unbounded (reported as null).`);
  }
  return {
    psd,
    aclr,
    occupiedBandwidth: computeOccupiedBandwidth(psd),
    oversampling,
    sampleRateHz: plan.sampleRateHz,
    symbols,
    dataSource: config.data.source === 'random' ? `random (seed ${config.data.seed})` : config.data.source,
    warnings,
  };
}

/** The PSD relative to the in-channel power: dBc/Hz, and dBc in one RBW (what an analyser set to that RBW shows). */
export function normalisePsd(psd: PowerSpectrum, inChannelPower: number): { dbcPerHz: Float64Array; dbcPerRbw: Float64Array } {
  const dbcPerHz = new Float64Array(psd.psdPerHz.length);
  const dbcPerRbw = new Float64Array(psd.psdPerHz.length);
  const rbwDb = 10 * Math.log10(psd.rbwHz);
  for (let i = 0; i < dbcPerHz.length; i++) {
    dbcPerHz[i] = 10 * Math.log10(psd.psdPerHz[i]! / inChannelPower);
    dbcPerRbw[i] = dbcPerHz[i]! + rbwDb;
  }
  return { dbcPerHz, dbcPerRbw };
}

function mhz(hz: number): string {
  return (hz / 1e6).toFixed(2);
}
