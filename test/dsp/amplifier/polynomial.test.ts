import { describe, expect, it } from 'vitest';
import { createPolynomialModel } from '../../../src/dsp/amplifier/polynomial';
import { createRng } from '../../../src/dsp/data/rng';
import { DspError } from '../../../src/dsp/errors';
import { expectCloseArray } from '../../helpers/expectClose';
import { TEST_SEED } from '../../helpers/seed';

const absTol = 1e-12;

describe('polynomial and memory-polynomial PA models (Kim & Konstantinou 2001)', () => {
  it('finds the AM/AM peak of y = x − 0.1·x|x|² at r = √(1/0.3) = 1.8257, A = 1.2172 (derived)', () => {
    const model = createPolynomialModel({ coefficients: [[[1, 0], [0, 0], [-0.1, 0]]], maxInputAmplitude: 3 });
    expect(model.kind).toBe('polynomial');
    expect(model.inputSaturationAmplitude).toBeCloseTo(Math.sqrt(1 / 0.3), 6);
    expect(model.outputSaturationAmplitude).toBeCloseTo(Math.sqrt(1 / 0.3) * (1 - 0.1 / 0.3), 9);
    expect(model.outputSaturationAmplitude).toBeCloseTo(1.2172, 4);
  });

  it('reports AM/PM relative to the linear term for complex coefficients', () => {
    // S(r) = (1+0j)r + (0 + 0.05j) r³: Φ(r) = atan(0.05 r²) (derived).
    const model = createPolynomialModel({ coefficients: [[[1, 0], [0, 0], [0, 0.05]]], maxInputAmplitude: 2, inputSaturationAmplitude: 1 });
    expect(model.amPmRad(1.5)).toBeCloseTo(Math.atan(0.05 * 2.25), 12);
    expect(model.amAm(1.5)).toBeCloseTo(Math.hypot(1.5, 0.05 * 1.5 ** 3), 12);
  });

  it('evaluates y[n] = Σ_m Σ_k a_km x[n−m]|x[n−m]|^(k−1) exactly (circular start), checked against a direct sum', () => {
    const coefficients: [number, number][][] = [
      [[1, 0.1], [0.02, 0], [-0.08, 0.01]],
      [[0.2, -0.05], [0, 0], [0.01, 0.005]],
      [[-0.05, 0], [0, 0], [0, 0]],
    ];
    const model = createPolynomialModel({ coefficients, maxInputAmplitude: 2, inputSaturationAmplitude: 1 });
    expect(model.memoryless).toBe(false);
    const rng = createRng(TEST_SEED);
    const n = 64;
    const x = new Float64Array(2 * n).map(() => 0.5 * rng.nextGaussian());
    const scale = 1.3;
    const expected = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      for (let m = 0; m < coefficients.length; m++) {
        const j = (i - m + n) % n;
        const xr = scale * x[2 * j]!;
        const xi = scale * x[2 * j + 1]!;
        const r = Math.hypot(xr, xi);
        coefficients[m]!.forEach(([ar, ai], k) => {
          const w = r ** k;
          expected[2 * i]! += w * (ar * xr - ai * xi);
          expected[2 * i + 1]! += w * (ar * xi + ai * xr);
        });
      }
    }
    expectCloseArray(model.apply(x, scale, new Float64Array(2 * n)), expected, absTol, `memory polynomial (seed ${TEST_SEED})`);
  });

  it('asks for inputSaturationAmplitude when the AM/AM has no peak in range, and rejects bad coefficients', () => {
    expect(() => createPolynomialModel({ coefficients: [[[1, 0]]], maxInputAmplitude: 1 })).toThrow(/inputSaturationAmplitude/);
    expect(() => createPolynomialModel({ coefficients: [[[0, 0], [1, 0]]], maxInputAmplitude: 1, inputSaturationAmplitude: 1 })).toThrow(/small-signal gain/);
    expect(() => createPolynomialModel({ coefficients: [], maxInputAmplitude: 1 })).toThrow(DspError);
    expect(() => createPolynomialModel({ coefficients: [[[1, Number.NaN]]], maxInputAmplitude: 1 })).toThrow(/coefficients\[0\]\[0\]/);
  });
});
