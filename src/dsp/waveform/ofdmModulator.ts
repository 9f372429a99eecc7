import { assertLength } from '../errors';
import { createFftPlan, ifftRaw, type FftPlan } from '../fft/fftPlan';
import type { Numerology } from '../numerology/numerology';
import { gridToIfftBins } from './subcarrierLayout';
import { cos, sin } from '../math/trig';

/**
 * OFDM symbol synthesis exactly as the standards' baseband formulas, evaluated at t = n·Ts/os over the whole
 * extended symbol (cyclic prefix included):
 *   LTE downlink (TS 36.211 §6.12): s_l(t) = Σ_k a_k e^{j2πkΔf(t − N_CP,l·Ts)}, DC unused;
 *   LTE uplink (TS 36.211 §5.6):    s_l(t) = Σ_k a_k e^{j2π(k+1/2)Δf(t − N_CP,l·Ts)};
 *   NR (TS 38.211 §5.3.1):           s_l(t) = Σ_k a_k e^{j2π(k − N_sc/2)Δf(t − N_CP,l·Tc − t_start,l)}.
 * With N_os = fftSize·os: an unscaled N_os-point IFFT of a_k placed at bin k mod N_os gives the periodic part;
 * sample n of the extended symbol is IFFT[(n − N_cp) mod N_os]. The LTE uplink's half-subcarrier term is the
 * ramp e^{jπ(n − N_cp)/N_os}, referenced to the first sample after the CP. Given a carrier f0, NR multiplies
 * symbol l of each subframe by e^{−j2πf0(t_start,l + N_CP,l·Tc)} (TS 38.211 §5.4).
 */
export interface OfdmPlan {
  readonly ifftSize: number;
  readonly oversampling: number;
  /** CP lengths at the output rate, one per symbol of the CP pattern's period. */
  readonly cpLengthsSamples: readonly number[];
  /** IFFT bin of each grid subcarrier. */
  readonly bins: Int32Array;
  readonly numGridSubcarriers: number;
  readonly fft: FftPlan;
  /** Half-subcarrier ramps e^{jπ(n − N_cp)/N_os}, one interleaved table per CP-pattern entry (LTE uplink), else empty. */
  readonly rampsIq: readonly Float64Array[];
  /** NR §5.4 phase per symbol of a subframe, rad (empty when no carrier is given or not NR). */
  readonly symbolPhaseRad: Float64Array;
}

const rampCache = new Map<string, Float64Array>();
const RAMP_CACHE_ENTRIES = 16;

/** e^{jπ(m − cp)/N}, m = 0 … cp + N − 1, interleaved re, im; cached per (N, cp). Callers must not write to it. */
function halfShiftRamp(ifftSize: number, cp: number): Float64Array {
  const key = `${ifftSize}:${cp}`;
  const hit = rampCache.get(key);
  if (hit !== undefined) return hit;
  const ramp = new Float64Array(2 * (cp + ifftSize));
  for (let n = 0; n < cp + ifftSize; n++) {
    const angle = (Math.PI * (n - cp)) / ifftSize;
    ramp[2 * n] = cos(angle);
    ramp[2 * n + 1] = sin(angle);
  }
  if (rampCache.size >= RAMP_CACHE_ENTRIES) rampCache.clear();
  rampCache.set(key, ramp);
  return ramp;
}

/**
 * Precomputes the synthesis of `numerology` at `oversampling`: IFFT size N·os, CP lengths at the output rate,
 * bin of each grid subcarrier, the LTE uplink ramps and the NR §5.4 phases (formulas on OfdmPlan above).
 * @param oversampling whole factor os ≥ 1 (validated by the configuration schema)
 * @param carrierFrequencyHz f0 for the NR upconversion phase (TS 38.211 §5.4); none applied when omitted
 */
