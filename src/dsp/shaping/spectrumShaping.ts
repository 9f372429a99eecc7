import { assertLength, DspError } from '../errors';
import { cos } from '../math/trig';

/**
 * Frequency-domain spectrum shaping (FDSS) of one DFT-s-OFDM block, as published for π/2-BPSK and SC-FDMA uplinks
 * (common practice; e.g. H. G. Myung, J. Lim & D. J. Goodman, IEEE Veh. Technol. Mag. 1(3):30–38, 2006, for RC pulse
 * shaping of SC-FDMA, and the 3GPP NR π/2-BPSK studies that let the UE shape its DFT output): the M DFT outputs z(k)
 * are optionally extended cyclically over E extra subcarriers (E/2 each side) and multiplied by a raised-cosine (RC)
 * or root-raised-cosine (RRC) window in frequency with roll-off β.
 * - With extension: Nyquist width W = M, E = 2·⌈βM/2⌉; the folded RC window sums to 1 on every bin (Nyquist), so an
 *   RRC transmitter plus RRC matched combining (`combineShapedSpectrum`) gives back z exactly. Extra bandwidth: E·Δf.
 * - Without extension: E = 0 and the window is fitted inside the allocation (W = M/(1 + β)): no extra bandwidth, but
 *   the edge subcarriers are attenuated and a receiver must equalise them.
 * Weights are scaled so that Σ w_i² = M: the mean power of the block is unchanged.
 * RC window of Nyquist width W at offset u from the block centre (in subcarriers):
 *   1 for |u| ≤ (1−β)W/2; ½[1 + cos(π/(βW)·(|u| − (1−β)W/2))] up to (1+β)W/2; 0 beyond. RRC is its square root.
 */
export interface SpectrumShapingPlan {
  readonly shape: 'rc' | 'rrc';
  readonly rollOff: number;
  /** M, the DFT size. */
  readonly dftSize: number;
  /** E, extra subcarriers (0 without extension). */
  readonly extensionSubcarriers: number;
  /** w_i for the M + E shaped subcarriers, lowest first. */
  readonly weights: Float64Array;
  /** DFT output index feeding shaped subcarrier i: (i − E/2) mod M. */
  readonly sourceIndex: Int32Array;
  /** Σ over shaped subcarriers fed by bin k of w_i², per k (M values), for combining. */
  readonly foldedEnergy: Float64Array;
}

/** Raised-cosine spectrum of Nyquist width `widthSubcarriers` and roll-off β at offset u (subcarriers). */
export function raisedCosineSpectrum(u: number, widthSubcarriers: number, rollOff: number): number {
  const a = Math.abs(u);
  const flat = ((1 - rollOff) * widthSubcarriers) / 2;
  const edge = ((1 + rollOff) * widthSubcarriers) / 2;
  if (a <= flat) return 1;
  if (a >= edge) return 0;
  return 0.5 * (1 + cos((Math.PI / (rollOff * widthSubcarriers)) * (a - flat)));
}

/** Builds the shaping plan for a block of `dftSize` subcarriers. */
export function createSpectrumShapingPlan(dftSize: number, shape: 'rc' | 'rrc', rollOff: number, extension: boolean): SpectrumShapingPlan {
  if (!Number.isInteger(dftSize) || dftSize < 1) throw new DspError('INTERNAL', `Shaping needs a positive DFT size; got ${dftSize}.`);
  if (!(rollOff >= 0 && rollOff <= 1)) {
    throw new DspError('INVALID_CONFIG', `spectrumShaping.rollOff must be from 0 to 1; got ${rollOff}.`, { field: 'spectrumShaping.rollOff' });
  }
  const m = dftSize;
  const e = extension ? 2 * Math.ceil((rollOff * m) / 2) : 0;
  const width = extension ? m : m / (1 + rollOff);
  const total = m + e;
  const weights = new Float64Array(total);
  const sourceIndex = new Int32Array(total);
  const centre = (total - 1) / 2;
  for (let i = 0; i < total; i++) {
    const rc = rollOff === 0 ? 1 : raisedCosineSpectrum(i - centre, width, rollOff);
    weights[i] = shape === 'rrc' ? Math.sqrt(rc) : rc;
    sourceIndex[i] = (((i - e / 2) % m) + m) % m;
  }
  let energy = 0;
  for (let i = 0; i < total; i++) energy += weights[i]! * weights[i]!;
  const scale = Math.sqrt(m / energy);
  const foldedEnergy = new Float64Array(m);
  for (let i = 0; i < total; i++) {
    weights[i]! *= scale;
    foldedEnergy[sourceIndex[i]!]! += weights[i]! * weights[i]!;
  }
  return { shape, rollOff, dftSize: m, extensionSubcarriers: e, weights, sourceIndex, foldedEnergy };
}

/**
 * Shapes one block: out_i = w_i · z(sourceIndex_i).
 * @param dftIq the M DFT outputs, 2M values; @param outIq 2(M + E) values
 */
export function applySpectrumShaping(plan: SpectrumShapingPlan, dftIq: Float64Array, outIq: Float64Array): Float64Array {
  assertLength(dftIq, 2 * plan.dftSize, 'Shaping input');
  assertLength(outIq, 2 * plan.weights.length, 'Shaping output');
  for (let i = 0; i < plan.weights.length; i++) {
    const k = plan.sourceIndex[i]!;
    const w = plan.weights[i]!;
    outIq[2 * i] = w * dftIq[2 * k]!;
    outIq[2 * i + 1] = w * dftIq[2 * k + 1]!;
  }
  return outIq;
}

/**
 * Receiver side: matched-filter combining of the shaped subcarriers back onto the M DFT bins,
 * ẑ(k) = Σ_{i→k} w_i·Y_i / Σ_{i→k} w_i² (exact inverse of `applySpectrumShaping` without noise; with RRC and
 * extension it is the matched filter, without extension a per-bin zero-forcing equaliser).
 * @param shapedIq 2(M + E) values; @param outIq 2M values
 */
export function combineShapedSpectrum(plan: SpectrumShapingPlan, shapedIq: Float64Array, outIq: Float64Array): Float64Array {
  assertLength(shapedIq, 2 * plan.weights.length, 'Combining input');
  assertLength(outIq, 2 * plan.dftSize, 'Combining output');
  outIq.fill(0);
  for (let i = 0; i < plan.weights.length; i++) {
    const k = plan.sourceIndex[i]!;
    const w = plan.weights[i]!;
    outIq[2 * k]! += w * shapedIq[2 * i]!;
    outIq[2 * k + 1]! += w * shapedIq[2 * i + 1]!;
  }
  for (let k = 0; k < plan.dftSize; k++) {
    const e = plan.foldedEnergy[k]!;
    outIq[2 * k]! /= e;
    outIq[2 * k + 1]! /= e;
  }
  return outIq;
}
