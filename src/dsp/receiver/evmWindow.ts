import type { WaveformPlan } from '../waveform/waveformPlan';

/**
 * EVM window length W and its two FFT window positions (TS 36.101 Annex F.5, TS 38.101-1 Annex F.5).
 * The window is W consecutive FFT start positions centred on the middle of the (shorter) cyclic prefix; EVM is measured
 * with the FFT starting at the first (Δt_l) and at the last (Δt_h) of them and the larger result is reported. Positions are
 * expressed here as the advance of the FFT start before the end of each CP, the same for every symbol (the longer CP of
 * symbol 0 only adds samples at its start). 36.101's own expressions are Δt_l = Δc − α − ⌊W/2⌋, Δt_h = Δc + ⌊W/2⌋
 * (REFERENCE.md §5.4, from memory — verify); rounding the centre of an odd CP down is our choice.
 */

/** TS 36.101 Table F.5.3-1, normal CP: W in samples at the nominal FFT size [S]. */
export const LTE_EVM_WINDOW_NORMAL_CP: Readonly<Record<number, number>> = { 128: 5, 256: 12, 512: 32, 1024: 66, 1536: 102, 2048: 136 };
/** TS 36.101 Table F.5.4-1, extended CP (CP 32…512 samples): W (from memory — verify). */
export const LTE_EVM_WINDOW_EXTENDED_CP: Readonly<Record<number, number>> = { 128: 28, 256: 58, 512: 124, 1024: 250, 1536: 374, 2048: 504 };
/**
 * NR: W as a fraction of the CP. TS 38.101-2 Tables F.5.3-1/-2 (FR2) give 50 % [S]; the FR1 tables of 38.101-1 are not
 * captured here and 50 % is used for them too (from memory — verify; some narrow FR1 channels may use about 40 %).
 */
export const NR_EVM_WINDOW_FRACTION = 0.5;

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
    source = plan.config.cyclicPrefix === 'extended' ? 'TS 36.101 Table F.5.4-1 (from memory — verify)' : 'TS 36.101 Table F.5.3-1';
  } else {
    w = Math.max(1, Math.round(NR_EVM_WINDOW_FRACTION * cp));
    source = plan.numerology.standard === 'nr' ? 'TS 38.101-1 Annex F.5, 50 % of the CP (from memory — verify)' : '50 % of the CP (no standard window for custom numerologies)';
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
