import { DspError } from '../errors';
import type { WaveformPlan } from '../waveform/waveformPlan';
import { createF32PowerSource } from './f32PowerSource';
import { createF64PowerSource } from './f64PowerSource';
import { expectedMeanPowerOf } from './powerRequest';

/**
 * Instantaneous power of random OFDM / DFT-s-OFDM symbols, for PAPR and CCDF statistics.
 *
 * Symbol l of block `blockSeed` is exactly symbol l of the waveform createWaveformGenerator makes from `plan` with
 * its data source replaced by `{ source: 'random', seed: blockSeed }`: same bits, mapping, DFT spreading, powers
 * per block and subcarrier positions. Only the useful part is kept (cyclic prefix removed); the LTE uplink's
 * half-subcarrier ramp and the NR §5.4 phase have unit modulus, so they do not change |x|² and are left out.
 * p[n] = |s_l(n·Ts/os)|², n = 0 … fftSize·os − 1, in the formulas' own scale (no normalisation).
 */
export interface PowerSource {
  /** Useful part of one symbol, CP removed, oversampled (fftSize·os). */
  readonly samplesPerSymbol: number;
  /** The arithmetic actually used: 'f32' only when the WebAssembly FFT is installed and suits the size. */
  readonly precisionUsed: 'f64' | 'f32';
  /**
   * Exact expectation of |x|² per sample: Σ over data subcarriers of amplitude² (unit-power constellations,
   * E|a_k|² = amplitude²; the unnormalised IFFT sums the subcarrier powers; unitary spreading keeps them).
   */
  readonly expectedMeanPower: number;
  /**
   * Writes the power of symbols firstSymbol … firstSymbol + numSymbols − 1 of block `blockSeed`, symbol after symbol.
   * @param blockSeed seed of the block's random data (e.g. deriveBlockSeed(runSeed, blockIndex)); a safe integer ≥ 0
   * @param firstSymbol index of the first symbol within the block (≥ 0; the data stream is skipped up to it, one
   *   generator step per 32 bits, so prefer blocks that start at 0)
   * @param outPower numSymbols · samplesPerSymbol values, linear power
   */
  fillSymbolPowers(blockSeed: number, firstSymbol: number, numSymbols: number, outPower: Float32Array | Float64Array): void;
}

export { expectedMeanPowerOf };

/** Options of createPowerSource. */
export interface PowerSourceOptions {
  /**
   * 'f64' (default): double precision through the engine's own transforms, equal to the generator to ~1e-12.
   * 'f32': single-precision WebAssembly FFT (see fft/f32Fft.ts) when one is installed and the IFFT size suits it;
   * powers agree with f64 to 5e-6 of each symbol's peak, PAPR to 1e-4 dB (tested). Without a backend, or for sizes
   * it cannot do, 'f32' quietly runs the f64 path, which is only more exact.
   */
  precision?: 'f64' | 'f32';
}

/**
 * Creates the power source of a waveform plan (its `data` field is ignored; see PowerSource).
 * @throws DspError INVALID_CONFIG for an unknown precision
 */
export function createPowerSource(plan: WaveformPlan, options: PowerSourceOptions = {}): PowerSource {
  const precision = options.precision ?? 'f64';
  if (precision !== 'f64' && precision !== 'f32') {
    throw new DspError('INVALID_CONFIG', `precision "${String(precision)}" is not supported; allowed: "f64", "f32".`, { field: 'precision' });
  }
  if (precision === 'f32') return createF32PowerSource(plan) ?? createF64PowerSource(plan);
  return createF64PowerSource(plan);
}
