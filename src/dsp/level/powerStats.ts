/**
 * Streaming power statistics of a complex record: mean and peak power, largest component, and a histogram of
 * instantaneous power |x[n]|² in 0.01 dB bins from which the power CCDF is read. One accumulator serves a record held
 * in memory and one streamed in chunks, so both give the same numbers.
 *
 * CCDF(γ) = P(|x|²/mean > γ) over all samples of the record (the whole-record mean, not a per-symbol one) — the
 * empirical form of the CCDF in van Nee & Prasad, OFDM for Wireless Multimedia Communications, 2000, ch. 6 (common
 * practice: reported in dB above the mean power).
 */
import { log10 } from '../math/expLog';
export interface PowerStats {
  numSamples: number;
  sumPower: number;
  maxPower: number;
  maxComponentAbs: number;
  /** Samples with |x|² = 0 (below the histogram). */
  zeroCount: number;
  /** counts[b]: samples with 10·log10|x|² in [MIN_DB + b·STEP, MIN_DB + (b + 1)·STEP). */
  readonly counts: Float64Array;
}

/** Histogram resolution, dB. */
export const POWER_HISTOGRAM_STEP_DB = 0.01;
/** Histogram range of absolute power 10·log10|x|², dB (values outside are clamped to the end bins). */
export const POWER_HISTOGRAM_MIN_DB = -300;
/** Upper end of that range, dB. */
export const POWER_HISTOGRAM_MAX_DB = 200;
const NUM_BINS = Math.round((POWER_HISTOGRAM_MAX_DB - POWER_HISTOGRAM_MIN_DB) / POWER_HISTOGRAM_STEP_DB);

/** An empty accumulator (the histogram is 50 000 bins of 0.01 dB). */
export function createPowerStats(): PowerStats {
  return { numSamples: 0, sumPower: 0, maxPower: 0, maxComponentAbs: 0, zeroCount: 0, counts: new Float64Array(NUM_BINS) };
}

/**
 * Adds the samples of `iq` (interleaved, 2N values) to `stats`.
 * @returns stats
 */
export function accumulatePowerStats(stats: PowerStats, iq: Float64Array): PowerStats {
  const counts = stats.counts;
  let sum = 0;
  let maxPower = stats.maxPower;
  let maxComp = stats.maxComponentAbs;
  let zeros = 0;
  const scale = 1 / POWER_HISTOGRAM_STEP_DB;
  for (let i = 0; i < iq.length; i += 2) {
    const re = iq[i]!;
    const im = iq[i + 1]!;
    const p = re * re + im * im;
    sum += p;
    if (p > maxPower) maxPower = p;
    const a = Math.abs(re) > Math.abs(im) ? Math.abs(re) : Math.abs(im);
    if (a > maxComp) maxComp = a;
    if (p > 0) {
      let b = Math.floor((10 * log10(p) - POWER_HISTOGRAM_MIN_DB) * scale);
      if (b < 0) b = 0;
      else if (b >= NUM_BINS) b = NUM_BINS - 1;
      counts[b]!++;
    } else {
      zeros++;
    }
  }
  stats.numSamples += iq.length / 2;
  stats.sumPower += sum;
  stats.maxPower = maxPower;
  stats.maxComponentAbs = maxComp;
  stats.zeroCount += zeros;
  return stats;
}

/** One point of the CCDF: the power level, dB above the mean, exceeded by at most `probability` of the samples. */
export interface CcdfPoint {
  readonly probability: number;
  readonly levelDb: number;
  /** False when probability·N < 10 samples: the level is then close to the record's peak and not a stable estimate. */
  readonly reliable: boolean;
}

/** What a record's level looks like, in dB relative to power 1 (dBFS once the record is scaled to full scale 1). */
export interface PowerSummary {
  readonly numSamples: number;
  readonly meanPower: number;
  readonly rmsDb: number;
  readonly peakPower: number;
  readonly peakDb: number;
  /** Peak-to-average power ratio of the whole record, dB. */
  readonly crestFactorDb: number;
  readonly maxComponentAbs: number;
  /** 20·log10 of the largest |I| or |Q|. */
  readonly peakComponentDb: number;
  readonly ccdf: readonly CcdfPoint[];
}

/** Probabilities reported by `summarisePowerStats`. */
export const CCDF_PROBABILITIES = [1e-1, 1e-2, 1e-3, 1e-4, 1e-5, 1e-6] as const;

/**
 * Mean, peak, crest factor and CCDF points of the accumulated record.
 * @param probabilities CCDF probabilities to report (default 1e-1 … 1e-6)
 */
export function summarisePowerStats(stats: PowerStats, probabilities: readonly number[] = CCDF_PROBABILITIES): PowerSummary {
  const mean = stats.numSamples > 0 ? stats.sumPower / stats.numSamples : 0;
  const rmsDb = 10 * log10(mean);
  const peakDb = 10 * log10(stats.maxPower);
  return {
    numSamples: stats.numSamples,
    meanPower: mean,
    rmsDb,
    peakPower: stats.maxPower,
    peakDb,
    crestFactorDb: peakDb - rmsDb,
    maxComponentAbs: stats.maxComponentAbs,
    peakComponentDb: 20 * log10(stats.maxComponentAbs),
    ccdf: probabilities.map((p) => ccdfPoint(stats, p)),
  };
}

/**
 * The power level, dB above the record's mean power, that at most `probability` of the samples exceed: the upper edge of
 * the histogram bin where the count from the top first passes probability·N (so at most 0.01 dB above the exact
 * order statistic), never above the record's peak.
 */
export function ccdfPoint(stats: PowerStats, probability: number): CcdfPoint {
  const n = stats.numSamples;
  const allowed = probability * n;
  const meanDb = 10 * log10(stats.sumPower / n);
  const peakDb = 10 * log10(stats.maxPower);
  const counts = stats.counts;
  let above = 0;
  let levelDb = peakDb;
  for (let b = counts.length - 1; b >= 0; b--) {
    above += counts[b]!;
    if (above > allowed) {
      levelDb = Math.min(peakDb, POWER_HISTOGRAM_MIN_DB + (b + 1) * POWER_HISTOGRAM_STEP_DB);
      break;
    }
  }
  return { probability, levelDb: levelDb - meanDb, reliable: allowed >= 10 };
}
