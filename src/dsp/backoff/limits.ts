import { DspError } from '../errors';
import type { Modulation } from '../modulation/constellations';
import type { Numerology } from '../numerology/numerology';

/** A default limit with where it comes from. */
export interface SourcedLimit {
  readonly value: number;
  readonly source: string;
}

/**
 * Required RMS EVM, % (REFERENCE.md §5.4):
 * - UE: TS 36.101 §6.5.2.1 Table 6.5.2.1.1-1 (LTE) and TS 38.101-1 §6.4.2.1 Table 6.4.2.1-1 (NR); from memory — verify.
 * - BS (downlink): TS 36.104 Table 6.5.2-1 (LTE, from memory — verify) and TS 38.104 Table 6.5.2.2-1 (NR, QPSK…256QAM [S2]).
 * A custom numerology uses the NR UE values (common practice: the same EVM budget per modulation).
 */
const UE_EVM: Record<'lte' | 'nr', Partial<Record<Modulation, number>>> = {
  lte: { qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5 },
  nr: { 'pi/2-bpsk': 30, qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5 },
};
const BS_EVM: Record<'lte' | 'nr', Partial<Record<Modulation, number>>> = {
  lte: { qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5, '1024qam': 2.5 },
  nr: { qpsk: 17.5, '16qam': 12.5, '64qam': 8, '256qam': 3.5, '1024qam': 2.5 },
};

/** The standard's EVM limit for `modulation` on this numerology's link, or undefined when it defines none (e.g. BPSK). */
export function defaultEvmLimit(numerology: Numerology, modulation: Modulation): SourcedLimit | undefined {
  const tech = numerology.standard === 'lte' ? 'lte' : 'nr';
  const downlink = numerology.link === 'downlink';
  const value = (downlink ? BS_EVM : UE_EVM)[tech][modulation];
  if (value === undefined) return undefined;
  const clause = downlink
    ? tech === 'lte'
      ? 'TS 36.104 Table 6.5.2-1 (from memory — verify)'
      : modulation === '1024qam'
        ? 'TS 38.104 Table 6.5.2.2-1 (from memory — verify)'
        : 'TS 38.104 Table 6.5.2.2-1'
    : tech === 'lte'
      ? 'TS 36.101 §6.5.2.1, Table 6.5.2.1.1-1 (from memory — verify)'
      : 'TS 38.101-1 §6.4.2.1, Table 6.4.2.1-1 (from memory — verify)';
  const note = numerology.standard === 'custom' ? ' (NR UE value used for a custom numerology, common practice)' : '';
  return { value, source: `${clause}${note}` };
}

/**
 * The EVM limit for a set of allocation blocks: the strictest of their modulations.
 * @throws DspError INVALID_CONFIG when the standard defines no EVM limit for a modulation in use (give --evm-limit)
 */
export function defaultEvmLimitFor(numerology: Numerology, modulations: readonly Modulation[]): SourcedLimit {
  let best: SourcedLimit | undefined;
  for (const m of new Set(modulations)) {
    const limit = defaultEvmLimit(numerology, m);
    if (!limit) {
      throw new DspError('INVALID_CONFIG', `No standard EVM limit for ${m} on this link; give the EVM budget yourself (--evm-limit, %).`, { field: 'evmLimitPercent' });
    }
    if (!best || limit.value < best.value) best = limit;
  }
  if (!best) throw new DspError('INTERNAL', 'defaultEvmLimitFor needs at least one modulation.');
  return best;
}

/**
 * Default ACLR limits, dB, by the key prefixes the measurement engine uses (src/dsp/metrics/aclr.ts). All from memory —
 * verify (REFERENCE.md §5.5):
 * - LTE UE, TS 36.101 §6.6.2.3: E-UTRA_ACLR 30, UTRA_ACLR1 33, UTRA_ACLR2 36.
 * - NR UE (PC3), TS 38.101-1 §6.5.2.4: NR_ACLR 30, UTRA_ACLR1 33, UTRA_ACLR2 36.
 * - BS, TS 36.104 §6.6.2 / TS 38.104 §6.6.3: 45 for every adjacent channel.
 * - custom numerologies: none (the user gives one).
 */
export function defaultAclrLimit(numerology: Numerology, channelKey: string): SourcedLimit | undefined {
  if (numerology.standard === 'custom') return undefined;
  const tech = numerology.standard;
  if (numerology.link === 'downlink') {
    return { value: 45, source: tech === 'lte' ? 'TS 36.104 §6.6.2 (from memory — verify)' : 'TS 38.104 §6.6.3 (from memory — verify)' };
  }
  const clause = tech === 'lte' ? 'TS 36.101 §6.6.2.3 (from memory — verify)' : 'TS 38.101-1 §6.5.2.4 (from memory — verify)';
  if (channelKey.startsWith('utra1')) return { value: 33, source: clause };
  if (channelKey.startsWith('utra2')) return { value: 36, source: clause };
  if (channelKey.startsWith('eutra') || channelKey.startsWith('nr')) return { value: 30, source: clause };
  return undefined;
}
