import { DspError } from '../errors';

/**
 * Least-squares channel estimation on known elements, with interpolation across frequency and time (common practice):
 * 1. Ĥ_LS(k, l) = Y(k, l)/X(k, l) on every pilot element (reference signals, or all known elements).
 * 2. Per pilot symbol and frequency group (an allocation block, or the whole grid for cell-wide CRS), a sliding LS fit
 *    over `frequencyWindow` neighbouring pilots (shortened symmetrically at the edges), Ĥ_i = Σ_j Y_j X_j* / Σ_j |X_j|²
 *    — the plain average of Y/X for constant-modulus reference signals, and a weighted one for known data whose
 *    amplitude varies — then linear interpolation to every subcarrier of the group between pilots and a flat hold
 *    beyond the outer ones.
 * 3. Across symbols: 'linear' interpolation between pilot symbols (flat hold before the first and after the last), or
 *    'average' over all pilot symbols, the static-channel estimate of TS 36.101 Annex F (time averaging of the
 *    reference-symbol ratios).
 * The noise variance per element is estimated from the pilot residuals |Y − Ĥ·X|², corrected for the W/(W − 1) the moving
 * average takes out (for W = 1, from differences of neighbouring pilots).
 */
export interface ChannelEstimationInput {
  readonly numSymbols: number;
  readonly numSubcarriers: number;
  /** Received grid Y, numSymbols × numSubcarriers, interleaved. */
  readonly rxGridIq: Float64Array;
  /** Known transmitted values X at the pilots (others ignored), same layout. */
  readonly pilotGridIq: Float64Array;
  /** 1 where an element is a pilot, same layout (one byte each). */
  readonly pilotMask: Uint8Array;
  /** Subcarrier ranges [first, first + count) estimated jointly. */
  readonly groups: readonly { readonly firstSubcarrier: number; readonly numSubcarriers: number }[];
  /** Moving-average length over neighbouring pilots (odd ≥ 1). */
  readonly frequencyWindow: number;
  readonly timeInterpolation: 'linear' | 'average';
}

/** Result of `estimateChannel`. */
export interface ChannelEstimate {
  /** Ĥ(k, l), numSymbols × numSubcarriers, interleaved (0 outside the groups). */
  readonly channelIq: Float64Array;
  /** Estimated noise variance per resource element (same scale as Y); NaN when it cannot be estimated. */
  readonly noiseVariance: number;
  readonly numPilots: number;
  /** Symbols that held pilots. */
  readonly pilotSymbols: readonly number[];
}

/**
 * Runs steps 1–3 above.
 * @throws DspError INTERNAL when no element is marked as a pilot
 */
