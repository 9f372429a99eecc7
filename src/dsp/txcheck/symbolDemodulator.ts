import { assertLength } from '../errors';
import {
  createDemodulatorWorkspace,
  createOfdmDemodulatorPlan,
  demodulateSymbol,
} from '../receiver/ofdmDemodulator';
import type { SymbolLayout, WaveformPlan } from '../waveform/waveformPlan';

/**
 * Known-timing OFDM demodulation of one symbol of a generated waveform: the receiver's `demodulateSymbol` with the
 * window placed `timingOffsetSamples` before the end of the CP (0 = right after the CP, −N_cp = the first CP sample;
 * values outside that range are clamped). Without impairments it returns the grid row exactly.
 */
export interface SymbolDemodulator {
  readonly plan: WaveformPlan;
  /** Fills `outRowIq` (2·numGridSubcarriers values) with the grid row a_{k',l} measured from `waveformIq`. */
  demodulate(waveformIq: Float64Array, layout: SymbolLayout, timingOffsetSamples: number, outRowIq: Float64Array): Float64Array;
}

/**
 * Builds the known-timing demodulator of a plan (its FFT plan and scratch buffers, reused for every symbol).
 * @param plan the waveform plan the recording was generated from
 */
export function createSymbolDemodulator(plan: WaveformPlan): SymbolDemodulator {
  const demodPlan = createOfdmDemodulatorPlan(plan);
  const work = createDemodulatorWorkspace(demodPlan);
  return {
    plan,
    demodulate(waveformIq, layout, timingOffsetSamples, outRowIq) {
      assertLength(outRowIq, 2 * demodPlan.numGridSubcarriers, 'Demodulated grid row');
      const advance = -Math.max(-layout.cpLengthSamples, Math.min(0, Math.round(timingOffsetSamples)));
      return demodulateSymbol(demodPlan, waveformIq, layout.startSample, layout.symbolIndex, advance, work, outRowIq);
    },
  };
}
