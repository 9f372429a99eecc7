import { DspError } from '../errors';
import type { PowerSpectrum } from './welchPsd';

/** UTRA chip rate, 3.84 Mcps, and its measurement filter's roll-off 0.22 (TS 25.101; TS 36.101 §6.6.2.3). */
export const UTRA_CHIP_RATE_HZ = 3.84e6;
/** Roll-off of the UTRA measurement RRC filter. */
export const UTRA_RRC_ROLL_OFF = 0.22;

/**
 * A channel measurement filter, by its power response |H(f)|² around the channel centre (unity in the passband):
 * - rect: 1 for |f| ≤ B/2, else 0 (the "square" filter of the E-UTRA and NR adjacent-channel measurements);
 * - rrc: root-raised-cosine with symbol rate 1/T and roll-off α, whose power response is the raised cosine
 *   |H(f)|² = 1 for |f| ≤ (1−α)/(2T); ½[1 + cos(πT/α·(|f| − (1−α)/(2T)))] up to (1+α)/(2T); 0 above
 *   (Proakis, Digital Communications 5th ed. §9.2; from memory — verify).
 */
export type ChannelFilter =
  | { readonly kind: 'rect'; readonly bandwidthHz: number }
  | { readonly kind: 'rrc'; readonly symbolRateHz: number; readonly rollOff: number };

/** The UTRA measurement filter: RRC, 3.84 Mcps, roll-off 0.22. */
export const UTRA_FILTER: ChannelFilter = { kind: 'rrc', symbolRateHz: UTRA_CHIP_RATE_HZ, rollOff: UTRA_RRC_ROLL_OFF };

/** |H(f)|² of `filter` at offset `offsetHz` from its centre. */
export function filterPowerResponse(filter: ChannelFilter, offsetHz: number): number {
  const f = Math.abs(offsetHz);
  if (filter.kind === 'rect') return f <= filter.bandwidthHz / 2 ? 1 : 0;
  const t = 1 / filter.symbolRateHz;
  const a = filter.rollOff;
  const passEdge = (1 - a) / (2 * t);
  const stopEdge = (1 + a) / (2 * t);
  if (f <= passEdge) return 1;
  if (f > stopEdge) return 0;
  return 0.5 * (1 + Math.cos(((Math.PI * t) / a) * (f - passEdge)));
}

/** Highest |offset| at which |H|² is non-zero, Hz. */
export function filterHalfSpanHz(filter: ChannelFilter): number {
  return filter.kind === 'rect' ? filter.bandwidthHz / 2 : ((1 + filter.rollOff) * filter.symbolRateHz) / 2;
}

/** ∫|H(f)|² df over all f, Hz: B for rect, 1/T for rrc (the raised cosine integrates to 1/T). */
export function filterNoiseBandwidthHz(filter: ChannelFilter): number {
  return filter.kind === 'rect' ? filter.bandwidthHz : filter.symbolRateHz;
}

/**
 * Antiderivative ∫_{−∞}^{x} |H(f)|² df, Hz, in closed form. For the raised cosine on the roll-off,
 * ∫_{f_a}^{u} ½[1 + cos(πT(f − f_a)/α)] df = ½(u − f_a) + (α/(2πT))·sin(πT(u − f_a)/α).
 */
export function filterPowerIntegralHz(filter: ChannelFilter, offsetHz: number): number {
  const half = filterNoiseBandwidthHz(filter) / 2;
  const fromCentre = (u: number): number => {
    if (filter.kind === 'rect') return Math.min(u, filter.bandwidthHz / 2);
    const t = 1 / filter.symbolRateHz;
    const a = filter.rollOff;
    const passEdge = (1 - a) / (2 * t);
    if (u <= passEdge) return u;
    const stopEdge = (1 + a) / (2 * t);
    const v = Math.min(u, stopEdge) - passEdge;
    return passEdge + 0.5 * v + (a / (2 * Math.PI * t)) * Math.sin((Math.PI * t * v) / a);
  };
  return offsetHz >= 0 ? half + fromCentre(offsetHz) : half - fromCentre(-offsetHz);
}

/**
 * Power of `psd` seen through `filter` centred at `centreHz`: Σ_k S[k]·∫_{bin k}|H(f − f_c)|² df, treating the PSD as
 * constant over each bin (the bin's share of the filter is integrated exactly, so edges between bins are weighted).
 * @returns power in the PSD's units × Hz (|x|²)
 */
export function filteredChannelPower(psd: PowerSpectrum, filter: ChannelFilter, centreHz: number): number {
  const span = filterHalfSpanHz(filter);
  const lo = centreHz - span;
  const hi = centreHz + span;
  const first = psd.frequenciesHz[0]! - psd.binWidthHz / 2;
  const last = psd.frequenciesHz[psd.frequenciesHz.length - 1]! + psd.binWidthHz / 2;
  if (lo < first - 1e-6 * psd.binWidthHz || hi > last + 1e-6 * psd.binWidthHz) {
    throw new DspError(
      'INTERNAL',
      `A channel at ${centreHz} Hz (±${span} Hz) reaches outside the spectrum (${first}…${last} Hz); the caller must raise the oversampling.`,
    );
  }
  const df = psd.binWidthHz;
  let power = 0;
  for (let i = 0; i < psd.frequenciesHz.length; i++) {
    const f = psd.frequenciesHz[i]!;
    if (f + df / 2 <= lo || f - df / 2 >= hi) continue;
    const weightHz = filterPowerIntegralHz(filter, f + df / 2 - centreHz) - filterPowerIntegralHz(filter, f - df / 2 - centreHz);
    power += psd.psdPerHz[i]! * weightHz;
  }
  return power;
}

/** Plain description of a filter, for reports. */
export function describeFilter(filter: ChannelFilter): string {
  return filter.kind === 'rect'
    ? `rectangular ${(filter.bandwidthHz / 1e6).toFixed(3)} MHz`
    : `RRC roll-off ${filter.rollOff}, ${(filter.symbolRateHz / 1e6).toFixed(2)} Mcps`;
}
