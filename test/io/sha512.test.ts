import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createSha512, sha512Hex } from '../../src/io/sha512';
import { createRng } from '../../src/dsp/data/rng';
import { TEST_SEED } from '../helpers/seed';

function randomBytes(n: number, seed: number): Uint8Array {
  const rng = createRng(seed);
  const out = new Uint8Array(n);
  for (let i = 0; i < n; i++) out[i] = rng.nextUint32() & 0xff;
  return out;
}

describe(`pure-TypeScript SHA-512 (seed ${TEST_SEED})`, () => {
  it('matches the FIPS 180-2 Appendix C.1 "abc" vector (value from memory, cross-checked by node:crypto)', () => {
    const expected =
      'ddaf35a193617abacc417349ae20413112e6fa4e89a97ea20a9eeee64b55d39a2192992a274fc1a836ba3c23a3feebbd454d4423643ce80e2a9ac94fa54ca49f';
    const abc = new TextEncoder().encode('abc');
    expect(sha512Hex(abc)).toBe(expected);
    expect(createHash('sha512').update(abc).digest('hex')).toBe(expected);
  });

  it('equals node:crypto for every length around the 128-byte block and the 112-byte padding boundary', () => {
    // Source of truth: Node's OpenSSL SHA-512 (an independent implementation of FIPS 180-4).
    for (const n of [0, 1, 55, 56, 63, 64, 111, 112, 113, 127, 128, 129, 239, 240, 255, 256, 257, 1000, 4097]) {
      const bytes = randomBytes(n, TEST_SEED + n);
      expect(sha512Hex(bytes), `length ${n}`).toBe(createHash('sha512').update(bytes).digest('hex'));
    }
  });

  it('gives the same digest however the message is split into update() calls', () => {
    const bytes = randomBytes(5000, TEST_SEED);
    const expected = createHash('sha512').update(bytes).digest('hex');
    for (const piece of [1, 7, 127, 128, 129, 1000]) {
      const h = createSha512();
      for (let i = 0; i < bytes.length; i += piece) h.update(bytes.subarray(i, i + piece));
      expect(h.digestHex(), `pieces of ${piece}`).toBe(expected);
    }
  });

  it('refuses update after digest', () => {
    const h = createSha512();
    h.digest();
    expect(() => h.update(new Uint8Array(1))).toThrow(/after digest/);
  });
});
