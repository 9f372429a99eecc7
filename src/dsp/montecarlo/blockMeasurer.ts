import { createDbHistogram, PAPR_HISTOGRAM_SPEC, POWER_HISTOGRAM_SPEC, type DbHistogram } from '../metrics/dbHistogram';
import { binIndexOfPower, bitsViewOf, createPowerBinner, type PowerBinner } from '../metrics/powerBinner';
import type { PowerSource } from '../stats/powerSource';
import { blockSeedOf, blockSymbolCount, type MonteCarloRun } from './runPlan';
import { accumulateSymbolF32, accumulateSymbolF64, createSubHistograms, foldSubHistograms, type SymbolSums } from './symbolKernels';

/**
 * The three histograms of a run:
 * - paprRunMean: per OFDM symbol, peak |x|² of the useful part / the plan's exact expected mean power;
 * - paprSymbolMean: per OFDM symbol, peak / that symbol's own mean power;
 * - power: every useful-part sample's |x|² / the expected mean power (the instantaneous-power CCDF).
 */
export interface HistogramSet {
  readonly paprRunMean: DbHistogram;
  readonly paprSymbolMean: DbHistogram;
  readonly power: DbHistogram;
}

/** Per-block sums; kept per block so that totals are summed in block order, identical however blocks were spread. */
export interface BlockRecord {
  readonly blockIndex: number;
  readonly numSymbols: number;
  /** Σ|x|² over the block's useful-part samples, summed symbol by symbol. */
  readonly sumPower: number;
  /** Σ|x|⁶ (for the cubic metric). */
  readonly sumPowerCubed: number;
  /** max |x|². */
  readonly peakPower: number;
  /** Largest per-symbol peak / symbol mean (linear), exact. */
  readonly maxPaprSymbolMean: number;
}

/** Three empty histograms over the fixed PAPR and power ranges. */
export function createHistogramSet(): HistogramSet {
  return {
    paprRunMean: createDbHistogram(PAPR_HISTOGRAM_SPEC),
    paprSymbolMean: createDbHistogram(PAPR_HISTOGRAM_SPEC),
    power: createDbHistogram(POWER_HISTOGRAM_SPEC),
  };
}

/** Measures blocks of a run into its own histograms (one per worker lane). */
export interface BlockMeasurer {
  readonly histograms: HistogramSet;
  measureBlock(blockIndex: number): BlockRecord;
}

/**
 * Symbols whose powers are held at once: bounds memory (32 × 8192 doubles = 2 MiB at LTE 20 MHz, 4×). Each chunk
 * restarts the block's bit stream and skips to its first symbol, so fewer, longer chunks skip less.
 */
const CHUNK_SYMBOLS = 32;

/**
 * Creates a measurer that draws block data from `source` and adds every symbol to its histograms.
 * @param source power source of the waveform plan at the measurement oversampling
 * @param precision 'f32' hands the source a Float32Array (its fast path), otherwise a Float64Array
 */
export function createBlockMeasurer(source: PowerSource, run: MonteCarloRun, precision: 'f64' | 'f32' = 'f64'): BlockMeasurer {
  const histograms = createHistogramSet();
  const n = source.samplesPerSymbol;
  const mean = source.expectedMeanPower;
  const powerBinner = createPowerBinner(POWER_HISTOGRAM_SPEC, mean);
  const paprRunBinner = createPowerBinner(PAPR_HISTOGRAM_SPEC, mean);
  const ratioBinner = createPowerBinner(PAPR_HISTOGRAM_SPEC, 1);
  const chunk = Math.min(CHUNK_SYMBOLS, run.blockSymbols);
  const powers = precision === 'f32' ? new Float32Array(chunk * n) : new Float64Array(chunk * n);
  const bits = bitsViewOf(powers);
  const sums: SymbolSums = { sum: 0, sumCubed: 0, peak: 0 };
  const sub = createSubHistograms(histograms.power.counts.length);
  return {
    histograms,
    measureBlock(blockIndex) {
      const numSymbols = blockSymbolCount(run, blockIndex);
      const seed = blockSeedOf(run, blockIndex);
      let sumPower = 0;
      let sumPowerCubed = 0;
      let peakPower = 0;
      let maxPaprSymbolMean = 0;
      for (let first = 0; first < numSymbols; first += chunk) {
        const count = Math.min(chunk, numSymbols - first);
        const view = powers.subarray(0, count * n);
        source.fillSymbolPowers(seed, first, count, view);
        for (let s = 0; s < count; s++) {
          const stats =
            powers instanceof Float64Array
              ? accumulateSymbolF64(powers, bits, s * n, n, powerBinner, sub, sums)
              : accumulateSymbolF32(powers, bits, s * n, n, powerBinner, sub, sums);
          sumPower += stats.sum;
          sumPowerCubed += stats.sumCubed;
          if (stats.peak > peakPower) peakPower = stats.peak;
          addOne(histograms.paprRunMean, paprRunBinner, stats.peak);
          const ratio = stats.sum > 0 ? (stats.peak * n) / stats.sum : 1;
          if (ratio > maxPaprSymbolMean) maxPaprSymbolMean = ratio;
          addOne(histograms.paprSymbolMean, ratioBinner, ratio);
        }
        // A chunk counts at most 32 × 2^20 samples, far below the sub-histograms' 2^32.
        foldSubHistograms(sub, histograms.power.counts);
      }
      return { blockIndex, numSymbols, sumPower, sumPowerCubed, peakPower, maxPaprSymbolMean };
    },
  };
}

function addOne(histogram: DbHistogram, binner: PowerBinner, value: number): void {
  histogram.counts[binIndexOfPower(binner, value)]!++;
}
