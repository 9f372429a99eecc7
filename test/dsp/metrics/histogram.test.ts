import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import {
  addDbHistogram,
  binCentreDb,
  binLowerEdgeDb,
  createDbHistogram,
  histogramTotal,
  POWER_HISTOGRAM_SPEC,
} from '../../../src/dsp/metrics/dbHistogram';
import { binIndexOfPower, binPowersInto, createPowerBinner } from '../../../src/dsp/metrics/powerBinner';
import { TEST_SEED } from '../../helpers/seed';

/** The bin definition written out directly: the number of lower edges ≤ p (binary search over the edge list). */
function referenceBin(edges: Float64Array, p: number): number {
  let lo = 0;
  let hi = edges.length - 1;
  // Largest j with edges[j] ≤ p; edges[0] = −∞; the last entry (a sentinel) is never read.
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (edges[mid]! <= p) lo = mid;
    else hi = mid;
  }
  return lo;
}

describe('0.01 dB histogram bins (exact, linear-domain edges)', () => {
  const reference = 1234.5;
  const binner = createPowerBinner(POWER_HISTOGRAM_SPEC, reference);
  const h = createDbHistogram(POWER_HISTOGRAM_SPEC);

  it('bin centres and edges follow the 0.01 dB grid', () => {
    expect(h.numBins).toBe(6001);
    expect(binCentreDb(h, 1)).toBe(-30);
    expect(binCentreDb(h, 3001)).toBe(0);
    expect(binLowerEdgeDb(h, 3001)).toBe(-0.005);
    expect(binCentreDb(h, 0)).toBeNaN();
  });

  it('the table lookup gives the same bin as a search over the edges, for random values and values on the edges', () => {
    const rng = createRng(TEST_SEED);
    const edges = binner.lowerEdges;
    let mismatches = 0;
    for (let i = 0; i < 200000; i++) {
      const db = -35 + 70 * rng.nextFloat();
      const p = reference * 10 ** (db / 10);
      if (binIndexOfPower(binner, p) !== referenceBin(edges, p)) mismatches++;
    }
    expect(mismatches, `seed ${TEST_SEED}`).toBe(0);
    for (let j = 1; j < edges.length - 1; j += 7) {
      const e = edges[j]!;
      const below = e * (1 - 2 ** -52);
      expect(binIndexOfPower(binner, e)).toBe(j);
      expect(binIndexOfPower(binner, below)).toBe(referenceBin(edges, below));
    }
  });

  it('single-precision powers use their own table and land in the same bins as the edge search', () => {
    const rng = createRng(TEST_SEED + 2);
    const values = new Float32Array(100000);
    for (let i = 0; i < values.length; i++) values[i] = reference * 10 ** ((-35 + 70 * rng.nextFloat()) / 10);
    // Include float values right at and just below edges.
    for (let j = 1; j < 2000; j++) {
      values[2 * j] = binner.lowerEdges[3 * j]!;
      values[2 * j + 1] = Math.fround(binner.lowerEdges[3 * j]! * (1 - 2 ** -23));
    }
    const viaF32 = createDbHistogram(POWER_HISTOGRAM_SPEC);
    binPowersInto(binner, values, 0, values.length, viaF32);
    const direct = createDbHistogram(POWER_HISTOGRAM_SPEC);
    for (const v of values) direct.counts[referenceBin(binner.lowerEdges, v)]!++;
    expect(Array.from(viaF32.counts)).toEqual(Array.from(direct.counts));
  });

  it('a value reads as its dB value rounded to 0.01 dB; zero and tiny powers underflow, huge ones overflow', () => {
    const at = (db: number) => binIndexOfPower(binner, reference * 10 ** (db / 10));
    expect(binCentreDb(h, at(8.391))).toBe(8.39);
    expect(binCentreDb(h, at(8.396))).toBe(8.4);
    expect(binCentreDb(h, at(-0.004))).toBe(0);
    expect(binIndexOfPower(binner, 0)).toBe(0);
    expect(binIndexOfPower(binner, reference * 1e-4)).toBe(0);
    expect(binIndexOfPower(binner, reference * 1e4)).toBe(h.numBins + 1);
    // The fused Monte-Carlo kernels compare every value with the next edge: +∞ and NaN must stay in the overflow bin.
    const odd = createDbHistogram(POWER_HISTOGRAM_SPEC);
    binPowersInto(binner, Float64Array.from([Number.POSITIVE_INFINITY, Number.NaN, 0]), 0, 3, odd);
    expect(odd.counts[h.numBins + 1]).toBe(2);
    expect(odd.counts[0]).toBe(1);
  });

  it('counts add exactly: binning in chunks and merging equals binning at once', () => {
    const rng = createRng(TEST_SEED + 1);
    const powers = new Float64Array(50000);
    for (let i = 0; i < powers.length; i++) powers[i] = -Math.log(1 - rng.nextFloat()) * reference;
    const whole = createDbHistogram(POWER_HISTOGRAM_SPEC);
    binPowersInto(binner, powers, 0, powers.length, whole);
    const a = createDbHistogram(POWER_HISTOGRAM_SPEC);
    const b = createDbHistogram(POWER_HISTOGRAM_SPEC);
    binPowersInto(binner, powers, 0, 12345, a);
    binPowersInto(binner, powers, 12345, powers.length - 12345, b);
    addDbHistogram(b, a);
    expect(Array.from(b.counts)).toEqual(Array.from(whole.counts));
    expect(histogramTotal(whole)).toBe(powers.length);
    const one = createDbHistogram(POWER_HISTOGRAM_SPEC);
    for (let i = 0; i < powers.length; i++) one.counts[binIndexOfPower(binner, powers[i]!)]!++;
    expect(Array.from(one.counts)).toEqual(Array.from(whole.counts));
  });

  it('rejects a non-positive reference and mismatched ranges', () => {
    expect(() => createPowerBinner(POWER_HISTOGRAM_SPEC, 0)).toThrow(/reference power/);
    expect(() => addDbHistogram(createDbHistogram({ minCentiDb: 0, maxCentiDb: 10 }), h)).toThrow(/different ranges/);
    expect(() => binPowersInto(binner, new Float64Array(4), 2, 3, h)).toThrow(/4 values/);
  });
});
