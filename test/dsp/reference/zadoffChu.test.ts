import { describe, expect, it } from 'vitest';
import { LTE_PHI_12, LTE_PHI_24, NR_PHI_12, NR_PHI_18, NR_PHI_24, NR_PHI_6 } from '../../../src/dsp/reference/lowPaprTables';
import {
  fillBaseSequence,
  fillShiftedBaseSequence,
  fillZadoffChuRoot,
  isBaseSequenceLength,
  largestPrimeBelow,
  zadoffChuRootIndex,
} from '../../../src/dsp/reference/zadoffChu';

const absTol = 1e-12;

function cyclicCorrelation(aIq: Float64Array, bIq: Float64Array, lag: number): [number, number] {
  const n = aIq.length / 2;
  let re = 0;
  let im = 0;
  for (let m = 0; m < n; m++) {
    const j = (m + lag) % n;
    re += aIq[2 * m]! * bIq[2 * j]! + aIq[2 * m + 1]! * bIq[2 * j + 1]!;
    im += aIq[2 * m + 1]! * bIq[2 * j]! - aIq[2 * m]! * bIq[2 * j + 1]!;
  }
  return [re, im];
}

describe('Zadoff–Chu root sequences x_q(m) = e^{−jπqm(m+1)/N_ZC} (TS 36.211 §5.5.1.1)', () => {
  // CAZAC property of prime-length Zadoff–Chu sequences (Chu, IEEE Trans. IT 1972; common practice): |x| = 1 and the
  // periodic autocorrelation vanishes at every non-zero lag.
  for (const [nZc, q] of [
    [11, 1],
    [31, 7],
    [71, 3],
    [139, 60],
    [1193, 1000],
  ] as const) {
    it(`N_ZC = ${nZc}, q = ${q}: constant amplitude and zero cyclic autocorrelation at lags ≠ 0`, () => {
      const x = fillZadoffChuRoot(q, nZc, new Float64Array(2 * nZc));
      for (let m = 0; m < nZc; m++) expect(Math.hypot(x[2 * m]!, x[2 * m + 1]!)).toBeCloseTo(1, 12);
      const lags = nZc < 200 ? Array.from({ length: nZc - 1 }, (_, i) => i + 1) : [1, 2, 17, 500, nZc - 1];
      for (const lag of lags) {
        const [re, im] = cyclicCorrelation(x, x, lag);
        expect(Math.hypot(re, im), `lag ${lag}`).toBeLessThan(1e-9 * nZc);
      }
      const [r0] = cyclicCorrelation(x, x, 0);
      expect(r0).toBeCloseTo(nZc, 9);
    });
  }

  it('N_ZC is the largest prime below the length (TS 36.211 §5.5.1.1; prime tables)', () => {
    expect(largestPrimeBelow(36)).toBe(31);
    expect(largestPrimeBelow(72)).toBe(71);
    expect(largestPrimeBelow(300)).toBe(293);
    expect(largestPrimeBelow(1200)).toBe(1193);
  });

  it('root index q = ⌊q̄ + ½⌋ + v(−1)^⌊2q̄⌋, q̄ = N_ZC(u+1)/31 (worked by hand from the formula, derived)', () => {
    expect(zadoffChuRootIndex(0, 0, 31)).toBe(1); // q̄ = 1
    expect(zadoffChuRootIndex(29, 0, 31)).toBe(30); // q̄ = 30
    expect(zadoffChuRootIndex(0, 1, 71)).toBe(3); // q̄ = 2.290…, ⌊2q̄⌋ = 4 → +1
    expect(zadoffChuRootIndex(1, 1, 71)).toBe(4); // q̄ = 4.580…, ⌊2q̄⌋ = 9 → −1: 5 − 1
  });
});

