import type { Numerology } from '../numerology/numerology';
import { describeFilter, filterHalfSpanHz, filteredChannelPower, UTRA_FILTER, type ChannelFilter } from './channelFilter';
import type { PowerSpectrum } from './welchPsd';

/**
 * Adjacent channel leakage ratio: the filtered mean power centred on the assigned channel over the filtered mean power
 * centred on an adjacent channel, as a positive dB value (3GPP definition, e.g. TS 37.145-2 §6.7.3.1).
 */
export interface AdjacentChannel {
  /** JSON key, e.g. "utra1Lower". */
  readonly key: string;
  readonly label: string;
  /** Centre of the adjacent channel relative to the assigned channel's centre, Hz. */
  readonly offsetHz: number;
  readonly filter: ChannelFilter;
  /** Where the offset and filter come from. */
  readonly source: string;
}

/** The assigned channel's filter and the adjacent channels to measure. */
export interface AclrPlan {
  /** Filter of the assigned channel (centred at 0 Hz). */
  readonly assignedFilter: ChannelFilter;
  readonly channels: readonly AdjacentChannel[];
}

/**
 * The adjacent channels the standards measure for a numerology (all UE values from memory — verify against the clause):
 * - LTE uplink, TS 36.101 §6.6.2.3: E-UTRA at ±BW (square filter over the transmission BW N_RB·180 kHz, as the assigned
 *   channel); UTRA_ACLR1 at ±(BW/2 + 2.5 MHz) and UTRA_ACLR2 at ±(BW/2 + 7.5 MHz), RRC 0.22 at 3.84 Mcps; ACLR2 is not
 *   defined for 1.4 and 3 MHz.
 * - LTE downlink, TS 36.104 §6.6.2: E-UTRA at ±BW and ±2·BW, UTRA at ±(BW/2 + 2.5 MHz) and ±(BW/2 + 7.5 MHz).
 * - NR uplink, TS 38.101-1 §6.5.2.4: NR at ±BW with the measurement BW = transmission bandwidth configuration
 *   (N_RB·12·Δf) (from memory — verify), and UTRA_ACLR1/2 at 2.5 and 7.5 MHz beyond the NR channel edge, i.e. the LTE
 *   offsets (FR1) [S2, the test-applicability text of TS 38.521-1 §6.5.2.4.2 as quoted in a public study summary].
 * - NR downlink, TS 38.104 §6.6.3: NR at ±BW and ±2·BW, UTRA as above.
 * - custom: a same-bandwidth neighbour at ±(fftSize·Δf), square over the transmission BW (our convention).
 */
export function aclrPlanFor(numerology: Numerology): AclrPlan {
  const bw = numerology.channelBandwidthHz;
  const assignedFilter: ChannelFilter = { kind: 'rect', bandwidthHz: numerology.transmissionBandwidthHz };
  const channels: AdjacentChannel[] = [];
  const pair = (key: string, label: string, offsetHz: number, filter: ChannelFilter, source: string): void => {
    channels.push({ key: `${key}Lower`, label: `${label} −`, offsetHz: -offsetHz, filter, source });
    channels.push({ key: `${key}Upper`, label: `${label} +`, offsetHz, filter, source });
  };
  const downlink = numerology.link === 'downlink';
  if (numerology.standard === 'custom') {
    pair('adjacent', 'adjacent (same BW)', bw, assignedFilter, 'same-bandwidth neighbour at ±channel BW (Crestline convention for custom numerologies)');
    return { assignedFilter, channels };
  }
  const sameKey = numerology.standard === 'lte' ? 'eutra' : 'nr';
  const sameLabel = numerology.standard === 'lte' ? 'E-UTRA' : 'NR';
  const clause =
    numerology.standard === 'lte'
      ? downlink
        ? 'TS 36.104 §6.6.2 (from memory — verify)'
        : 'TS 36.101 §6.6.2.3 (from memory — verify)'
      : downlink
        ? 'TS 38.104 §6.6.3 (from memory — verify)'
        : 'TS 38.101-1 §6.5.2.4 (from memory — verify)';
  pair(sameKey, `${sameLabel} ACLR1`, bw, assignedFilter, clause);
  if (downlink) pair(`${sameKey}2`, `${sameLabel} ACLR2`, 2 * bw, assignedFilter, clause);
  // NR uplink UTRA offsets (2.5 / 7.5 MHz beyond the channel edge) are [S2]; the rest of the NR clause is from memory.
  const utraClause = numerology.standard === 'nr' && !downlink ? 'TS 38.101-1 §6.5.2.4.2 (offsets [S2]; filter from memory — verify)' : clause;
  pair('utra1', 'UTRA ACLR1', bw / 2 + 2.5e6, UTRA_FILTER, utraClause);
  const narrowLte = numerology.standard === 'lte' && !downlink && bw < 5e6;
  if (!narrowLte) pair('utra2', 'UTRA ACLR2', bw / 2 + 7.5e6, UTRA_FILTER, utraClause);
  return { assignedFilter, channels };
}

/** Highest |frequency| any channel of `plan` reaches, Hz: the spectrum must cover it. */
export function aclrSpanHz(plan: AclrPlan): number {
  let span = filterHalfSpanHz(plan.assignedFilter);
  for (const c of plan.channels) span = Math.max(span, Math.abs(c.offsetHz) + filterHalfSpanHz(c.filter));
  return span;
}

/** ACLR of one adjacent channel. */
export interface AclrValue {
  readonly key: string;
  readonly label: string;
  readonly offsetHz: number;
  readonly filter: string;
  /** Positive dB; Infinity when no power at all reached the adjacent channel. */
  readonly aclrDb: number;
  readonly source: string;
}

/** ACLR of every adjacent channel, with the assigned-channel power and the method used. */
export interface AclrResult {
  /** Power in the assigned channel's filter, |x|² units. */
  readonly assignedPower: number;
  readonly assignedFilter: string;
  readonly values: readonly AclrValue[];
  readonly method: string;
}

/** The method statement printed with every ACLR result. */
export const ACLR_METHOD =
  'integration of the Welch PSD through each channel filter (|H(f)|² integrated exactly over every PSD bin); ACLR = assigned-channel power / adjacent-channel power';

/** ACLR of every adjacent channel of `plan`, from the spectrum `psd` (which must cover aclrSpanHz(plan)). */
export function computeAclr(psd: PowerSpectrum, plan: AclrPlan): AclrResult {
  const assignedPower = filteredChannelPower(psd, plan.assignedFilter, 0);
  const values = plan.channels.map((c): AclrValue => {
    const adjacent = filteredChannelPower(psd, c.filter, c.offsetHz);
    return {
      key: c.key,
      label: c.label,
      offsetHz: c.offsetHz,
      filter: describeFilter(c.filter),
      aclrDb: adjacent > 0 ? 10 * Math.log10(assignedPower / adjacent) : Number.POSITIVE_INFINITY,
      source: c.source,
    };
  });
  return { assignedPower, assignedFilter: describeFilter(plan.assignedFilter), values, method: ACLR_METHOD };
}
