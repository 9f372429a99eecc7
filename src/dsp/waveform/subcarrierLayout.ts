import type { Numerology } from '../numerology/numerology';

/**
 * Where grid subcarrier k' = 0…12·N_RB−1 (k' = 0 the lowest frequency) sits, in whole subcarriers from DC;
 * the LTE uplink adds the half-subcarrier shift separately (Numerology.halfSubcarrierShift).
 * - LTE downlink (TS 36.211 §6.12): k = k' − 6N_RB below the centre, k' − 6N_RB + 1 above (DC unused).
 * - LTE uplink (TS 36.211 §5.6): k = k' − 6N_RB, transmitted at (k + 1/2)Δf.
 * - NR (TS 38.211 §5.3.1, k0 = 0): k' − 12N_RB/2, no DC null.
 */
export function gridSubcarrierOffset(numerology: Numerology, gridIndex: number): number {
  const half = numerology.numGridSubcarriers / 2;
  const k = gridIndex - half;
  return numerology.dcNull && k >= 0 ? k + 1 : k;
}

/** Frequency of grid subcarrier k' relative to the carrier, Hz. */
export function gridSubcarrierFrequencyHz(numerology: Numerology, gridIndex: number): number {
  const shift = numerology.halfSubcarrierShift ? 0.5 : 0;
  return (gridSubcarrierOffset(numerology, gridIndex) + shift) * numerology.subcarrierSpacingHz;
}

/**
 * IFFT bin of every grid subcarrier for an `ifftSize`-point transform (fftSize × oversampling): offset mod ifftSize.
 * Zero padding the IFFT this way evaluates the continuous-time formula at t = n·Ts/os.
 */
export function gridToIfftBins(numerology: Numerology, ifftSize: number): Int32Array {
  const bins = new Int32Array(numerology.numGridSubcarriers);
  for (let g = 0; g < bins.length; g++) {
    const k = gridSubcarrierOffset(numerology, g);
    bins[g] = ((k % ifftSize) + ifftSize) % ifftSize;
  }
  return bins;
}
