import { getF32Transform } from '../fft/f32Fft';
import type { WaveformPlan } from '../waveform/waveformPlan';
import { createPowerKernel } from './powerKernel';
import { expectedMeanPowerOf, openPowerRequest } from './powerRequest';
import type { PowerSource } from './powerSource';
import { createSubcarrierFiller } from './subcarrierFiller';

/**
 * Single-precision power source over the installed WebAssembly FFT (PFFFT), or null when none is installed or the
 * IFFT size is not a PFFFT size (then createPowerSource uses the f64 path).
 *
 * Per symbol: the same bits and mapping as the f64 path, DFT spreading by PFFFT where the block size allows (else
 * the f64 DFT), the values written straight into the IFFT's internal z-order input (no zero fill: only the data
 * bins ever change), one unscaled backward transform with its time output in natural order, then |x|² by a
 * small WebAssembly SIMD kernel (powerKernel.ts; a JavaScript loop where WebAssembly SIMD is missing).
 * Accuracy: PFFFT is f32 throughout (ε = 6e-8); p[n] agrees with the f64 path to within about 6e-7 of the symbol's
 * peak power at 8192 points, and the per-symbol PAPR to a few 1e-6 dB (the tests hold 5e-6 and 1e-4 dB).
 */
export function createF32PowerSource(plan: WaveformPlan): PowerSource | null {
  const n = plan.ofdm.ifftSize;
  const transform = getF32Transform(n);
  if (!transform) return null;
  const filler = createSubcarrierFiller(plan);
  const positionsRe = filler.binsInOrder.map((b) => transform.zRe[b]!);
  const positionsIm = filler.binsInOrder.map((b) => transform.zIm[b]!);
  // NOTE: the transform and its heap buffers are shared by every f32 source of this size in the thread; a source
  // that finds another one's bins in the input clears it first.
  const owner = {};
  const kernel = createPowerKernel(n);
  return {
    samplesPerSymbol: n,
    precisionUsed: 'f32',
    expectedMeanPower: expectedMeanPowerOf(plan),
    fillSymbolPowers(blockSeed, firstSymbol, numSymbols, outPower) {
      const reader = openPowerRequest(blockSeed, firstSymbol, numSymbols, outPower, n, filler.bitsPerOfdmSymbol);
      if (transform.owner !== owner) {
        transform.input().fill(0);
        transform.owner = owner;
      }
      for (let s = 0; s < numSymbols; s++) {
        filler.fill32(reader, firstSymbol + s, transform.input(), positionsRe, positionsIm);
        transform.run('backward', false);
        if (kernel) kernel.compute(transform.output(), outPower, s * n);
        else writePowers(transform.output(), outPower, s * n, n);
      }
    },
  };
}

/** out[base + i] = |x_i|² for i < n, x interleaved f32. */
function writePowers(timeIq: Float32Array, out: Float32Array | Float64Array, base: number, n: number): void {
  for (let i = 0; i < n; i++) {
    const re = timeIq[2 * i]!;
    const im = timeIq[2 * i + 1]!;
    out[base + i] = re * re + im * im;
  }
}
