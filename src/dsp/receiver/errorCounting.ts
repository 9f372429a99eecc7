import { assertLength } from '../errors';
import { bitsPerSymbol } from '../modulation/constellations';
import { dataSubcarriersOf, type WaveformPlan } from '../waveform/waveformPlan';

/** Bit and symbol errors of received bits against the known transmitted bits (both in the generator's fill order). */
export interface ErrorCounts {
  readonly bitErrors: number;
  readonly numBits: number;
  /** A symbol is in error when any of its bits is. */
  readonly symbolErrors: number;
  readonly numSymbols: number;
  readonly ber: number;
  readonly ser: number;
}

/** Counts bit and symbol errors; symbols are delimited by the plan's data layout and modulations. */
export function countErrors(plan: WaveformPlan, txBits: Uint8Array, rxBits: Uint8Array): ErrorCounts {
  assertLength(rxBits, txBits.length, 'Received bits');
  let bitErrors = 0;
  let symbolErrors = 0;
  let numSymbols = 0;
  let offset = 0;
  for (let l = 0; l < plan.config.symbols && offset < txBits.length; l++) {
    plan.allocations.forEach((a, b) => {
      const m = dataSubcarriersOf(plan, l, b).length;
      const width = bitsPerSymbol(a.modulation);
      for (let s = 0; s < m; s++) {
        let wrong = 0;
        for (let i = 0; i < width; i++, offset++) wrong += txBits[offset] !== rxBits[offset] ? 1 : 0;
        bitErrors += wrong;
        if (wrong > 0) symbolErrors++;
        numSymbols++;
      }
    });
  }
  return {
    bitErrors,
    numBits: txBits.length,
    symbolErrors,
    numSymbols,
    ber: txBits.length > 0 ? bitErrors / txBits.length : Number.NaN,
    ser: numSymbols > 0 ? symbolErrors / numSymbols : Number.NaN,
  };
}
