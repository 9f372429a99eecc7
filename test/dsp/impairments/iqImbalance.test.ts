import { describe, expect, it } from 'vitest';
import { createFftPlan, fftForward } from '../../../src/dsp/fft/fftPlan';
import { applyIqImbalance, imageRejectionRatioDb, iqImbalanceCoefficients } from '../../../src/dsp/impairments/iqImbalance';
import { applyDcOffset } from '../../../src/dsp/impairments/dcOffset';
import { expectCloseArray } from '../../helpers/expectClose';

const toleranceDb = 1e-6;
const absTol = 1e-12;

function tone(n: number, bin: number): Float64Array {
  const x = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    x[2 * i] = Math.cos((2 * Math.PI * bin * i) / n);
    x[2 * i + 1] = Math.sin((2 * Math.PI * bin * i) / n);
  }
  return x;
}

describe('IQ gain/phase imbalance', () => {
  it('leaves an image whose rejection ratio matches the closed form (Razavi, RF Microelectronics §4.2)', () => {
    const n = 256;
    const bin = 37;
    const plan = createFftPlan(n);
    for (const [gainDb, phaseDeg] of [
      [0.5, 0],
      [0, 3],
      [-1, 5],
      [0.2, -2],
    ] as const) {
      const y = applyIqImbalance(tone(n, bin), gainDb, phaseDeg, new Float64Array(2 * n));
      const spectrum = fftForward(plan, y, new Float64Array(2 * n));
      const power = (k: number): number => spectrum[2 * k]! ** 2 + spectrum[2 * k + 1]! ** 2;
      const measuredDb = 10 * Math.log10(power(bin) / power(n - bin));
      // IRR = (1 + 2g cos φ + g²)/(1 − 2g cos φ + g²), g = 10^(gainDb/20).
      const g = 10 ** (gainDb / 20);
      const c = Math.cos((phaseDeg * Math.PI) / 180);
      const closedFormDb = 10 * Math.log10((1 + 2 * g * c + g * g) / (1 - 2 * g * c + g * g));
      expect(Math.abs(measuredDb - closedFormDb)).toBeLessThan(toleranceDb);
      expect(imageRejectionRatioDb(gainDb, phaseDeg)).toBeCloseTo(closedFormDb, 9);
    }
    // Common-practice check value: 1° phase alone gives IRR ≈ 41.2 dB (derived: cot²(φ/2)).
    expect(imageRejectionRatioDb(0, 1)).toBeCloseTo(20 * Math.log10(1 / Math.tan(Math.PI / 360)), 6);
  });

  it('equals the widely-linear form μx + νx*', () => {
    const x = Float64Array.of(0.3, -0.7, 1.1, 0.4, -0.2, -0.9);
    const { mu, nu } = iqImbalanceCoefficients(0.7, 4);
    const expected = new Float64Array(6);
    for (let i = 0; i < 6; i += 2) {
      const [a, b] = [x[i]!, x[i + 1]!];
      expected[i] = mu[0] * a - mu[1] * b + nu[0] * a + nu[1] * b;
      expected[i + 1] = mu[0] * b + mu[1] * a + nu[1] * a - nu[0] * b;
    }
    expectCloseArray(applyIqImbalance(x, 0.7, 4, new Float64Array(6)), expected, absTol);
  });
});

describe('LO leakage (DC offset)', () => {
  it('adds a constant whose power over the signal power is the level asked for', () => {
    const x = tone(128, 5);
    const y = Float64Array.from(x);
    const [dRe, dIm] = applyDcOffset(x, -25, 30, y);
    expect(10 * Math.log10(dRe * dRe + dIm * dIm)).toBeCloseTo(-25, 9); // tone power 1
    expect((Math.atan2(dIm, dRe) * 180) / Math.PI).toBeCloseTo(30, 9);
    let meanRe = 0;
    for (let i = 0; i < y.length; i += 2) meanRe += y[i]!;
    expect(meanRe / 128).toBeCloseTo(dRe, 12);
  });
});
