import { DspError } from '../errors';
import { createFftPlan, fftForward } from '../fft/fftPlan';
import { log10 } from '../math/expLog';

/**
 * Out-of-band power ratio of a record: one DFT over the whole record (periodogram, rectangular window, the record
 * being one period of a looped signal), power in bins outside [lowHz, highHz] over power inside, in dB.
 * A quick figure for comparing processing steps; ACLR with the standards' filters is the measurement engine's job.
 * @param waveformIq 2N values at `sampleRateHz`
 */
export function outOfBandPowerRatioDb(waveformIq: Float64Array, sampleRateHz: number, lowHz: number, highHz: number): number {
  const n = waveformIq.length / 2;
  if (!(highHz > lowHz)) throw new DspError('INTERNAL', `In-band edges must satisfy low < high; got ${lowHz}, ${highHz} Hz.`);
  const spectrum = fftForward(createFftPlan(n), waveformIq, new Float64Array(2 * n));
  let inBand = 0;
  let outBand = 0;
  for (let k = 0; k < n; k++) {
    const f = (k < n / 2 ? k : k - n) * (sampleRateHz / n);
    const p = spectrum[2 * k]! * spectrum[2 * k]! + spectrum[2 * k + 1]! * spectrum[2 * k + 1]!;
    if (f >= lowHz && f <= highHz) inBand += p;
    else outBand += p;
  }
  return 10 * log10(outBand / inBand);
}

/** PAPR of a whole record: max |x|² over mean |x|², dB (mean over the record; REFERENCE.md §5.1). */
export function recordPaprDb(waveformIq: Float64Array): number {
  let peak = 0;
  let sum = 0;
  for (let i = 0; i < waveformIq.length; i += 2) {
    const p = waveformIq[i]! * waveformIq[i]! + waveformIq[i + 1]! * waveformIq[i + 1]!;
    sum += p;
    if (p > peak) peak = p;
  }
  return 10 * log10(peak / (sum / (waveformIq.length / 2)));
}
