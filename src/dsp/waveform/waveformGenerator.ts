import type { WaveformConfig } from '../../config/schema';
import { openBitStream, type BitStream } from '../data/bitSource';
import { DspError } from '../errors';
import { bitsPerSymbol as bitsPerSymbolOf } from '../modulation/constellations';
import { mapBitsToSymbols } from '../modulation/mapper';
import { createDftSpreadPlan, spreadDft } from './transformPrecoding';
import { applySpectrumShaping } from '../shaping/spectrumShaping';
import { createOfdmWorkspace, ofdmModulateSymbol, symbolLengthValues, type OfdmWorkspace } from './ofdmModulator';
import { createWaveformPlan, dataSubcarriersOf, symbolLayoutOf, type SymbolLayout, type WaveformPlan } from './waveformPlan';
import type { FftPlan } from '../fft/fftPlan';
import { fillReferenceSignals } from '../reference/referenceSignalMapper';
import { RE_DATA } from './resourceKinds';

export { RE_DATA, RE_EMPTY, RE_REFERENCE } from './resourceKinds';

/** A run of consecutive OFDM symbols. */
export interface SymbolBatch {
  readonly firstSymbol: number;
  readonly numSymbols: number;
  /** Samples of these symbols, CP first, interleaved. */
  readonly waveformIq: Float64Array;
  /** a_{k',l}: numSymbols rows of 12·N_RB subcarriers, interleaved. */
  readonly gridIq: Float64Array;
  /** RE_EMPTY / RE_DATA / RE_REFERENCE per resource element, same layout as gridIq (one byte each). */
  readonly gridKinds: Uint8Array;
  /** Modulation symbols before DFT spreading, in fill order. */
  readonly dataSymbolsIq: Float64Array;
  /** Payload bits in fill order, one per byte. */
  readonly bits: Uint8Array;
}

/** Stateful generator: each `generate` call continues the data stream where the previous one stopped. */
export interface WaveformGenerator {
  readonly plan: WaveformPlan;
  /** Index of the next symbol `generate` will produce. */
  readonly nextSymbol: number;
  generate(numSymbols: number): SymbolBatch;
}

