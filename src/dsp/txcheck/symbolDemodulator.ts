import { assertLength } from '../errors';
import { createFftPlan, fftForward, type FftPlan } from '../fft/fftPlan';
import type { SymbolLayout, WaveformPlan } from '../waveform/waveformPlan';

/**
 * Known-timing OFDM demodulation of one symbol of a generated waveform, the inverse of ofdmModulateSymbol:
 * the N_os samples starting `timingOffsetSamples` before the end of the CP (0 = right after the CP, −N_cp = the
 * first CP sample) are de-rotated by the LTE uplink's half-subcarrier ramp and NR's §5.4 phase, transformed, scaled
 * by 1/N_os and corrected for the window's start (a start d samples early multiplies bin k by e^{j2πkd/N_os}).
 * Without impairments it returns the grid row exactly. The record is periodic: a window past its end wraps.
 */
export interface SymbolDemodulator {
  readonly plan: WaveformPlan;
  /** Fills `outRowIq` (2·numGridSubcarriers values) with the grid row a_{k',l} measured from `waveformIq`. */
  demodulate(waveformIq: Float64Array, layout: SymbolLayout, timingOffsetSamples: number, outRowIq: Float64Array): Float64Array;
}

export function createSymbolDemodulator(plan: WaveformPlan): SymbolDemodulator {
  const n = plan.ofdm.ifftSize;
  const fft: FftPlan = createFftPlan(n);
  const timeIq = new Float64Array(2 * n);
  const freqIq = new Float64Array(2 * n);
  const bins = plan.ofdm.bins;
  return {
    plan,
    demodulate(waveformIq, layout, timingOffsetSamples, outRowIq) {
      assertLength(outRowIq, 2 * bins.length, 'Demodulated grid row');
      const total = waveformIq.length / 2;
      const cp = layout.cpLengthSamples;
      const d = Math.max(-cp, Math.min(0, Math.round(timingOffsetSamples)));
      const pattern = layout.symbolIndex % plan.ofdm.cpLengthsSamples.length;
      const ramp = plan.ofdm.rampsIq[pattern];
      const phases = plan.ofdm.symbolPhaseRad;
      const theta = phases.length > 0 ? phases[layout.symbolIndex % phases.length]! : 0;
      for (let m = 0; m < n; m++) {
        const p = cp + d + m; // position in the extended symbol
        const src = 2 * ((layout.startSample + p) % total);
        let re = waveformIq[src]!;
        let im = waveformIq[src + 1]!;
        let angle = -theta;
        if (ramp) angle -= Math.atan2(ramp[2 * p + 1]!, ramp[2 * p]!);
        if (angle !== 0) {
          const c = Math.cos(angle);
          const s = Math.sin(angle);
          [re, im] = [re * c - im * s, re * s + im * c];
        }
        timeIq[2 * m] = re;
        timeIq[2 * m + 1] = im;
      }
      fftForward(fft, timeIq, freqIq);
      for (let g = 0; g < bins.length; g++) {
        const b = bins[g]!;
        const angle = (-2 * Math.PI * b * d) / n;
        const c = Math.cos(angle) / n;
        const s = Math.sin(angle) / n;
        const re = freqIq[2 * b]!;
        const im = freqIq[2 * b + 1]!;
        outRowIq[2 * g] = re * c - im * s;
        outRowIq[2 * g + 1] = re * s + im * c;
      }
      return outRowIq;
    },
  };
}
