import { assertLength } from '../errors';
import { getConstellation, type Modulation } from './constellations';

/**
 * Maps bits to complex symbols per TS 38.211 §5.1 / TS 36.211 §7.1: b(m·i) … b(m·i+m−1) give d(i), b0 first.
 * π/2-BPSK rotates symbol i by e^{jπ(i mod 2)/2}, i counted from `firstSymbolIndex` (the index of the first
 * symbol written, so a stream mapped in pieces keeps its rotation pattern).
 * @param bits one bit (0/1) per byte, length = numSymbols · bitsPerSymbol
 * @param outIq interleaved output, 2·numSymbols values
 */
export function mapBitsToSymbols(
  modulation: Modulation,
  bits: Uint8Array,
  outIq: Float64Array,
  firstSymbolIndex = 0,
): Float64Array {
  const table = getConstellation(modulation);
  const m = table.bitsPerSymbol;
  const numSymbols = outIq.length / 2;
  assertLength(bits, numSymbols * m, `Bits for ${numSymbols} ${modulation} symbols`);
  const points = table.pointsIq;
  for (let s = 0, b = 0; s < numSymbols; s++) {
    let index = 0;
    for (let i = 0; i < m; i++, b++) index = (index << 1) | bits[b]!;
    let re = points[2 * index]!;
    let im = points[2 * index + 1]!;
    if (modulation === 'pi/2-bpsk' && ((firstSymbolIndex + s) & 1) === 1) {
      const t = re;
      re = -im;
      im = t;
    }
    outIq[2 * s] = re;
    outIq[2 * s + 1] = im;
  }
  return outIq;
}
