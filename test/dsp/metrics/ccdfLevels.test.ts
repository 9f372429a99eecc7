import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { ccdfCurve, levelsFromHistogram } from '../../../src/dsp/metrics/ccdfLevels';
import { wilsonInterval } from '../../../src/dsp/metrics/confidence';
import { createDbHistogram, POWER_HISTOGRAM_SPEC } from '../../../src/dsp/metrics/dbHistogram';
import { binPowersInto, createPowerBinner } from '../../../src/dsp/metrics/powerBinner';
import { gaussianPowerAtProbabilityDb } from '../../../src/dsp/metrics/paprTheory';
import { TEST_SEED } from '../../helpers/seed';

describe('Wilson score interval (Wilson 1927)', () => {
  const absTol = 1e-4;
  it('matches the closed form at hand-computed points', () => {
    // k = 0, n = 100: upper = z²/(n + z²) = 3.8415/103.8415 = 0.036994 (derived from the formula).
    const zero = wilsonInterval(0, 100);
    expect(zero.lower).toBe(0);
    expect(Math.abs(zero.upper - 0.036994)).toBeLessThan(absTol);
    // k = 5, n = 100: centre (5 + 1.9207)/103.8415 = 0.066649, half-width 1.96·√(4.75 + 0.9604)/103.8415 = 0.045103.
    const five = wilsonInterval(5, 100);
    expect(Math.abs(five.lower - 0.021546)).toBeLessThan(absTol);
    expect(Math.abs(five.upper - 0.111752)).toBeLessThan(absTol);
    const all = wilsonInterval(100, 100);
    expect(all.upper).toBe(1);
  });
});

describe('CCDF levels with 95 % intervals', () => {
  it('levels of exponential power (complex Gaussian signal) match 10·log10(−ln p) within their intervals', () => {
    // |x|²/σ² of a complex Gaussian is exponential: P(> γ) = e^−γ (common practice).
    const rng = createRng(TEST_SEED);
    const n = 1 << 20;
    const powers = new Float64Array(n);
    for (let i = 0; i < n; i++) powers[i] = -Math.log(1 - rng.nextFloat());
    const h = createDbHistogram(POWER_HISTOGRAM_SPEC);
    binPowersInto(createPowerBinner(POWER_HISTOGRAM_SPEC, 1), powers, 0, n, h);
    const { levels, warnings } = levelsFromHistogram(h, { what: 'power', unit: 'samples' });
    for (const l of levels.slice(0, 4)) {
      const theory = gaussianPowerAtProbabilityDb(l.probability);
      const [lo, hi] = l.ci95Db!;
      expect(lo! <= l.levelDb! && l.levelDb! <= hi!).toBe(true);
      // Twice the 95 % half-width (plus one bin) fails only about once in 10⁴ seeds.
      const halfWidth = Math.max(hi! - l.levelDb!, l.levelDb! - lo!) + 0.01;
      expect(Math.abs(l.levelDb! - theory), `seed ${TEST_SEED}, ${l.key}`).toBeLessThanOrEqual(2 * halfWidth);
    }
    // 1e-5 of 2^20 samples expects about 10.5 exceedances: reported, with a wide interval.
    expect(levels[4]!.levelDb).not.toBeNull();
    expect(warnings).toEqual([]);
  });

  it('reports null and a plain warning when the run is too short, and honours an effective sample size', () => {
    const h = createDbHistogram(POWER_HISTOGRAM_SPEC);
    h.counts[3001] = 5000; // 5000 values at 0.00 dB
    const { levels, warnings } = levelsFromHistogram(h, { what: 'PAPR', unit: 'symbols' });
    // 1e-3 of 5000 expects 5 exceedances, fewer than the 10 required.
    expect(levels.map((l) => l.levelDb)).toEqual([0, 0, null, null, null]);
    expect(warnings).toEqual([
      'PAPR at 1e-3, 1e-4, 1e-5: the run has 5000 symbols, fewer than the 10000, 100000, 1000000 needed for about 10 values beyond each probability, so these levels are reported as null. Run more symbols.',
    ]);
    // 5000 correlated values worth 500 independent trials: only 1e-1 is reported.
    const scaled = levelsFromHistogram(h, { what: 'power', unit: 'samples', trialsPerValue: 0.1 });
    expect(scaled.levels.map((l) => l.levelDb)).toEqual([0, null, null, null, null]);
  });

  it('a hand-built histogram gives the empirical quantile and the CCDF curve', () => {
    const h = createDbHistogram(POWER_HISTOGRAM_SPEC);
    h.counts[3001] = 9900; // 0.00 dB
    h.counts[4001] = 100; // 10.00 dB
    const { levels } = levelsFromHistogram(h, { what: 'x', unit: 'values' }, [0.05, 0.01, 0.005]);
    // P(X > 0.00) = 0.01: above 0.05 → level 0.00 at p = 0.05 and at p = 0.01; at 0.005 the level is 10.00.
    expect(levels.map((l) => l.levelDb)).toEqual([0, 0, 10]);
    expect(levels.map((l) => l.key)).toEqual(['0.05', '1e-2', '0.005']);
    const curve = ccdfCurve(h);
    expect(curve.thresholdDb[0]).toBe(-0.005);
    expect(curve.probability[0]).toBe(1);
    expect(curve.probability[1]).toBeCloseTo(0.01, 12);
    expect(curve.probability[curve.probability.length - 1]).toBe(0);
    for (let i = 1; i < curve.probability.length; i++) expect(curve.probability[i]!).toBeLessThanOrEqual(curve.probability[i - 1]!);
  });
});
