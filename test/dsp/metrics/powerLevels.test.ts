import { describe, expect, it } from 'vitest';
import { computePowerLevels } from '../../../src/dsp/metrics/powerLevels';

describe('mean power, peak power and crest factor', () => {
  it('a two-level signal: mean, peak and crest factor in dB, and dBFS against a full-scale magnitude (derived)', () => {
    // Three samples of |x|² = 1 and one of |x|² = 9: mean 3 (4.771 dB), peak 9 (9.542 dB), crest 4.771 dB.
    const iq = Float64Array.from([1, 0, 0, 1, -1, 0, 0, -3]);
    const absTol = 1e-9;
    const levels = computePowerLevels(iq, 6);
    expect(Math.abs(levels.meanPowerDb - 10 * Math.log10(3))).toBeLessThan(absTol);
    expect(Math.abs(levels.peakPowerDb - 10 * Math.log10(9))).toBeLessThan(absTol);
    expect(Math.abs(levels.crestFactorDb - 10 * Math.log10(3))).toBeLessThan(absTol);
    // dBFS = 10·log10(|x|²/A_fs²), A_fs = 6: peak 9/36 → −6.021 dBFS.
    expect(Math.abs(levels.peakPowerDbfs! - 10 * Math.log10(9 / 36))).toBeLessThan(absTol);
    expect(computePowerLevels(iq).meanPowerDbfs).toBeNull();
    expect(() => computePowerLevels(iq, -1)).toThrow(/fullScale must be a positive amplitude/);
  });
});
