import { assertSeparateOutput, DspError } from '../errors';
import type { SymbolLayout } from '../waveform/waveformPlan';
import { cos } from '../math/trig';

/**
 * Transmit windowing of OFDM symbols with raised-cosine edges (weighted overlap-add at the transmitter; common
 * practice, e.g. R. van Nee & R. Prasad, OFDM for Wireless Multimedia Communications, Artech House 2000, §2.3
 * (from memory — verify the section)). Each symbol is extended by a cyclic suffix of W samples; its first W samples
 * (the start of its CP) are multiplied by the rising ramp r[j] = ½[1 − cos(π(j + ½)/W)], its suffix by the falling
 * ramp 1 − r[j], and the suffix is added onto the first W samples of the next symbol. Because r[j] + r[W−1−j] = 1,
 * the useful part after the CP is untouched; only the first W CP samples change, which smooths the symbol boundaries
 * (lower out-of-band emission) at the cost of EVM when the receiver's FFT window starts within those W samples.
 * The last symbol's suffix wraps onto the first symbol (the record is one period of a looped signal).
 * @param continuationSign the factor between x[n + N] and x[n] within a symbol: +1, or −1 for the LTE uplink's
 *        half-subcarrier shift (TS 36.211 §5.6: e^{jπ(n + N − N_cp)/N} = −e^{jπ(n − N_cp)/N})
 * @param rampLengthSamples W at the output rate, 1 ≤ W ≤ the shortest CP
 * @param inIq the generated waveform, 2·(total samples); @param outIq same length, not the same buffer
 */
export function applyTimeWindowing(
  inIq: Float64Array,
  layouts: readonly SymbolLayout[],
  rampLengthSamples: number,
  continuationSign: 1 | -1,
  outIq: Float64Array,
): Float64Array {
  assertSeparateOutput(inIq, outIq, 'Windowing');
  const w = rampLengthSamples;
  const shortestCp = Math.min(...layouts.map((l) => l.cpLengthSamples));
  if (!Number.isInteger(w) || w < 1 || w > shortestCp) {
    throw new DspError(
      'INVALID_CONFIG',
      `windowing.rampLengthSamples gives a ramp of ${w} samples at the output rate; it must be a whole number from 1 to the shortest cyclic prefix (${shortestCp} samples at this rate).`,
      { field: 'windowing.rampLengthSamples' },
    );
  }
  const total = inIq.length / 2;
  const ramp = new Float64Array(w);
  for (let j = 0; j < w; j++) ramp[j] = 0.5 * (1 - cos((Math.PI * (j + 0.5)) / w));
  outIq.set(inIq);
  for (const l of layouts) {
    for (let j = 0; j < w; j++) {
      const i = 2 * (l.startSample + j);
      outIq[i]! *= ramp[j]!;
      outIq[i + 1]! *= ramp[j]!;
    }
  }
  for (const l of layouts) {
    const usefulStart = l.startSample + l.cpLengthSamples;
    const suffixStart = usefulStart + l.fftSize;
    for (let j = 0; j < w; j++) {
      const src = 2 * (usefulStart + j);
      const dst = 2 * ((suffixStart + j) % total);
      const gain = continuationSign * ramp[w - 1 - j]!;
      outIq[dst]! += gain * inIq[src]!;
      outIq[dst + 1]! += gain * inIq[src + 1]!;
    }
  }
  return outIq;
}
