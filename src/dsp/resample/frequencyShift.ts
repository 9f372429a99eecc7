import { assertLength, DspError } from '../errors';
import { cos, sin } from '../math/trig';

/**
 * A digital frequency shift y[n] = x[n]·e^{j2π·c·n}, n counted from the first sample of the file.
 * When the shift is periodic over a loop of P samples (c = k/P, k whole), the phase index ρ(n) = k·n mod P is kept in
 * exact integer arithmetic, so every loop of the file carries identical phases and the seam has no phase step.
 */
export interface FrequencyShift {
  /** c = f/fs, cycles per sample. */
  readonly cyclesPerSample: number;
  /** k and P when periodic over P samples, else undefined. */
  readonly cyclesPerPeriod?: number | undefined;
  readonly periodSamples?: number | undefined;
}

/** The shift actually applied and whether it loops cleanly. */
export interface FrequencyShiftPlan {
  readonly shift: FrequencyShift;
  readonly requestedHz: number;
  /** The offset applied: the request, or the nearest k·fs/P when snapped. */
  readonly appliedHz: number;
  /** True when the shift is a whole number of cycles over the loop period. */
  readonly periodic: boolean;
  readonly snapped: boolean;
}

/**
 * Plans a shift of `freqOffsetHz` at `sampleRateHz` for a loop of `periodSamples`. With `snapToLoop` the offset moves
 * to the nearest k·fs/P (at most fs/(2P) away) so the loop has no phase seam; otherwise it is kept exactly and
 * `periodic` says whether it happens to loop cleanly.
 */
export function planFrequencyShift(freqOffsetHz: number, sampleRateHz: number, periodSamples: number, snapToLoop: boolean): FrequencyShiftPlan {
  if (!Number.isFinite(freqOffsetHz) || Math.abs(freqOffsetHz) >= sampleRateHz / 2) {
    throw new DspError(
      'INVALID_CONFIG',
      `freqOffsetHz ${freqOffsetHz} must be a finite offset inside the ±${sampleRateHz / 2} Hz Nyquist band of the ${sampleRateHz} Hz file.`,
      { field: 'freqOffsetHz' },
    );
  }
  const cyclesExact = (freqOffsetHz * periodSamples) / sampleRateHz;
  const k = Math.round(cyclesExact);
  const periodicAlready = Math.abs(cyclesExact - k) < 1e-9;
  if (snapToLoop || periodicAlready) {
    const appliedHz = (k * sampleRateHz) / periodSamples;
    return {
      shift: { cyclesPerSample: k / periodSamples, cyclesPerPeriod: k, periodSamples },
      requestedHz: freqOffsetHz,
      appliedHz,
      periodic: true,
      snapped: !periodicAlready,
    };
  }
  return { shift: { cyclesPerSample: freqOffsetHz / sampleRateHz }, requestedHz: freqOffsetHz, appliedHz: freqOffsetHz, periodic: false, snapped: false };
}

/**
 * Multiplies `iq` by e^{j2π·c·n} for n = firstSampleIndex … into `outIq` (same length; may be the same buffer).
 * @param iq interleaved input, 2N values
 * @param firstSampleIndex index n of iq's first sample in the file (a whole number ≥ 0)
 */
export function applyFrequencyShift(shift: FrequencyShift, iq: Float64Array, firstSampleIndex: number, outIq: Float64Array): Float64Array {
  assertLength(outIq, iq.length, 'Frequency-shift output');
  const count = iq.length / 2;
  const twoPi = 2 * Math.PI;
  if (shift.cyclesPerPeriod !== undefined && shift.periodSamples !== undefined) {
    const p = shift.periodSamples;
    const k = ((shift.cyclesPerPeriod % p) + p) % p;
    // ρ(n0) = k·n0 mod P in BigInt (k·n0 can pass 2^53), then ρ += k mod P per sample.
    let rho = Number((BigInt(k) * BigInt(firstSampleIndex)) % BigInt(p));
    for (let i = 0; i < count; i++) {
      const angle = (twoPi * rho) / p;
      rotate(iq, outIq, i, cos(angle), sin(angle));
      rho += k;
      if (rho >= p) rho -= p;
    }
    return outIq;
  }
  const c = shift.cyclesPerSample;
  for (let i = 0; i < count; i++) {
    const cycles = c * (firstSampleIndex + i);
    const angle = twoPi * (cycles - Math.floor(cycles));
    rotate(iq, outIq, i, cos(angle), sin(angle));
  }
  return outIq;
}

function rotate(iq: Float64Array, outIq: Float64Array, i: number, c: number, s: number): void {
  const re = iq[2 * i]!;
  const im = iq[2 * i + 1]!;
  outIq[2 * i] = re * c - im * s;
  outIq[2 * i + 1] = re * s + im * c;
}
