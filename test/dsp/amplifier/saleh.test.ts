import { describe, expect, it } from 'vitest';
import { createSalehModel, SALEH_TWT_PRESET } from '../../../src/dsp/amplifier/saleh';

describe('Saleh TWT model (Saleh 1981, classic parameters)', () => {
  const model = createSalehModel();
  const { alphaA, betaA, alphaPhi, betaPhi } = SALEH_TWT_PRESET;

  it('uses the classic TWT fit 2.1587 / 1.1517 / 4.0033 / 9.1040', () => {
    // REFERENCE.md §7 [S2, public code].
    expect([alphaA, betaA, alphaPhi, betaPhi]).toEqual([2.1587, 1.1517, 4.0033, 9.104]);
  });

  it('peaks at r = 1/√β_a = 0.9318 with A_max = α_a/(2√β_a) = 1.0058', () => {
    // Derived from dA/dr = 0 (REFERENCE.md §7).
    let best = 0;
    let bestR = 0;
    for (let i = 1; i <= 200000; i++) {
      const r = i / 100000;
      const a = model.amAm(r);
      if (a > best) [best, bestR] = [a, r];
    }
    expect(bestR).toBeCloseTo(1 / Math.sqrt(betaA), 4);
    expect(bestR).toBeCloseTo(0.9318, 4);
    expect(best).toBeCloseTo(alphaA / (2 * Math.sqrt(betaA)), 9);
    expect(best).toBeCloseTo(1.0058, 4);
    expect(model.inputSaturationAmplitude).toBeCloseTo(0.9318, 4);
    expect(model.outputSaturationAmplitude).toBeCloseTo(1.0058, 4);
    // Fold-back above saturation.
    expect(model.amAm(1.5)).toBeLessThan(model.amAm(1));
  });

  it('gives A(1) = 1.0033, Φ(1) = 22.70°, Φ(∞) = 25.19° and small-signal gain 6.68 dB', () => {
    // REFERENCE.md §10 #19 (derived).
    expect(model.amAm(1)).toBeCloseTo(1.0033, 4);
    expect((model.amPmRad(1) * 180) / Math.PI).toBeCloseTo(22.7, 2);
    expect((model.amPmRad(1e4) * 180) / Math.PI).toBeCloseTo((alphaPhi / betaPhi) * (180 / Math.PI), 4);
    expect((alphaPhi / betaPhi) * (180 / Math.PI)).toBeCloseTo(25.19, 2);
    expect(20 * Math.log10(model.smallSignalGainLinear)).toBeCloseTo(6.68, 2);
  });

  it('reaches half its AM/PM limit at r = 1/√β_φ (derived) and rises monotonically', () => {
    expect(model.amPmRad(1 / Math.sqrt(betaPhi))).toBeCloseTo(alphaPhi / betaPhi / 2, 12);
    let previous = 0;
    for (let i = 1; i < 300; i++) {
      const phi = model.amPmRad(i / 100);
      expect(phi).toBeGreaterThan(previous);
      previous = phi;
    }
  });
});
