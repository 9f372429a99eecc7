import { describe, expect, it } from 'vitest';
import {
  gaussianPowerAtProbabilityDb,
  gaussianPowerCcdf,
  ofdmPaprAtProbabilityDb,
  ofdmPaprCcdfTheory,
  VAN_NEE_ALPHA_OVERSAMPLED,
} from '../../../src/dsp/metrics/paprTheory';

// Check values derived from 1 − (1 − e^−γ)^(αN) (van Nee & Prasad 2000; REFERENCE.md §5.1 and §10 row 15).
describe('van Nee & Prasad OFDM PAPR CCDF', () => {
  it('N = 256 at 10 dB: 1.16e-2 at Nyquist, 3.20e-2 with α = 2.8', () => {
    expect(ofdmPaprCcdfTheory(10, 256)).toBeCloseTo(1.16e-2, 4);
    expect(ofdmPaprCcdfTheory(10, 256, VAN_NEE_ALPHA_OVERSAMPLED)).toBeCloseTo(3.2e-2, 3);
  });

  it('PAPR at 1e-4: N = 64 → 11.3 / 11.6 dB, N = 256 → 11.7 / 12.0 dB, N = 1200 → 12.1 / 12.4 dB (α = 1 / 2.8)', () => {
    const toleranceDb = 0.05; // the sheet rounds to 0.1 dB
    const cases: [number, number, number][] = [
      [64, 11.3, 11.6],
      [256, 11.7, 12.0],
      [1200, 12.1, 12.4],
    ];
    for (const [n, nyquist, oversampled] of cases) {
      expect(Math.abs(ofdmPaprAtProbabilityDb(1e-4, n) - nyquist)).toBeLessThan(toleranceDb);
      expect(Math.abs(ofdmPaprAtProbabilityDb(1e-4, n, VAN_NEE_ALPHA_OVERSAMPLED) - oversampled)).toBeLessThan(toleranceDb);
    }
  });

  it('the inverse undoes the CCDF, and the CCDF falls with the threshold', () => {
    for (const p of [0.3, 1e-2, 1e-5, 1e-9]) {
      expect(ofdmPaprCcdfTheory(ofdmPaprAtProbabilityDb(p, 1200), 1200) / p).toBeCloseTo(1, 9);
    }
    let previous = 1;
    for (let db = 4; db < 16; db += 0.5) {
      const p = ofdmPaprCcdfTheory(db, 300);
      expect(p).toBeLessThanOrEqual(previous);
      previous = p;
    }
    expect(() => ofdmPaprAtProbabilityDb(0, 10)).toThrow(/strictly between 0 and 1/);
  });

  it('complex Gaussian instantaneous power: P(> γ) = e^−γ; 8.39 dB at 1e-3', () => {
    expect(gaussianPowerCcdf(0)).toBeCloseTo(Math.exp(-1), 12);
    expect(gaussianPowerAtProbabilityDb(1e-3)).toBeCloseTo(8.3929, 3);
  });
});
