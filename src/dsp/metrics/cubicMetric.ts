import { DspError } from '../errors';

/**
 * Cubic metric (TS 25.101 §6.2.2; REFERENCE.md §5.3):
 *   CM = CEIL{ [20·log10(rms(v_norm³)) − 20·log10(rms(v_norm_ref³))] / k , 0.5 }
 * with v_norm the signal scaled to unit RMS amplitude. Since |v³| = |v|³, 20·log10(rms(v_norm³)) =
 * 10·log10( E|v|⁶ / (E|v|²)³ ) — the "raw CM", computed here from power moments so that it merges exactly.
 */

/** 20·log10(rms(v_norm_ref³)) of the 12.2 kbps AMR speech reference signal, dB (TS 25.101 §6.2.2; from memory — verify). */
export const CM_REFERENCE_RAW_DB = 1.52;
/** Slope for every signal other than WCDMA with only codes C_SF,N, N < SF/2 (TS 25.101 §6.2.2); LTE/DFT-s-OFDM studies use it unrounded (from memory — verify). */
export const CM_SLOPE_DEFAULT = 1.56;
/** Slope when every channelisation code C_SF,N used has N < SF/2 (TS 25.101 §6.2.2). */
export const CM_SLOPE_WCDMA_LOW_CODES = 1.85;

/** Constants of the cubic metric (defaults: k = 1.56, unrounded). */
export interface CubicMetricOptions {
  /** Empirical slope k (default CM_SLOPE_DEFAULT = 1.56). */
  readonly slope?: number;
  /** Round up to the next 0.5 dB as the TS 25.101 power-reduction rule does (default false: the unrounded LTE form). */
  readonly roundUpToHalfDb?: boolean;
}

/** A cubic metric with the raw value and the constants used. */
export interface CubicMetricResult {
  /** 10·log10(E|v|⁶/(E|v|²)³), dB: 0 for a constant envelope, 10·log10 6 ≈ 7.78 for a complex Gaussian. */
  readonly rawCubicMetricDb: number;
  /** (raw − 1.52)/k, rounded up to 0.5 dB when asked. */
  readonly cubicMetricDb: number;
  readonly slope: number;
  readonly rounded: boolean;
  /** How the value was computed, for reports. */
  readonly definition: string;
}

/**
 * Cubic metric from the power moments of a signal.
 * @param sumPower Σ|x[n]|²
 * @param sumPowerCubed Σ|x[n]|⁶
 * @param numSamples n ≥ 1
 */
export function cubicMetricFromMoments(
  sumPower: number,
  sumPowerCubed: number,
  numSamples: number,
  options: CubicMetricOptions = {},
): CubicMetricResult {
  const slope = options.slope ?? CM_SLOPE_DEFAULT;
  if (!(slope > 0)) throw new DspError('INVALID_CONFIG', `The cubic-metric slope k must be positive; got ${slope}.`);
  if (!(numSamples >= 1) || !(sumPower > 0)) {
    throw new DspError('INVALID_CONFIG', 'The cubic metric needs at least one sample of non-zero power.');
  }
  const meanPower = sumPower / numSamples;
  const rawCubicMetricDb = 10 * Math.log10(sumPowerCubed / numSamples / meanPower ** 3);
  const unrounded = (rawCubicMetricDb - CM_REFERENCE_RAW_DB) / slope;
  const rounded = options.roundUpToHalfDb ?? false;
  // The 1e-9 guard keeps an exact multiple of 0.5 dB from rounding up a step through floating-point noise.
  const cubicMetricDb = rounded ? Math.ceil(unrounded * 2 - 1e-9) / 2 : unrounded;
  const definition = `TS 25.101 §6.2.2: (20·log10 rms(v_norm³) − ${CM_REFERENCE_RAW_DB} dB) / ${slope}${rounded ? ', rounded up to 0.5 dB' : ', unrounded (LTE study form)'}`;
  return { rawCubicMetricDb, cubicMetricDb, slope, rounded, definition };
}

/**
 * Cubic metric of a complex baseband signal held in memory.
 * @param signalIq interleaved samples (2 values per sample); use ≥ 2× oversampled data (Kim, No, Shin,
 *   arXiv:1506.07054: 1.7× suffices)
 */
export function computeCubicMetric(signalIq: Float64Array, options: CubicMetricOptions = {}): CubicMetricResult {
  let sumPower = 0;
  let sumPowerCubed = 0;
  for (let i = 0; i < signalIq.length; i += 2) {
    const p = signalIq[i]! * signalIq[i]! + signalIq[i + 1]! * signalIq[i + 1]!;
    sumPower += p;
    sumPowerCubed += p * p * p;
  }
  return cubicMetricFromMoments(sumPower, sumPowerCubed, signalIq.length / 2, options);
}
