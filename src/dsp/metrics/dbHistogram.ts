import { DspError } from '../errors';

/** Width of every histogram bin, dB. Fixed so that histograms from any run, worker or machine add bin by bin. */
export const BIN_WIDTH_DB = 0.01;

/**
 * A histogram of values in dB with fixed 0.01 dB bins and integer counts.
 *
 * Regular bin c (c = minCentiDb … maxCentiDb) is centred on c·0.01 dB and covers [(c − ½)·0.01, (c + ½)·0.01) dB, so a
 * level read from it is the exact value rounded to the 0.01 dB grid. `counts` holds numBins + 2 entries:
 * counts[0] = values below the first bin (including zero power), counts[1 + i] = regular bin i (centre
 * (minCentiDb + i)·0.01 dB), counts[numBins + 1] = values at or above the last bin.
 *
 * Counts are whole numbers stored in a Float64Array: exact up to 2^53 and added exactly, in any order, so merged
 * histograms are bit-identical however the samples were split.
 */
export interface DbHistogram {
  /** Centre of the first regular bin in hundredths of a dB (e.g. −1000 for −10.00 dB). */
  readonly minCentiDb: number;
  /** Centre of the last regular bin in hundredths of a dB. */
  readonly maxCentiDb: number;
  /** maxCentiDb − minCentiDb + 1. */
  readonly numBins: number;
  /** numBins + 2 whole-number counts: underflow, regular bins, overflow. */
  readonly counts: Float64Array;
}

/** The range of a histogram, in hundredths of a dB (plain data; crosses to workers and into shard files). */
export interface DbHistogramSpec {
  readonly minCentiDb: number;
  readonly maxCentiDb: number;
}

/** Histogram range for per-symbol PAPR: −10.00 … +30.00 dB (peak/run-mean can fall below 0 dB for a quiet symbol). */
export const PAPR_HISTOGRAM_SPEC: DbHistogramSpec = { minCentiDb: -1000, maxCentiDb: 3000 };
/** Histogram range for instantaneous power relative to the mean: −30.00 … +30.00 dB. */
export const POWER_HISTOGRAM_SPEC: DbHistogramSpec = { minCentiDb: -3000, maxCentiDb: 3000 };

/** Creates an empty histogram over `spec`. @throws DspError INTERNAL for a range that is not whole hundredths, or reversed */
export function createDbHistogram(spec: DbHistogramSpec): DbHistogram {
  const { minCentiDb, maxCentiDb } = spec;
  if (!Number.isInteger(minCentiDb) || !Number.isInteger(maxCentiDb) || maxCentiDb < minCentiDb || maxCentiDb - minCentiDb > 200000) {
    throw new DspError('INTERNAL', `Histogram range ${minCentiDb}…${maxCentiDb} (hundredths of a dB) must be whole, ascending and at most 2000 dB wide.`);
  }
  const numBins = maxCentiDb - minCentiDb + 1;
  return { minCentiDb, maxCentiDb, numBins, counts: new Float64Array(numBins + 2) };
}

/** Centre in dB of counts[index] (index 1…numBins); the underflow and overflow entries have no centre (NaN). */
export function binCentreDb(histogram: DbHistogram, index: number): number {
  if (index < 1 || index > histogram.numBins) return Number.NaN;
  return (histogram.minCentiDb + index - 1) / 100;
}

/** Lower edge in dB of counts[index]: −∞ for the underflow entry, (centre − 0.005) dB otherwise. */
export function binLowerEdgeDb(histogram: DbHistogram, index: number): number {
  if (index <= 0) return Number.NEGATIVE_INFINITY;
  return (2 * (histogram.minCentiDb + index - 1) - 1) / 200;
}

/** Whole count of values in the histogram. */
export function histogramTotal(histogram: DbHistogram): number {
  let total = 0;
  for (let i = 0; i < histogram.counts.length; i++) total += histogram.counts[i]!;
  return total;
}

/** True when both histograms cover the same bins. */
export function sameHistogramRange(a: DbHistogramSpec, b: DbHistogramSpec): boolean {
  return a.minCentiDb === b.minCentiDb && a.maxCentiDb === b.maxCentiDb;
}

/**
 * Adds `from` into `into` bin by bin (exact: whole numbers below 2^53).
 * @throws DspError INTERNAL when the ranges differ
 */
export function addDbHistogram(into: DbHistogram, from: DbHistogram): DbHistogram {
  if (!sameHistogramRange(into, from)) {
    throw new DspError(
      'INTERNAL',
      `Cannot add histograms over different ranges (${from.minCentiDb}…${from.maxCentiDb} into ${into.minCentiDb}…${into.maxCentiDb} hundredths of a dB).`,
    );
  }
  const a = into.counts;
  const b = from.counts;
  for (let i = 0; i < a.length; i++) a[i] = a[i]! + b[i]!;
  return into;
}

/** A deep copy. */
export function cloneDbHistogram(histogram: DbHistogram): DbHistogram {
  return { ...histogram, counts: histogram.counts.slice() };
}
