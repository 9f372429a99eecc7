import { createFftPlan, fftForward, type FftPlan } from '../fft/fftPlan';
import type { WaveformPlan } from '../waveform/waveformPlan';

/**
 * OFDM symbol demodulation, the inverse of ofdmModulator.ts: take N samples starting `windowAdvanceSamples` before the end
 * of the cyclic prefix, remove the LTE uplink's half-subcarrier ramp e^{jπ(n − N_cp)/N}, FFT, scale by 1/N (the generator's
 * IFFT is unscaled), undo the circular shift of the early window (×e^{+j2πk·a/N}, a = advance) and NR's §5.4 phase term,
 * and read the grid subcarriers out of their bins. A noiseless, undistorted symbol gives back a_{k',l} exactly.
 */
export interface OfdmDemodulatorPlan {
  readonly ifftSize: number;
  readonly bins: Int32Array;
  readonly numGridSubcarriers: number;
  readonly halfSubcarrierShift: boolean;
  readonly symbolPhaseRad: Float64Array;
  readonly cpLengthsSamples: readonly number[];
  readonly fft: FftPlan;
}

/** Derives the demodulator from the waveform plan (same IFFT size, bins, CP pattern, ramps and phase terms). */
export function createOfdmDemodulatorPlan(plan: WaveformPlan): OfdmDemodulatorPlan {
  return {
    ifftSize: plan.ofdm.ifftSize,
    bins: plan.ofdm.bins,
    numGridSubcarriers: plan.ofdm.numGridSubcarriers,
    halfSubcarrierShift: plan.numerology.halfSubcarrierShift,
    symbolPhaseRad: plan.ofdm.symbolPhaseRad,
    cpLengthsSamples: plan.ofdm.cpLengthsSamples,
    fft: createFftPlan(plan.ofdm.ifftSize),
  };
}

/** Scratch buffers (2·N values each). */
export interface DemodulatorWorkspace {
  readonly timeIq: Float64Array;
  readonly freqIq: Float64Array;
}

/** Allocates the scratch buffers of `demodulateSymbol`. */
export function createDemodulatorWorkspace(plan: OfdmDemodulatorPlan): DemodulatorWorkspace {
  return { timeIq: new Float64Array(2 * plan.ifftSize), freqIq: new Float64Array(2 * plan.ifftSize) };
}

/**
 * Demodulates symbol `symbolIndex` whose first CP sample sits at `symbolStartSample` of `rxIq`.
 * Samples outside the record count as zero.
 * @param windowAdvanceSamples integer 0…N_cp: FFT window start before the end of the CP (0 = right after the CP)
 * @param outRowIq grid row, 2·12·N_RB values
 */
export function demodulateSymbol(
  plan: OfdmDemodulatorPlan,
  rxIq: Float64Array,
  symbolStartSample: number,
  symbolIndex: number,
  windowAdvanceSamples: number,
  work: DemodulatorWorkspace,
  outRowIq: Float64Array,
): Float64Array {
  const n = plan.ifftSize;
  const cp = plan.cpLengthsSamples[symbolIndex % plan.cpLengthsSamples.length]!;
  const a = windowAdvanceSamples;
  const first = symbolStartSample + cp - a;
  const numRx = rxIq.length / 2;
  const { timeIq, freqIq } = work;
  for (let m = 0; m < n; m++) {
    const j = first + m;
    let re = j >= 0 && j < numRx ? rxIq[2 * j]! : 0;
    let im = j >= 0 && j < numRx ? rxIq[2 * j + 1]! : 0;
    if (plan.halfSubcarrierShift) {
      const angle = (-Math.PI * (m - a)) / n;
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      const t = re * c - im * s;
      im = re * s + im * c;
      re = t;
    }
    timeIq[2 * m] = re;
    timeIq[2 * m + 1] = im;
  }
  fftForward(plan.fft, timeIq, freqIq);
  const phase = plan.symbolPhaseRad.length > 0 ? plan.symbolPhaseRad[symbolIndex % plan.symbolPhaseRad.length]! : 0;
  for (let k = 0; k < plan.numGridSubcarriers; k++) {
    const b = plan.bins[k]!;
    const angle = (2 * Math.PI * b * a) / n - phase;
    const c = Math.cos(angle) / n;
    const s = Math.sin(angle) / n;
    const re = freqIq[2 * b]!;
    const im = freqIq[2 * b + 1]!;
    outRowIq[2 * k] = re * c - im * s;
    outRowIq[2 * k + 1] = re * s + im * c;
  }
  return outRowIq;
}
