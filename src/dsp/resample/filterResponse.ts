import { DspError } from '../errors';
import { createFftPlan, fftForward, MAX_FFT_SIZE } from '../fft/fftPlan';
import { log10 } from '../math/expLog';

/** What a lowpass FIR achieves, measured on a dense frequency grid. */
export interface LowpassMeasurement {
  /** Peak-to-peak passband ripple, dB: 20·log10(max|H| / min|H|) over 0…ωp. */
  readonly passbandRippleDb: number;
  /** Largest passband deviation from the nominal gain, linear (max |(|H|/gain) − 1|). */
  readonly passbandDeviation: number;
  /** Stopband attenuation, dB: −20·log10(max |H|/gain) over ωs…π. */
  readonly stopbandAttenuationDb: number;
  /** Points per 2π of the grid used. */
  readonly gridSize: number;
}

/**
 * Measures a real lowpass FIR's magnitude response |H(e^{jω})| = |Σ h[n] e^{−jωn}| on an FFT grid of `gridSize`
 * points (taps zero-padded), over the passband [0, ωp] and the stopband [ωs, π].
 * @param taps h[n], K values
 * @param gainLinear nominal passband gain (L for an interpolator's prototype)
 * @param passbandEdgeRad ωp, rad/sample
 * @param stopbandEdgeRad ωs, rad/sample (ωp < ωs ≤ π)
 * @param gridSize FFT size, at least K; default the power of two ≥ 32·K (at least 2^14, at most 2^22)
 */
export function measureLowpass(
  taps: Float64Array,
  gainLinear: number,
  passbandEdgeRad: number,
  stopbandEdgeRad: number,
  gridSize = defaultGridSize(taps.length),
): LowpassMeasurement {
  if (gridSize < taps.length || gridSize > MAX_FFT_SIZE) {
    throw new DspError('UNSUPPORTED_SIZE', `Response grid of ${gridSize} points must hold the ${taps.length} taps and be at most ${MAX_FFT_SIZE}.`);
  }
  const inIq = new Float64Array(2 * gridSize);
  for (let n = 0; n < taps.length; n++) inIq[2 * n] = taps[n]!;
  const outIq = new Float64Array(2 * gridSize);
  fftForward(createFftPlan(gridSize), inIq, outIq);
  const binOf = (w: number): number => (w * gridSize) / (2 * Math.PI);
  let maxPass = 0;
  let minPass = Infinity;
  let maxDev = 0;
  for (let b = 0; b <= Math.floor(binOf(passbandEdgeRad)); b++) {
    const mag = Math.hypot(outIq[2 * b]!, outIq[2 * b + 1]!) / gainLinear;
    maxPass = Math.max(maxPass, mag);
    minPass = Math.min(minPass, mag);
    maxDev = Math.max(maxDev, Math.abs(mag - 1));
  }
  let maxStop = 0;
  for (let b = Math.ceil(binOf(stopbandEdgeRad)); b <= gridSize / 2; b++) {
    maxStop = Math.max(maxStop, Math.hypot(outIq[2 * b]!, outIq[2 * b + 1]!) / gainLinear);
  }
  return {
    passbandRippleDb: 20 * log10(maxPass / minPass),
    passbandDeviation: maxDev,
    stopbandAttenuationDb: -20 * log10(maxStop),
    gridSize,
  };
}

function defaultGridSize(numTaps: number): number {
  let n = 1 << 14;
  while (n < 32 * numTaps && n < MAX_FFT_SIZE) n *= 2;
  return n;
}
