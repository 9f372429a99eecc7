import { describe, expect, it } from 'vitest';
import { fillGoldQpsk, fillGoldSequence, GOLD_NC } from '../../../src/dsp/reference/goldSequence';

/**
 * TS 38.211 §5.2.1 (= TS 36.211 §7.2) written out literally with arrays, as an independent oracle for the word-based
 * register implementation.
 */
function goldByDefinition(cInit: number, length: number): number[] {
  const total = GOLD_NC + length + 31;
  const x1 = new Array<number>(total).fill(0);
  const x2 = new Array<number>(total).fill(0);
  x1[0] = 1;
  for (let i = 0; i < 31; i++) x2[i] = Math.floor(cInit / 2 ** i) % 2;
  for (let n = 0; n + 31 < total; n++) {
    x1[n + 31] = (x1[n + 3]! + x1[n]!) % 2;
    x2[n + 31] = (x2[n + 3]! + x2[n + 2]! + x2[n + 1]! + x2[n]!) % 2;
  }
  return Array.from({ length }, (_, n) => (x1[n + GOLD_NC]! + x2[n + GOLD_NC]!) % 2);
}

describe('Gold sequence c(n), TS 38.211 §5.2.1', () => {
  it('matches the clause written out with arrays for several c_init, including 0 and 2^31 − 1', () => {
    for (const cInit of [0, 1, 8193, 123456789, 2 ** 31 - 1]) {
      const c = fillGoldSequence(cInit, new Uint8Array(500));
      expect(Array.from(c), `c_init ${cInit}`).toEqual(goldByDefinition(cInit, 500));
    }
  });

  it('is balanced to within a few percent over 10 000 bits (property of m-sequence sums, common practice)', () => {
    const c = fillGoldSequence(0x1234567, new Uint8Array(10000));
    const ones = c.reduce((a, b) => a + b, 0);
    expect(Math.abs(ones / 10000 - 0.5)).toBeLessThan(0.02);
  });

  it('QPSK mapping r(m) = (1 − 2c(2m))/√2 + j(1 − 2c(2m+1))/√2 (TS 36.211 §6.10.1.1)', () => {
    const c = fillGoldSequence(777, new Uint8Array(40));
    const r = fillGoldQpsk(777, new Float64Array(40));
    for (let i = 0; i < 40; i++) expect(r[i]).toBeCloseTo((1 - 2 * c[i]!) / Math.SQRT2, 15);
  });
});
