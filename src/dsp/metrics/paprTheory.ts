import { DspError } from '../errors';

/**
 * Oversampling factor of the van Nee & Prasad approximation for the continuous-time (or ≥ 4× oversampled) OFDM
 * signal: treat it as αN independent samples, α ≈ 2.8 (R. van Nee, R. Prasad, "OFDM for Wireless Multimedia
 * Communications", Artech House, 2000, ch. 6; from memory — verify). An empirical fit, good for N ≳ 64.
 */
export const VAN_NEE_ALPHA_OVERSAMPLED = 2.8;

/**
 * Theoretical per-symbol PAPR CCDF of OFDM with N subcarriers (van Nee & Prasad 2000, from memory — verify):
 *   P(PAPR > γ) ≈ 1 − (1 − e^−γ)^(αN),  γ linear, power normalised to the expected mean power.
 * α = 1 models Nyquist sampling (N independent complex-Gaussian samples); α = VAN_NEE_ALPHA_OVERSAMPLED models the
 * continuous-time peak. Evaluated as −expm1(αN·log1p(−e^−γ)) so that small probabilities keep their precision.
 * @param paprDb threshold γ in dB
 * @param numSubcarriers N, active subcarriers
 * @param alpha α (default 1)
 */
export function ofdmPaprCcdfTheory(paprDb: number, numSubcarriers: number, alpha = 1): number {
  checkN(numSubcarriers, alpha);
  const gamma = 10 ** (paprDb / 10);
  return -Math.expm1(alpha * numSubcarriers * Math.log1p(-Math.exp(-gamma)));
}

/**
 * Inverse of `ofdmPaprCcdfTheory`: the PAPR in dB exceeded with probability p,
 *   γ = −ln(1 − (1 − p)^(1/(αN))).
 * @param probability p in (0, 1)
 */
export function ofdmPaprAtProbabilityDb(probability: number, numSubcarriers: number, alpha = 1): number {
  checkN(numSubcarriers, alpha);
  if (!(probability > 0 && probability < 1)) {
    throw new DspError('INVALID_CONFIG', `A CCDF probability must lie strictly between 0 and 1; got ${probability}.`);
  }
  const gamma = -Math.log(-Math.expm1(Math.log1p(-probability) / (alpha * numSubcarriers)));
  return 10 * Math.log10(gamma);
}

/**
 * CCDF of the instantaneous power of a complex Gaussian signal relative to its mean (large-N OFDM):
 * |x|²/σ² is exponential, so P(|x|²/σ² > γ) = e^−γ (common practice; e.g. van Nee & Prasad 2000 ch. 6).
 */
export function gaussianPowerCcdf(thresholdDb: number): number {
  return Math.exp(-(10 ** (thresholdDb / 10)));
}

/** Inverse of `gaussianPowerCcdf`: 10·log10(−ln p) dB. */
export function gaussianPowerAtProbabilityDb(probability: number): number {
  return 10 * Math.log10(-Math.log(probability));
}

function checkN(numSubcarriers: number, alpha: number): void {
  if (!(numSubcarriers >= 1) || !(alpha > 0)) {
    throw new DspError('INVALID_CONFIG', `The OFDM PAPR theory needs N ≥ 1 subcarriers and α > 0; got N = ${numSubcarriers}, α = ${alpha}.`);
  }
}
