import { applyFrequencyOffset } from '../channel/impairments';
import { DspError } from '../errors';
import { bitsPerSymbol, type Modulation } from '../modulation/constellations';
import { demapHard, demapMaxLogLlr } from '../modulation/demapper';
import { fillReferenceSignals } from '../reference/referenceSignalMapper';
import { RE_REFERENCE } from '../waveform/resourceKinds';
import { dataSubcarriersOf, symbolLayoutOf, type WaveformPlan } from '../waveform/waveformPlan';
import { estimateChannel, type ChannelEstimate } from './channelEstimation';
import { estimateResidualCfoHz } from './cfoRefinement';
import { estimateCpTimingAndCfo } from './cpSynchronisation';
import { equaliseBlock, type EqualizerKind } from './equalisation';
import { createDemodulatorWorkspace, createOfdmDemodulatorPlan, demodulateSymbol } from './ofdmDemodulator';

/**
 * The reference receiver (pure): CP-based timing and fractional CFO (van de Beek 1997) or known timing → CFO removal →
 * CP removal at a chosen FFT window position → FFT → least-squares channel estimate → ZF or MMSE equaliser → IDFT
 * de-spreading for DFT-s-OFDM → hard decisions and max-log LLRs. Outputs follow the generator's fill order, so bits
 * compare one to one with GeneratedWaveform.bits.
 *
 * Channel knowledge, by `channelEstimation`:
 * - 'reference': LS on the reference signals (needs referenceSignals on), interpolated in frequency and time.
 * - 'known-grid': data-aided LS on every known element of `transmittedGridIq` (the regenerated transmit grid), for
 *   data-only waveforms whose payload is known from the configuration.
 * - 'ideal': the channel is given (`idealChannel`, e.g. a simulator's true response), or taken as H = 1.
 */
export type ChannelEstimationMode = 'reference' | 'known-grid' | 'ideal';

/** Receiver settings; every one has a default. */
export interface ReceiverOptions {
  /** 'known' (default): the waveform starts `knownTimingOffsetSamples` into the record; 'cp': estimate it. */
  readonly timing?: 'known' | 'cp';
  readonly knownTimingOffsetSamples?: number;
  /**
   * CP search range θ = 0…max, samples (default: how much longer the record is than the waveform). CP correlation cannot
   * tell shifts of whole symbols apart when all CPs are equal (extended CP), so keep the range below one symbol there.
   */
  readonly maxTimingOffsetSamples?: number;
  /** Estimate and remove the fractional CFO from the CP (default: on with timing 'cp'). */
  readonly estimateCfo?: boolean;
  /** A known CFO to remove, Hz (used when the CFO is not estimated). */
  readonly knownCfoHz?: number;
  /**
   * Refine the CP-based CFO from the phase drift between pilot symbols (cfoRefinement.ts); default on whenever the CFO is
   * estimated and the channel is estimated from pilots.
   */
  readonly refineCfo?: boolean;
  /** FFT window start before the end of each CP, integer 0…shortest CP (default 0). */
  readonly windowAdvanceSamples?: number;
  readonly channelEstimation?: ChannelEstimationMode;
  /** Regenerated transmit grid a_{k',l} (numSymbols × 12·N_RB, interleaved), for 'known-grid'. */
  readonly transmittedGridIq?: Float64Array;
  /** For 'ideal': writes H(k', l) of symbol l into a 2·12·N_RB row. */
  readonly idealChannel?: (symbolIndex: number, outRowIq: Float64Array) => void;
  /** Frequency smoothing length over neighbouring pilots (default 7). */
  readonly frequencyWindow?: number;
  readonly timeInterpolation?: 'linear' | 'average';
  readonly equalizer?: EqualizerKind;
  /** Noise variance per resource element on the receiver's scale (default: estimated from the pilots). */
  readonly noiseVariance?: number;
  readonly computeLlr?: boolean;
  /** SNR used in the van de Beek ρ (default 20 dB). */
  readonly snrDbForTiming?: number;
}

