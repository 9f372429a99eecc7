import { LEVEL_KEYS, LEVEL_PROBABILITIES, levelsFromHistogram, type LevelEstimate, type LevelKey } from '../metrics/ccdfLevels';
import { cubicMetricFromMoments, type CubicMetricOptions } from '../metrics/cubicMetric';
import { ofdmPaprAtProbabilityDb, VAN_NEE_ALPHA_OVERSAMPLED } from '../metrics/paprTheory';
import { powerLevelsFromStats } from '../metrics/powerLevels';
import { describeWaveform } from '../waveform/configDescription';
import type { MeasurementContext, SpectrumSummary } from './measurementContext';
import { runTotals, type RunStats } from './runStats';

/** Which PAPR definition fills `paprDb`. */
export type PaprMeanDefinition = 'run' | 'symbol';

/** Options that change only how counts are reported (so `merge` may choose them afresh). */
export interface ReportOptions {
  /** Default 'run': peak / expected mean power of the whole waveform. */
  readonly paprMean?: PaprMeanDefinition | undefined;
  readonly cubicMetric?: CubicMetricOptions | undefined;
  /** Full-scale amplitude for dBFS figures (sample units). */
  readonly fullScale?: number | undefined;
}

/** Level in dB per probability key; null where the run is too short. */
export type LevelMap = Record<LevelKey, number | null>;
/** 95 % interval [lower, upper] dB per probability key. */
export type IntervalMap = Record<LevelKey, readonly [number | null, number | null] | null>;

/** The result of `crestline measure` / `crestline merge`, as plain JSON. */
export interface MeasureReport {
  readonly configuration: string;
  readonly waveform: 'ofdm' | 'dft-s-ofdm';
  readonly symbols: number;
  readonly oversampling: number;
  readonly sampleRateHz: number;
  readonly runSeed: number;
  readonly blockSymbols: number;
  readonly numBlocks: number;
  readonly precision: 'f64' | 'f32';
  readonly paprDefinition: string;
  readonly paprDb: LevelMap;
  readonly paprCi95Db: IntervalMap;
  readonly paprRunMeanDefinition: string;
  readonly paprRunMeanDb: LevelMap;
  readonly paprRunMeanCi95Db: IntervalMap;
  readonly paprSymbolMeanDefinition: string;
  readonly paprSymbolMeanDb: LevelMap;
  readonly paprSymbolMeanCi95Db: IntervalMap;
  /** Largest per-symbol PAPR of the run, both definitions, dB (exact, not binned). */
  readonly maxPaprDb: { readonly runMean: number; readonly symbolMean: number };
  readonly ccdfDefinition: string;
  readonly ccdfDb: LevelMap;
  readonly ccdfCi95Db: IntervalMap;
  readonly theory: {
    readonly definition: string;
    readonly numSubcarriers: number;
    readonly nyquistDb: LevelMap;
    readonly oversampledDb: LevelMap;
  };
  readonly cubicMetricDb: number;
  readonly cubicMetricRawDb: number;
  readonly cubicMetricDefinition: string;
  readonly meanPowerDb: number;
  readonly peakPowerDb: number;
  readonly crestFactorDb: number;
  readonly meanPowerDbfs: number | null;
  readonly peakPowerDbfs: number | null;
  readonly fullScale: number | null;
  readonly expectedMeanPowerDb: number;
  readonly powerReference: string;
  readonly aclrDb: Record<string, number | null>;
  readonly aclrChannels: SpectrumSummary['aclr'];
  readonly aclrMethod: string | null;
  readonly occupiedBandwidthHz: number | null;
  readonly spectrum: Omit<SpectrumSummary, 'aclr' | 'warnings'> | null;
  readonly warnings: readonly string[];
  readonly notes: readonly string[];
}

const RUN_MEAN_DEFINITION =
  'peak |x|² of each OFDM symbol (useful part, cyclic prefix removed) / the exact expected mean power of the waveform (Σ data-subcarrier amplitude², from the plan)';
const SYMBOL_MEAN_DEFINITION = "peak |x|² of each OFDM symbol (useful part, cyclic prefix removed) / that symbol's own mean power";
const CCDF_DEFINITION =
  'instantaneous power |x|² of every useful-part sample / the exact expected mean power; intervals use an effective sample size of N data subcarriers per symbol';

/**
 * Builds the report of a finished run (or of merged shards) from its counts and context. Deterministic: the same
 * counts and context give the same report, whichever workers or shards produced them.
 */
