import type { WaveformConfig } from '../../config/schema';
import { DspError } from '../errors';
import type { Numerology } from '../numerology/numerology';
import type { AllocationPlan } from '../waveform/allocation';
import { createSpectrumShapingPlan } from './spectrumShaping';

/**
 * Attaches `config.spectrumShaping` to each allocation block (unchanged when the option is absent). The extension
 * subcarriers sit E/2 below and E/2 above the block, so they must be free grid subcarriers: inside the grid and
 * not used by another block (the allocation itself stays as configured).
 * @throws DspError INVALID_CONFIG for OFDM or interleaved mapping (FDSS is defined for localized DFT-s-OFDM), or an
 * extension that leaves the grid or overlaps a neighbour
 */
export function attachSpectrumShaping(
  blocks: AllocationPlan[],
  config: WaveformConfig,
  numerology: Numerology,
  waveform: 'ofdm' | 'dft-s-ofdm',
): AllocationPlan[] {
  const shaping = config.spectrumShaping;
  if (!shaping) return blocks;
  if (waveform !== 'dft-s-ofdm') {
    throw new DspError('INVALID_CONFIG', 'spectrumShaping shapes the DFT output of DFT-s-OFDM; set waveform "dft-s-ofdm" or remove spectrumShaping.', {
      field: 'spectrumShaping',
    });
  }
  if (config.referenceSignals?.enabled) {
    throw new DspError(
      'INVALID_CONFIG',
      'spectrumShaping with referenceSignals is not supported yet: the reference signals would need the same shaping and extension; turn one of them off.',
      { field: 'spectrumShaping' },
    );
  }
  if (config.mapping !== 'localized') {
    throw new DspError('INVALID_CONFIG', 'spectrumShaping needs localized mapping (the shaped block must be contiguous).', { field: 'spectrumShaping' });
  }
  let previousEnd = 0;
  return blocks.map((block, index) => {
    const m = block.dataSubcarriers.length;
    const plan = createSpectrumShapingPlan(m, shaping.shape, shaping.rollOff, shaping.extension);
    const half = plan.extensionSubcarriers / 2;
    const first = block.dataSubcarriers[0]! - half;
    const end = block.dataSubcarriers[m - 1]! + half + 1;
    if (first < previousEnd || end > numerology.numGridSubcarriers) {
      throw new DspError(
        'INVALID_CONFIG',
        `spectrumShaping: roll-off ${shaping.rollOff} extends block ${index} (${m} subcarriers) by ${half} subcarriers on each side, to subcarriers ${first}…${end - 1}, which ${end > numerology.numGridSubcarriers || first < 0 ? `leaves the grid (0…${numerology.numGridSubcarriers - 1})` : 'overlaps the block below'}; leave ${Math.ceil(half / 12)} free RB on each side, lower rollOff, or set extension false.`,
        { field: 'spectrumShaping.rollOff' },
      );
    }
    previousEnd = end;
    const subcarriers = new Int32Array(m + plan.extensionSubcarriers);
    for (let i = 0; i < subcarriers.length; i++) subcarriers[i] = first + i;
    return { ...block, shaping: { plan, subcarriers } };
  });
}

/**
 * Extra bandwidth spectrum shaping occupies beyond the configured allocation, Hz: Σ over blocks of E·Δf
 * (0 without extension or without shaping).
 */
export function shapingExtraBandwidthHz(blocks: readonly AllocationPlan[], numerology: Numerology): number {
  let extra = 0;
  for (const b of blocks) extra += (b.shaping?.plan.extensionSubcarriers ?? 0) * numerology.subcarrierSpacingHz;
  return extra;
}