/** Everything the receiver found, in the generator's layouts. */
export interface ReceiverResult {
  readonly timingOffsetSamples: number;
  readonly cfoHz: number;
  readonly channelEstimation: ChannelEstimationMode;
  /** How the channel was obtained, for reports. */
  readonly channelEstimationNote: string;
  readonly equalizer: EqualizerKind;
  readonly windowAdvanceSamples: number;
  readonly numSymbols: number;
  /** Y(k', l) after synchronisation, numSymbols × 12·N_RB. */
  readonly rxGridIq: Float64Array;
  /** Ĥ(k', l), same layout. */
  readonly channelIq: Float64Array;
  /** Equalised frequency-domain value of every data element (0 elsewhere), same layout. */
  readonly equalisedGridIq: Float64Array;
  /** Equalised (and de-spread) data symbols in fill order. */
  readonly dataSymbolsIq: Float64Array;
  /** Post-equaliser noise variance of each data symbol. */
  readonly symbolNoiseVariance: Float64Array;
  /** Hard decisions in fill order. */
  readonly bits: Uint8Array;
  readonly llr: Float64Array | undefined;
  /** Noise variance per resource element used or estimated (NaN when unknown). */
  readonly noiseVariancePerRe: number;
  readonly warnings: string[];
}

/**
 * Demodulates `rxIq`, a recording of `plan`'s waveform (it may start later in the record, carry a CFO, a channel and noise).
 * @throws DspError INVALID_CONFIG for 'reference' without reference signals or a window advance outside the CP,
 *   LENGTH_MISMATCH for a known grid of the wrong size, INVALID_FILE when the record cannot hold one symbol (CP timing)
 */
