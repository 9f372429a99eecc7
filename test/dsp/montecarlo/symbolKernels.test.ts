import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { createDbHistogram, POWER_HISTOGRAM_SPEC } from '../../../src/dsp/metrics/dbHistogram';
import { binIndexOfPower, bitsViewOf, createPowerBinner } from '../../../src/dsp/metrics/powerBinner';
import { accumulateSymbolF32, accumulateSymbolF64, createSubHistograms, foldSubHistograms } from '../../../src/dsp/montecarlo/symbolKernels';
import { TEST_SEED } from '../../helpers/seed';

describe('fused per-symbol kernels', () => {
  const binner = createPowerBinner(POWER_HISTOGRAM_SPEC, 300);
  for (const precision of ['f64', 'f32'] as const) {
    it(`${precision}: counts, Σp, Σp³ and the peak equal a plain loop, for odd and even lengths`, () => {
      const rng = createRng(TEST_SEED);
      const powers = precision === 'f64' ? new Float64Array(4099) : new Float32Array(4099);
      for (let i = 0; i < powers.length; i++) powers[i] = -Math.log(1 - rng.nextFloat()) * 300 * (i % 3 === 0 ? 1e-4 : 1);
      const bits = bitsViewOf(powers);
      for (const [start, n] of [
        [0, 4099],
        [3, 2048],
        [1, 1],
        [10, 0],
      ] as const) {
        const sub = createSubHistograms(6003);
        const sums = { sum: 0, sumCubed: 0, peak: 0 };
        if (powers instanceof Float64Array) accumulateSymbolF64(powers, bits, start, n, binner, sub, sums);
        else accumulateSymbolF32(powers, bits, start, n, binner, sub, sums);
        const got = createDbHistogram(POWER_HISTOGRAM_SPEC);
        foldSubHistograms(sub, got.counts);
        const want = createDbHistogram(POWER_HISTOGRAM_SPEC);
        let sum = 0;
        let sumCubed = 0;
        let peak = 0;
        for (let i = start; i < start + n; i++) {
          want.counts[binIndexOfPower(binner, powers[i]!)]!++;
          peak = Math.max(peak, powers[i]!);
          sum += powers[i]!;
          sumCubed += powers[i]! ** 3;
        }
        expect(Array.from(got.counts)).toEqual(Array.from(want.counts));
        expect(sums.peak).toBe(peak);
        // Pairwise accumulation reorders the additions: equal to rounding.
        expect(Math.abs(sums.sum - sum)).toBeLessThanOrEqual(1e-12 * Math.max(1, sum));
        expect(Math.abs(sums.sumCubed - sumCubed)).toBeLessThanOrEqual(1e-12 * Math.max(1, sumCubed));
        expect(sub.even.every((c) => c === 0) && sub.odd.every((c) => c === 0)).toBe(true);
      }
    });
  }
});
