import { DspError } from '../errors';
import { createPnState, fillPnBits, type PnOrder } from './pnSequence';
import { createRng } from './rng';

/** Where the payload bits come from (mirrors the `data` field of the waveform configuration). */
export type DataSource =
  | { source: 'pn9' | 'pn15' | 'pn23' }
  | { source: 'random'; seed: number }
  | { source: 'bits'; hex: string };

/** A stream of bits: each call continues where the previous one stopped. */
export interface BitStream {
  fill(out: Uint8Array): Uint8Array;
}

/**
 * Opens a bit stream for `data`.
 * - pn9/pn15/pn23: ITU-T O.150 sequences from the all-ones state.
 * - random: xoshiro128** seeded with `seed`, 32 bits per draw, most significant bit first.
 * - bits: the hex string's bits, most significant bit of the first digit first, repeated cyclically.
 */
export function openBitStream(data: DataSource): BitStream {
  switch (data.source) {
    case 'pn9':
    case 'pn15':
    case 'pn23': {
      const state = createPnState(Number(data.source.slice(2)) as PnOrder);
      return { fill: (out) => fillPnBits(state, out) };
    }
    case 'random': {
      const rng = createRng(data.seed);
      let word = 0;
      let left = 0;
      return {
        fill(out) {
          for (let i = 0; i < out.length; i++) {
            if (left === 0) {
              word = rng.nextUint32();
              left = 32;
            }
            left--;
            out[i] = (word >>> left) & 1;
          }
          return out;
        },
      };
    }
    case 'bits': {
      const pattern = hexToBits(data.hex);
      let pos = 0;
      return {
        fill(out) {
          for (let i = 0; i < out.length; i++) {
            out[i] = pattern[pos]!;
            pos = pos + 1 === pattern.length ? 0 : pos + 1;
          }
          return out;
        },
      };
    }
  }
}

/** Parses a hex string (optional 0x prefix, spaces and underscores ignored) into bits, MSB first. */
export function hexToBits(hex: string): Uint8Array {
  const clean = hex.replace(/^0x/i, '').replace(/[\s_]/g, '');
  if (clean.length === 0 || !/^[0-9a-fA-F]+$/.test(clean)) {
    throw new DspError(
      'INVALID_CONFIG',
      `data.hex must be a non-empty hexadecimal string (digits 0-9, a-f); got "${hex.slice(0, 40)}".`,
    );
  }
  const bits = new Uint8Array(clean.length * 4);
  for (let i = 0; i < clean.length; i++) {
    const nibble = Number.parseInt(clean[i]!, 16);
    for (let b = 0; b < 4; b++) bits[4 * i + b] = (nibble >>> (3 - b)) & 1;
  }
  return bits;
}
