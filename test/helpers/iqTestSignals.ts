import { createRng } from '../../src/dsp/data/rng';

/** Complex Gaussian noise, N samples, unit mean power (each component variance 1/2), seeded. */
export function gaussianIq(numSamples: number, seed: number, rms = 1): Float64Array {
  const rng = createRng(seed);
  const out = new Float64Array(2 * numSamples);
  const s = rms / Math.SQRT2;
  for (let i = 0; i < out.length; i++) out[i] = rng.nextGaussian() * s;
  return out;
}

/** Sum of complex tones a_k·e^{j(2π f_k n / fs + φ_k)}. */
export function tonesIq(numSamples: number, tones: readonly { cyclesPerSample: number; amplitude: number; phaseRad: number }[]): Float64Array {
  const out = new Float64Array(2 * numSamples);
  for (const t of tones) {
    for (let n = 0; n < numSamples; n++) {
      const cycles = t.cyclesPerSample * n;
      const a = 2 * Math.PI * (cycles - Math.floor(cycles)) + t.phaseRad;
      out[2 * n] += t.amplitude * Math.cos(a);
      out[2 * n + 1] += t.amplitude * Math.sin(a);
    }
  }
  return out;
}

/** Mean of |x|². */
export function meanPower(iq: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < iq.length; i++) s += iq[i]! * iq[i]!;
  return s / (iq.length / 2);
}

/**
 * Hann-windowed power spectrum |X[k]|² of `length` samples of `iq` starting at `start` (naive DFT over the bins asked
 * for, so the test does not lean on the engine's FFT). Returns power per bin k = 0…length−1 when `bins` is omitted.
 */
export function hannSpectrum(iq: Float64Array, start: number, length: number, bins?: readonly number[]): Float64Array {
  const ks = bins ?? Array.from({ length }, (_, k) => k);
  const out = new Float64Array(ks.length);
  const w = new Float64Array(length);
  for (let n = 0; n < length; n++) w[n] = 0.5 - 0.5 * Math.cos((2 * Math.PI * n) / length);
  ks.forEach((k, idx) => {
    let re = 0;
    let im = 0;
    for (let n = 0; n < length; n++) {
      const a = (-2 * Math.PI * k * n) / length;
      const x = iq[2 * (start + n)]! * w[n]!;
      const y = iq[2 * (start + n) + 1]! * w[n]!;
      re += x * Math.cos(a) - y * Math.sin(a);
      im += x * Math.sin(a) + y * Math.cos(a);
    }
    out[idx] = re * re + im * im;
  });
  return out;
}
