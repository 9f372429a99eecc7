import type { Rng } from '../data/rng';
import { assertLength, DspError } from '../errors';
import { createFftPlan, ifftRaw } from '../fft/fftPlan';
import { log10, pow } from '../math/expLog';
import { cos, sin } from '../math/trig';

/** One point of a single-sideband phase-noise mask L(f). */
export interface PhaseNoiseMaskPoint {
  /** Offset from the carrier, Hz (> 0). */
  readonly offsetHz: number;
  /** L(f), dBc/Hz. */
  readonly levelDbcPerHz: number;
}

/**
 * Wiener (random-walk) phase noise of a free-running oscillator with 3 dB (full) linewidth Δν:
 * φ[0] = 0, φ[n] = φ[n−1] + w[n], w ~ N(0, 2π·Δν/f_s). This is the Lorentzian-spectrum model used by
 * T. Pollet, M. Van Bladel & M. Moeneclaey, "BER sensitivity of OFDM systems to carrier frequency offset and
 * Wiener phase noise", IEEE Trans. Commun. 43(2/3/4):191–193, 1995 (from memory — verify).
 * @param outRad N values, radians
 */
export function generateWienerPhaseNoise(linewidthHz: number, sampleRateHz: number, rng: Rng, outRad: Float64Array): Float64Array {
  if (!(linewidthHz >= 0) || !Number.isFinite(linewidthHz)) {
    throw new DspError('INVALID_CONFIG', `impairments.phaseNoise.linewidthHz must be ≥ 0 Hz; got ${linewidthHz}.`, { field: 'impairments.phaseNoise.linewidthHz' });
  }
  const sigma = Math.sqrt((2 * Math.PI * linewidthHz) / sampleRateHz);
  let phi = 0;
  for (let n = 0; n < outRad.length; n++) {
    if (n > 0) phi += sigma * rng.nextGaussian();
    outRad[n] = phi;
  }
  return outRad;
}

/**
 * Interpolates a mask at `offsetHz`: straight lines in dB against log10(f) between points (common practice);
 * the first level holds below the first offset, the last above the last offset.
 */
export function maskLevelDbcPerHz(mask: readonly PhaseNoiseMaskPoint[], offsetHz: number): number {
  const first = mask[0]!;
  const last = mask[mask.length - 1]!;
  if (offsetHz <= first.offsetHz) return first.levelDbcPerHz;
  if (offsetHz >= last.offsetHz) return last.levelDbcPerHz;
  let k = 0;
  while (mask[k + 1]!.offsetHz < offsetHz) k++;
  const a = mask[k]!;
  const b = mask[k + 1]!;
  const t = log10(offsetHz / a.offsetHz) / log10(b.offsetHz / a.offsetHz);
  return a.levelDbcPerHz + t * (b.levelDbcPerHz - a.levelDbcPerHz);
}

/** Checks a mask: ≥ 2 points, offsets positive and strictly increasing, levels finite. */
export function validatePhaseNoiseMask(mask: readonly PhaseNoiseMaskPoint[]): void {
  if (mask.length < 2) throw new DspError('INVALID_CONFIG', `impairments.phaseNoise.mask needs at least 2 points; got ${mask.length}.`, { field: 'impairments.phaseNoise.mask' });
  mask.forEach((p, i) => {
    if (!(p.offsetHz > 0) || !Number.isFinite(p.levelDbcPerHz) || (i > 0 && !(p.offsetHz > mask[i - 1]!.offsetHz))) {
      throw new DspError(
        'INVALID_CONFIG',
        `impairments.phaseNoise.mask[${i}]: offsets must be positive and strictly increasing and levels finite; got offset ${p.offsetHz} Hz, level ${p.levelDbcPerHz} dBc/Hz.`,
        { field: `impairments.phaseNoise.mask.${i}` },
      );
    }
  });
}

/**
 * Gaussian phase noise with a given mask, synthesised in the frequency domain over the record (periodic, like every
 * block here). The two-sided PSD of φ is S(f) = L(|f|) in rad²/Hz (small-angle, IEEE Std 1139: L(f) = S_φ(f)/2
 * with S_φ one-sided), so var φ = ∫ L(|f|) df. With X[k] = √(L(|f_k|)·f_s/N)·w_k, w_k ~ CN(0, 1), and DC left out,
 * φ[n] = √2·Re{Σ_k X[k] e^{j2πkn/N}} has exactly that PSD on the FFT grid (common practice).
 * @param outRad N values, radians
 */
export function generateMaskPhaseNoise(
  mask: readonly PhaseNoiseMaskPoint[],
  sampleRateHz: number,
  rng: Rng,
  outRad: Float64Array,
): Float64Array {
  validatePhaseNoiseMask(mask);
  const n = outRad.length;
  const plan = createFftPlan(n);
  const spectrumIq = new Float64Array(2 * n);
  for (let k = 1; k < n; k++) {
    const fHz = (k <= n / 2 ? k : n - k) * (sampleRateHz / n);
    const amplitude = Math.sqrt((pow(10, maskLevelDbcPerHz(mask, fHz) / 10) * sampleRateHz) / n / 2);
    spectrumIq[2 * k] = amplitude * rng.nextGaussian();
    spectrumIq[2 * k + 1] = amplitude * rng.nextGaussian();
  }
  const timeIq = ifftRaw(plan, spectrumIq, new Float64Array(2 * n));
  for (let i = 0; i < n; i++) outRad[i] = Math.SQRT2 * timeIq[2 * i]!;
  return outRad;
}

/**
 * Integrated phase noise σ_φ² = 2∫_{f1}^{f2} L(f) df in rad² (double sideband; common practice), by the trapezoid
 * rule on 2000 log-spaced points of the interpolated mask.
 */
export function integratePhaseNoiseRad2(mask: readonly PhaseNoiseMaskPoint[], fromHz: number, toHz: number): number {
  if (!(toHz > fromHz && fromHz > 0)) throw new DspError('INVALID_CONFIG', `Phase-noise integration needs 0 < from < to; got ${fromHz}, ${toHz} Hz.`);
  const steps = 2000;
  let sum = 0;
  let prevF = fromHz;
  let prevL = pow(10, maskLevelDbcPerHz(mask, fromHz) / 10);
  for (let i = 1; i <= steps; i++) {
    const f = fromHz * pow(toHz / fromHz, i / steps);
    const l = pow(10, maskLevelDbcPerHz(mask, f) / 10);
    sum += 0.5 * (l + prevL) * (f - prevF);
    prevF = f;
    prevL = l;
  }
  return 2 * sum;
}

/**
 * Rotates each sample by its phase: y[n] = x[n]·e^{jφ[n]} (the LO's phase noise multiplies the modulated signal).
 * @param inIq 2N values; @param phaseRad N values; @param outIq 2N values (may be the same buffer)
 */
export function applyPhaseNoise(inIq: Float64Array, phaseRad: Float64Array, outIq: Float64Array): Float64Array {
  assertLength(phaseRad, inIq.length / 2, 'Phase-noise samples');
  assertLength(outIq, inIq.length, 'Phase-noise output');
  for (let n = 0; n < phaseRad.length; n++) {
    const c = cos(phaseRad[n]!);
    const s = sin(phaseRad[n]!);
    const re = inIq[2 * n]!;
    const im = inIq[2 * n + 1]!;
    outIq[2 * n] = re * c - im * s;
    outIq[2 * n + 1] = re * s + im * c;
  }
  return outIq;
}
