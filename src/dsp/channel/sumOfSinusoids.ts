import { assertWholeSamples, DspError } from '../errors';
import type { Rng } from '../data/rng';

/**
 * Rayleigh fading by the statistical sum-of-sinusoids model of C. Xiao, Y. R. Zheng and N. C. Beaulieu, "Novel
 * sum-of-sinusoids simulation models for Rayleigh and Rician fading channels", IEEE Trans. Wireless Commun. 5(12),
 * 3667–3679, Dec. 2006 [S2 for title and venue] (the Rayleigh model of Zheng & Xiao's line of work):
 *   g(t) = (1/√N) Σ_{n=1}^{N} exp(j(2π f_D t cos α_n + φ_n)),   α_n = (2πn + θ_n)/N,
 * θ_n and φ_n independent and uniform on [−π, π) (equations from memory — verify; the normalisation here gives E|g|² = 1).
 * Because each α_n is uniform over its own 2π/N arc, the arcs tile the circle and the ensemble autocorrelation is
 * exactly E[g(t+τ)g*(t)] = J0(2π f_D τ) (Clarke/Jakes) for any N; every component lies inside |f| ≤ f_D.
 */
export interface SosFading {
  readonly dopplerHz: number;
  /** cos α_n, one per sinusoid. */
  readonly cosAlpha: Float64Array;
  /** φ_n, rad. */
  readonly phaseRad: Float64Array;
}

/** Draws one fading process (θ_n, φ_n) from `rng`. */
export function createSosFading(dopplerHz: number, numSinusoids: number, rng: Rng): SosFading {
  if (!(dopplerHz >= 0) || !Number.isFinite(dopplerHz)) {
    throw new DspError('INVALID_CONFIG', `Doppler frequency ${dopplerHz} Hz must be a finite number ≥ 0.`);
  }
  if (!Number.isInteger(numSinusoids) || numSinusoids < 1) {
    throw new DspError('INVALID_CONFIG', `Number of sinusoids ${numSinusoids} must be a whole number ≥ 1.`);
  }
  const cosAlpha = new Float64Array(numSinusoids);
  const phaseRad = new Float64Array(numSinusoids);
  for (let n = 1; n <= numSinusoids; n++) {
    const theta = Math.PI * (2 * rng.nextFloat() - 1);
    cosAlpha[n - 1] = Math.cos((2 * Math.PI * n + theta) / numSinusoids);
    phaseRad[n - 1] = Math.PI * (2 * rng.nextFloat() - 1);
  }
  return { dopplerHz, cosAlpha, phaseRad };
}

/**
 * Fills g(t_0 + i/f_s), i = 0…M−1. Each sinusoid advances by a phasor recursion, re-seeded exactly every 1024
 * samples so rounding does not accumulate.
 * @param outIq 2M values
 */
export function fillSosFading(fading: SosFading, startTimeS: number, sampleRateHz: number, outIq: Float64Array): Float64Array {
  assertWholeSamples(outIq, 'fillSosFading outIq');
  const numSamples = outIq.length / 2;
  outIq.fill(0);
  const scale = 1 / Math.sqrt(fading.cosAlpha.length);
  for (let n = 0; n < fading.cosAlpha.length; n++) {
    const omega = 2 * Math.PI * fading.dopplerHz * fading.cosAlpha[n]!;
    const stepRe = Math.cos(omega / sampleRateHz);
    const stepIm = Math.sin(omega / sampleRateHz);
    let re = 0;
    let im = 0;
    for (let i = 0; i < numSamples; i++) {
      if ((i & 1023) === 0) {
        const angle = omega * (startTimeS + i / sampleRateHz) + fading.phaseRad[n]!;
        re = Math.cos(angle);
        im = Math.sin(angle);
      }
      outIq[2 * i] = outIq[2 * i]! + scale * re;
      outIq[2 * i + 1] = outIq[2 * i + 1]! + scale * im;
      const nextRe = re * stepRe - im * stepIm;
      im = re * stepIm + im * stepRe;
      re = nextRe;
    }
  }
  return outIq;
}
