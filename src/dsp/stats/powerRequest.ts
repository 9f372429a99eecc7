import { assertLength, DspError } from '../errors';
import type { WaveformPlan } from '../waveform/waveformPlan';
import { createRandomBitReader, type RandomBitReader } from './randomBits';

/** Σ over blocks of (data subcarriers × amplitude²). */
export function expectedMeanPowerOf(plan: WaveformPlan): number {
  let sum = 0;
  for (const a of plan.allocations) sum += a.dataSubcarriers.length * a.amplitudeLinear * a.amplitudeLinear;
  return sum;
}

/**
 * Checks the arguments of fillSymbolPowers and opens the block's data stream at `firstSymbol`: the preamble both
 * the f64 and the f32 power sources share (once per call, not per symbol).
 * @param outPower must hold numSymbols · samplesPerSymbol values
 * @param bitsPerOfdmSymbol data bits of one symbol (the subcarrier filler's count), to skip to `firstSymbol`
 * @throws DspError INVALID_CONFIG for a bad seed or symbol range, LENGTH_MISMATCH for a wrong output length
 */
export function openPowerRequest(
  blockSeed: number,
  firstSymbol: number,
  numSymbols: number,
  outPower: Float32Array | Float64Array,
  samplesPerSymbol: number,
  bitsPerOfdmSymbol: number,
): RandomBitReader {
  checkPowerRequest(blockSeed, firstSymbol, numSymbols);
  assertLength(outPower, numSymbols * samplesPerSymbol, `Power output for ${numSymbols} symbols of ${samplesPerSymbol} samples`);
  const reader = createRandomBitReader(blockSeed);
  reader.skip(firstSymbol * bitsPerOfdmSymbol);
  return reader;
}

function checkPowerRequest(blockSeed: number, firstSymbol: number, numSymbols: number): void {
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
