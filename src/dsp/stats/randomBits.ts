import { createRng, type Rng } from '../data/rng';

/**
 * The bit stream of the data source `{ source: 'random', seed }` (see openBitStream in data/bitSource.ts):
 * xoshiro128** words, most significant bit first, one word after the other. This reader returns the same
 * bits, but several at a time, and can skip ahead cheaply, so a statistics block can start at any symbol.
 */
export interface RandomBitReader {
  /** Discards the next `numBits` bits (whole words are drawn and dropped, no per-bit work). */
  skip(numBits: number): void;
  /**
   * Next `count` bits (1 ≤ count ≤ 24) as an unsigned integer, first bit most significant, exactly as
   * mapBitsToSymbols reads b(m·i) … b(m·i + m − 1) into a constellation index.
   */
  take(count: number): number;
  /** Next whole 32-bit word when the reader sits on a word boundary (the QPSK fast path); otherwise −1. */
  takeAlignedWord(): number;
  /** Bits consumed so far. */
  readonly position: number;
}

/** Opens the random bit stream of `seed` at bit 0. */
export function createRandomBitReader(seed: number): RandomBitReader {
  const rng: Rng = createRng(seed);
  // `word` holds the current 32-bit draw; its low `left` bits are still unread.
  let word = 0;
  let left = 0;
  let position = 0;
  return {
    get position() {
      return position;
    },
    skip(numBits) {
      let n = numBits;
      position += n;
      if (n <= left) {
        left -= n;
        return;
      }
      n -= left;
      left = 0;
      while (n >= 32) {
        rng.nextUint32();
        n -= 32;
      }
      if (n > 0) {
        word = rng.nextUint32();
        left = 32 - n;
      }
    },
    take(count) {
      position += count;
      if (count <= left) {
        left -= count;
        // NOTE: count ≤ 24 and left < 32, so the shift never reaches 32.
        return (word >>> left) & ((1 << count) - 1);
      }
      const high = left === 0 ? 0 : word & ((1 << left) - 1);
      const need = count - left;
      word = rng.nextUint32();
      left = 32 - need;
      return (high << need) | (word >>> left);
    },
    takeAlignedWord() {
      if (left !== 0) return -1;
      position += 32;
      return rng.nextUint32();
    },
  };
}
