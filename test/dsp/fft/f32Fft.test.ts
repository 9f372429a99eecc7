import { beforeAll, describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { DspError } from '../../../src/dsp/errors';
import {
  f32FftBackendName,
  getF32Transform,
  installF32Fft,
  isF32FftSize,
  loadF32Fft,
} from '../../../src/dsp/fft/f32Fft';
import { maxAbs } from '../../helpers/expectClose';
import { naiveDft, randomIq } from '../../helpers/naiveDft';
import { TEST_SEED } from '../../helpers/seed';

// PFFFT works in IEEE single precision (ε = 2^−24 ≈ 6e-8); its error grows about ε·log N·‖x‖ per output
// (common practice). The bound below is ~5× what 8192 points need.
const relTolF32 = 2e-6;

function worstRelative(actual: ArrayLike<number>, expected: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < expected.length; i++) worst = Math.max(worst, Math.abs(actual[i]! - expected[i]!));
  return worst / maxAbs(expected);
}

describe(`f32 FFT backend over @echogarden/pffft-wasm (seed ${TEST_SEED})`, () => {
  const rng = createRng(TEST_SEED);
  const gauss = () => rng.nextGaussian();

  beforeAll(async () => {
    const failing = () => Promise.reject(new Error('no such build'));
    const loaded = await loadF32Fft([failing, () => import('@echogarden/pffft-wasm/simd'), () => import('@echogarden/pffft-wasm')]);
    expect(loaded.failures).toEqual(['no such build']);
    expect(loaded.backend).toBe('pffft-wasm simd (f32)');
  });

  it('names the backend and the sizes PFFFT plans (multiples of 16 of the form 2^a·3^b·5^c)', () => {
    expect(f32FftBackendName()).toBe('pffft-wasm simd (f32)');
    expect([16, 48, 1200, 1536, 8192, 6144].every(isF32FftSize)).toBe(true);
    expect([8, 12, 300, 1000, 16 * 7, 16 * 13].some(isF32FftSize)).toBe(false);
    expect(getF32Transform(300)).toBeNull();
  });

  for (const n of [48, 1200, 1536]) {
    it(`size ${n}: forward and backward (unscaled) match the O(N²) DFT to ${relTolF32} of the peak`, () => {
      const x = randomIq(n, gauss);
      const t = getF32Transform(n)!;
      t.owner = 'test';
      for (const direction of ['forward', 'backward'] as const) {
        t.input().set(x);
        t.run(direction, true);
        expect(worstRelative(t.output(), naiveDft(x, direction === 'backward')), direction).toBeLessThanOrEqual(relTolF32);
      }
    });
  }

  it('z positions: the internal-order forward output read at zRe/zIm equals the ordered output', () => {
    const n = 8192;
    const x = randomIq(n, gauss);
    const t = getF32Transform(n)!;
    t.owner = 'test';
    t.input().set(x);
    t.run('forward', true);
    const ordered = t.output().slice();
    t.run('forward', false);
    const internal = t.output();
    const gathered = new Float32Array(2 * n);
    for (let k = 0; k < n; k++) {
      gathered[2 * k] = internal[t.zRe[k]!]!;
      gathered[2 * k + 1] = internal[t.zIm[k]!]!;
    }
    expect(gathered).toEqual(ordered);
  });

  it('rejects an object that is not a PFFFT module with a typed error', () => {
    for (const bad of [null, {}, { HEAPF32: new Float32Array(4) }]) {
      try {
        installF32Fft(bad);
        expect.unreachable('should have thrown');
      } catch (err) {
        expect(err).toBeInstanceOf(DspError);
        expect((err as DspError).code).toBe('INTERNAL');
        expect((err as DspError).message).toMatch(/PFFFT WebAssembly module; missing/);
      }
    }
    // The installed backend survives a rejected install.
    expect(f32FftBackendName()).toBe('pffft-wasm simd (f32)');
  });
});
