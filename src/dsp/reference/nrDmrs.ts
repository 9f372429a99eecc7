import { RE_REFERENCE } from '../waveform/resourceKinds';
import { fillGoldQpsk } from './goldSequence';
import type { ReferenceBlock } from './referenceSignalPlan';

/**
 * NR PUSCH/PDSCH DMRS, configuration type 1, single symbol, antenna port 0 (TS 38.211 §6.4.1.1, §7.4.1.1):
 * a_{k,l} = β·r(2n + k'), k = 4n + 2k' + Δ, k' ∈ {0, 1}, Δ = 0 (CDM group 0), w_f = w_t = 1, so r(m) sits on subcarrier 2m.
 * - Without transform precoding k counts from subcarrier 0 of common resource block 0, taken as grid subcarrier 0 (the
 *   carrier grid starts at point A here), and r(m) is the Gold-sequence QPSK of §6.4.1.1.1.1 with
 *   c_init = (2^17·(N_symb^slot·n_s,f + l + 1)·(2N_ID + 1) + 2N_ID + n_SCID) mod 2^31 (the Rel-15 form; Rel-16's λ̄ term is 0 for port 0).
 * - With transform precoding k counts from the start of the allocation and r(n) = r^{(0,1)}_{u,v}(n), n < M_sc/2 (§6.4.1.1.1.2).
 * β = √2: both CDM groups are kept free of data, for which TS 38.214 Table 6.2.2-1 sets the DMRS 3 dB above the data
 * (from memory — verify).
 */
export const NR_DMRS_AMPLITUDE = Math.SQRT2;

/**
 * Default DMRS symbols: l0 = 2 (dmrs-TypeA-Position pos2) with dmrs-AdditionalPosition pos2 over a 14-symbol PUSCH,
 * i.e. symbols 2, 7 and 11 (TS 38.211 Table 6.4.1.1.3-3; pos2 is the default when the parameter is absent, TS 38.331)
 * (from memory — verify).
 */
export const NR_DEFAULT_DMRS_SYMBOLS: readonly number[] = [2, 7, 11];

/** c_init of the Gold-sequence DMRS in slot n_s,f and slot symbol l. */
export function nrDmrsInitialisation(symbolsPerSlot: number, slotInFrame: number, symbolInSlot: number, scramblingId: number, nScid: number): number {
  const product = 131072 * (symbolsPerSlot * slotInFrame + symbolInSlot + 1) * (2 * scramblingId + 1);
  // The product stays below 2^46, so double arithmetic is exact.
  return (product + 2 * scramblingId + nScid) % 2147483648;
}

/** Writes Gold-sequence DMRS on the even subcarriers of every block and marks them RE_REFERENCE. */
export function fillNrGoldDmrsRow(
  blocks: readonly ReferenceBlock[],
  cInit: number,
  rowIq: Float64Array,
  kinds: Uint8Array,
): void {
  let lastSubcarrier = 0;
  for (const b of blocks) lastSubcarrier = Math.max(lastSubcarrier, b.firstSubcarrier + b.numSubcarriers - 1);
  const sequenceIq = fillGoldQpsk(cInit, new Float64Array(2 * (Math.floor(lastSubcarrier / 2) + 1)));
  for (const b of blocks) {
    const amp = NR_DMRS_AMPLITUDE * b.amplitudeLinear;
    for (let k = b.firstSubcarrier; k < b.firstSubcarrier + b.numSubcarriers; k += 2) {
      const m = k / 2;
      rowIq[2 * k] = amp * sequenceIq[2 * m]!;
      rowIq[2 * k + 1] = amp * sequenceIq[2 * m + 1]!;
      kinds[k] = RE_REFERENCE;
    }
  }
}

/** Writes the precomputed low-PAPR DMRS of every block on its even subcarriers and marks them RE_REFERENCE. */
export function fillNrLowPaprDmrsRow(blocks: readonly ReferenceBlock[], rowIq: Float64Array, kinds: Uint8Array): void {
  for (const b of blocks) {
    const amp = NR_DMRS_AMPLITUDE * b.amplitudeLinear;
    for (let n = 0; n < b.numSubcarriers / 2; n++) {
      const k = b.firstSubcarrier + 2 * n;
      rowIq[2 * k] = amp * b.sequenceIq[2 * n]!;
      rowIq[2 * k + 1] = amp * b.sequenceIq[2 * n + 1]!;
      kinds[k] = RE_REFERENCE;
    }
  }
}
