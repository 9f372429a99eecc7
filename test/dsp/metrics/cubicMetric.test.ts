import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { computeCubicMetric, cubicMetricFromMoments } from '../../../src/dsp/metrics/cubicMetric';
import { TEST_SEED } from '../../helpers/seed';

// TS 25.101 §6.2.2 formula; check values derived in REFERENCE.md §5.3 (reference 1.52 dB from memory — verify).
describe('cubic metric', () => {
  it('a constant-envelope signal has raw CM 0 dB, CM (0 − 1.52)/1.56 = −0.974 dB', () => {
    const n = 4096;
    const iq = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      iq[2 * i] = 3 * Math.cos(0.37 * i);
      iq[2 * i + 1] = 3 * Math.sin(0.37 * i);
    }
    const cm = computeCubicMetric(iq);
    expect(Math.abs(cm.rawCubicMetricDb)).toBeLessThan(1e-12);
    expect(cm.cubicMetricDb).toBeCloseTo(-1.52 / 1.56, 12);
    expect(cm.definition).toMatch(/unrounded/);
  });

  it('complex Gaussian noise: raw CM 10·log10 6 = 7.78 dB; CM 4.01 dB with k = 1.56 and 3.38 dB with k = 1.85', () => {
    const rng = createRng(TEST_SEED);
    const n = 1 << 18;
    const iq = new Float64Array(2 * n);
    for (let i = 0; i < 2 * n; i++) iq[i] = rng.nextGaussian();
    // E|v|⁶ of exponential power has relative std √(684/n)/6 ≈ 0.9 % here → ≈ 0.04 dB; allow 0.15 dB.
    const toleranceDb = 0.15;
    const cm = computeCubicMetric(iq);
    expect(Math.abs(cm.rawCubicMetricDb - 7.7815), `seed ${TEST_SEED}`).toBeLessThan(toleranceDb);
    expect(Math.abs(cm.cubicMetricDb - 4.01)).toBeLessThan(toleranceDb / 1.56);
    const wcdma = computeCubicMetric(iq, { slope: 1.85 });
    expect(Math.abs(wcdma.cubicMetricDb - 3.38)).toBeLessThan(toleranceDb / 1.85);
  });

  it('the 25.101 rounding goes up to the next 0.5 dB step and leaves exact steps alone', () => {
    // raw = 1.52 + 1.56·x gives CM x before rounding.
    const fromCm = (x: number) => {
      const rawLinear = 10 ** ((1.52 + 1.56 * x) / 10);
      return cubicMetricFromMoments(1, rawLinear, 1, { roundUpToHalfDb: true }).cubicMetricDb;
    };
    expect(fromCm(4.01)).toBe(4.5);
    expect(fromCm(1.2)).toBe(1.5);
    expect(fromCm(2)).toBe(2);
    expect(() => cubicMetricFromMoments(1, 1, 1, { slope: 0 })).toThrow(/slope k must be positive/);
  });
});
