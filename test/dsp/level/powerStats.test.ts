import { describe, expect, it } from 'vitest';
import { DspError } from '../../../src/dsp/errors';
import { resolveLevel } from '../../../src/dsp/level/levelScale';
import { accumulatePowerStats, ccdfPoint, createPowerStats, summarisePowerStats } from '../../../src/dsp/level/powerStats';
import { gaussianIq, meanPower } from '../../helpers/iqTestSignals';
import { TEST_SEED } from '../../helpers/seed';

/** Exact order statistic: the smallest level (dB re mean) that at most p·N samples exceed. */
function exactCcdfDb(iq: Float64Array, p: number): number {
  const n = iq.length / 2;
  const powers = Float64Array.from({ length: n }, (_, i) => iq[2 * i]! ** 2 + iq[2 * i + 1]! ** 2).sort().reverse();
  const allowed = Math.floor(p * n);
  return 10 * Math.log10(powers[allowed]! / meanPower(iq));
}

describe(`power statistics and levels (seed ${TEST_SEED})`, () => {
  const noise = gaussianIq(300_000, TEST_SEED, 0.3);
  const stats = createPowerStats();
  // Fed in chunks: the streamed export's path.
  for (let i = 0; i < noise.length; i += 65536) accumulatePowerStats(stats, noise.subarray(i, i + 65536));

  it('the histogram CCDF is within one 0.01 dB bin above the exact order statistic', () => {
    for (const p of [1e-1, 1e-2, 1e-3, 1e-4]) {
      const got = ccdfPoint(stats, p).levelDb;
      const exact = exactCcdfDb(noise, p);
      expect(got - exact, `p = ${p}`).toBeGreaterThanOrEqual(-1e-9);
      expect(got - exact, `p = ${p}`).toBeLessThanOrEqual(0.0100001);
    }
  });

  it('complex Gaussian noise follows CCDF(γ) = e^{−γ} (exponential |x|², Proakis 5th ed. §2.3; derived: 1e-2 → 6.63 dB)', () => {
    const s = summarisePowerStats(stats);
    const toleranceDb = 0.15;
    for (const p of [1e-1, 1e-2, 1e-3]) {
      expect(Math.abs(s.ccdf.find((c) => c.probability === p)!.levelDb - 10 * Math.log10(Math.log(1 / p)))).toBeLessThan(toleranceDb);
    }
    expect(Math.abs(s.rmsDb - 10 * Math.log10(0.09))).toBeLessThan(0.05);
    expect(s.crestFactorDb).toBeCloseTo(s.peakDb - s.rmsDb, 12);
  });

  it('resolves rms, peak and auto levels to the scale that hits them', () => {
    const rms = resolveLevel({ mode: 'rms', levelDbfs: -12 }, stats);
    expect(10 * Math.log10((stats.sumPower / stats.numSamples) * rms.scaleLinear ** 2)).toBeCloseTo(-12, 10);
    const peak = resolveLevel({ mode: 'peak', levelDbfs: -1 }, stats);
    expect(10 * Math.log10(stats.maxPower * peak.scaleLinear ** 2)).toBeCloseTo(-1, 10);
    const auto = resolveLevel({ mode: 'auto' }, stats);
    // The level exceeded by 1e-4 of the samples sits 1 dB below full scale (|x| = 1).
    expect(auto.requestedDbfs! + auto.ccdfLevelDb!).toBeCloseTo(-1, 10);
    expect(auto.ccdfLevelDb).toBeCloseTo(ccdfPoint(stats, 1e-4).levelDb, 12);
    expect(resolveLevel({ mode: 'formula' }, undefined).scaleLinear).toBe(1);
    expect(() => resolveLevel({ mode: 'rms', levelDbfs: 99 }, stats)).toThrow(DspError);
    expect(() => resolveLevel({ mode: 'linear', scaleLinear: -1 }, stats)).toThrow(/scaleLinear/);
  });
});
