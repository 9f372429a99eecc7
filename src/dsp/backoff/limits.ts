import { DspError } from '../errors';
import type { Modulation } from '../modulation/constellations';
import type { Numerology } from '../numerology/numerology';
import { evmLimitFor } from '../receiver/evmLimits';

/** A default limit with where it comes from. */
export interface SourcedLimit {
  readonly value: number;
  readonly source: string;
}

/**
 * The standard's EVM limit for `modulation` on this numerology's link (the reference receiver's table,
 * src/dsp/receiver/evmLimits.ts: UE limits on the uplink, BS limits on the downlink; REFERENCE.md §5.4), or undefined when
 * it defines none (plain BPSK, custom numerologies).
 */
export function defaultEvmLimit(numerology: Numerology, modulation: Modulation): SourcedLimit | undefined {
  const limit = evmLimitFor(numerology.standard, numerology.link, modulation);
  return limit.limitPercent === undefined ? undefined : { value: limit.limitPercent, source: limit.source };
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
      throw new DspError(
        'INVALID_CONFIG',
        `No standard EVM limit for ${m} on this ${numerology.standard === 'custom' ? 'custom numerology' : 'link'}; give the EVM budget yourself (--evm-limit, %).`,
        { field: 'evmLimitPercent' },
      );
    }
    if (!best || limit.value < best.value) best = limit;
  }
  if (!best) throw new DspError('INTERNAL', 'defaultEvmLimitFor needs at least one modulation.');
  return best;
}

/**
 * Default ACLR limits, dB, by the key prefixes the measurement engine uses (src/dsp/metrics/aclr.ts) (REFERENCE.md §5.5):
 * - LTE UE, TS 36.101 §6.6.2.3: E-UTRA_ACLR 30, UTRA_ACLR1 33, UTRA_ACLR2 36 (from memory — verify; the stored copy of
 *   36.101 V19.6.0 lacks the tables and no transcription was found).
 * - NR UE (PC3), TS 38.101-1 §6.5.2.4.1: NR_ACLR 30; §6.5.2.4.2: UTRA_ACLR1 33, UTRA_ACLR2 36 [S2: a public 38.101-1 study
 *   summary, and public UE test code that sets 30 / 33 / 36 dB less a 0.8 dB test tolerance; the table was not found].
 *   UTRA ACLR applies to NR only where the network signals UTRA coexistence (e.g. NS_100); it is reported here always.
 * - BS, TS 36.104 §6.6.2 / TS 38.104 §6.6.3: 45 for every adjacent channel (from memory — verify).
 * - custom numerologies: none (the user gives one).
 */
export function defaultAclrLimit(numerology: Numerology, channelKey: string): SourcedLimit | undefined {
  if (numerology.standard === 'custom') return undefined;
  const tech = numerology.standard;
  if (numerology.link === 'downlink') {
    return { value: 45, source: tech === 'lte' ? 'TS 36.104 §6.6.2 (from memory — verify)' : 'TS 38.104 §6.6.3 (from memory — verify)' };
  }
  const lte = tech === 'lte';
  const clause = lte ? 'TS 36.101 §6.6.2.3 (from memory — verify)' : 'TS 38.101-1 §6.5.2.4.2 [S2]';
  if (channelKey.startsWith('utra1')) return { value: 33, source: clause };
  if (channelKey.startsWith('utra2')) return { value: 36, source: clause };
  if (channelKey.startsWith('eutra') || channelKey.startsWith('nr')) return { value: 30, source: lte ? clause : 'TS 38.101-1 §6.5.2.4.1, power class 3 [S2]' };
  return undefined;
}
