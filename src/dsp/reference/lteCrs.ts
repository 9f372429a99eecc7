import { RE_REFERENCE } from '../waveform/resourceKinds';
import { fillGoldQpsk } from './goldSequence';

/**
 * LTE cell-specific reference signal, antenna port 0 (TS 36.211 §6.10.1):
 *   r_{l,n_s}(m) = (1/√2)(1 − 2c(2m)) + j(1/√2)(1 − 2c(2m+1)), m = 0…2N_RB^max,DL − 1, N_RB^max,DL = 110,
 *   c_init = 2^10·(7(n_s + 1) + l + 1)·(2N_ID^cell + 1) + 2N_ID^cell + N_CP (N_CP = 1 normal, 0 extended CP),
 *   a_{k,l} = r_{l,n_s}(m'), k = 6m + (v + v_shift) mod 6, m = 0…2N_RB − 1, m' = m + N_RB^max,DL − N_RB,
 *   l ∈ {0, N_symb^DL − 3}, v = 0 for l = 0 and 3 otherwise, v_shift = N_ID^cell mod 6.
 * k is the grid subcarrier k' (lowest frequency first, DC not counted). The c_init form is the Rel-8 one
 * (frame structure type 1, n_s = slot number in the frame).
 */
export const LTE_MAX_DL_RB = 110;

/** CRS symbols of a slot for port 0: 0 and N_symb^DL − 3 (4 with normal CP, 3 with extended CP). */
export function lteCrsSymbolsInSlot(extendedCp: boolean): number[] {
  return [0, (extendedCp ? 6 : 7) - 3];
}

/** (v + v_shift) mod 6: which subcarrier of every six carries the CRS in slot symbol `symbolInSlot`. */
export function crsSubcarrierOffset(symbolInSlot: number, cellId: number): number {
  const v = symbolInSlot === 0 ? 0 : 3;
  return (v + (cellId % 6)) % 6;
}

/** c_init of the CRS sequence for slot n_s (0…19) and slot symbol l. */
export function crsInitialisation(slotInFrame: number, symbolInSlot: number, cellId: number, extendedCp: boolean): number {
  return 1024 * (7 * (slotInFrame + 1) + symbolInSlot + 1) * (2 * cellId + 1) + 2 * cellId + (extendedCp ? 0 : 1);
}

/** Writes the port-0 CRS of one symbol (over the whole grid, amplitude 1) and marks its elements RE_REFERENCE. */
export function fillLteCrsRow(
  numRb: number,
  slotInFrame: number,
  symbolInSlot: number,
  cellId: number,
  extendedCp: boolean,
  rowIq: Float64Array,
  kinds: Uint8Array,
): void {
  const sequenceIq = fillGoldQpsk(crsInitialisation(slotInFrame, symbolInSlot, cellId, extendedCp), new Float64Array(4 * LTE_MAX_DL_RB));
  const offset = crsSubcarrierOffset(symbolInSlot, cellId);
  for (let m = 0; m < 2 * numRb; m++) {
    const k = 6 * m + offset;
    const mPrime = m + LTE_MAX_DL_RB - numRb;
    rowIq[2 * k] = sequenceIq[2 * mPrime]!;
    rowIq[2 * k + 1] = sequenceIq[2 * mPrime + 1]!;
    kinds[k] = RE_REFERENCE;
  }
}