export function receiveWaveform(plan: WaveformPlan, rxIq: Float64Array, options: ReceiverOptions = {}): ReceiverResult {
  const warnings: string[] = [];
  const numSymbols = plan.config.symbols;
  const k = plan.numerology.numGridSubcarriers;
  const rsOn = plan.referenceSignals.kind !== 'none';
  const mode: ChannelEstimationMode = options.channelEstimation ?? (rsOn ? 'reference' : options.transmittedGridIq ? 'known-grid' : 'ideal');
  if (mode === 'reference' && !rsOn) {
    throw new DspError('INVALID_CONFIG', 'Channel estimation "reference" needs reference signals: set referenceSignals.enabled, or use the known grid or an ideal channel.', {
      field: 'referenceSignals.enabled',
    });
  }
  if (mode === 'known-grid' && options.transmittedGridIq?.length !== 2 * k * numSymbols) {
    throw new DspError('LENGTH_MISMATCH', `Known-grid estimation needs the transmitted grid of ${numSymbols} × ${k} elements.`);
  }
  const layout = Array.from({ length: numSymbols }, (_, l) => symbolLayoutOf(plan, l));
  const minCp = Math.min(...plan.ofdm.cpLengthsSamples);
  const advance = options.windowAdvanceSamples ?? 0;
  if (!Number.isInteger(advance) || advance < 0 || advance > minCp) {
    throw new DspError('INVALID_CONFIG', `FFT window advance ${advance} samples must be a whole number from 0 to ${minCp} (the shortest cyclic prefix).`, {
      field: 'windowAdvanceSamples',
    });
  }

  // 1. Timing and fractional CFO.
  const numRx = rxIq.length / 2;
  let timing = options.knownTimingOffsetSamples ?? 0;
  let cfoSubcarriers = 0;
  const useCp = options.timing === 'cp';
  if (useCp) {
    const sync = estimateCpTimingAndCfo(rxIq, {
      symbols: layout,
      fftSize: plan.ofdm.ifftSize,
      cpSign: plan.numerology.halfSubcarrierShift ? -1 : 1,
      maxOffsetSamples: options.maxTimingOffsetSamples ?? Math.max(numRx - plan.numSamples, 0),
      snrDb: options.snrDbForTiming ?? 20,
    });
    timing = sync.timingOffsetSamples;
    if (options.estimateCfo ?? true) cfoSubcarriers = sync.cfoSubcarriers;
  }
  let cfoHz = useCp && (options.estimateCfo ?? true) ? cfoSubcarriers * plan.numerology.subcarrierSpacingHz : (options.knownCfoHz ?? 0);
  const lastEnd = timing + plan.numSamples;
  if (lastEnd > numRx) warnings.push(`The record ends ${lastEnd - numRx} samples before the waveform does; missing samples count as zero.`);

  // 2. CFO removal, CP removal and FFT; with pilots, a second pass removes the residual CFO they reveal.
  const demod = createOfdmDemodulatorPlan(plan);
  const work = createDemodulatorWorkspace(demod);
  const rxGridIq = new Float64Array(2 * k * numSymbols);
  const demodulateAll = (offsetHz: number): void => {
    // r[n]·e^{−j2πΔf(n − n0)/f_s}: the offset removed with its phase referenced to the waveform start n0 = timing.
    const signalIq = offsetHz === 0 ? rxIq : applyFrequencyOffset(rxIq, -offsetHz, plan.sampleRateHz, new Float64Array(rxIq.length), -timing);
    for (let l = 0; l < numSymbols; l++) {
      demodulateSymbol(demod, signalIq, timing + layout[l]!.startSample, l, advance, work, rxGridIq.subarray(2 * k * l, 2 * k * (l + 1)));
    }
  };
  demodulateAll(cfoHz);
  const pilots = mode === 'ideal' ? undefined : buildPilots(plan, mode, options, numSymbols);
  if (pilots && (options.refineCfo ?? (useCp && (options.estimateCfo ?? true)))) {
    const times = layout.map((s) => s.startSample / plan.sampleRateHz);
    const residualHz = estimateResidualCfoHz(rxGridIq, pilots.pilotGridIq, pilots.pilotMask, k, times);
    if (residualHz !== 0) {
      cfoHz += residualHz;
      demodulateAll(cfoHz);
    }
  }

  // 3. Channel.
  const { channelIq, noiseVariance: estimatedNoise, note } = obtainChannel(plan, mode, rxGridIq, options, numSymbols, pilots);
  const noiseVariancePerRe = options.noiseVariance ?? estimatedNoise;
  const equalizer: EqualizerKind = options.equalizer ?? 'zf';
  if (equalizer === 'mmse' && !Number.isFinite(noiseVariancePerRe)) warnings.push('MMSE needs a noise variance; none was given or estimated, so ZF was used.');

  // 4. Equalise, de-spread, decide.
  const equalisedGridIq = new Float64Array(2 * k * numSymbols);
  const dataSymbolsIq = new Float64Array(2 * plan.numDataSymbols);
  const symbolNoiseVariance = new Float64Array(plan.numDataSymbols);
  const bits = new Uint8Array(plan.numBits);
  const llr = options.computeLlr ? new Float64Array(plan.numBits) : undefined;
  const counters = plan.allocations.map(() => 0);
  let dataOffset = 0;
  let bitOffset = 0;
  for (let l = 0; l < numSymbols; l++) {
    plan.allocations.forEach((a, b) => {
      const sc = dataSubcarriersOf(plan, l, b);
      const m = sc.length;
      if (m === 0) return;
      const y = new Float64Array(2 * m);
      const g = new Float64Array(2 * m);
      for (let i = 0; i < m; i++) {
        const e = 2 * (k * l + sc[i]!);
        y[2 * i] = rxGridIq[e]!;
        y[2 * i + 1] = rxGridIq[e + 1]!;
        g[2 * i] = channelIq[e]! * a.amplitudeLinear;
        g[2 * i + 1] = channelIq[e + 1]! * a.amplitudeLinear;
      }
      const symbols = dataSymbolsIq.subarray(2 * dataOffset, 2 * (dataOffset + m));
      const freq = new Float64Array(2 * m);
      const variances = symbolNoiseVariance.subarray(dataOffset, dataOffset + m);
      equaliseBlock(equalizer, y, g, noiseVariancePerRe, plan.waveform === 'dft-s-ofdm', symbols, freq, variances);
      for (let i = 0; i < m; i++) {
        const e = 2 * (k * l + sc[i]!);
        equalisedGridIq[e] = freq[2 * i]!;
        equalisedGridIq[e + 1] = freq[2 * i + 1]!;
      }
      const nBits = m * bitsPerSymbol(a.modulation);
      demapHard(a.modulation, symbols, bits.subarray(bitOffset, bitOffset + nBits), counters[b]);
      if (llr) demapWithVariances(a.modulation, symbols, variances, counters[b]!, llr.subarray(bitOffset, bitOffset + nBits));
      counters[b]! += m;
      dataOffset += m;
      bitOffset += nBits;
    });
  }
  return {
    timingOffsetSamples: timing,
    cfoHz,
    channelEstimation: mode,
    channelEstimationNote: note,
    equalizer: equalizer === 'mmse' && Number.isFinite(noiseVariancePerRe) ? 'mmse' : 'zf',
    windowAdvanceSamples: advance,
    numSymbols,
    rxGridIq,
    channelIq,
    equalisedGridIq,
    dataSymbolsIq,
    symbolNoiseVariance,
    bits,
    llr,
    noiseVariancePerRe,
    warnings,
  };
}

