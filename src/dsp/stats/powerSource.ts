import { assertLength, DspError } from '../errors';
import { ifftRaw } from '../fft/fftPlan';
import type { WaveformPlan } from '../waveform/waveformPlan';
import { createRandomBitReader } from './randomBits';
import { createSubcarrierFiller } from './subcarrierFiller';

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
  /**
   * Exact expectation of |x|² per sample: Σ over data subcarriers of amplitude² (unit-power constellations,
   * E|a_k|² = amplitude²; the unnormalised IFFT sums the subcarrier powers; unitary spreading keeps them).
   */
  readonly expectedMeanPower: number;
  /**
   * Writes the power of symbols firstSymbol … firstSymbol + numSymbols − 1 of block `blockSeed`, symbol after symbol.
   * @param blockSeed seed of the block's random data (e.g. deriveBlockSeed(runSeed, blockIndex)); a safe integer ≥ 0
   * @param firstSymbol index of the first symbol within the block (≥ 0; the data stream is skipped up to it)
   * @param outPower numSymbols · samplesPerSymbol values, linear power
   */
  fillSymbolPowers(blockSeed: number, firstSymbol: number, numSymbols: number, outPower: Float32Array | Float64Array): void;
}

/** Options of createPowerSource. */
export interface PowerSourceOptions {
  /** 'f64' (default): double precision through the engine's own transforms, equal to the generator to ~1e-12. */
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
  if (precision === 'f32') {
    throw new DspError('INVALID_CONFIG', 'precision "f32" is not available yet; use "f64".', { field: 'precision' });
  }
  return createF64PowerSource(plan);
}

function createF64PowerSource(plan: WaveformPlan): PowerSource {
  const filler = createSubcarrierFiller(plan);
  const n = plan.ofdm.ifftSize;
  const freqIq = new Float64Array(2 * n);
  const timeIq = new Float64Array(2 * n);
  return {
    samplesPerSymbol: n,
    expectedMeanPower: expectedMeanPowerOf(plan),
    fillSymbolPowers(blockSeed, firstSymbol, numSymbols, outPower) {
      checkRequest(blockSeed, firstSymbol, numSymbols);
      assertLength(outPower, numSymbols * n, `Power output for ${numSymbols} symbols of ${n} samples`);
      const reader = createRandomBitReader(blockSeed);
      reader.skip(firstSymbol * filler.bitsPerOfdmSymbol);
      for (let s = 0; s < numSymbols; s++) {
        filler.fill(reader, firstSymbol + s, freqIq);
        ifftRaw(plan.ofdm.fft, freqIq, timeIq);
        const base = s * n;
        for (let i = 0; i < n; i++) {
          const re = timeIq[2 * i]!;
          const im = timeIq[2 * i + 1]!;
          outPower[base + i] = re * re + im * im;
        }
      }
    },
  };
}

/** Σ over blocks of (data subcarriers × amplitude²). */
export function expectedMeanPowerOf(plan: WaveformPlan): number {
  let sum = 0;
  for (const a of plan.allocations) sum += a.dataSubcarriers.length * a.amplitudeLinear * a.amplitudeLinear;
  return sum;
}

function checkRequest(blockSeed: number, firstSymbol: number, numSymbols: number): void {
  if (!Number.isSafeInteger(blockSeed) || blockSeed < 0) {
    throw new DspError('INVALID_CONFIG', `blockSeed must be a whole number from 0 to ${Number.MAX_SAFE_INTEGER}; got ${blockSeed}.`, { field: 'blockSeed' });
  }
  if (!Number.isSafeInteger(firstSymbol) || firstSymbol < 0) {
    throw new DspError('INVALID_CONFIG', `firstSymbol must be a whole number ≥ 0; got ${firstSymbol}.`, { field: 'firstSymbol' });
  }
  if (!Number.isSafeInteger(numSymbols) || numSymbols < 0) {
    throw new DspError('INVALID_CONFIG', `numSymbols must be a whole number ≥ 0; got ${numSymbols}.`, { field: 'numSymbols' });
  }
}