describe('φ tables of the short base sequences', () => {
  it('LTE Table 5.5.1.2-1 rows u = 0…3 equal the 36.211 clause text (Rel-17 copy) [S]', () => {
    expect(Array.from(LTE_PHI_12[0]!)).toEqual([-1, 1, 3, -3, 3, 3, 1, 1, 3, 1, -3, 3]);
    expect(Array.from(LTE_PHI_12[1]!)).toEqual([1, 1, 3, 3, 3, -1, 1, -3, -3, 1, -3, 3]);
    expect(Array.from(LTE_PHI_12[2]!)).toEqual([1, 1, -3, -3, -3, -1, -3, -3, 1, -3, 1, -1]);
    expect(Array.from(LTE_PHI_12[3]!)).toEqual([-1, 1, 1, 1, 1, -1, -3, -3, 1, -3, 3, -1]);
  });

  it('a few further entries against public transcriptions of 36.211 / 38.211 [S2]', () => {
    // LTE Table 5.5.1.2-2, u = 0 and u = 29; NR Table 5.2.2.2-1 u = 0, -2 u = 0, -3 u = 29, -4 u = 0 (first values).
    expect(Array.from(LTE_PHI_24[0]!.subarray(0, 8))).toEqual([-1, 3, 1, -3, 3, -1, 1, 3]);
    expect(Array.from(LTE_PHI_24[29]!.subarray(20))).toEqual([-1, -1, 1, 3]);
    expect(Array.from(NR_PHI_6[0]!)).toEqual([-3, -1, 3, 3, -1, -3]);
    expect(Array.from(NR_PHI_12[0]!)).toEqual([-3, 1, -3, -3, -3, 3, -3, -1, 1, 1, 1, -3]);
    expect(Array.from(NR_PHI_18[29]!.subarray(0, 6))).toEqual([-3, 3, 1, -1, -1, -1]);
    expect(Array.from(NR_PHI_24[0]!.subarray(0, 6))).toEqual([-1, -3, 3, -1, 3, 1]);
  });

  it('every table has 30 groups of the right length with φ ∈ {±1, ±3}; NR re-designed lengths 12 and 24', () => {
    for (const [table, length] of [
      [LTE_PHI_12, 12],
      [LTE_PHI_24, 24],
      [NR_PHI_6, 6],
      [NR_PHI_12, 12],
      [NR_PHI_18, 18],
      [NR_PHI_24, 24],
    ] as const) {
      expect(table).toHaveLength(30);
      for (const row of table) {
        expect(row).toHaveLength(length);
        for (const v of row) expect([-3, -1, 1, 3]).toContain(v);
      }
    }
    expect(Array.from(NR_PHI_12[0]!)).not.toEqual(Array.from(LTE_PHI_12[0]!));
    expect(Array.from(NR_PHI_24[0]!)).not.toEqual(Array.from(LTE_PHI_24[0]!));
  });
});

describe('base sequences r̄_{u,v}(n) and cyclic shifts', () => {
  it('defines the lengths of each standard and rejects the others (36.211 §5.5.1; 38.211 §5.2.2)', () => {
    for (const m of [12, 24, 36, 48, 1200]) expect(isBaseSequenceLength('lte', m)).toBe(true);
    for (const m of [6, 18, 30]) expect(isBaseSequenceLength('lte', m)).toBe(false);
    for (const m of [6, 12, 18, 24, 30, 36, 600]) expect(isBaseSequenceLength('nr', m)).toBe(true);
    expect(() => fillBaseSequence('lte', 0, 0, 18, new Float64Array(36))).toThrowError(/length 18/);
  });

  it('has unit modulus for every group and length, and short ones follow e^{jφπ/4}', () => {
    for (const family of ['lte', 'nr'] as const) {
      for (const m of family === 'lte' ? [12, 24, 36, 72, 96] : [6, 12, 18, 24, 30, 36, 72]) {
        for (const u of [0, 13, 29]) {
          const r = fillBaseSequence(family, u, 1, m, new Float64Array(2 * m));
          for (let n = 0; n < m; n++) expect(Math.hypot(r[2 * n]!, r[2 * n + 1]!)).toBeCloseTo(1, 12);
        }
      }
    }
    const r = fillBaseSequence('lte', 5, 0, 12, new Float64Array(24));
    expect(r[0]).toBeCloseTo(Math.cos((LTE_PHI_12[5]![0]! * Math.PI) / 4), 15);
    expect(r[1]).toBeCloseTo(Math.sin((LTE_PHI_12[5]![0]! * Math.PI) / 4), 15);
  });

  it('NR length 30 is e^{−jπ(u+1)(n+1)(n+2)/31} (38.211 §5.2.2.2)', () => {
    const u = 7;
    const r = fillBaseSequence('nr', u, 0, 30, new Float64Array(60));
    for (let n = 0; n < 30; n++) {
      const angle = (-Math.PI * (u + 1) * (n + 1) * (n + 2)) / 31;
      expect(r[2 * n]).toBeCloseTo(Math.cos(angle), 12);
      expect(r[2 * n + 1]).toBeCloseTo(Math.sin(angle), 12);
    }
  });

  it('long sequences are the root ZC of N_ZC repeated cyclically to length M (36.211 §5.5.1.1)', () => {
    const m = 48;
    const r = fillBaseSequence('lte', 3, 0, m, new Float64Array(2 * m));
    const nZc = 47;
    const x = fillZadoffChuRoot(zadoffChuRootIndex(3, 0, nZc), nZc, new Float64Array(2 * nZc));
    expect(r[2 * 47]).toBeCloseTo(x[0]!, 15);
    expect(r[2 * 10 + 1]).toBeCloseTo(x[2 * 10 + 1]!, 15);
  });

  it('cyclic shifts α = 2πn_cs/12 of one base sequence are mutually orthogonal over M = 12·M_RB (derived: Σ e^{j(α1−α2)n} = 0)', () => {
    for (const m of [12, 24, 36, 60]) {
      const a = fillShiftedBaseSequence('lte', 4, 0, (2 * Math.PI * 2) / 12, m, new Float64Array(2 * m));
      const b = fillShiftedBaseSequence('lte', 4, 0, (2 * Math.PI * 7) / 12, m, new Float64Array(2 * m));
      const [re, im] = cyclicCorrelation(a, b, 0);
      expect(Math.hypot(re, im), `M = ${m}`).toBeLessThan(absTol * m * 100);
    }
  });
});
