import { assertLength } from '../errors';
import { getConstellation, type ConstellationTable, type Modulation } from './constellations';

/**
 * Hard-decision demapping: the bits of the nearest constellation point to each received symbol.
 * @param symbolsIq interleaved received symbols (already equalised, unit-power reference)
 * @param outBits one bit per byte, numSymbols · bitsPerSymbol values
 * @param firstSymbolIndex index of the first symbol (π/2-BPSK rotation)
 */
export function demapHard(
  modulation: Modulation,
  symbolsIq: Float64Array,
  outBits: Uint8Array,
  firstSymbolIndex = 0,
): Uint8Array {
  const llr = new Float64Array(outBits.length);
  demapMaxLogLlr(modulation, symbolsIq, 1, llr, firstSymbolIndex);
  for (let i = 0; i < llr.length; i++) outBits[i] = llr[i]! < 0 ? 1 : 0;
  return outBits;
}

/**
 * Max-log LLRs, LLR(b) = (min_{s: b=1} |y − s|² − min_{s: b=0} |y − s|²) / N0: positive favours bit 0.
 * Square QAM is separable, so each axis is searched over its √M levels (I carries the even bits, Q the odd);
 * BPSK and π/2-BPSK put one bit on both axes and use the 2-D distance.
 * @param noiseVariance N0 = E|n|² per complex symbol (> 0)
 * @param outLlr numSymbols · bitsPerSymbol values
 */
export function demapMaxLogLlr(
  modulation: Modulation,
  symbolsIq: Float64Array,
  noiseVariance: number,
  outLlr: Float64Array,
  firstSymbolIndex = 0,
): Float64Array {
  const table = getConstellation(modulation);
  const m = table.bitsPerSymbol;
  const numSymbols = symbolsIq.length / 2;
  assertLength(outLlr, numSymbols * m, `LLR output for ${numSymbols} ${modulation} symbols`);
  const invN0 = 1 / noiseVariance;
  if (m === 1) {
    const a = Math.SQRT1_2;
    for (let s = 0; s < numSymbols; s++) {
      let re = symbolsIq[2 * s]!;
      let im = symbolsIq[2 * s + 1]!;
      if (modulation === 'pi/2-bpsk' && ((firstSymbolIndex + s) & 1) === 1) {
        // Undo the e^{jπ/2} rotation of odd symbols.
        const t = re;
        re = im;
        im = -t;
      }
      const d0 = (re - a) ** 2 + (im - a) ** 2;
      const d1 = (re + a) ** 2 + (im + a) ** 2;
      outLlr[s] = (d1 - d0) * invN0;
    }
    return outLlr;
  }
  const h = m / 2;
  for (let s = 0; s < numSymbols; s++) {
    axisLlr(table, symbolsIq[2 * s]!, h, invN0, outLlr, s * m, 0);
    axisLlr(table, symbolsIq[2 * s + 1]!, h, invN0, outLlr, s * m, 1);
  }
  return outLlr;
}

const best0 = new Float64Array(8);
const best1 = new Float64Array(8);

function axisLlr(
  table: ConstellationTable,
  y: number,
  h: number,
  invN0: number,
  out: Float64Array,
  base: number,
  parity: number,
): void {
  best0.fill(Infinity, 0, h);
  best1.fill(Infinity, 0, h);
  const levels = table.axisLevels;
  const bits = table.axisBits;
  for (let l = 0; l < levels.length; l++) {
    const d = (y - levels[l]!) ** 2;
    for (let i = 0; i < h; i++) {
      if (bits[l * h + i] === 0) {
        if (d < best0[i]!) best0[i] = d;
      } else if (d < best1[i]!) best1[i] = d;
    }
  }
  // Axis bit i is codeword bit 2i + parity; a complex symbol's distance is the sum of its axes', and the other
  // axis's minimum cancels in the difference.
  for (let i = 0; i < h; i++) out[base + 2 * i + parity] = (best1[i]! - best0[i]!) * invN0;
}
