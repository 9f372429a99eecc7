import { describe, expect, it } from 'vitest';
import { applySampleClockOffset } from '../../../src/dsp/impairments/sampleClockOffset';

const absTol = 1e-3;

describe('sample-clock offset', () => {
  it('turns a periodic tone at f into one at f·(1 + ε) (y[n] = x_c((1 + ε)nT))', () => {
    const n = 4096;
    const cycles = 700; // f = 0.171 f_s, periodic in the record
    const x = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      x[2 * i] = Math.cos((2 * Math.PI * cycles * i) / n);
      x[2 * i + 1] = Math.sin((2 * Math.PI * cycles * i) / n);
    }
    for (const ppm of [100, -250, 20]) {
      const y = applySampleClockOffset(x, ppm, new Float64Array(2 * n));
      let worst = 0;
      for (let i = 0; i < n; i++) {
        const phase = (2 * Math.PI * cycles * i * (1 + ppm * 1e-6)) / n;
        worst = Math.max(worst, Math.hypot(y[2 * i]! - Math.cos(phase), y[2 * i + 1]! - Math.sin(phase)));
      }
      expect(worst, `${ppm} ppm`).toBeLessThan(absTol);
    }
  });

  it('is the identity at 0 ppm', () => {
    const x = Float64Array.of(1, 2, 3, 4, 5, 6);
    expect(Array.from(applySampleClockOffset(x, 0, new Float64Array(6)))).toEqual(Array.from(x));
  });
});