export function buildMeasureReport(context: MeasurementContext, stats: RunStats, options: ReportOptions = {}): MeasureReport {
  const { identity, statistics: facts, spectrum } = context;
  const warnings: string[] = [...context.warnings];
  const totals = runTotals(stats);
  const numSamples = totals.numSymbols * facts.samplesPerSymbol;
  const paprMean = options.paprMean ?? 'run';

  const levelsOf = (estimates: { levels: LevelEstimate[]; warnings: string[] }) => {
    warnings.push(...estimates.warnings);
    return {
      levels: Object.fromEntries(estimates.levels.map((l) => [l.key, l.levelDb])) as LevelMap,
      intervals: Object.fromEntries(estimates.levels.map((l) => [l.key, l.ci95Db])) as IntervalMap,
    };
  };
  const runMean = levelsOf(levelsFromHistogram(stats.histograms.paprRunMean, { what: 'PAPR', unit: 'symbols' }));
  const symbolMean = levelsOf(levelsFromHistogram(stats.histograms.paprSymbolMean, { what: 'PAPR', unit: 'symbols' }));
  const ccdf = levelsOf(
    levelsFromHistogram(stats.histograms.power, {
      what: 'Power CCDF',
      unit: 'samples',
      trialsPerValue: Math.min(1, facts.numDataSubcarriers / facts.samplesPerSymbol),
    }),
  );
  const chosen = paprMean === 'run' ? runMean : symbolMean;

  const theoryLevels = (alpha: number): LevelMap =>
    Object.fromEntries(LEVEL_KEYS.map((k, i) => [k, round(ofdmPaprAtProbabilityDb(LEVEL_PROBABILITIES[i]!, facts.numDataSubcarriers, alpha), 2)])) as LevelMap;

  const cm = cubicMetricFromMoments(totals.sumPower, totals.sumPowerCubed, numSamples, options.cubicMetric ?? {});
  if (identity.oversampling < 2) warnings.push('Cubic metric at oversampling 1 is approximate; 2× or more is accurate (Kim, No, Shin, arXiv:1506.07054).');
  const levels = powerLevelsFromStats(totals.sumPower, totals.peakPower, numSamples, options.fullScale);
  const expectedMeanPowerDb = 10 * Math.log10(facts.expectedMeanPower);
  const offsetDb = levels.meanPowerDb - expectedMeanPowerDb;
  if (Math.abs(offsetDb) > 0.05) {
    warnings.push(`The measured mean power differs from the expected one by ${offsetDb.toFixed(3)} dB; the CCDF and run-mean PAPR use the expected mean.`);
  }

  const aclrDb: Record<string, number | null> = {};
  for (const c of spectrum?.aclr ?? []) aclrDb[c.key] = c.aclrDb === null ? null : round(c.aclrDb, 3);
  if (spectrum) warnings.push(...spectrum.warnings);
  const spectrumSettings = spectrum ? (({ aclr: _a, warnings: _w, ...rest }) => rest)(spectrum) : null;

  return {
    configuration: describeWaveform(context.identity.config),
    waveform: facts.waveform,
    symbols: totals.numSymbols,
    oversampling: identity.oversampling,
    sampleRateHz: facts.sampleRateHz,
    runSeed: identity.run.runSeed,
    blockSymbols: identity.run.blockSymbols,
    numBlocks: totals.numBlocks,
    precision: identity.precision,
    paprDefinition: paprMean === 'run' ? RUN_MEAN_DEFINITION : SYMBOL_MEAN_DEFINITION,
    paprDb: chosen.levels,
    paprCi95Db: chosen.intervals,
    paprRunMeanDefinition: RUN_MEAN_DEFINITION,
    paprRunMeanDb: runMean.levels,
    paprRunMeanCi95Db: runMean.intervals,
    paprSymbolMeanDefinition: SYMBOL_MEAN_DEFINITION,
    paprSymbolMeanDb: symbolMean.levels,
    paprSymbolMeanCi95Db: symbolMean.intervals,
    maxPaprDb: {
      runMean: 10 * Math.log10(totals.peakPower / facts.expectedMeanPower),
      symbolMean: 10 * Math.log10(totals.maxPaprSymbolMean),
    },
    ccdfDefinition: CCDF_DEFINITION,
    ccdfDb: ccdf.levels,
    ccdfCi95Db: ccdf.intervals,
    theory: {
      definition: `OFDM with N = ${facts.numDataSubcarriers} active subcarriers: P(PAPR > γ) = 1 − (1 − e^−γ)^(αN), α = 1 (Nyquist) and α = ${VAN_NEE_ALPHA_OVERSAMPLED} (oversampled / continuous time); van Nee & Prasad, OFDM for Wireless Multimedia Communications, 2000 (from memory — verify)${facts.waveform === 'dft-s-ofdm' ? '; shown for DFT-s-OFDM only as the OFDM reference' : ''}`,
      numSubcarriers: facts.numDataSubcarriers,
      nyquistDb: theoryLevels(1),
      oversampledDb: theoryLevels(VAN_NEE_ALPHA_OVERSAMPLED),
    },
    cubicMetricDb: round(cm.cubicMetricDb, 3),
    cubicMetricRawDb: round(cm.rawCubicMetricDb, 3),
    cubicMetricDefinition: `${cm.definition}; moments of the useful-part samples at oversampling ${identity.oversampling}`,
    meanPowerDb: round(levels.meanPowerDb, 3),
    peakPowerDb: round(levels.peakPowerDb, 3),
    crestFactorDb: round(levels.crestFactorDb, 3),
    meanPowerDbfs: levels.meanPowerDbfs === null ? null : round(levels.meanPowerDbfs, 3),
    peakPowerDbfs: levels.peakPowerDbfs === null ? null : round(levels.peakPowerDbfs, 3),
    fullScale: levels.fullScaleAmplitude,
    expectedMeanPowerDb: round(expectedMeanPowerDb, 3),
    powerReference:
      'dB re |x|² = 1 in the unscaled formula units of the generator (dBFS re the given full-scale magnitude); over the useful parts of the Monte-Carlo symbols, so the peak grows with the run length',
    aclrDb,
    aclrChannels: (spectrum?.aclr ?? []).map((c) => ({ ...c, aclrDb: c.aclrDb === null ? null : round(c.aclrDb, 3) })),
    aclrMethod: spectrum?.aclrMethod ?? null,
    occupiedBandwidthHz: spectrum ? Math.round(spectrum.occupiedBandwidthHz) : null,
    spectrum: spectrumSettings,
    warnings: dedupe(warnings),
    notes: context.notes,
  };
}

function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

function dedupe(lines: readonly string[]): string[] {
  return [...new Set(lines)];
}
