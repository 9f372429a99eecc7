/**
 * The bench's per-symbol statistics: peak and mean of each symbol's power, PAPR = peak / mean, counted in
 * 0.01 dB bins from 0 to 20 dB (bench/numpy_ccdf.py does the same). A stand-in for the measurement engine's
 * histograms, kept here so the bench measures the power source plus a realistic, simple consumer.
 */
export const BINS_PER_DB = 100;
export const NUM_BINS = 20 * BINS_PER_DB + 1;

/** Adds the PAPR of `numSymbols` symbols of `samplesPerSymbol` powers each to `histogram` (NUM_BINS counts). */
export function accumulatePaprHistogram(
  power: Float32Array | Float64Array,
  samplesPerSymbol: number,
  numSymbols: number,
  histogram: Float64Array,
): void {
  for (let s = 0; s < numSymbols; s++) {
    const base = s * samplesPerSymbol;
    let peak = 0;
    let sum = 0;
    for (let i = base; i < base + samplesPerSymbol; i++) {
      const p = power[i]!;
      sum += p;
      if (p > peak) peak = p;
    }
    const paprDb = 10 * Math.log10((peak * samplesPerSymbol) / sum);
    const bin = Math.min(NUM_BINS - 1, Math.max(0, Math.floor(paprDb * BINS_PER_DB)));
    histogram[bin]! += 1;
  }
}

/** The level (dB) where the PAPR CCDF first falls to `probability` or below, as numpy_ccdf.py computes it. */
export function levelAtProbabilityDb(histogram: Float64Array, probability: number): number {
  let total = 0;
  for (let i = 0; i < histogram.length; i++) total += histogram[i]!;
  let below = 0;
  for (let i = 0; i < histogram.length; i++) {
    below += histogram[i]!;
    if (1 - below / total <= probability) return i / BINS_PER_DB;
  }
  return Number.NaN;
}
