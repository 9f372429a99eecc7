import { describe, expect, it } from 'vitest';
import { DspError } from '../../../src/dsp/errors';
import { applyFrequencyShift, planFrequencyShift } from '../../../src/dsp/resample/frequencyShift';
import { hannSpectrum } from '../../helpers/iqTestSignals';

function dcOnes(n: number): Float64Array {
  const x = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) x[2 * i] = 1;
  return x;
}

function twice(x: Float64Array): Float64Array {
  const out = new Float64Array(2 * x.length);
  out.set(x);
  out.set(x, x.length);
  return out;
}

describe('digital frequency offset', () => {
  it('snaps to a whole number of cycles per loop, at most fs/(2P) away', () => {
    const p = planFrequencyShift(1.2345e6, 100e6, 100_000, true);
    expect(p.appliedHz).toBe(1.235e6);
    expect(p.snapped).toBe(true);
    expect(p.periodic).toBe(true);
    const exact = planFrequencyShift(1.2345e6, 100e6, 100_000, false);
    expect(exact.appliedHz).toBe(1.2345e6);
    expect(exact.periodic).toBe(false);
    expect(planFrequencyShift(2e6, 100e6, 100_000, false).periodic).toBe(true);
    expect(() => planFrequencyShift(60e6, 100e6, 1000, true)).toThrow(DspError);
  });

  it('a snapped offset loops without a seam: a constant shifted then played twice is one clean tone; unsnapped is not', () => {
    // Hann-window leakage far from the tone is tiny; a phase step spreads power (common practice, Harris 1978).
    const n = 4000;
    const fs = 1e6;
    const far = Array.from({ length: 256 }, (_, k) => k).filter((k) => Math.abs(k - 64) > 12 && Math.abs(k - 64) < 200);
    const oobAtSeam = (snap: boolean): number => {
      // 250 kHz is bin 64 of the 256-point window and 1000 whole cycles over the 4000-sample loop.
      const plan = planFrequencyShift(250_012.3, fs, n, snap);
      const x = dcOnes(n);
      applyFrequencyShift(plan.shift, x, 0, x);
      const p = hannSpectrum(twice(x), n - 128, 256, far);
      return p.reduce((s, v) => s + v, 0);
    };
    const snappedDb = 10 * Math.log10(oobAtSeam(true));
    const exactDb = 10 * Math.log10(oobAtSeam(false));
    expect(exactDb - snappedDb).toBeGreaterThan(30);
  });

  it('keeps exact phases far into a long file (BigInt phase index k·n mod P)', () => {
    const period = 122_880_000;
    const plan = planFrequencyShift(1e6 + 0.25, 122.88e6, period, true);
    const k = plan.shift.cyclesPerPeriod!;
    const start = 3 * period + 98_765_431;
    const x = dcOnes(4);
    applyFrequencyShift(plan.shift, x, start, x);
    for (let i = 0; i < 4; i++) {
      const rho = Number((BigInt(k) * BigInt(start + i)) % BigInt(period));
      const angle = (2 * Math.PI * rho) / period;
      expect(x[2 * i]).toBeCloseTo(Math.cos(angle), 12);
      expect(x[2 * i + 1]).toBeCloseTo(Math.sin(angle), 12);
    }
  });
});