/** Opens a generator at symbol 0 of `plan` (the data source restarts from its seed/initial state). */
export function createWaveformGenerator(plan: WaveformPlan): WaveformGenerator {
  const bitStream: BitStream = openBitStream(plan.config.data);
  const workspace: OfdmWorkspace = createOfdmWorkspace(plan.ofdm);
  const spreadPlans = new Map<number, FftPlan>();
  if (plan.waveform === 'dft-s-ofdm') {
    for (const a of plan.allocations) spreadPlans.set(a.dataSubcarriers.length, createDftSpreadPlan(a.dataSubcarriers.length));
  }
  const maxBlock = Math.max(...plan.allocations.map((a) => a.dataSubcarriers.length));
  const spreadIq = new Float64Array(2 * maxBlock);
  const shapedIq = new Float64Array(2 * Math.max(...plan.allocations.map((a) => a.shaping?.subcarriers.length ?? 0)));
  const blockCounters = plan.allocations.map(() => 0);
  const k = plan.numerology.numGridSubcarriers;
  let next = 0;

  return {
    plan,
    get nextSymbol() {
      return next;
    },
    generate(numSymbols) {
      if (!Number.isInteger(numSymbols) || numSymbols < 0) {
        throw new DspError('INTERNAL', `generate() needs a whole, non-negative symbol count; got ${numSymbols}.`);
      }
      let totalValues = 0;
      let totalData = 0;
      let totalBits = 0;
      const period = plan.dataSymbolsPerSlotSymbol.length;
      for (let l = next; l < next + numSymbols; l++) {
        totalValues += symbolLengthValues(plan.ofdm, l);
        totalData += plan.dataSymbolsPerSlotSymbol[l % period]!;
        totalBits += plan.bitsPerSlotSymbol[l % period]!;
      }
      const waveformIq = new Float64Array(totalValues);
      const gridIq = new Float64Array(2 * k * numSymbols);
      const gridKinds = new Uint8Array(k * numSymbols);
      const dataSymbolsIq = new Float64Array(2 * totalData);
      const bits = new Uint8Array(totalBits);
      let sampleOffset = 0;
      let bitOffset = 0;
      let dataOffset = 0;
      for (let s = 0; s < numSymbols; s++) {
        const l = next + s;
        const row = gridIq.subarray(2 * k * s, 2 * k * (s + 1));
        const kinds = gridKinds.subarray(k * s, k * (s + 1));
        plan.allocations.forEach((a, blockIndex) => {
          const dataSubcarriers = dataSubcarriersOf(plan, l, blockIndex);
          const m = dataSubcarriers.length;
          // Reference-signal symbols of DFT-s-OFDM leave no data in the block (m = 0); OFDM ones may leave some.
          if (m === 0) return;
          const nBits = m * bitsPerSymbolOf(a.modulation);
          const blockBits = bitStream.fill(bits.subarray(bitOffset, bitOffset + nBits));
          const symbolsIq = dataSymbolsIq.subarray(2 * dataOffset, 2 * (dataOffset + m));
          mapBitsToSymbols(a.modulation, blockBits, symbolsIq, blockCounters[blockIndex]);
          blockCounters[blockIndex]! += m;
          let source: Float64Array = symbolsIq;
          if (plan.waveform === 'dft-s-ofdm') source = spreadDft(spreadPlans.get(m)!, symbolsIq, spreadIq.subarray(0, 2 * m));
          let subcarriers = dataSubcarriers;
          if (a.shaping) {
            subcarriers = a.shaping.subcarriers;
            source = applySpectrumShaping(a.shaping.plan, source, shapedIq.subarray(0, 2 * subcarriers.length));
          }
          const amp = a.amplitudeLinear;
          for (let i = 0; i < subcarriers.length; i++) {
            const g = subcarriers[i]!;
            row[2 * g] = source[2 * i]! * amp;
            row[2 * g + 1] = source[2 * i + 1]! * amp;
            kinds[g] = RE_DATA;
          }
          bitOffset += nBits;
          dataOffset += m;
        });
        fillReferenceSignals(plan.referenceSignals, l, row, kinds);
        const length = symbolLengthValues(plan.ofdm, l);
        ofdmModulateSymbol(plan.ofdm, l, row, workspace, waveformIq.subarray(sampleOffset, sampleOffset + length));
        sampleOffset += length;
      }
      const batch: SymbolBatch = { firstSymbol: next, numSymbols, waveformIq, gridIq, gridKinds, dataSymbolsIq, bits };
      next += numSymbols;
      return batch;
    },
  };
}

/** A whole configured waveform held in memory, with its layout. */
export interface GeneratedWaveform extends SymbolBatch {
  readonly plan: WaveformPlan;
  readonly sampleRateHz: number;
  readonly numSamples: number;
  readonly numGridSubcarriers: number;
  readonly symbolLayout: readonly SymbolLayout[];
  readonly warnings: readonly string[];
}

/** Largest waveform `generateWaveform` builds in memory (2^26 samples, 1 GiB of doubles); longer ones stream. */
export const MAX_IN_MEMORY_SAMPLES = 1 << 26;

/**
 * Generates all `config.symbols` symbols of a validated configuration in memory.
 * @throws DspError INVALID_CONFIG when the waveform exceeds MAX_IN_MEMORY_SAMPLES (use createWaveformGenerator in chunks)
 */
export function generateWaveform(config: WaveformConfig): GeneratedWaveform {
  const plan = createWaveformPlan(config);
  if (plan.numSamples > MAX_IN_MEMORY_SAMPLES) {
    throw new DspError(
      'INVALID_CONFIG',
      `symbols: ${config.symbols} symbols give ${plan.numSamples} samples, more than the ${MAX_IN_MEMORY_SAMPLES} held in memory at once; generate fewer symbols or stream the export.`,
      { field: 'symbols' },
    );
  }
  const batch = createWaveformGenerator(plan).generate(config.symbols);
  return {
    ...batch,
    plan,
    sampleRateHz: plan.sampleRateHz,
    numSamples: plan.numSamples,
    numGridSubcarriers: plan.numerology.numGridSubcarriers,
    symbolLayout: Array.from({ length: config.symbols }, (_, l) => symbolLayoutOf(plan, l)),
    warnings: plan.warnings,
  };
}
