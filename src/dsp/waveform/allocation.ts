import type { WaveformConfig } from '../../config/schema';
import { DspError } from '../errors';
import type { Modulation } from '../modulation/constellations';
import type { Numerology } from '../numerology/numerology';
import type { SpectrumShapingPlan } from '../shaping/spectrumShaping';
import { checkDftSpreadSize } from './transformPrecoding';
import { pow } from '../math/expLog';

/** One allocated block after defaults: its data subcarriers, modulation and amplitude. */
export interface AllocationPlan {
  readonly startRb: number;
  readonly numRb: number;
  readonly modulation: Modulation;
  readonly powerOffsetDb: number;
  /** 10^(powerOffsetDb/20). */
  readonly amplitudeLinear: number;
  /** Grid subcarrier indices k' carrying this block's data, ascending. */
  readonly dataSubcarriers: Int32Array;
  /** DFT-s-OFDM spectrum shaping (config.spectrumShaping): the window and the M + E grid subcarriers it fills. */
  readonly shaping?: { readonly plan: SpectrumShapingPlan; readonly subcarriers: Int32Array };
}

/** Grid subcarriers a block actually occupies: its shaped span when spectrum shaping is on, else its data subcarriers. */
export function occupiedSubcarriers(block: AllocationPlan): Int32Array {
  return block.shaping?.subcarriers ?? block.dataSubcarriers;
}

/**
 * Resolves the allocation blocks of a configuration (default: the whole grid) and checks them against the grid:
 * inside it, not overlapping, interleaving factor dividing the block, DFT sizes allowed for DFT-s-OFDM.
 * Blocks are returned in ascending frequency: the order in which bits fill them.
 */
export function resolveAllocations(config: WaveformConfig, numerology: Numerology, waveform: 'ofdm' | 'dft-s-ofdm'): AllocationPlan[] {
  const given = config.allocation === undefined ? [{ startRb: 0, numRb: numerology.numRb, powerOffsetDb: 0 }] : [config.allocation].flat();
  const blocks = given
    .map((b, i) => ({ ...b, given: i }))
    .sort((a, b) => a.startRb - b.startRb);
  const q = config.mapping === 'interleaved' ? config.interleaveFactor : 1;
  if (config.mapping === 'interleaved' && config.combOffset >= q) {
    throw new DspError('INVALID_CONFIG', `combOffset ${config.combOffset} must be less than interleaveFactor ${q}.`, { field: 'combOffset' });
  }
  const plans: AllocationPlan[] = [];
  let previousEnd = 0;
  for (const b of blocks) {
    const where = given.length > 1 ? `allocation.${b.given}` : 'allocation';
    if (b.startRb + b.numRb > numerology.numRb) {
      throw new DspError(
        'INVALID_CONFIG',
        `${where}: RBs ${b.startRb}…${b.startRb + b.numRb - 1} exceed the grid of ${numerology.numRb} RB (0…${numerology.numRb - 1}); numRb may be at most ${Math.max(0, numerology.numRb - b.startRb)} from startRb ${b.startRb}.`,
        { field: `${where}.numRb` },
      );
    }
    if (b.startRb < previousEnd) {
      throw new DspError('INVALID_CONFIG', `${where}: block starting at RB ${b.startRb} overlaps the block ending at RB ${previousEnd - 1}.`, {
        field: `${where}.startRb`,
      });
    }
    previousEnd = b.startRb + b.numRb;
    const span = 12 * b.numRb;
    if (span % q !== 0) {
      throw new DspError(
        'INVALID_CONFIG',
        `${where}: interleaveFactor ${q} must divide the block's ${span} subcarriers (12·numRb); allowed factors for ${b.numRb} RB: ${divisors(span).filter((d) => d >= 2 && d <= 64).join(', ')}.`,
        { field: 'interleaveFactor' },
      );
    }
    const numData = span / q;
    const modulation: Modulation = b.modulation ?? config.modulation;
    if (waveform === 'dft-s-ofdm') checkDftSpreadSize(numData, b.numRb, where, config.mapping);
    if (modulation === 'pi/2-bpsk' && waveform !== 'dft-s-ofdm') {
      throw new DspError('INVALID_CONFIG', `${where}: π/2-BPSK is used only with transform precoding (TS 38.211 §6.3.1.2): set waveform "dft-s-ofdm".`, {
        field: 'modulation',
      });
    }
    const dataSubcarriers = new Int32Array(numData);
    const offset = q > 1 ? config.combOffset : 0;
    for (let i = 0; i < numData; i++) dataSubcarriers[i] = 12 * b.startRb + offset + q * i;
    const powerOffsetDb = b.powerOffsetDb ?? 0;
    plans.push({
      startRb: b.startRb,
      numRb: b.numRb,
      modulation,
      powerOffsetDb,
      amplitudeLinear: pow(10, powerOffsetDb / 20),
      dataSubcarriers,
    });
  }
  return plans;
}

function divisors(n: number): number[] {
  const out: number[] = [];
  for (let d = 1; d <= n; d++) if (n % d === 0) out.push(d);
  return out;
}
