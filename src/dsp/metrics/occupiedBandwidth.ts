import { DspError } from '../errors';
import type { PowerSpectrum } from './welchPsd';

/** Share of the total power the occupied bandwidth holds: 99 %, 0.5 % left outside on each side (TS 36.101 §6.6.1, from memory — verify). */
export const OBW_POWER_FRACTION = 0.99;

/** The occupied bandwidth and its edges, Hz. */
export interface OccupiedBandwidth {
  readonly occupiedBandwidthHz: number;
  /** Frequency below which 0.5 % of the power lies, Hz. */
  readonly lowerHz: number;
  /** Frequency above which 0.5 % of the power lies, Hz. */
  readonly upperHz: number;
  readonly totalPower: number;
}

/**
 * Occupied bandwidth: the width between the frequencies below and above which (1 − fraction)/2 of the total integrated
 * power of the spectrum lies. The PSD is taken as constant over each bin, so the crossing is interpolated linearly
 * inside the bin where the cumulative power passes the threshold.
 * @param fraction share of the power inside (default 0.99)
 */
export function computeOccupiedBandwidth(psd: PowerSpectrum, fraction = OBW_POWER_FRACTION): OccupiedBandwidth {
  if (!(fraction > 0 && fraction < 1)) throw new DspError('INVALID_CONFIG', `The occupied-bandwidth fraction must lie in (0, 1); got ${fraction}.`);
  const n = psd.psdPerHz.length;
  const df = psd.binWidthHz;
  let totalPower = 0;
  for (let i = 0; i < n; i++) totalPower += psd.psdPerHz[i]! * df;
  if (!(totalPower > 0)) throw new DspError('INVALID_CONFIG', 'The occupied bandwidth of a signal without power is undefined.');
  const tail = ((1 - fraction) / 2) * totalPower;
  const crossing = (fromTop: boolean): number => {
    let cumulative = 0;
    for (let step = 0; step < n; step++) {
      const i = fromTop ? n - 1 - step : step;
      const binPower = psd.psdPerHz[i]! * df;
      if (cumulative + binPower >= tail && binPower > 0) {
        const share = (tail - cumulative) / binPower;
        const edge = psd.frequenciesHz[i]! + (fromTop ? df / 2 : -df / 2);
        return fromTop ? edge - share * df : edge + share * df;
      }
      cumulative += binPower;
    }
    return psd.frequenciesHz[fromTop ? 0 : n - 1]!;
  };
  const lowerHz = crossing(false);
  const upperHz = crossing(true);
  return { occupiedBandwidthHz: upperHz - lowerHz, lowerHz, upperHz, totalPower };
}
