import { ifftRaw } from '../fft/fftPlan';
import type { WaveformPlan } from '../waveform/waveformPlan';
import { expectedMeanPowerOf, openPowerRequest } from './powerRequest';
import type { PowerSource } from './powerSource';
import { createSubcarrierFiller } from './subcarrierFiller';

/**
 * Double-precision power source: the grid row goes through the engine's own IFFT (fft.js for powers of two,
 * mixed radix otherwise), unscaled, so p[n] equals |ofdmModulateSymbol|² of the useful part to rounding.
 */
export function createF64PowerSource(plan: WaveformPlan): PowerSource {
  const filler = createSubcarrierFiller(plan);
  const n = plan.ofdm.ifftSize;
  const freqIq = new Float64Array(2 * n);
  const timeIq = new Float64Array(2 * n);
  return {
    samplesPerSymbol: n,
    precisionUsed: 'f64',
    expectedMeanPower: expectedMeanPowerOf(plan),
    fillSymbolPowers(blockSeed, firstSymbol, numSymbols, outPower) {
      const reader = openPowerRequest(blockSeed, firstSymbol, numSymbols, outPower, n, filler.bitsPerOfdmSymbol);
      for (let s = 0; s < numSymbols; s++) {
        filler.fill64(reader, firstSymbol + s, freqIq);
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

