/**
 * Seeded pseudo-random numbers that give the same stream in Node and in every browser: xoshiro128**
 * (Blackman & Vigna, "Scrambled linear pseudorandom number generators", 2018), 32-bit integer arithmetic only
 * (Math.imul and unsigned shifts), seeded through splitmix32 so that nearby seeds give unrelated streams.
 * Randomness is always a parameter (`rng: Rng`), never a global.
 */
import { log } from '../math/expLog';
import { cos, sin } from '../math/trig';
export interface Rng {
  /** Next 32-bit unsigned integer. */
  nextUint32(): number;
  /** Uniform in [0, 1), 32-bit resolution. */
  nextFloat(): number;
  /** Standard normal N(0, 1) by the Box–Muller transform (one value per call, the pair's twin cached). */
  nextGaussian(): number;
}

/** One splitmix32 step: a well-mixed 32-bit value from a 32-bit state (used for seeding and seed derivation). */
export function splitmix32(state: number): number {
  let z = (state + 0x9e3779b9) | 0;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}

/**
 * Seed of block `blockIndex` of a Monte-Carlo run seeded `runSeed`: independent of how blocks are spread
 * over workers, so a run gives the same result on 1 or 8 workers.
 */
export function deriveBlockSeed(runSeed: number, blockIndex: number): number {
  return splitmix32(splitmix32(runSeed >>> 0) ^ splitmix32((blockIndex + 0x6a09e667) >>> 0));
}

/** Creates a generator from an integer seed (any safe integer; its low and high 32-bit halves are both mixed in). */
export function createRng(seed: number): Rng {
  const lo = seed >>> 0;
  const hi = Math.floor(seed / 4294967296) >>> 0;
  const s0 = splitmix32(lo ^ 0x243f6a88);
  const s1 = splitmix32(s0 ^ hi);
  const s2 = splitmix32(s1 ^ 0x85a308d3);
  const s3 = splitmix32(s2 ^ 0x13198a2e);
  return createRngFromState(s0 | s1 | s2 | s3 ? s0 : 1, s1, s2, s3);
}

/** A generator started from an explicit xoshiro128** state (not all zero); for reference-vector tests. */
export function createRngFromState(state0: number, state1: number, state2: number, state3: number): Rng {
  let s0 = state0 >>> 0;
  let s1 = state1 >>> 0;
  let s2 = state2 >>> 0;
  let s3 = state3 >>> 0;
  let spare = 0;
  let hasSpare = false;

  const nextUint32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return result;
  };
  const nextFloat = (): number => nextUint32() / 4294967296;
  return {
    nextUint32,
    nextFloat,
    nextGaussian() {
      if (hasSpare) {
        hasSpare = false;
        return spare;
      }
      // 1 − u keeps the logarithm's argument in (0, 1].
      const u = 1 - nextFloat();
      const v = nextFloat();
      const radius = Math.sqrt(-2 * log(u));
      spare = radius * sin(2 * Math.PI * v);
      hasSpare = true;
      return radius * cos(2 * Math.PI * v);
    },
  };
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
