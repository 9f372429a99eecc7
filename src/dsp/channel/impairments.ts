import { assertLength, DspError } from '../errors';
import { applyFractionalDelay, designFractionalDelay } from './fractionalDelay';

/**
 * Impairments that exercise the receiver's estimators.
 * - Carrier frequency offset: out[n] = in[n]·e^{j2π·Δf·(n + n0)/f_s}, phase 0 at sample −n0.
 * - Timing offset: the signal arrives `delaySamples` later (fractional delays by band-limited interpolation),
 *   preceded by zeros, so the record is longer by ⌈delay⌉ samples.
 */

/** Applies a carrier frequency offset. `outIq` may be `inIq`. */
export function applyFrequencyOffset(
  inIq: Float64Array,
  offsetHz: number,
  sampleRateHz: number,
  outIq: Float64Array,
  firstSampleIndex = 0,
): Float64Array {
  assertLength(outIq, inIq.length, 'Frequency-offset output');
  if (!Number.isFinite(offsetHz)) throw new DspError('INVALID_CONFIG', `Frequency offset ${offsetHz} Hz must be finite.`);
  const step = (2 * Math.PI * offsetHz) / sampleRateHz;
  for (let n = 0; n < inIq.length / 2; n++) {
    const angle = step * (n + firstSampleIndex);
    const c = Math.cos(angle);
    const s = Math.sin(angle);
    const re = inIq[2 * n]!;
    const im = inIq[2 * n + 1]!;
    outIq[2 * n] = re * c - im * s;
    outIq[2 * n + 1] = re * s + im * c;
  }
  return outIq;
}

/** Delays a signal by `delaySamples` (≥ 0, fractional allowed); returns a new buffer ⌈delay⌉ samples longer. */
export function applyTimingOffset(inIq: Float64Array, delaySamples: number): Float64Array {
  const filter = designFractionalDelay(delaySamples);
  const out = new Float64Array(inIq.length + 2 * Math.ceil(delaySamples));
  return applyFractionalDelay(filter, inIq, out);
}
