import type { ReferenceSignalsConfig, WaveformConfig } from '../../config/schema';
import { DspError } from '../errors';
import type { Numerology } from '../numerology/numerology';
import type { AllocationPlan } from '../waveform/allocation';
import { crsSubcarrierOffset, lteCrsSymbolsInSlot } from './lteCrs';
import { lteDmrsSymbolInSlot } from './lteDmrs';
import { NR_DMRS_AMPLITUDE, NR_DEFAULT_DMRS_SYMBOLS } from './nrDmrs';
import { fillShiftedBaseSequence } from './zadoffChu';

/**
 * Which reference signal a configuration carries, where it sits and what the data around it may use. Plain data.
 * - 'lte-pusch-dmrs': TS 36.211 §5.5.2.1, on symbol 3 (normal CP) / 2 (extended CP) of every slot, every allocated subcarrier.
 * - 'lte-crs': TS 36.211 §6.10.1, antenna port 0, symbols 0 and N_symb − 3 of every slot, every 6th subcarrier of the grid.
 * - 'nr-dmrs-low-papr': TS 38.211 §6.4.1.1 with transform precoding, low-PAPR type 1 (§5.2.2) of length 6·M_RB, α = 0, δ = 1.
 * - 'nr-dmrs-gold': TS 38.211 §6.4.1.1 (PUSCH) / §7.4.1.1 (PDSCH) without transform precoding, Gold sequence (§5.2.1).
 * NR DMRS are configuration type 1, single symbol, port 0 (CDM group 0, every even subcarrier); the other CDM group stays
 * empty, so DMRS symbols carry no data and the DMRS gets β = √2 (TS 38.214 Table 6.2.2-1, two CDM groups without data).
 */
export type ReferenceSignalKind = 'none' | 'lte-pusch-dmrs' | 'lte-crs' | 'nr-dmrs-low-papr' | 'nr-dmrs-gold';

/** One allocation block as the reference signals see it. */
export interface ReferenceBlock {
  /** Lowest grid subcarrier k' of the block. */
  readonly firstSubcarrier: number;
  /** 12·numRb. */
  readonly numSubcarriers: number;
  readonly amplitudeLinear: number;
  /** Precomputed sequence for the slot-invariant kinds (LTE DMRS, NR low-PAPR), interleaved; else empty. */
  readonly sequenceIq: Float64Array;
}

/** The resolved reference signals of a waveform (plain data, part of the WaveformPlan). */
export interface ReferenceSignalPlan {
  readonly kind: ReferenceSignalKind;
  /** One line for summaries, e.g. "LTE PUSCH DMRS (TS 36.211 §5.5.2.1), u 0, v 0, n_cs 0, symbol 3 of each slot". */
  readonly description: string;
  readonly params: ReferenceSignalsConfig;
  readonly symbolsPerSlot: number;
  /** Slots per 10 ms frame (LTE 20; NR 10·2^μ): slot numbers in the sequence initialisations run modulo this. */
  readonly slotsPerFrame: number;
  /** Symbols of a slot that carry reference signals, ascending. */
  readonly rsSymbolsInSlot: readonly number[];
  readonly numRb: number;
  readonly numGridSubcarriers: number;
  readonly extendedCp: boolean;
  readonly blocks: readonly ReferenceBlock[];
  /** Data subcarriers of each block in each symbol of a slot: dataLayout[symbolInSlot][blockIndex], ascending. */
  readonly dataLayout: readonly (readonly Int32Array[])[];
}

