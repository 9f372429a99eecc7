import type { WaveformConfig } from '../../config/schema';
import { DspError } from '../errors';
import { bitsPerSymbol } from '../modulation/constellations';
import { resolveNumerology, type Numerology } from '../numerology/numerology';
import { createReferenceSignalPlan, type ReferenceSignalPlan } from '../reference/referenceSignalPlan';
import { resolveAllocations, type AllocationPlan } from './allocation';
import { createOfdmPlan, type OfdmPlan } from './ofdmModulator';
import { attachSpectrumShaping } from '../shaping/blockShaping';

/** Layout of one OFDM symbol in the generated sample stream (all lengths at the output rate, oversampling included). */
export interface SymbolLayout {
  readonly symbolIndex: number;
  readonly slotIndex: number;
  readonly startSample: number;
  readonly cpLengthSamples: number;
  /** Useful-part length = IFFT size = fftSize × oversampling. */
  readonly fftSize: number;
}

/** Everything needed to generate a configuration's waveform, resolved once. Plain data. */
export interface WaveformPlan {
  readonly config: WaveformConfig;
  readonly waveform: 'ofdm' | 'dft-s-ofdm';
  readonly numerology: Numerology;
  readonly ofdm: OfdmPlan;
  readonly allocations: readonly AllocationPlan[];
  /** Data symbols (before spreading) of an OFDM symbol without reference signals, over all blocks. */
  readonly dataSymbolsPerOfdmSymbol: number;
  /** Bits of an OFDM symbol without reference signals. */
  readonly bitsPerOfdmSymbol: number;
  /** Reference signals (kind 'none' when off) and the data subcarriers left in each symbol of a slot. */
  readonly referenceSignals: ReferenceSignalPlan;
  /** Data symbols in symbol l of any slot, indexed by l mod symbolsPerSlot (equal to dataSymbolsPerOfdmSymbol without RS). */
  readonly dataSymbolsPerSlotSymbol: readonly number[];
  /** Bits in symbol l of any slot, indexed by l mod symbolsPerSlot. */
  readonly bitsPerSlotSymbol: readonly number[];
  /** Data symbols of the whole configuration (config.symbols OFDM symbols). */
  readonly numDataSymbols: number;
  /** Payload bits of the whole configuration. */
  readonly numBits: number;
  readonly numSamples: number;
  readonly sampleRateHz: number;
  readonly warnings: readonly string[];
}

/** The waveform a configuration asks for: its own, or the link's default (uplink DFT-s-OFDM, downlink OFDM). */
export function effectiveWaveform(config: WaveformConfig): 'ofdm' | 'dft-s-ofdm' {
  return config.waveform ?? (config.link === 'uplink' ? 'dft-s-ofdm' : 'ofdm');
}

/** Cross-field checks of a schema-valid configuration; throws DspError naming the field. */
export function validateWaveformConfig(config: WaveformConfig): void {
  createWaveformPlan(config);
}

/** Resolves numerology, allocations and the OFDM modulator for `config`. */
export function createWaveformPlan(config: WaveformConfig): WaveformPlan {
  const waveform = effectiveWaveform(config);
  if (waveform === 'dft-s-ofdm' && config.link === 'downlink') {
    throw new DspError('INVALID_CONFIG', 'waveform "dft-s-ofdm" is an uplink waveform; LTE and NR downlinks use OFDM (TS 36.211 §6, TS 38.211 §7).', {
      field: 'waveform',
    });
  }
  const numerology = resolveNumerology(config);
  const allocations = attachSpectrumShaping(resolveAllocations(config, numerology, waveform), config, numerology, waveform);
  const ofdm = createOfdmPlan(numerology, config.oversampling, config.carrierFrequencyHz);
  let dataSymbolsPerOfdmSymbol = 0;
  let bitsPerOfdmSymbol = 0;
  for (const a of allocations) {
    dataSymbolsPerOfdmSymbol += a.dataSubcarriers.length;
    bitsPerOfdmSymbol += a.dataSubcarriers.length * bitsPerSymbol(a.modulation);
  }
  const referenceSignals = createReferenceSignalPlan(config, numerology, allocations, waveform);
  const dataSymbolsPerSlotSymbol = referenceSignals.dataLayout.map((blocks) => blocks.reduce((sum, sc) => sum + sc.length, 0));
  const bitsPerSlotSymbol = referenceSignals.dataLayout.map((blocks) =>
    blocks.reduce((sum, sc, i) => sum + sc.length * bitsPerSymbol(allocations[i]!.modulation), 0),
  );
  let numDataSymbols = 0;
  let numBits = 0;
  for (let l = 0; l < config.symbols; l++) {
    numDataSymbols += dataSymbolsPerSlotSymbol[l % dataSymbolsPerSlotSymbol.length]!;
    numBits += bitsPerSlotSymbol[l % bitsPerSlotSymbol.length]!;
  }
  let numSamples = 0;
  for (let l = 0; l < config.symbols; l++) numSamples += ofdm.ifftSize + ofdm.cpLengthsSamples[l % ofdm.cpLengthsSamples.length]!;
  const warnings: string[] = [];
  const cpMax = Math.max(...numerology.cpPatternSamples);
  if (cpMax > numerology.fftSize / 4) warnings.push(`The cyclic prefix (${cpMax} samples) is over 25 % of the symbol (${numerology.fftSize}).`);
  if (config.mapping === 'interleaved') warnings.push('Interleaved (comb) mapping is a research option, not a 3GPP PUSCH mode.');
  if (config.standard === 'lte' && config.link === 'uplink' && waveform === 'ofdm') {
    warnings.push('LTE uplink with plain OFDM is a comparison case: LTE PUSCH always uses transform precoding (TS 36.211 §5.3.3).');
  }
  return {
    config,
    waveform,
    numerology,
    ofdm,
    allocations,
    dataSymbolsPerOfdmSymbol,
    bitsPerOfdmSymbol,
    referenceSignals,
    dataSymbolsPerSlotSymbol,
    bitsPerSlotSymbol,
    numDataSymbols,
    numBits,
    numSamples,
    sampleRateHz: numerology.sampleRateHz * config.oversampling,
    warnings,
  };
}

/** Layout of symbol `symbolIndex` (start sample computed from the CP pattern). */
export function symbolLayoutOf(plan: WaveformPlan, symbolIndex: number): SymbolLayout {
  const cps = plan.ofdm.cpLengthsSamples;
  const period = cps.length;
  let periodLength = 0;
  for (const c of cps) periodLength += c + plan.ofdm.ifftSize;
  let start = Math.floor(symbolIndex / period) * periodLength;
  for (let l = 0; l < symbolIndex % period; l++) start += cps[l]! + plan.ofdm.ifftSize;
  return {
    symbolIndex,
    slotIndex: Math.floor(symbolIndex / plan.numerology.symbolsPerSlot),
    startSample: start,
    cpLengthSamples: cps[symbolIndex % period]!,
    fftSize: plan.ofdm.ifftSize,
  };
}

/** Data subcarriers of allocation block `blockIndex` in OFDM symbol `symbolIndex` (those the reference signals leave). */
export function dataSubcarriersOf(plan: WaveformPlan, symbolIndex: number, blockIndex: number): Int32Array {
  const layout = plan.referenceSignals.dataLayout;
  return layout[symbolIndex % layout.length]![blockIndex]!;
}
