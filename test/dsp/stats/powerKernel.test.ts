import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { assemblePowerKernel, createPowerKernel } from '../../../src/dsp/stats/powerKernel';
import { TEST_SEED } from '../../helpers/seed';

// f32 arithmetic: fl(fl(re²) + fl(im²)) lies within 2 ulp (2·2^−23 relative) of re² + im² rounded to f32
// (IEEE 754 rounding, common practice).
const relTolUlp = 2 * 2 ** -23;

describe(`WebAssembly SIMD power kernel (seed ${TEST_SEED})`, () => {
  it('is a valid WebAssembly module (166 bytes)', () => {
    const bytes = assemblePowerKernel();
    expect(WebAssembly.validate(bytes)).toBe(true);
    expect(bytes.length).toBe(166);
  });

  for (const n of [4, 16, 1200, 8192, 65536]) {
    it(`${n} samples: |x|² in sample order, into f32 and f64 outputs at an offset`, () => {
      const rng = createRng(TEST_SEED + n);
      const iq = new Float32Array(2 * n);
      for (let i = 0; i < iq.length; i++) iq[i] = 100 * rng.nextGaussian();
      const kernel = createPowerKernel(n)!;
      expect(kernel).not.toBeNull();
      const out32 = new Float32Array(n + 7);
      const out64 = new Float64Array(n + 3);
      kernel.compute(iq, out32, 7);
      kernel.compute(iq, out64, 3);
      let worst = 0;
      for (let i = 0; i < n; i++) {
        const exact = iq[2 * i]! * iq[2 * i]! + iq[2 * i + 1]! * iq[2 * i + 1]!;
        worst = Math.max(worst, Math.abs(out32[7 + i]! - exact) / exact, Math.abs(out64[3 + i]! - exact) / exact);
      }
      expect(worst).toBeLessThanOrEqual(relTolUlp);
      expect(out32.subarray(0, 7)).toEqual(new Float32Array(7));
      expect(out64.subarray(0, 3)).toEqual(new Float64Array(3));
    });
  }

  it('declines sizes that are not positive multiples of 4', () => {
    for (const n of [0, 2, 6, 1201, -4, 4.5]) expect(createPowerKernel(n)).toBeNull();
  });
});
