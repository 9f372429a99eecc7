import { RE_REFERENCE } from '../waveform/resourceKinds';
import type { ReferenceBlock } from './referenceSignalPlan';

/**
 * LTE PUSCH demodulation reference signal (TS 36.211 §5.5.2.1), single layer, hopping off:
 *   r^PUSCH(m·M_sc + n) = r^{(α)}_{u,v}(n), α = 2π·n_cs/12, n = 0…M_sc − 1,
 * mapped in increasing subcarrier order onto the PUSCH resource blocks of symbol l = 3 of each slot (normal CP) or
 * l = 2 (extended CP) (§5.5.2.1.2). With hopping off, u, v and n_cs are the same in every slot (the pseudo-random
 * n_PN(n_s) term of n_cs is taken as 0, so the configured n_cs is used as is).
 */

/** The DMRS symbol of each slot: 3 for normal CP, 2 for extended CP (TS 36.211 §5.5.2.1.2). */
export function lteDmrsSymbolInSlot(extendedCp: boolean): number {
  return extendedCp ? 2 : 3;
}

/**
 * Writes the DMRS of every block into one grid row and marks its elements RE_REFERENCE.
 * @param rowIq grid row, 2·12·N_RB values; @param kinds the row's kinds, 12·N_RB values
 */
export function fillLteDmrsRow(blocks: readonly ReferenceBlock[], rowIq: Float64Array, kinds: Uint8Array): void {
  for (const b of blocks) {
    for (let n = 0; n < b.numSubcarriers; n++) {
      const k = b.firstSubcarrier + n;
      rowIq[2 * k] = b.amplitudeLinear * b.sequenceIq[2 * n]!;
      rowIq[2 * k + 1] = b.amplitudeLinear * b.sequenceIq[2 * n + 1]!;
      kinds[k] = RE_REFERENCE;
    }
  }
}
