import { assertWholeSamples, DspError } from '../errors';

/**
 * Fractional delay by band-limited interpolation: y[n] = x(n − d) = Σ_m h[m]·x[n − D − m], D = ⌊d⌋,
 * h[m] = sinc(m − f)·w(m − f), f = d − D, m = −H+1…H, with a Blackman window w(x) = 0.42 + 0.5cos(πx/H) + 0.08cos(2πx/H)
 * and the taps scaled to unit DC gain (common practice for tapped-delay-line channels; the rule that taps be applied at
 * their exact delays rather than rounded to the sample grid is common practice too). Integer delays are exact (one tap).
 * With H = 16 the response is flat to about 1e-3 up to 0.4·f_s.
 */
export interface FractionalDelayFilter {
  readonly delaySamples: number;
  /** y[n] = Σ_i taps[i]·x[n − firstIndex − i]. */
  readonly firstIndex: number;
  readonly taps: Float64Array;
}

/**
 * Designs the interpolator for a delay of `delaySamples` (≥ 0) with half-length H = `halfLength` (a whole number ≥ 1;
 * a fractional delay gets 2H taps, a whole-sample delay one).
 */
export function designFractionalDelay(delaySamples: number, halfLength = 16): FractionalDelayFilter {
  if (!(delaySamples >= 0) || !Number.isFinite(delaySamples)) {
    throw new DspError('INVALID_CONFIG', `Delay ${delaySamples} samples must be a finite number ≥ 0.`);
  }
  if (!Number.isInteger(halfLength) || halfLength < 1) {
    throw new DspError(
      'INVALID_CONFIG',
      `Fractional-delay halfLength ${halfLength} must be a whole number ≥ 1 (the filter has 2·halfLength taps; default 16).`,
      { field: 'halfLength' },
    );
  }
  const whole = Math.floor(delaySamples);
  const frac = delaySamples - whole;
  if (frac < 1e-12) return { delaySamples, firstIndex: whole, taps: Float64Array.of(1) };
  const taps = new Float64Array(2 * halfLength);
  let sum = 0;
  for (let i = 0; i < taps.length; i++) {
    const x = i - halfLength + 1 - frac;
    const sinc = Math.sin(Math.PI * x) / (Math.PI * x);
    const window = 0.42 + 0.5 * Math.cos((Math.PI * x) / halfLength) + 0.08 * Math.cos((2 * Math.PI * x) / halfLength);
    taps[i] = sinc * window;
    sum += taps[i]!;
  }
  for (let i = 0; i < taps.length; i++) taps[i] = taps[i]! / sum;
  return { delaySamples, firstIndex: whole - halfLength + 1, taps };
}

/**
 * Filters a complex signal: out[n] = Σ_i taps[i]·in[n − firstIndex − i], with in[·] = 0 outside the buffer.
 * @param inIq any number of samples (an even number of values)
 * @param outIq any number of samples (an even number of values; the output covers samples 0…outIq.length/2 − 1); not
 *   the same buffer as `inIq`
 */
export function applyFractionalDelay(filter: FractionalDelayFilter, inIq: Float64Array, outIq: Float64Array): Float64Array {
  assertWholeSamples(inIq, 'applyFractionalDelay inIq');
  assertWholeSamples(outIq, 'applyFractionalDelay outIq');
  // Each output sample reads several input samples, so writing in place would read already-delayed values.
  if (inIq === outIq) throw new DspError('INTERNAL', 'applyFractionalDelay inIq and outIq must be different buffers.');
  const numIn = inIq.length / 2;
  const numOut = outIq.length / 2;
  const { taps, firstIndex } = filter;
  for (let n = 0; n < numOut; n++) {
    let re = 0;
    let im = 0;
    for (let i = 0; i < taps.length; i++) {
      const j = n - firstIndex - i;
      if (j < 0 || j >= numIn) continue;
      re += taps[i]! * inIq[2 * j]!;
      im += taps[i]! * inIq[2 * j + 1]!;
    }
    outIq[2 * n] = re;
    outIq[2 * n + 1] = im;
  }
  return outIq;
}

/** The filter's frequency response at f (Hz), sample rate f_s: Σ_i taps[i]·e^{−j2πf(firstIndex + i)/f_s}. */
export function fractionalDelayResponse(filter: FractionalDelayFilter, frequencyHz: number, sampleRateHz: number): [number, number] {
  let re = 0;
  let im = 0;
  for (let i = 0; i < filter.taps.length; i++) {
    const angle = (-2 * Math.PI * frequencyHz * (filter.firstIndex + i)) / sampleRateHz;
    re += filter.taps[i]! * Math.cos(angle);
    im += filter.taps[i]! * Math.sin(angle);
  }
  return [re, im];
}
