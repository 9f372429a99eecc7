import { DspError } from '../errors';
import type { WaveformPlan } from '../waveform/waveformPlan';

/** Σ over blocks of (data subcarriers × amplitude²). */
export function expectedMeanPowerOf(plan: WaveformPlan): number {
  let sum = 0;
  for (const a of plan.allocations) sum += a.dataSubcarriers.length * a.amplitudeLinear * a.amplitudeLinear;
  return sum;
}

/** Checks the arguments of fillSymbolPowers (the output length is checked by each implementation). */
export function checkPowerRequest(blockSeed: number, firstSymbol: number, numSymbols: number): void {
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
