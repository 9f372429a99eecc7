import type { Modulation } from '../modulation/constellations';

/**
 * RMS EVM limits per modulation, in percent.
 * - LTE UE, TS 36.101 §6.5.2.1 Table 6.5.2.1.1-1: QPSK 17.5, 16QAM 12.5, 64QAM 8, 256QAM 3.5 (Rel-14+) (from memory — verify).
 * - LTE BS, TS 36.104 §6.5.2 Table 6.5.2-1: QPSK 17.5, 16QAM 12.5, 64QAM 8, 256QAM 3.5, 1024QAM 2.5 (Rel-15+) (from memory — verify).
 * - NR UE, TS 38.101-1 §6.4.2.1 Table 6.4.2.1-1: π/2-BPSK 30, QPSK 17.5, 16QAM 12.5, 64QAM 8, 256QAM 3.5 (from memory — verify).
 * - NR BS, TS 38.104 Table 6.5.2.2-1: QPSK 17.5, 16QAM 12.5, 64QAM 8, 256QAM 3.5 [S2: a public RF reference page quoting the
 *   table and a vendor radio-unit manual listing the same four limits]; 1024QAM 2.5 (from memory — verify, not found).
 * The stored copies of 36.101 and 38.101-1 (V19.6.0) searched for this lack their tables, so the UE rows could not be read.
 * The uplink is held to the UE limits and the downlink to the BS limits (REFERENCE.md §5.4). Plain BPSK has no PUSCH/PDSCH
 * limit and custom numerologies none at all.
 */
/** A limit and where it comes from. */
export interface EvmLimit {
  readonly limitPercent: number | undefined;
  readonly source: string;
}

const LTE_UE: Partial<Record<Modulation, number>> = { qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5 };
const LTE_BS: Partial<Record<Modulation, number>> = { qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5, '1024qam': 2.5 };
const NR_UE: Partial<Record<Modulation, number>> = { 'pi/2-bpsk': 30, qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5 };
const NR_BS: Partial<Record<Modulation, number>> = { qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5, '1024qam': 2.5 };

/** The RMS EVM limit for a modulation on a link of a standard (undefined where none is defined). */
export function evmLimitFor(standard: 'lte' | 'nr' | 'custom', link: 'uplink' | 'downlink', modulation: Modulation): EvmLimit {
  if (standard === 'custom') return { limitPercent: undefined, source: 'no limit: custom numerology' };
  const [table, source] =
    standard === 'lte'
      ? link === 'uplink'
        ? [LTE_UE, 'TS 36.101 Table 6.5.2.1.1-1']
        : [LTE_BS, 'TS 36.104 Table 6.5.2-1']
      : link === 'uplink'
        ? [NR_UE, 'TS 38.101-1 Table 6.4.2.1-1']
        : [NR_BS, 'TS 38.104 Table 6.5.2.2-1'];
  const limitPercent = table[modulation];
  return limitPercent === undefined ? { limitPercent, source: `no ${modulation} limit in ${source}` } : { limitPercent, source };
}
