import { DspError } from '../errors';
import { createFftPlan, fftForward, type FftPlan } from '../fft/fftPlan';
import { isTwoThreeFiveSmooth } from '../waveform/transformPrecoding';
import { createSpectralWindow, equivalentNoiseBandwidthBins, nominalEnbwBins, type SpectralWindowKind } from './spectralWindows';

/**
 * Welch's averaged, windowed periodogram (P. D. Welch, "The use of fast Fourier transform for the estimation of power
 * spectra", IEEE Trans. Audio Electroacoust. AU-15(2), 1967), two-sided for complex baseband:
 *   S[k] = (1/K) Σ_segments |Σ_n w[n] x_s[n] e^{−j2πkn/N}|² / (f_s · Σ_n w[n]²)   (power per Hz)
 * normalised so that Σ_k S[k]·f_s/N equals the mean power of the samples (Parseval). The resolution bandwidth is the
 * window's equivalent noise bandwidth, RBW = ENBW·f_s/N.
 */
export interface WelchPlan {
  readonly sampleRateHz: number;
  readonly window: SpectralWindowKind;
  /** Segment (FFT) length N, a 2·3·5-smooth size near ENBW·f_s/RBW. */
  readonly segmentLength: number;
  /** Step between segment starts (N/2: 50 % overlap). */
  readonly hopSamples: number;
  /** ENBW·f_s/N, Hz: the RBW actually used. */
  readonly rbwHz: number;
  /** f_s/N, Hz. */
  readonly binWidthHz: number;
  readonly windowValues: Float64Array;
  readonly windowPowerSum: number;
  readonly fft: FftPlan;
}

/** Sample rate, requested RBW and window of a Welch estimate. */
export interface WelchOptions {
  readonly sampleRateHz: number;
  /** Requested resolution bandwidth, Hz. */
  readonly rbwHz: number;
  readonly window: SpectralWindowKind;
}

/** Largest Welch segment (2^20 points). */
export const MAX_SEGMENT_LENGTH = 1 << 20;

/**
 * Chooses the segment length for the requested RBW: the 2·3·5-smooth size closest (in ratio) to ENBW·f_s/RBW, so
 * the FFT stays fast; the RBW actually used is reported in the plan.
 * @throws DspError INVALID_CONFIG when the RBW asks for fewer than 16 or more than 2^20 points per segment
 */
export function createWelchPlan(options: WelchOptions): WelchPlan {
  const { sampleRateHz, rbwHz, window } = options;
  if (!(rbwHz > 0) || !Number.isFinite(rbwHz)) throw new DspError('INVALID_CONFIG', `rbwHz must be a positive number of Hz; got ${rbwHz}.`, { field: 'rbwHz' });
  const enbw = nominalEnbwBins(window);
  const target = (enbw * sampleRateHz) / rbwHz;
  if (target < 16 || target > MAX_SEGMENT_LENGTH) {
    throw new DspError(
      'INVALID_CONFIG',
      `rbwHz ${rbwHz} at a sample rate of ${sampleRateHz} Hz needs ${Math.round(target)}-point segments; allowed RBWs for this window run from ${formatHz((enbw * sampleRateHz) / MAX_SEGMENT_LENGTH)} to ${formatHz((enbw * sampleRateHz) / 16)}.`,
      { field: 'rbwHz' },
    );
  }
  const segmentLength = nearestSmoothSize(target);
  const windowValues = createSpectralWindow(window, segmentLength);
  let windowPowerSum = 0;
  for (let n = 0; n < segmentLength; n++) windowPowerSum += windowValues[n]! * windowValues[n]!;
  return {
    sampleRateHz,
    window,
    segmentLength,
    hopSamples: Math.floor(segmentLength / 2),
    rbwHz: (equivalentNoiseBandwidthBins(windowValues) * sampleRateHz) / segmentLength,
    binWidthHz: sampleRateHz / segmentLength,
    windowValues,
    windowPowerSum,
    fft: createFftPlan(segmentLength),
  };
}

/** Running Welch estimate fed with consecutive chunks of one signal. */
export interface WelchAccumulator {
  readonly plan: WelchPlan;
  /** Σ over segments of |X[k]|², natural FFT order. */
  readonly sumPeriodograms: Float64Array;
  numSegments: number;
  /** Samples not yet consumed, interleaved (2N values); `buffered` of them valid. */
  readonly pendingIq: Float64Array;
  buffered: number;
  readonly windowedIq: Float64Array;
  readonly spectrumIq: Float64Array;
}

