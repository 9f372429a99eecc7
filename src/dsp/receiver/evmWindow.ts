import type { WaveformPlan } from '../waveform/waveformPlan';

/**
 * EVM window length W and its two FFT window positions (TS 36.101 Annex F.5, TS 38.101-1 Annex F.5).
 * The window is W consecutive FFT start positions centred on the middle of the (shorter) cyclic prefix; EVM is measured
 * with the FFT starting at the first (Δt_l) and at the last (Δt_h) of them and the larger result is reported. Positions are
 * expressed here as the advance of the FFT start before the end of each CP, the same for every symbol (the longer CP of
 * symbol 0 only adds samples at its start). 36.101's own expressions are Δt_l = Δc − α − ⌊W/2⌋, Δt_h = Δc + ⌊W/2⌋
 * (REFERENCE.md §5.4; the clause text of 36.101 Annex F.4 is [S] in a stored copy of V19.6.0, but its equations did not
 * survive that copy, so the expressions stay from memory — verify); rounding the centre of an odd CP down is our choice.
 */

/** TS 36.101 Table F.5.3-1, normal CP: W in samples at the nominal FFT size [S]. */
export const LTE_EVM_WINDOW_NORMAL_CP: Readonly<Record<number, number>> = { 128: 5, 256: 12, 512: 32, 1024: 66, 1536: 102, 2048: 136 };
/**
 * TS 36.101 Table F.5.4-1, extended CP (CP 32…512 samples): W at the nominal FFT size.
 * - 128/256/512/1024/2048 → 28/58/124/250/504: [S2], public LTE code that sets CP − W = 4/6/4/6/8 samples "as implied by
 *   TS 36.101 Tables F.5.3-1 and F.5.4-1", the same exclusion as normal CP; the table itself was not found.
 * - 1536 (15 MHz) → 374: from memory — verify. The clause text of F.5.4 ([S], stored copy of 36.101 V19.6.0, table not
 *   reproduced there) says the nominal windows for 3 and 15 MHz are rounded down one sample, so 15 MHz is not simply
 *   CP − 6 = 378.
 */
export const LTE_EVM_WINDOW_EXTENDED_CP: Readonly<Record<number, number>> = { 128: 28, 256: 58, 512: 124, 1024: 250, 1536: 374, 2048: 504 };
/**
 * NR normal CP: W = 50 % of the CP, rounded half up at the nominal FFT size. TS 38.101-1 Tables F.5.3-1/-2/-3 (FR1, 15/30/60 kHz,
 * V17.0.0) list W = 50 % for every channel bandwidth, e.g. 60 kHz 15 MHz: CP 27 → W 14 [S2, two public code transcriptions
 * of the tables, which agree]; TS 38.101-2 Tables F.5.3-1/-2 (FR2) also give 50 % [S].
 * These are the UE (uplink) tables. The BS tables of TS 38.104 Annex B.5.2 differ for some bandwidths and are not used here.
 */
export const NR_EVM_WINDOW_FRACTION = 0.5;

/**
 * NR extended CP (60 kHz only): TS 38.101-1 Table F.5.4-1 (V17.0.0), by channel bandwidth in MHz: [CP, W] in samples at the
 * table's FFT size (256 for 10 MHz … 2048 for 80–100 MHz) [S2, two public code transcriptions of the table, which agree].
 * W is about 85.9 % of the CP; note 20 and 25 MHz share CP 128 but list W 106 and 110.
 */
export const NR_EVM_WINDOW_EXTENDED_CP: Readonly<Record<number, readonly [number, number]>> = {
  10: [64, 54],
  15: [96, 80],
  20: [128, 106],
  25: [128, 110],
  30: [192, 164],
  40: [256, 220],
  50: [256, 220],
  60: [384, 330],
  70: [384, 330],
  80: [512, 440],
  90: [512, 440],
  100: [512, 440],
};
/** W / CP of TS 38.101-1 Table F.5.4-1 for the bandwidths of 40 MHz and up (220/256 = 330/384 = 440/512) [S2]. */
export const NR_EVM_WINDOW_EXTENDED_CP_FRACTION = 440 / 512;

/** W and the two window positions, as FFT-start advances before the CP end. */
export interface EvmWindow {
  /** W at the record's rate (oversampling included). */
  readonly windowLengthSamples: number;
  /** The shorter CP at the record's rate. */
  readonly cpLengthSamples: number;
  /** FFT start advance before the CP end for Δt_l (earliest start) and Δt_h (latest start). */
  readonly lowAdvanceSamples: number;
  readonly highAdvanceSamples: number;
  /** Advance at the CP centre, used for nominal demodulation. */
  readonly centreAdvanceSamples: number;
  readonly source: string;
}

/** W and the two positions for a waveform; `overrideWindowSamples` replaces W (at the record's rate). */
export function evmWindowFor(plan: WaveformPlan, overrideWindowSamples?: number): EvmWindow {
  const os = plan.config.oversampling;
  const cp = Math.min(...plan.ofdm.cpLengthsSamples);
  const nominalFft = plan.numerology.fftSize;
  let w: number;
  let source: string;
  if (overrideWindowSamples !== undefined) {
    w = overrideWindowSamples;
    source = 'given';
  } else if (plan.numerology.standard === 'lte') {
    const table = plan.config.cyclicPrefix === 'extended' ? LTE_EVM_WINDOW_EXTENDED_CP : LTE_EVM_WINDOW_NORMAL_CP;
    w = (table[nominalFft] ?? Math.round(0.9 * (cp / os))) * os;
    source =
      plan.config.cyclicPrefix === 'extended'
        ? nominalFft === 1536
          ? 'TS 36.101 Table F.5.4-1 (15 MHz value from memory — verify)'
          : 'TS 36.101 Table F.5.4-1'
        : 'TS 36.101 Table F.5.3-1';
  } else if (plan.numerology.standard === 'nr' && plan.config.cyclicPrefix === 'extended') {
    // W scales with the CP when our FFT size differs from the table's; at the table's FFT size it is the listed W.
    const row = NR_EVM_WINDOW_EXTENDED_CP[plan.numerology.channelBandwidthHz / 1e6];
    const fraction = row ? row[1] / row[0] : NR_EVM_WINDOW_EXTENDED_CP_FRACTION;
    w = Math.max(1, Math.round(fraction * (cp / os))) * os;
    source = 'TS 38.101-1 Table F.5.4-1 (extended CP)';
  } else if (plan.numerology.standard === 'nr') {
    // Rounded at the nominal rate, then scaled, as the tables give W in samples at the nominal FFT size.
    w = Math.max(1, Math.round(NR_EVM_WINDOW_FRACTION * (cp / os))) * os;
    source = 'TS 38.101-1 Tables F.5.3-1/-2/-3, 50 % of the CP';
  } else {
    w = Math.max(1, Math.round(NR_EVM_WINDOW_FRACTION * cp));
    source = '50 % of the CP (no standard window for custom numerologies)';
  }
  w = Math.max(1, Math.min(Math.floor(w), cp + 1));
  // FFT start offsets from the CP start: W positions centred on cp/2.
  const low = Math.floor(cp / 2 - (w - 1) / 2);
  const high = low + w - 1;
  return {
    windowLengthSamples: w,
    cpLengthSamples: cp,
    lowAdvanceSamples: cp - Math.max(0, low),
    highAdvanceSamples: cp - Math.min(cp, high),
    centreAdvanceSamples: cp - Math.floor(cp / 2),
    source,
  };
}
