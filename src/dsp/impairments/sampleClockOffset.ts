import { assertSeparateOutput, DspError } from '../errors';
import { cos, sin } from '../math/trig';

/** Half-length of the interpolation kernel, taps on each side. */
export const CLOCK_OFFSET_HALF_TAPS = 32;

/**
 * A DAC whose sample clock runs ppm·10⁻⁶ fast (ε > 0) or slow: the analogue signal is x_c((1 + ε)·t), so a receiver
 * sampling at the nominal rate sees y[n] = x_c((1 + ε)·n·T_s). x_c is reconstructed from the samples by band-limited
 * interpolation with a Blackman-windowed sinc of 2·CLOCK_OFFSET_HALF_TAPS taps (common practice; the window keeps the
 * error below about −70 dB for signals occupying up to ≈ 80 % of the Nyquist band). The record is treated as one
 * period of a looped signal, so times past its end wrap to its start. Only the sample clock is modelled (the carrier is
 * not shifted). Each subcarrier k then drifts in phase by 2π·k·Δf·ε·t and its neighbours leak into it.
 * @param inIq 2N values; @param outIq 2N values, not the same buffer
 */
export function applySampleClockOffset(inIq: Float64Array, ppm: number, outIq: Float64Array): Float64Array {
  if (!Number.isFinite(ppm) || Math.abs(ppm) > 1e4) {
    throw new DspError('INVALID_CONFIG', `impairments.sampleClockPpm must be within ±10000 ppm; got ${ppm}.`, { field: 'impairments.sampleClockPpm' });
  }
  assertSeparateOutput(inIq, outIq, 'Clock-offset');
  const n = inIq.length / 2;
  const epsilon = ppm * 1e-6;
  const half = CLOCK_OFFSET_HALF_TAPS;
  for (let m = 0; m < n; m++) {
    const tau = m * (1 + epsilon);
    const base = Math.floor(tau);
    const mu = tau - base;
    let yRe = 0;
    let yIm = 0;
    if (mu < 1e-12) {
      const j = 2 * (base % n);
      outIq[2 * m] = inIq[j]!;
      outIq[2 * m + 1] = inIq[j + 1]!;
      continue;
    }
    // sin(π(μ − k)) = (−1)^k·sin(πμ): one sine per output sample.
    const sinPiMu = sin(Math.PI * mu);
    for (let k = -half + 1; k <= half; k++) {
      const t = mu - k;
      const sinc = ((k & 1 ? -1 : 1) * sinPiMu) / (Math.PI * t);
      const w = 0.42 + 0.5 * cos((Math.PI * t) / half) + 0.08 * cos((2 * Math.PI * t) / half);
      const j = 2 * ((((base + k) % n) + n) % n);
      yRe += inIq[j]! * sinc * w;
      yIm += inIq[j + 1]! * sinc * w;
    }
    outIq[2 * m] = yRe;
    outIq[2 * m + 1] = yIm;
  }
  return outIq;
}