/** An empty running estimate for `plan` (buffers of 2·N values, allocated once). */
export function createWelchAccumulator(plan: WelchPlan): WelchAccumulator {
  const n = plan.segmentLength;
  return {
    plan,
    sumPeriodograms: new Float64Array(n),
    numSegments: 0,
    pendingIq: new Float64Array(2 * n),
    buffered: 0,
    windowedIq: new Float64Array(2 * n),
    spectrumIq: new Float64Array(2 * n),
  };
}

/**
 * Feeds the next samples of the signal; every complete segment (50 % overlap) is windowed, transformed and added.
 * @param signalIq interleaved samples, any length
 */
export function pushWelchSamples(acc: WelchAccumulator, signalIq: Float64Array): void {
  const { segmentLength: n, hopSamples, windowValues: w } = acc.plan;
  let offset = 0;
  const samples = signalIq.length / 2;
  while (offset < samples) {
    const take = Math.min(n - acc.buffered, samples - offset);
    acc.pendingIq.set(signalIq.subarray(2 * offset, 2 * (offset + take)), 2 * acc.buffered);
    acc.buffered += take;
    offset += take;
    if (acc.buffered < n) break;
    const x = acc.pendingIq;
    const xw = acc.windowedIq;
    for (let i = 0; i < n; i++) {
      xw[2 * i] = x[2 * i]! * w[i]!;
      xw[2 * i + 1] = x[2 * i + 1]! * w[i]!;
    }
    fftForward(acc.plan.fft, xw, acc.spectrumIq);
    const s = acc.spectrumIq;
    const sum = acc.sumPeriodograms;
    for (let k = 0; k < n; k++) sum[k] = sum[k]! + s[2 * k]! * s[2 * k]! + s[2 * k + 1]! * s[2 * k + 1]!;
    acc.numSegments++;
    x.copyWithin(0, 2 * hopSamples, 2 * n);
    acc.buffered = n - hopSamples;
  }
}

/** A two-sided power spectral density on an ascending frequency grid. */
export interface PowerSpectrum {
  /** Bin centres from −f_s/2 upward, Hz (N values). */
  readonly frequenciesHz: Float64Array;
  /** Power per Hz at each frequency (units of |x|² per Hz). */
  readonly psdPerHz: Float64Array;
  readonly binWidthHz: number;
  readonly rbwHz: number;
  readonly sampleRateHz: number;
  readonly window: SpectralWindowKind;
  readonly segmentLength: number;
  readonly numSegments: number;
}

/**
 * The averaged PSD so far, reordered to ascending frequency (bin k ↦ f = k·f_s/N, wrapped into [−f_s/2, f_s/2)).
 * @throws DspError INVALID_CONFIG when not even one segment was complete
 */
export function finishWelch(acc: WelchAccumulator): PowerSpectrum {
  const { segmentLength: n, sampleRateHz, binWidthHz, windowPowerSum } = acc.plan;
  if (acc.numSegments === 0) {
    throw new DspError('INVALID_CONFIG', `The spectrum needs at least one full ${n}-sample segment; the signal was shorter. Use a wider RBW or more symbols.`);
  }
  const half = Math.floor(n / 2);
  const frequenciesHz = new Float64Array(n);
  const psdPerHz = new Float64Array(n);
  const scale = 1 / (acc.numSegments * sampleRateHz * windowPowerSum);
  for (let i = 0; i < n; i++) {
    const k = (i - half + n) % n;
    frequenciesHz[i] = (i - half) * binWidthHz;
    psdPerHz[i] = acc.sumPeriodograms[k]! * scale;
  }
  return {
    frequenciesHz,
    psdPerHz,
    binWidthHz,
    rbwHz: acc.plan.rbwHz,
    sampleRateHz,
    window: acc.plan.window,
    segmentLength: n,
    numSegments: acc.numSegments,
  };
}

/** Welch PSD of a signal held in memory. */
export function computeWelchPsd(signalIq: Float64Array, options: WelchOptions): PowerSpectrum {
  const acc = createWelchAccumulator(createWelchPlan(options));
  pushWelchSamples(acc, signalIq);
  return finishWelch(acc);
}

function nearestSmoothSize(target: number): number {
  let below = Math.floor(target);
  while (below > 1 && !isTwoThreeFiveSmooth(below)) below--;
  let above = Math.ceil(target);
  while (!isTwoThreeFiveSmooth(above)) above++;
  return target / below <= above / target ? below : above;
}

function formatHz(hz: number): string {
  return hz >= 1e6 ? `${(hz / 1e6).toPrecision(3)} MHz` : hz >= 1e3 ? `${(hz / 1e3).toPrecision(3)} kHz` : `${hz.toPrecision(3)} Hz`;
}
