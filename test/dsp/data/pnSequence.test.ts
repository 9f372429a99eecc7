import { describe, expect, it } from 'vitest';
import { createPnState, fillPnBits, type PnOrder } from '../../../src/dsp/data/pnSequence';
import { hexToBits, openBitStream } from '../../../src/dsp/data/bitSource';
import { createRng, createRngFromState, deriveBlockSeed } from '../../../src/dsp/data/rng';

describe('ITU-T O.150 PN sequences', () => {
  it('PN9 (x^9+x^5+1, all-ones seed) begins 111111111000001111011111000101110011 (issue spec, O.150 register)', () => {
    const bits = fillPnBits(createPnState(9), new Uint8Array(36));
    expect(Array.from(bits).join('')).toBe('111111111000001111011111000101110011');
  });

  // m-sequence properties (common practice): period 2^n − 1, 2^(n−1) ones per period, longest run of ones n.
  const orders: PnOrder[] = [9, 15, 23];
  for (const n of orders) {
    it(`PN${n}: period 2^${n}−1 with 2^${n - 1} ones and a longest run of ${n} ones`, () => {
      const period = 2 ** n - 1;
      const bits = fillPnBits(createPnState(n), new Uint8Array(period + 64));
      let ones = 0;
      let run = 0;
      let longest = 0;
      for (let i = 0; i < period; i++) {
        ones += bits[i]!;
        run = bits[i] ? run + 1 : 0;
        longest = Math.max(longest, run);
      }
      expect(ones).toBe(2 ** (n - 1));
      expect(longest).toBe(n);
      // Period exactly 2^n − 1: the sequence repeats there (and the state is back to all ones).
      for (let i = 0; i < 64; i++) expect(bits[period + i]).toBe(bits[i]);
      // No shorter period that divides it (2^n − 1's proper divisors) would leave the full pattern unchanged:
      // for a primitive polynomial the only return to the seed is at the full period.
      const state = createPnState(n);
      fillPnBits(state, new Uint8Array(period));
      expect(state.register).toBe(2 ** n - 1);
    });
  }

  it('continues across chunks exactly as one long call', () => {
    const whole = fillPnBits(createPnState(15), new Uint8Array(1000));
    const s = createPnState(15);
    const parts = [...fillPnBits(s, new Uint8Array(333)), ...fillPnBits(s, new Uint8Array(667))];
    expect(parts).toEqual(Array.from(whole));
  });
});

describe('bit sources', () => {
  it('hex bits are MSB first and repeat cyclically', () => {
    expect(Array.from(hexToBits('0xA5'))).toEqual([1, 0, 1, 0, 0, 1, 0, 1]);
    const stream = openBitStream({ source: 'bits', hex: 'C' });
    expect(Array.from(stream.fill(new Uint8Array(10)))).toEqual([1, 1, 0, 0, 1, 1, 0, 0, 1, 1]);
  });
  it('rejects a non-hex string with the field named', () => {
    expect(() => hexToBits('xyz')).toThrow(/data\.hex/);
  });
  it('the seeded generator is deterministic, uniform, and seeds differ', () => {
    const a = createRng(7);
    const b = createRng(7);
    const c = createRng(8);
    const xs = Array.from({ length: 5 }, () => a.nextUint32());
    expect(Array.from({ length: 5 }, () => b.nextUint32())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c.nextUint32())).not.toEqual(xs);
    // Reference vector: the authors' C code xoshiro128starstar.c (Blackman & Vigna, prng.di.unimi.it) compiled
    // here with gcc, state {1, 2, 3, 4}, first six outputs.
    const ref = createRngFromState(1, 2, 3, 4);
    expect(Array.from({ length: 6 }, () => ref.nextUint32())).toEqual([11520, 0, 5927040, 70819200, 2031721883, 1637235492]);
    const r = createRng(1);
    let sum = 0;
    let sumSq = 0;
    const n = 200000;
    for (let i = 0; i < n; i++) {
      const g = r.nextGaussian();
      sum += g;
      sumSq += g * g;
    }
    // Mean 0 and variance 1 within ~5 standard errors.
    expect(Math.abs(sum / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sumSq / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });
  it('block seeds are distinct and independent of anything but (run seed, block)', () => {
    const before = deriveBlockSeed(42, 17);
    const seeds = new Set(Array.from({ length: 1000 }, (_, i) => deriveBlockSeed(42, i)));
    expect(seeds.size).toBe(1000);
    // No hidden state: the same pair gives the same seed after 1000 other derivations.
    expect(deriveBlockSeed(42, 17)).toBe(before);
    // Frozen from this implementation (not an outside source): shards written by earlier runs merge only while it holds.
    expect(before).toBe(2322716646);
    expect(deriveBlockSeed(43, 17)).not.toBe(deriveBlockSeed(42, 17));
  });
});
