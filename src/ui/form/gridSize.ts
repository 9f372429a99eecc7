/**
 * Size of the resource grid a draft asks for, read from the standards' tables (plain data, no engine
 * code), so the RB picker can draw the grid before the engine answers. Returns undefined when the
 * tables do not list the combination; the engine then names the problem at its field.
 */
import { findLteBandwidth } from '../../dsp/numerology/lteNumerology';
import { NR_FR1_NUM_RB } from '../../dsp/numerology/nrNumerology';
import type { ConfigDraft } from '../state/configValidation';

/** NR subcarrier spacing when the draft gives none (schema comment: NR default 30 kHz). */
export const NR_DEFAULT_SCS_KHZ = 30;
/** Schema defaults the form shows when the draft leaves a field out. */
export const DEFAULT_STANDARD = 'lte';
export const DEFAULT_BANDWIDTH_MHZ = 20;

/** N_RB of the draft's carrier: TS 36.101 Table 5.6-1 (LTE), TS 38.101-1 Table 5.3.2-1 (NR FR1), or custom.numRb. */
export function gridNumRb(draft: ConfigDraft): number | undefined {
  const standard = draft.standard ?? DEFAULT_STANDARD;
  const bandwidthMHz = typeof draft.bandwidthMHz === 'number' ? draft.bandwidthMHz : draft.bandwidthMHz === undefined ? DEFAULT_BANDWIDTH_MHZ : Number.NaN;
  if (standard === 'lte') return findLteBandwidth(bandwidthMHz)?.numRb;
  if (standard === 'nr') {
    const scs = typeof draft.subcarrierSpacingKHz === 'number' ? draft.subcarrierSpacingKHz : NR_DEFAULT_SCS_KHZ;
    return NR_FR1_NUM_RB[scs]?.[bandwidthMHz];
  }
  const custom = draft.custom as { numRb?: unknown } | undefined;
  return typeof custom?.numRb === 'number' && Number.isInteger(custom.numRb) && custom.numRb > 0 ? custom.numRb : undefined;
}
