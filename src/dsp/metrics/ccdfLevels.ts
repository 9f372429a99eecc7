import { binCentreDb, binLowerEdgeDb, histogramTotal, type DbHistogram } from './dbHistogram';
import { wilsonInterval, Z_95 } from './confidence';

/** The probabilities at which levels are reported, and their JSON keys. */
export const LEVEL_PROBABILITIES = [1e-1, 1e-2, 1e-3, 1e-4, 1e-5] as const;
/** JSON keys of LEVEL_PROBABILITIES. */
export const LEVEL_KEYS = ['1e-1', '1e-2', '1e-3', '1e-4', '1e-5'] as const;
/** One of LEVEL_KEYS. */
export type LevelKey = (typeof LEVEL_KEYS)[number];

/**
 * Fewer expected values beyond a probability than this and its level is not reported (null): about ten exceedances
 * are needed before the level is more than a guess (common practice: 10⁻⁴ needs ≳ 10⁵ symbols).
 */
export const MIN_EXPECTED_EXCEEDANCES = 10;

/** A CCDF level with its 95 % confidence interval; null where the run cannot say. */
export interface LevelEstimate {
  readonly key: LevelKey;
  readonly probability: number;
  /** Value in dB (0.01 dB grid) that the empirical CCDF crosses at `probability`; null when too few values. */
  readonly levelDb: number | null;
  /** 95 % interval of the level, [lower, upper] dB; a side is null when it falls outside the histogram. */
  readonly ci95Db: readonly [number | null, number | null] | null;
}

/** How `levelsFromHistogram` names and counts the values. */
export interface LevelOptions {
  /** Names the statistic in warnings, e.g. "PAPR (peak / run mean)". */
  readonly what: string;
  /** Unit of the counted values in warnings: "symbols" or "samples". */
  readonly unit: string;
  /**
   * Independent trials per counted value (default 1). Samples of one oversampled symbol are correlated; pass
   * (degrees of freedom per symbol) / (samples per symbol) so the interval uses an effective sample size.
   */
  readonly trialsPerValue?: number;
}

/**
 * Levels of the complementary CDF P(X > x) of the values in `histogram` at `probabilities`, each with a 95 % interval.
 *
 * Method: with n values and k_c the number in bins above bin c, the level is the centre of the first bin c at which
 * k_c/n ≤ p (the empirical quantile rounded to the 0.01 dB grid). The interval inverts pointwise 95 % Wilson intervals
 * of the exceedance probability: its lower end is the first bin whose Wilson lower bound is ≤ p, its upper end the
 * first bin whose Wilson upper bound is ≤ p (the thresholds at which the interval still contains p).
 * A level is null, with a warning, when n·p < MIN_EXPECTED_EXCEEDANCES or when it falls outside the histogram.
 */
export function levelsFromHistogram(
  histogram: DbHistogram,
  options: LevelOptions,
  probabilities: readonly number[] = LEVEL_PROBABILITIES,
): { levels: LevelEstimate[]; warnings: string[] } {
  const warnings: string[] = [];
  const total = histogramTotal(histogram);
  const scale = options.trialsPerValue ?? 1;
  const trials = total * scale;
  const counts = histogram.counts;
  // above[j] = values in bins strictly above counts[j].
  const above = new Float64Array(counts.length);
  for (let j = counts.length - 2; j >= 0; j--) above[j] = above[j + 1]! + counts[j + 1]!;
  const firstBin = (test: (k: number) => boolean): number => {
    for (let j = 0; j < counts.length; j++) if (test(above[j]! * scale)) return j;
    return counts.length - 1;
  };
  const centreOrNull = (j: number): number | null => (j >= 1 && j <= histogram.numBins ? binCentreDb(histogram, j) : null);
  const tooShort: { key: string; needed: number }[] = [];
  const levels = probabilities.map((p): LevelEstimate => {
    const key = probabilityKey(p) as LevelKey;
    if (trials * p < MIN_EXPECTED_EXCEEDANCES) {
      tooShort.push({ key, needed: Math.ceil(MIN_EXPECTED_EXCEEDANCES / (p * scale)) });
      return { key, probability: p, levelDb: null, ci95Db: null };
    }
    const j = firstBin((k) => k <= p * trials);
    const lower = firstBin((k) => wilsonInterval(k, trials, Z_95).lower <= p);
    const upper = firstBin((k) => wilsonInterval(k, trials, Z_95).upper <= p);
    const levelDb = centreOrNull(j);
    if (levelDb === null) {
      const where = j === 0 ? 'below' : 'above';
      warnings.push(`${options.what} at ${key} lies ${where} the histogram range; reported as null.`);
      return { key, probability: p, levelDb: null, ci95Db: null };
    }
    return { key, probability: p, levelDb, ci95Db: [centreOrNull(lower), centreOrNull(upper)] };
  });
  if (tooShort.length > 0) {
    const plural = tooShort.length > 1;
    warnings.unshift(
      `${options.what} at ${tooShort.map((t) => t.key).join(', ')}: the run has ${total} ${options.unit}, fewer than the ${tooShort.map((t) => t.needed).join(', ')} needed for about ${MIN_EXPECTED_EXCEEDANCES} values beyond ${plural ? 'each probability' : 'that probability'}, so ${plural ? 'these levels are' : 'this level is'} reported as null. Run more symbols.`,
    );
  }
  return { levels, warnings };
}

/** JSON key of a probability: "1e-3" for the standard ones, the number's shortest form otherwise ("0.05"). */
export function probabilityKey(probability: number): string {
  const i = LEVEL_PROBABILITIES.indexOf(probability as (typeof LEVEL_PROBABILITIES)[number]);
  return i >= 0 ? LEVEL_KEYS[i]! : String(probability);
}

/** A CCDF curve for plotting: P(X ≥ threshold) at each bin's lower edge, trimmed to where it leaves 1 and reaches 0. */
export interface CcdfCurve {
  readonly thresholdDb: Float64Array;
  readonly probability: Float64Array;
}

/** The empirical CCDF of `histogram` at the lower edge of every regular bin and of the overflow bin. */
export function ccdfCurve(histogram: DbHistogram): CcdfCurve {
  const total = histogramTotal(histogram);
  const counts = histogram.counts;
  const atOrAbove = new Float64Array(counts.length);
  let running = 0;
  for (let j = counts.length - 1; j >= 1; j--) {
    running += counts[j]!;
    atOrAbove[j] = running;
  }
  let first = 1;
  while (first < counts.length - 1 && atOrAbove[first + 1] === total) first++;
  let last = counts.length - 1;
  while (last > first && atOrAbove[last - 1] === 0) last--;
  const size = Math.max(0, last - first + 1);
  const thresholdDb = new Float64Array(size);
  const probability = new Float64Array(size);
  for (let i = 0; i < size; i++) {
    thresholdDb[i] = binLowerEdgeDb(histogram, first + i);
    probability[i] = total > 0 ? atOrAbove[first + i]! / total : 0;
  }
  return { thresholdDb, probability };
}
