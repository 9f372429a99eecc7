import type { Modulation } from '../modulation/constellations';
import type { Numerology } from '../numerology/numerology';

/** The standard's maximum power reduction allowance for an allocation, as context beside a measured back-off. */
export interface MprAllowance {
  /** Upper bound of the MPR allowed, dB (MPR ≤ this). */
  readonly maxMprDb: number;
  /** How the allocation was classified, e.g. "QPSK, 25 RB > 8 RB (5 MHz)" or "DFT-s-OFDM QPSK, inner". */
  readonly condition: string;
  readonly source: string;
}

/**
 * LTE UE power class 3, TS 36.101 Table 6.2.3-1 (REFERENCE.md §5.6, from memory — verify): N_RB allocated compared
 * with a per-bandwidth threshold (1.4: 5, 3: 4, 5: 8, 10: 12, 15: 16, 20: 18 RB). No transcription of Table 6.2.3-1 itself
 * was found (the stored copy of 36.101 V19.6.0 lacks its tables). The CA table 6.2.3A-1 as quoted by a public MPR
 * calculator page uses the same 8 / 12 / 16 / 18 RB thresholds and the same QPSK ≤ 1, 16QAM ≤ 1 / ≤ 2, 64QAM ≤ 2 / ≤ 3 and
 * 256QAM ≤ 5 dB steps per component carrier [S2 for the pattern only].
 */
export const LTE_MPR_RB_THRESHOLD: Readonly<Record<number, number>> = { 1.4: 5, 3: 4, 5: 8, 10: 12, 15: 16, 20: 18 };

const LTE_SOURCE = 'TS 36.101 Table 6.2.3-1, power class 3 (from memory — verify)';
const NR_SOURCE = 'TS 38.101-1 §6.2.2 Table 6.2.2-1, power class 3 (from memory — verify)';

/** LTE UE MPR allowance, or undefined when the table has no entry (e.g. downlink, BPSK). */
export function lteMprAllowance(bandwidthMHz: number, numRbAllocated: number, modulation: Modulation): MprAllowance | undefined {
  const threshold = LTE_MPR_RB_THRESHOLD[bandwidthMHz];
  if (threshold === undefined) return undefined;
  const wide = numRbAllocated > threshold;
  const cmp = `${numRbAllocated} RB ${wide ? '>' : '≤'} ${threshold} RB (${bandwidthMHz} MHz)`;
  const table: Partial<Record<Modulation, [number, number]>> = { qpsk: [0, 1], '16qam': [1, 2], '64qam': [2, 3] };
  if (modulation === '256qam') return { maxMprDb: 5, condition: `256QAM, ${numRbAllocated} RB`, source: LTE_SOURCE };
  const row = table[modulation];
  if (!row) return undefined;
  return { maxMprDb: wide ? row[1] : row[0], condition: `${modulation.toUpperCase()}, ${cmp}`, source: LTE_SOURCE };
}

/**
 * NR allocation class of TS 38.101-1 §6.2.2: with RB_start,low = max(1, ⌊L_CRB/2⌋) and
 * RB_start,high = N_RB − RB_start,low − L_CRB, an allocation is "inner" when RB_start,low ≤ RB_start ≤ RB_start,high and
 * L_CRB ≤ ⌈N_RB/2⌉; "edge" when it has at most 2 RB and touches the lowest or highest RB; "outer" otherwise
 * ([S], clause text of a stored copy of 38.101-1 V19.6.0; the PC1 edge rule and the Rel-19 extended inner region there do
 * not apply to power class 3 without the signalled extension).
 */
export function nrAllocationClass(numRbGrid: number, startRb: number, numRb: number): 'inner' | 'outer' | 'edge' {
  const low = Math.max(1, Math.floor(numRb / 2));
  const high = numRbGrid - low - numRb;
  if (startRb >= low && startRb <= high && numRb <= Math.ceil(numRbGrid / 2)) return 'inner';
  if (numRb <= 2 && (startRb === 0 || startRb + numRb === numRbGrid)) return 'edge';
  return 'outer';
}

/**
 * NR PC3 MPR headline values [edge, outer, inner], dB (REFERENCE.md §5.6, from memory — verify; the stored copy of
 * 38.101-1 V19.6.0 names Table 6.2.2-1 but does not reproduce it, and no other transcription was found). One value = all classes.
 */
const NR_MPR: Record<'dft-s-ofdm' | 'ofdm', Partial<Record<Modulation, readonly number[]>>> = {
  'dft-s-ofdm': { 'pi/2-bpsk': [3.5, 1.2, 0.2], qpsk: [3.5, 1, 0], '16qam': [3.5, 2, 1], '64qam': [3.5, 2.5, 2.5], '256qam': [4.5] },
  ofdm: { qpsk: [3.5, 3, 1.5], '16qam': [3.5, 3, 2], '64qam': [3.5], '256qam': [6.5] },
};

/** NR UE MPR allowance, or undefined when the table has no entry. */
export function nrMprAllowance(
  numRbGrid: number,
  startRb: number,
  numRb: number,
  modulation: Modulation,
  waveform: 'ofdm' | 'dft-s-ofdm',
): MprAllowance | undefined {
  const row = NR_MPR[waveform][modulation];
  if (!row) return undefined;
  const cls = nrAllocationClass(numRbGrid, startRb, numRb);
  const value = row.length === 1 ? row[0]! : row[cls === 'edge' ? 0 : cls === 'outer' ? 1 : 2]!;
  return { maxMprDb: value, condition: `${waveform === 'ofdm' ? 'CP-OFDM' : 'DFT-s-OFDM'} ${modulation.toUpperCase()}, ${cls} allocation (RB ${startRb}…${startRb + numRb - 1} of ${numRbGrid})`, source: NR_SOURCE };
}

/** The MPR allowance that applies to an uplink allocation on this numerology (undefined for downlinks and custom numerologies). */
export function mprAllowanceFor(
  numerology: Numerology,
  bandwidthMHz: number,
  startRb: number,
  numRb: number,
  modulation: Modulation,
  waveform: 'ofdm' | 'dft-s-ofdm',
): MprAllowance | undefined {
  if (numerology.link !== 'uplink') return undefined;
  if (numerology.standard === 'lte') return lteMprAllowance(bandwidthMHz, numRb, modulation);
  if (numerology.standard === 'nr') return nrMprAllowance(numerology.numRb, startRb, numRb, modulation, waveform);
  return undefined;
}
