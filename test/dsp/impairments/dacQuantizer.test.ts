import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { fullScaleFromHeadroom, quantizeDac } from '../../../src/dsp/impairments/dacQuantizer';
import { DspError } from '../../../src/dsp/errors';
import { TEST_SEED } from '../../helpers/seed';

// Bennett's formula assumes a uniform, signal-independent error; for one sine the deterministic error pattern moves
// the SQNR by up to ~0.2 dB at 8 bits (measured here), so the tolerance is 0.25 dB.
const toleranceDb = 0.25;

describe('DAC quantisation', () => {
  it('gives SQNR = 6.02·b + 1.76 dB for a full-scale sine (Bennett 1948)', () => {
    for (const bits of [8, 10, 12, 14]) {
      const n = 40000;
      const x = new Float64Array(2 * n);
      // Incommensurate frequency so the error is not periodic; amplitude just below full scale.
      for (let i = 0; i < n; i++) x[2 * i] = 0.999999 * Math.sin(2 * Math.PI * 0.1234567 * i);
      const q = new Float64Array(2 * n);
      quantizeDac(x, bits, 1, q);
      let signal = 0;
      let noise = 0;
      for (let i = 0; i < n; i++) {
        signal += x[2 * i]! ** 2;
        noise += (q[2 * i]! - x[2 * i]!) ** 2;
      }
      expect(Math.abs(10 * Math.log10(signal / noise) - (6.02 * bits + 1.76))).toBeLessThan(toleranceDb);
    }
  });

  it('adds Δ²/12 per rail on a busy Gaussian signal and clips beyond full scale', () => {
    const rng = createRng(TEST_SEED);
    const n = 50000;
    const x = new Float64Array(2 * n).map(() => rng.nextGaussian());
    expect(fullScaleFromHeadroom(x, 12)).toBeCloseTo(10 ** (12 / 20), 1); // rail RMS ≈ 1
    // 18 dB headroom ≈ 7.9σ per rail: no clipping, so the error is the quantiser's alone.
    const fullScale = fullScaleFromHeadroom(x, 18);
    const q = new Float64Array(2 * n);
    expect(quantizeDac(x, 10, fullScale, q)).toBe(0);
    // At 12 dB (≈ 4σ) a few values clip, and the function counts them.
    expect(quantizeDac(x, 10, fullScaleFromHeadroom(x, 12), new Float64Array(2 * n))).toBeGreaterThan(0);
    let noise = 0;
    for (let i = 0; i < 2 * n; i++) noise += (q[i]! - x[i]!) ** 2;
    const step = (2 * fullScale) / 2 ** 10;
    expect(noise / (2 * n) / (step * step / 12)).toBeGreaterThan(0.95);
    expect(noise / (2 * n) / (step * step / 12)).toBeLessThan(1.05);
  });

  it('rejects bits outside 1…32 with INVALID_CONFIG', () => {
    expect(() => quantizeDac(new Float64Array(2), 0, 1, new Float64Array(2))).toThrow(DspError);
    expect(() => quantizeDac(new Float64Array(2), 8, 0, new Float64Array(2))).toThrow(/full scale/);
  });
});
