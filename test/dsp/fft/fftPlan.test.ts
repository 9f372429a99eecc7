import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { createFftPlan, fftForward, fftUnitary, ifftRaw, ifftUnitary } from '../../../src/dsp/fft/fftPlan';
import { DspError } from '../../../src/dsp/errors';
import { createRng } from '../../../src/dsp/data/rng';
import { expectCloseArray, maxAbs } from '../../helpers/expectClose';
import { naiveDft, randomIq } from '../../helpers/naiveDft';
import { TEST_SEED } from '../../helpers/seed';

// Independent reference library from npm: fft-js (Vail Systems, MIT) — recursive radix-2 FFT and a plain DFT.
const require = createRequire(import.meta.url);
const fftJsRef = require('fft-js') as {
  fft: (v: [number, number][]) => [number, number][];
  dft: (v: [number, number][]) => [number, number][];
};

function toPairs(iq: Float64Array): [number, number][] {
  return Array.from({ length: iq.length / 2 }, (_, i) => [iq[2 * i]!, iq[2 * i + 1]!]);
}
function fromPairs(pairs: [number, number][]): Float64Array {
  return Float64Array.from(pairs.flat());
}

// Relative tolerance for double-precision transforms of these sizes (rounding grows ~ log N · ε · ‖x‖).
const relTol = 1e-11;

describe(`FFT of every size the standards need (seed ${TEST_SEED})`, () => {
  const rng = createRng(TEST_SEED);
  const gauss = () => rng.nextGaussian();

  // Sizes: LTE FFTs 128…2048 and 1536 (TS 36.101 bandwidths, common practice), DFT-spreading sizes
  // M_sc = 12, 36, 180, 300, 1200 (TS 36.211 §5.3.3), primes and other sizes that take the Bluestein path.
  const sizes = [1, 2, 3, 5, 7, 12, 13, 36, 97, 128, 180, 300, 384, 1200, 1536];
  for (const n of sizes) {
    it(`size ${n} matches the O(N²) definition, forward and unscaled inverse`, () => {
      const x = randomIq(n, gauss);
      const plan = createFftPlan(n);
      const out = new Float64Array(2 * n);
      const tol = relTol * maxAbs(x) * n;
      expectCloseArray(fftForward(plan, x, out), naiveDft(x), tol, `forward ${n}`);
      expectCloseArray(ifftRaw(plan, x, out), naiveDft(x, true), tol, `inverse ${n}`);
    });
  }

  for (const n of [12, 300, 1536]) {
    it(`size ${n} matches fft-js's independent DFT`, () => {
      const x = randomIq(n, gauss);
      const out = fftForward(createFftPlan(n), x, new Float64Array(2 * n));
      expectCloseArray(out, fromPairs(fftJsRef.dft(toPairs(x))), relTol * maxAbs(x) * n, `fft-js dft ${n}`);
    });
  }

  for (const n of [2, 8, 128, 1024, 2048, 4096]) {
    it(`power of two ${n} matches fft-js's independent radix-2 FFT`, () => {
      const x = randomIq(n, gauss);
      const out = fftForward(createFftPlan(n), x, new Float64Array(2 * n));
      expectCloseArray(out, fromPairs(fftJsRef.fft(toPairs(x))), relTol * maxAbs(x) * n, `fft-js ${n}`);
    });
  }

  for (const n of [128, 1200, 1536, 97]) {
    it(`size ${n}: unitary round trip restores the input and Parseval holds`, () => {
      const x = randomIq(n, gauss);
      const plan = createFftPlan(n);
      const spectrum = fftUnitary(plan, x, new Float64Array(2 * n));
      const back = ifftUnitary(plan, spectrum, new Float64Array(2 * n));
      expectCloseArray(back, x, 1e-12 * maxAbs(x) * Math.log2(n + 1) * 10, 'round trip');
      const energy = (v: Float64Array) => v.reduce((s, a) => s + a * a, 0);
      // Parseval (unitary DFT): Σ|x|² = Σ|X|².
      expect(Math.abs(energy(spectrum) - energy(x)) / energy(x)).toBeLessThan(1e-12);
    });
  }

  it('reports which algorithm each size uses', () => {
    expect(createFftPlan(2048).method).toBe('power-of-two');
    expect(createFftPlan(1536).method).toBe('mixed-radix');
    expect(createFftPlan(1200).method).toBe('mixed-radix');
    expect(createFftPlan(97).method).toBe('bluestein');
  });
});

describe('FFT errors', () => {
  it('rejects sizes it cannot plan', () => {
    for (const bad of [0, -4, 2.5, Number.NaN, 2 ** 23]) {
      expect(() => createFftPlan(bad)).toThrow(DspError);
    }
    try {
      createFftPlan(0);
    } catch (e) {
      expect((e as DspError).code).toBe('UNSUPPORTED_SIZE');
    }
  });
  it('rejects wrong buffer lengths and aliasing', () => {
    const plan = createFftPlan(8);
    expect(() => fftForward(plan, new Float64Array(14), new Float64Array(16))).toThrow(/16 are required/);
    const buf = new Float64Array(16);
    expect(() => fftForward(plan, buf, buf)).toThrow(/different buffers/);
  });
});
