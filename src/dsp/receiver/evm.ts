import { createFftPlan, fftUnitary } from '../fft/fftPlan';
import { bitsPerSymbol, type Modulation } from '../modulation/constellations';
import { mapBitsToSymbols } from '../modulation/mapper';
import { dataSubcarriersOf, type WaveformPlan } from '../waveform/waveformPlan';
import type { ReceiverResult } from './referenceReceiver';

/**
 * EVM over the allocated data elements after equalisation (TS 36.101 Annex F.2, TS 38.101-1 Annex F.2):
 *   EVM = √( Σ_{v∈T} |z'(v) − i(v)|² / (|T|·P0) ),
 * z' the equalised (for DFT-s-OFDM, de-spread) symbols, i the ideal symbols and P0 = 1 (unit-power constellations; block
 * power offsets are divided out by the equaliser). The ideal symbols are the receiver's decisions re-mapped (what the
 * measurement equipment reconstructs), or given ones. Also per OFDM symbol, per subcarrier (for DFT-s-OFDM from the
 * equalised frequency-domain values against the re-spread ideal ones, which by Parseval totals the same), per modulation,
 * and the peak |z' − i|.
 */
export interface EvmResult {
  readonly rmsPercent: number;
  readonly peakPercent: number;
  /** Per OFDM symbol (NaN for symbols without data). */
  readonly perSymbolPercent: Float64Array;
  /** Per grid subcarrier k' (NaN where no data). */
  readonly perSubcarrierPercent: Float64Array;
  readonly perModulation: readonly { readonly modulation: Modulation; readonly rmsPercent: number; readonly numSymbols: number }[];
  /** The ideal symbols used, fill order. */
  readonly idealSymbolsIq: Float64Array;
  readonly numSymbols: number;
}

/** Computes EVM from a receiver result; `idealSymbolsIq` (fill order) replaces the decisions when given. */
export function computeEvm(plan: WaveformPlan, rx: ReceiverResult, idealSymbolsIq?: Float64Array): EvmResult {
  const k = plan.numerology.numGridSubcarriers;
  const ideal = idealSymbolsIq ?? new Float64Array(rx.dataSymbolsIq.length);
  const perSymbolSum = new Float64Array(rx.numSymbols);
  const perSymbolCount = new Float64Array(rx.numSymbols);
  const perScSum = new Float64Array(k);
  const perScCount = new Float64Array(k);
  const byModulation = new Map<Modulation, { sum: number; count: number }>();
  const counters = plan.allocations.map(() => 0);
  let dataOffset = 0;
  let bitOffset = 0;
  let total = 0;
  let peak = 0;
  for (let l = 0; l < rx.numSymbols; l++) {
    plan.allocations.forEach((a, b) => {
      const sc = dataSubcarriersOf(plan, l, b);
      const m = sc.length;
      if (m === 0) return;
      const nBits = m * bitsPerSymbol(a.modulation);
      const idealBlock = ideal.subarray(2 * dataOffset, 2 * (dataOffset + m));
      if (!idealSymbolsIq) mapBitsToSymbols(a.modulation, rx.bits.subarray(bitOffset, bitOffset + nBits), idealBlock, counters[b]);
      let blockSum = 0;
      for (let i = 0; i < m; i++) {
        const dRe = rx.dataSymbolsIq[2 * (dataOffset + i)]! - idealBlock[2 * i]!;
        const dIm = rx.dataSymbolsIq[2 * (dataOffset + i) + 1]! - idealBlock[2 * i + 1]!;
        const e2 = dRe * dRe + dIm * dIm;
        blockSum += e2;
        if (e2 > peak) peak = e2;
      }
      // Frequency-domain error per subcarrier: the ideal symbols themselves (OFDM) or their unitary DFT (DFT-s-OFDM).
      const idealFreq = plan.waveform === 'dft-s-ofdm' ? fftUnitary(createFftPlan(m), idealBlock.slice(), new Float64Array(2 * m)) : idealBlock;
      for (let i = 0; i < m; i++) {
        const e = 2 * (k * l + sc[i]!);
        const dRe = rx.equalisedGridIq[e]! - idealFreq[2 * i]!;
        const dIm = rx.equalisedGridIq[e + 1]! - idealFreq[2 * i + 1]!;
        perScSum[sc[i]!] = perScSum[sc[i]!]! + dRe * dRe + dIm * dIm;
        perScCount[sc[i]!] = perScCount[sc[i]!]! + 1;
      }
      perSymbolSum[l] = perSymbolSum[l]! + blockSum;
      perSymbolCount[l] = perSymbolCount[l]! + m;
      const entry = byModulation.get(a.modulation) ?? { sum: 0, count: 0 };
      entry.sum += blockSum;
      entry.count += m;
      byModulation.set(a.modulation, entry);
      total += blockSum;
      counters[b]! += m;
      dataOffset += m;
      bitOffset += nBits;
    });
  }
  const percent = (sum: number, count: number): number => (count > 0 ? 100 * Math.sqrt(sum / count) : Number.NaN);
  return {
    rmsPercent: percent(total, dataOffset),
    peakPercent: 100 * Math.sqrt(peak),
    perSymbolPercent: perSymbolSum.map((s, l) => percent(s, perSymbolCount[l]!)),
    perSubcarrierPercent: perScSum.map((s, i) => percent(s, perScCount[i]!)),
    perModulation: [...byModulation].map(([modulation, e]) => ({ modulation, rmsPercent: percent(e.sum, e.count), numSymbols: e.count })),
    idealSymbolsIq: ideal,
    numSymbols: dataOffset,
  };
}
