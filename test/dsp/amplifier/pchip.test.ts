import { describe, expect, it } from 'vitest';
import { createPchip, evaluatePchip } from '../../../src/dsp/amplifier/pchip';

const absTol = 1e-12;

describe('monotone cubic interpolation (Fritsch & Carlson 1980)', () => {
  it('passes through every knot and reproduces straight lines', () => {
    const x = [0, 1, 2.5, 4, 7];
    const p = createPchip(x, x.map((v) => 3 * v - 2));
    for (const v of x) expect(Math.abs(evaluatePchip(p, v) - (3 * v - 2))).toBeLessThan(absTol);
    for (let t = 0; t <= 7; t += 0.05) expect(Math.abs(evaluatePchip(p, t) - (3 * t - 2))).toBeLessThan(1e-9);
  });

  it('gives 0.625 at x = 0.5 for knots (0,0), (1,1), (2,1) (derived: slopes 1, 0, 0; Hermite basis)', () => {
    const p = createPchip([0, 1, 2], [0, 1, 1]);
    expect(evaluatePchip(p, 0.5)).toBeCloseTo(0.625, 12);
    // Flat segment stays flat: no overshoot above 1.
    for (let t = 1; t <= 2; t += 0.01) expect(evaluatePchip(p, t)).toBeCloseTo(1, 12);
  });

  it('keeps monotone data monotone and never overshoots a step (a plain cubic spline would)', () => {
    const x = [0, 1, 2, 3, 4, 5, 6];
    const y = [0, 0.01, 0.02, 5, 9.98, 9.99, 10];
    const p = createPchip(x, y);
    let previous = -Infinity;
    for (let t = 0; t <= 6; t += 0.001) {
      const v = evaluatePchip(p, t);
      expect(v).toBeGreaterThanOrEqual(previous - 1e-12);
      expect(v).toBeGreaterThanOrEqual(-1e-12);
      expect(v).toBeLessThanOrEqual(10 + 1e-12);
      previous = v;
    }
  });

  it('holds the end values outside the knots', () => {
    const p = createPchip([1, 2], [5, 7]);
    expect(evaluatePchip(p, 0)).toBe(5);
    expect(evaluatePchip(p, 3)).toBe(7);
  });
});