export function estimateChannel(input: ChannelEstimationInput): ChannelEstimate {
  const { numSymbols, numSubcarriers: k, rxGridIq, pilotGridIq, pilotMask, groups } = input;
  const w = Math.max(1, Math.floor(input.frequencyWindow));
  const perSymbol: (Float64Array | undefined)[] = new Array(numSymbols);
  const pilotSymbols: number[] = [];
  let residual = 0;
  let residualCount = 0;
  let numPilots = 0;
  for (let l = 0; l < numSymbols; l++) {
    let rowEstimate: Float64Array | undefined;
    for (const g of groups) {
      const positions: number[] = [];
      for (let sc = g.firstSubcarrier; sc < g.firstSubcarrier + g.numSubcarriers; sc++) if (pilotMask[l * k + sc]) positions.push(sc);
      if (positions.length === 0) continue;
      rowEstimate ??= new Float64Array(2 * k);
      numPilots += positions.length;
      const ls = new Float64Array(2 * positions.length);
      positions.forEach((sc, i) => {
        const e = 2 * (l * k + sc);
        const [re, im] = divide(rxGridIq[e]!, rxGridIq[e + 1]!, pilotGridIq[e]!, pilotGridIq[e + 1]!);
        ls[2 * i] = re;
        ls[2 * i + 1] = im;
      });
      const smooth = w > 1 ? slidingLeastSquares(l * k, positions, rxGridIq, pilotGridIq, w) : ls;
      positions.forEach((sc, i) => {
        const e = 2 * (l * k + sc);
        const xRe = pilotGridIq[e]!;
        const xIm = pilotGridIq[e + 1]!;
        if (w > 1) {
          const dRe = rxGridIq[e]! - (smooth[2 * i]! * xRe - smooth[2 * i + 1]! * xIm);
          const dIm = rxGridIq[e + 1]! - (smooth[2 * i]! * xIm + smooth[2 * i + 1]! * xRe);
          residual += dRe * dRe + dIm * dIm;
          residualCount++;
        } else if (i > 0) {
          // Neighbouring LS values differ by two independent noise terms (and little channel change).
          const p = 2 * (l * k + positions[i - 1]!);
          const pPow = pilotGridIq[p]! ** 2 + pilotGridIq[p + 1]! ** 2;
          const xPow = xRe * xRe + xIm * xIm;
          const dRe = ls[2 * i]! - ls[2 * i - 2]!;
          const dIm = ls[2 * i + 1]! - ls[2 * i - 1]!;
          residual += ((dRe * dRe + dIm * dIm) / 2) * ((2 * pPow * xPow) / (pPow + xPow));
          residualCount++;
        }
      });
      interpolateFrequency(positions, smooth, g.firstSubcarrier, g.numSubcarriers, rowEstimate);
    }
    if (rowEstimate) {
      perSymbol[l] = rowEstimate;
      pilotSymbols.push(l);
    }
  }
  if (pilotSymbols.length === 0) {
    throw new DspError('INTERNAL', 'Channel estimation found no pilot elements: reference signals or a known grid are needed.');
  }
  const channelIq = new Float64Array(2 * k * numSymbols);
  if (input.timeInterpolation === 'average') {
    const mean = new Float64Array(2 * k);
    for (const l of pilotSymbols) for (let i = 0; i < mean.length; i++) mean[i] = mean[i]! + perSymbol[l]![i]! / pilotSymbols.length;
    for (let l = 0; l < numSymbols; l++) channelIq.set(mean, 2 * k * l);
  } else {
    let next = 0;
    for (let l = 0; l < numSymbols; l++) {
      while (next < pilotSymbols.length && pilotSymbols[next]! < l) next++;
      const after = pilotSymbols[Math.min(next, pilotSymbols.length - 1)]!;
      const before = pilotSymbols[Math.max(0, pilotSymbols[next] === l ? next : next - 1)]!;
      const out = channelIq.subarray(2 * k * l, 2 * k * (l + 1));
      if (before === after || l <= before) out.set(perSymbol[before]!);
      else if (l >= after) out.set(perSymbol[after]!);
      else {
        const t = (l - before) / (after - before);
        const a = perSymbol[before]!;
        const b = perSymbol[after]!;
        for (let i = 0; i < out.length; i++) out[i] = (1 - t) * a[i]! + t * b[i]!;
      }
    }
  }
  const gain = w > 1 ? w / (w - 1) : 1;
  return {
    channelIq,
    noiseVariance: residualCount > 0 ? (gain * residual) / residualCount : Number.NaN,
    numPilots,
    pilotSymbols,
  };
}

function divide(aRe: number, aIm: number, bRe: number, bIm: number): [number, number] {
  const d = bRe * bRe + bIm * bIm;
  return [(aRe * bRe + aIm * bIm) / d, (aIm * bRe - aRe * bIm) / d];
}

/** Ĥ_i = Σ_j Y_j X_j* / Σ_j |X_j|² over a centred window of w pilots that shrinks symmetrically at the edges. */
function slidingLeastSquares(rowBase: number, positions: readonly number[], rxIq: Float64Array, pilotIq: Float64Array, w: number): Float64Array {
  const count = positions.length;
  const half = Math.floor(w / 2);
  const out = new Float64Array(2 * count);
  for (let i = 0; i < count; i++) {
    const reach = Math.min(half, i, count - 1 - i);
    let re = 0;
    let im = 0;
    let energy = 0;
    for (let j = i - reach; j <= i + reach; j++) {
      const e = 2 * (rowBase + positions[j]!);
      const yRe = rxIq[e]!;
      const yIm = rxIq[e + 1]!;
      const xRe = pilotIq[e]!;
      const xIm = pilotIq[e + 1]!;
      re += yRe * xRe + yIm * xIm;
      im += yIm * xRe - yRe * xIm;
      energy += xRe * xRe + xIm * xIm;
    }
    out[2 * i] = re / energy;
    out[2 * i + 1] = im / energy;
  }
  return out;
}

function interpolateFrequency(positions: readonly number[], valuesIq: Float64Array, first: number, count: number, rowIq: Float64Array): void {
  let p = 0;
  for (let sc = first; sc < first + count; sc++) {
    while (p + 1 < positions.length && positions[p + 1]! <= sc) p++;
    const left = positions[p]!;
    if (sc <= left || p + 1 >= positions.length) {
      rowIq[2 * sc] = valuesIq[2 * p]!;
      rowIq[2 * sc + 1] = valuesIq[2 * p + 1]!;
      continue;
    }
    const right = positions[p + 1]!;
    const t = (sc - left) / (right - left);
    rowIq[2 * sc] = (1 - t) * valuesIq[2 * p]! + t * valuesIq[2 * p + 2]!;
    rowIq[2 * sc + 1] = (1 - t) * valuesIq[2 * p + 1]! + t * valuesIq[2 * p + 3]!;
  }
}