/** Resolves the reference signals of a configuration, or kind 'none' when they are off. */
export function createReferenceSignalPlan(
  config: WaveformConfig,
  numerology: Numerology,
  allocations: readonly AllocationPlan[],
  waveform: 'ofdm' | 'dft-s-ofdm',
): ReferenceSignalPlan {
  const given = config.referenceSignals;
  const params: ReferenceSignalsConfig = given ?? {
    enabled: false,
    groupNumber: 0,
    sequenceNumber: 0,
    cyclicShift: 0,
    cellId: 0,
    scramblingId: 0,
    nScid: 0,
  };
  const symbolsPerSlot = numerology.symbolsPerSlot;
  const kind = resolveKind(config, waveform, params);
  const extendedCp = config.cyclicPrefix === 'extended';
  let rsSymbolsInSlot: number[] = [];
  let slotsPerFrame = 20;
  let description = 'none (data only)';
  if (kind === 'lte-pusch-dmrs') {
    rsSymbolsInSlot = [lteDmrsSymbolInSlot(extendedCp)];
    description = `LTE PUSCH DMRS (TS 36.211 §5.5.2.1), u ${params.groupNumber}, v ${params.sequenceNumber}, n_cs ${params.cyclicShift}, symbol ${rsSymbolsInSlot[0]} of each slot`;
  } else if (kind === 'lte-crs') {
    rsSymbolsInSlot = lteCrsSymbolsInSlot(extendedCp);
    description = `LTE CRS port 0 (TS 36.211 §6.10.1), cell ${params.cellId}, symbols ${rsSymbolsInSlot.join(' and ')} of each slot`;
  } else if (kind !== 'none') {
    rsSymbolsInSlot = resolveNrSymbols(params, symbolsPerSlot);
    slotsPerFrame = 10 * Math.round(numerology.subcarrierSpacingHz / 15000);
    description =
      kind === 'nr-dmrs-low-papr'
        ? `NR PUSCH DMRS, transform precoding, low-PAPR type 1 (TS 38.211 §6.4.1.1, §5.2.2), u ${params.groupNumber}, v ${params.sequenceNumber}, symbols ${rsSymbolsInSlot.join(', ')}`
        : `NR ${config.link === 'uplink' ? 'PUSCH' : 'PDSCH'} DMRS type 1, Gold sequence (TS 38.211 §${config.link === 'uplink' ? '6.4.1.1' : '7.4.1.1'}), N_ID ${params.scramblingId}, n_SCID ${params.nScid}, symbols ${rsSymbolsInSlot.join(', ')}`;
  }
  const blocks = allocations.map((a): ReferenceBlock => {
    const firstSubcarrier = 12 * a.startRb;
    const numSubcarriers = 12 * a.numRb;
    let sequenceIq = new Float64Array(0);
    if (kind === 'lte-pusch-dmrs') {
      sequenceIq = new Float64Array(2 * numSubcarriers);
      fillShiftedBaseSequence('lte', params.groupNumber, params.sequenceNumber, (2 * Math.PI * params.cyclicShift) / 12, numSubcarriers, sequenceIq);
    } else if (kind === 'nr-dmrs-low-papr') {
      sequenceIq = new Float64Array(numSubcarriers);
      fillShiftedBaseSequence('nr', params.groupNumber, params.sequenceNumber, 0, numSubcarriers / 2, sequenceIq);
    }
    return { firstSubcarrier, numSubcarriers, amplitudeLinear: a.amplitudeLinear, sequenceIq };
  });
  const dataLayout = Array.from({ length: symbolsPerSlot }, (_, s) =>
    allocations.map((a) => dataSubcarriersInSymbol(kind, rsSymbolsInSlot.includes(s), s, params.cellId, a.dataSubcarriers)),
  );
  return {
    kind,
    description,
    params,
    symbolsPerSlot,
    slotsPerFrame,
    rsSymbolsInSlot,
    numRb: numerology.numRb,
    numGridSubcarriers: numerology.numGridSubcarriers,
    extendedCp,
    blocks,
    dataLayout,
  };
}

function resolveKind(config: WaveformConfig, waveform: 'ofdm' | 'dft-s-ofdm', params: ReferenceSignalsConfig): ReferenceSignalKind {
  if (!params.enabled) return 'none';
  if (config.standard === 'custom') {
    throw new DspError('INVALID_CONFIG', 'referenceSignals.enabled: standard "custom" has no standard reference signal; switch them off or use "lte" or "nr".', {
      field: 'referenceSignals.enabled',
    });
  }
  if (config.mapping === 'interleaved') {
    throw new DspError('INVALID_CONFIG', 'referenceSignals.enabled: the 3GPP reference signals are defined for localized mapping only; set mapping "localized" or switch them off.', {
      field: 'referenceSignals.enabled',
    });
  }
  if (config.standard === 'lte') {
    if (params.dmrsSymbols !== undefined) {
      throw new DspError('INVALID_CONFIG', 'referenceSignals.dmrsSymbols: applies to NR only; LTE places its reference signals where TS 36.211 says.', {
        field: 'referenceSignals.dmrsSymbols',
      });
    }
    return config.link === 'uplink' ? 'lte-pusch-dmrs' : 'lte-crs';
  }
  return waveform === 'dft-s-ofdm' ? 'nr-dmrs-low-papr' : 'nr-dmrs-gold';
}

function resolveNrSymbols(params: ReferenceSignalsConfig, symbolsPerSlot: number): number[] {
  const symbols = [...(params.dmrsSymbols ?? NR_DEFAULT_DMRS_SYMBOLS)];
  for (let i = 0; i < symbols.length; i++) {
    const s = symbols[i]!;
    if (s >= symbolsPerSlot || (i > 0 && s <= symbols[i - 1]!)) {
      throw new DspError(
        'INVALID_CONFIG',
        `referenceSignals.dmrsSymbols: [${symbols.join(', ')}] must be distinct, ascending symbol indices below ${symbolsPerSlot} (symbols per slot).`,
        { field: 'referenceSignals.dmrsSymbols' },
      );
    }
  }
  return symbols;
}

function dataSubcarriersInSymbol(
  kind: ReferenceSignalKind,
  isRsSymbol: boolean,
  symbolInSlot: number,
  cellId: number,
  dataSubcarriers: Int32Array,
): Int32Array {
  if (!isRsSymbol) return dataSubcarriers;
  if (kind !== 'lte-crs') return new Int32Array(0);
  const offset = crsSubcarrierOffset(symbolInSlot, cellId);
  return dataSubcarriers.filter((k) => k % 6 !== offset);
}

/** True when symbol `symbolIndex` (counted from slot 0) carries reference signals. */
export function isReferenceSymbol(plan: ReferenceSignalPlan, symbolIndex: number): boolean {
  return plan.rsSymbolsInSlot.includes(symbolIndex % plan.symbolsPerSlot);
}

/** Slot number within the frame and symbol within the slot of `symbolIndex`. */
export function slotPosition(plan: ReferenceSignalPlan, symbolIndex: number): { slotInFrame: number; symbolInSlot: number } {
  return {
    slotInFrame: Math.floor(symbolIndex / plan.symbolsPerSlot) % plan.slotsPerFrame,
    symbolInSlot: symbolIndex % plan.symbolsPerSlot,
  };
}

/** The NR DMRS amplitude β relative to the data (re-exported for the receiver). */
export const NR_DMRS_BETA = NR_DMRS_AMPLITUDE;