interface Pilots {
  readonly pilotGridIq: Float64Array;
  readonly pilotMask: Uint8Array;
}

/** The known elements: the reference signals ('reference') or every non-empty element of the transmitted grid. */
function buildPilots(plan: WaveformPlan, mode: ChannelEstimationMode, options: ReceiverOptions, numSymbols: number): Pilots {
  const k = plan.numerology.numGridSubcarriers;
  const pilotGridIq = new Float64Array(2 * k * numSymbols);
  const pilotMask = new Uint8Array(k * numSymbols);
  if (mode === 'reference') {
    const kinds = new Uint8Array(k);
    for (let l = 0; l < numSymbols; l++) {
      kinds.fill(0);
      const row = pilotGridIq.subarray(2 * k * l, 2 * k * (l + 1));
      fillReferenceSignals(plan.referenceSignals, l, row, kinds);
      for (let i = 0; i < k; i++) if (kinds[i] === RE_REFERENCE) pilotMask[k * l + i] = 1;
    }
  } else {
    const grid = options.transmittedGridIq!;
    pilotGridIq.set(grid);
    for (let i = 0; i < pilotMask.length; i++) if (grid[2 * i] !== 0 || grid[2 * i + 1] !== 0) pilotMask[i] = 1;
  }
  return { pilotGridIq, pilotMask };
}

function obtainChannel(
  plan: WaveformPlan,
  mode: ChannelEstimationMode,
  rxGridIq: Float64Array,
  options: ReceiverOptions,
  numSymbols: number,
  pilots: Pilots | undefined,
): { channelIq: Float64Array; noiseVariance: number; note: string } {
  const k = plan.numerology.numGridSubcarriers;
  if (mode === 'ideal' || !pilots) {
    const channelIq = new Float64Array(2 * k * numSymbols);
    for (let l = 0; l < numSymbols; l++) {
      const row = channelIq.subarray(2 * k * l, 2 * k * (l + 1));
      if (options.idealChannel) options.idealChannel(l, row);
      else for (let i = 0; i < row.length; i += 2) row[i] = 1;
    }
    return {
      channelIq,
      noiseVariance: Number.NaN,
      note: options.idealChannel ? 'ideal channel knowledge (the simulated channel response)' : 'ideal channel assumed (H = 1, no estimation)',
    };
  }
  const { pilotGridIq, pilotMask } = pilots;
  const groups =
    mode === 'reference' && plan.referenceSignals.kind === 'lte-crs'
      ? [{ firstSubcarrier: 0, numSubcarriers: k }]
      : plan.allocations.map((a) => ({ firstSubcarrier: 12 * a.startRb, numSubcarriers: 12 * a.numRb }));
  const estimate: ChannelEstimate = estimateChannel({
    numSymbols,
    numSubcarriers: k,
    rxGridIq,
    pilotGridIq,
    pilotMask,
    groups,
    frequencyWindow: options.frequencyWindow ?? 7,
    timeInterpolation: options.timeInterpolation ?? 'linear',
  });
  const how = `LS over ${options.frequencyWindow ?? 7} pilots in frequency, ${options.timeInterpolation ?? 'linear'} in time`;
  return {
    channelIq: estimate.channelIq,
    noiseVariance: estimate.noiseVariance,
    note:
      mode === 'reference'
        ? `estimated from the reference signals (${plan.referenceSignals.description}; ${how})`
        : `data-aided: estimated from the known transmitted grid, reference signals off (${how})`,
  };
}

/** Max-log LLRs with a per-symbol noise variance: LLRs scale as 1/N0, so compute with N0 = 1 and divide. */
function demapWithVariances(modulation: Modulation, symbolsIq: Float64Array, variances: Float64Array, first: number, out: Float64Array): void {
  demapMaxLogLlr(modulation, symbolsIq, 1, out, first);
  const m = bitsPerSymbol(modulation);
  for (let s = 0; s < variances.length; s++) {
    const v = variances[s]!;
    const scale = Number.isFinite(v) && v > 0 ? 1 / v : 1;
    for (let i = 0; i < m; i++) out[s * m + i] = out[s * m + i]! * scale;
  }
}