export function createOfdmPlan(numerology: Numerology, oversampling: number, carrierFrequencyHz?: number): OfdmPlan {
  const ifftSize = numerology.fftSize * oversampling;
  const cpLengthsSamples = numerology.cpPatternSamples.map((c) => c * oversampling);
  let rampsIq: Float64Array[] = [];
  if (numerology.halfSubcarrierShift) {
    // e^{jπ(n − cp)/N} for n = 0 … cp + N − 1 is, for every cp, a tail of the ramp of the longest CP (same integer
    // n − cp, so the same bits): one ramp per (N, longest CP), cached, and views of it.
    const longestCp = Math.max(...cpLengthsSamples);
    const full = halfShiftRamp(ifftSize, longestCp);
    rampsIq = cpLengthsSamples.map((cp) => full.subarray(2 * (longestCp - cp)));
  }
  let symbolPhaseRad = new Float64Array(0);
  if (numerology.standard === 'nr' && carrierFrequencyHz !== undefined) {
    const sampleRateHz = numerology.sampleRateHz * oversampling;
    const symbolsPerSubframe = Math.round(numerology.symbolsPerSlot * (numerology.subcarrierSpacingHz / 15000));
    symbolPhaseRad = new Float64Array(symbolsPerSubframe);
    const cyclesPerSample = carrierFrequencyHz / sampleRateHz;
    let start = 0;
    for (let l = 0; l < symbolsPerSubframe; l++) {
      const cp = cpLengthsSamples[l % cpLengthsSamples.length]!;
      const cycles = cyclesPerSample * (start + cp);
      symbolPhaseRad[l] = -2 * Math.PI * (cycles - Math.floor(cycles));
      start += cp + ifftSize;
    }
  }
  return {
    ifftSize,
    oversampling,
    cpLengthsSamples,
    bins: gridToIfftBins(numerology, ifftSize),
    numGridSubcarriers: numerology.numGridSubcarriers,
    fft: createFftPlan(ifftSize),
    rampsIq,
    symbolPhaseRad,
  };
}

/** Scratch buffers for `ofdmModulateSymbol`, reused across symbols (2·ifftSize values each). */
export interface OfdmWorkspace {
  readonly freqIq: Float64Array;
  readonly timeIq: Float64Array;
}

/** Allocates the scratch buffers of `ofdmModulateSymbol` for `plan` (2·ifftSize values each). */
export function createOfdmWorkspace(plan: OfdmPlan): OfdmWorkspace {
  return { freqIq: new Float64Array(2 * plan.ifftSize), timeIq: new Float64Array(2 * plan.ifftSize) };
}

/** Output length in values (2 × samples) of symbol `symbolIndex`. */
export function symbolLengthValues(plan: OfdmPlan, symbolIndex: number): number {
  return 2 * (plan.ifftSize + plan.cpLengthsSamples[symbolIndex % plan.cpLengthsSamples.length]!);
}

/**
 * Synthesises OFDM symbol `symbolIndex` (counted from slot 0's first symbol) from its grid row.
 * @param gridRowIq a_{k',l} for k' = 0…12·N_RB−1, interleaved (2·numGridSubcarriers values)
 * @param outIq the extended symbol, 2·(N_cp + N_os) values, CP first
 */
export function ofdmModulateSymbol(
  plan: OfdmPlan,
  symbolIndex: number,
  gridRowIq: Float64Array,
  work: OfdmWorkspace,
  outIq: Float64Array,
): Float64Array {
  const pattern = symbolIndex % plan.cpLengthsSamples.length;
  const cp = plan.cpLengthsSamples[pattern]!;
  const n = plan.ifftSize;
  assertLength(gridRowIq, 2 * plan.numGridSubcarriers, 'Grid row');
  assertLength(outIq, 2 * (cp + n), `Symbol ${symbolIndex} output`);
  const { freqIq, timeIq } = work;
  freqIq.fill(0);
  const bins = plan.bins;
  for (let g = 0; g < bins.length; g++) {
    const b = 2 * bins[g]!;
    freqIq[b] = gridRowIq[2 * g]!;
    freqIq[b + 1] = gridRowIq[2 * g + 1]!;
  }
  ifftRaw(plan.fft, freqIq, timeIq);
  // CP = the last N_cp samples of the periodic part, then the whole period.
  outIq.set(timeIq.subarray(2 * (n - cp)), 0);
  outIq.set(timeIq, 2 * cp);
  const ramp = plan.rampsIq[pattern];
  if (ramp) rotateBy(outIq, ramp);
  if (plan.symbolPhaseRad.length > 0) {
    const phase = plan.symbolPhaseRad[symbolIndex % plan.symbolPhaseRad.length]!;
    rotateByConstant(outIq, cos(phase), sin(phase));
  }
  return outIq;
}

function rotateBy(iq: Float64Array, phasorIq: Float64Array): void {
  for (let i = 0; i < iq.length; i += 2) {
    const re = iq[i]!;
    const im = iq[i + 1]!;
    const c = phasorIq[i]!;
    const s = phasorIq[i + 1]!;
    iq[i] = re * c - im * s;
    iq[i + 1] = re * s + im * c;
  }
}

function rotateByConstant(iq: Float64Array, c: number, s: number): void {
  for (let i = 0; i < iq.length; i += 2) {
    const re = iq[i]!;
    const im = iq[i + 1]!;
    iq[i] = re * c - im * s;
    iq[i + 1] = re * s + im * c;
  }
}
