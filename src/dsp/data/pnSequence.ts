import { DspError } from '../errors';

/**
 * Pseudo-random binary sequences of ITU-T O.150: PN9 (x^9+x^5+1), PN15 (x^15+x^14+1), PN23 (x^23+x^18+1).
 * Fibonacci register seeded all ones; the output is the last stage; the feedback, last stage XOR tap stage,
 * shifts into stage 1. PN9 so begins 111111111000001111011111000101110011 (period 2^9 − 1 = 511).
 */
export type PnOrder = 9 | 15 | 23;

const TAP_STAGE: Record<PnOrder, number> = { 9: 5, 15: 14, 23: 18 };

/** State of a running PN generator, so a long stream can be produced in chunks. */
export interface PnState {
  readonly order: PnOrder;
  /** Register stages 1..order packed as bits 0..order−1 (stage 1 = bit 0). */
  register: number;
}

/** A generator at the start of its sequence (all ones). */
export function createPnState(order: PnOrder): PnState {
  if (!(order in TAP_STAGE)) {
    throw new DspError('INVALID_CONFIG', `PN order ${order} is not supported: use 9, 15 or 23 (ITU-T O.150).`);
  }
  return { order, register: (1 << order) - 1 };
}

/**
 * Writes the next `out.length` bits (0/1, one per byte) of the sequence into `out` and advances `state`.
 * @returns out
 */
export function fillPnBits(state: PnState, out: Uint8Array): Uint8Array {
  const order = state.order;
  const lastBit = order - 1;
  const tapBit = TAP_STAGE[order] - 1;
  const mask = (1 << order) - 1;
  let reg = state.register;
  for (let i = 0; i < out.length; i++) {
    const last = (reg >>> lastBit) & 1;
    out[i] = last;
    const feedback = last ^ ((reg >>> tapBit) & 1);
    reg = ((reg << 1) | feedback) & mask;
  }
  state.register = reg;
  return out;
}
