import { describe, expect, it } from 'vitest';
import { createRappModel, powerOfTwoExponent } from '../../../src/dsp/amplifier/rapp';
import { createSoftLimiterModel } from '../../../src/dsp/amplifier/softLimiter';
import { DspError } from '../../../src/dsp/errors';

const toleranceDb = 1e-3;

describe('Rapp model (Rapp 1991; A_sat refers to the output)', () => {
  it('drops the gain by 10·log10(2)/p dB when the input equals A_sat (G = 1): 1.505 dB at p = 2, 1.003 dB at p = 3', () => {
    // REFERENCE.md §7 and §10 #18 (derived): A(A_sat) = A_sat·2^(−1/(2p)).
    for (const [p, dropDb] of [
      [2, 1.505],
      [3, 1.003],
    ] as const) {
      const model = createRappModel({ smoothness: p, outputSaturationAmplitude: 0.8 });
      const gainDb = 20 * Math.log10(model.amAm(0.8) / 0.8);
      expect(gainDb).toBeCloseTo(-dropDb, 3);
      expect(Math.abs(gainDb + (10 * Math.log10(2)) / p)).toBeLessThan(toleranceDb);
    }
  });

  it('computes 2p = 2^k (p = 0.5, 1, 2, 4) by squarings and square roots, equal to the formula with Math.pow', () => {
    // Rapp 1991: A(r) = G·r / [1 + (G·r/A_sat)^{2p}]^{1/(2p)}; the reference here uses the platform's Math.pow.
    expect([1, 2, 4, 8, 3, 2.5, 0.5].map(powerOfTwoExponent)).toEqual([0, 1, 2, 3, null, null, null]);
    for (const p of [0.5, 1, 2, 4]) {
      const model = createRappModel({ smoothness: p, outputSaturationAmplitude: 0.8, gainDb: 3 });
      const g = 10 ** (3 / 20);
      for (const r of [1e-6, 0.01, 0.2, 0.5, 0.8, 1, 3, 1e3, 1e200]) {
        const reference = (g * r) / Math.pow(1 + Math.pow((g * r) / 0.8, 2 * p), 1 / (2 * p));
        const expected = Number.isFinite(reference) && reference > 0 ? reference : 0.8;
        expect(Math.abs(model.amAm(r) - expected) / expected, `p = ${p}, r = ${r}`).toBeLessThan(1e-14);
      }
    }
  });

  it('approaches the ideal soft limiter as p grows', () => {
    // Rapp 1991: p → ∞ gives the ideal limiter. Worst gap is at r = A_sat, A_sat·(1 − 2^(−1/(2p))) (derived).
    const limiter = createSoftLimiterModel({ outputSaturationAmplitude: 1 });
    const worstGap = (p: number): number => {
      const rapp = createRappModel({ smoothness: p });
      let worst = 0;
      for (let i = 0; i <= 3000; i++) worst = Math.max(worst, Math.abs(rapp.amAm(i / 1000) - limiter.amAm(i / 1000)));
      return worst;
    };
    const gaps = [2, 10, 100, 1000].map(worstGap);
    for (let i = 1; i < gaps.length; i++) expect(gaps[i]!).toBeLessThan(gaps[i - 1]!);
    expect(gaps[2]!).toBeCloseTo(1 - 2 ** (-1 / 200), 4);
    expect(gaps[3]!).toBeLessThan(4e-4);
  });

  it('has small-signal gain G, output tending to A_sat, and r_sat = A_sat/G', () => {
    const model = createRappModel({ smoothness: 2, gainDb: 20, outputSaturationAmplitude: 2 });
    expect(model.smallSignalGainLinear).toBeCloseTo(10, 12);
    expect(model.inputSaturationAmplitude).toBeCloseTo(0.2, 12);
    expect(model.amAm(1e-6) / 1e-6).toBeCloseTo(10, 6);
    expect(model.amAm(1e6)).toBeCloseTo(2, 9);
    expect(model.amPmRad(0.5)).toBe(0);
  });

  it('applies the optional AM/PM Φ(r) = α·r^q/(1 + (r/β)^q) degrees', () => {
    const model = createRappModel({ smoothness: 2, amPm: { alphaDeg: 10, betaAmplitude: 0.5, exponent: 4 } });
    // At r = β: Φ = α·β^q/2 (derived).
    expect((model.amPmRad(0.5) * 180) / Math.PI).toBeCloseTo((10 * 0.5 ** 4) / 2, 12);
    const out = model.apply(Float64Array.of(0.5, 0), 1, new Float64Array(2));
    expect(Math.atan2(out[1]!, out[0]!)).toBeCloseTo(model.amPmRad(0.5), 12);
    expect(Math.hypot(out[0]!, out[1]!)).toBeCloseTo(model.amAm(0.5), 12);
  });

  it('rejects a non-positive smoothness with INVALID_CONFIG naming the field', () => {
    expect(() => createRappModel({ smoothness: 0 })).toThrow(DspError);
    expect(() => createRappModel({ smoothness: -1 })).toThrow(/amplifier\.smoothness/);
  });
});
