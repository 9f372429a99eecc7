import { combineShapedSpectrum } from '../shaping/spectrumShaping';
import { occupiedSubcarriers } from '../waveform/allocation';
import { RE_DATA } from '../waveform/waveformGenerator';
import type { SymbolLayout, WaveformPlan } from '../waveform/waveformPlan';
import { createSymbolDemodulator } from './symbolDemodulator';

/** Options of `measureGridEvm`. */
export interface GridEvmOptions {
  /** FFT window start relative to the end of the CP, samples at the output rate (≤ 0; default 0). */
  readonly timingOffsetSamples?: number;
  /** Fit a complex gain per OFDM symbol (removes common phase error) instead of one for the record (default false). */
  readonly gainPerSymbol?: boolean;
  /** The generator's RE kinds (same layout as the grid): blocks whose resource elements are not RE_DATA on a symbol (e.g. reference symbols) are skipped there. */
  readonly gridKinds?: Uint8Array;
}

export interface GridEvmResult {
  /** RMS EVM over every data resource element of the record, %. */
  readonly evmRmsPercent: number;
  /** Standard error of evmRmsPercent from the spread of per-symbol error powers, %. */
  readonly evmStandardErrorPercent: number;
  /** Per-symbol RMS EVM, %. */
  readonly perSymbolEvmPercent: Float64Array;
  /** The fitted complex gain (record fit), [re, im]. */
  readonly gainIq: readonly [number, number];
}

/**
 * A quick transmitter-quality check with known timing and no channel: demodulates every symbol at the given FFT
 * window position (symbolDemodulator.ts), undoes spectrum shaping by matched combining, fits one complex gain
 * (the TX amplitude and phase, removed before measuring as TS 36.104 Annex E.3 says), and returns
 * EVM = √(Σ|Y − αX|² / Σ|αX|²) over the data resource elements (TS 36.101 Annex F.2 form, P0 = mean ideal power).
 * Data subcarriers before de-spreading give the same error power as the de-spread symbols (the DFT is unitary).
 * This is not the standard's two-position EVM with per-subcarrier equalisation (that is the reference receiver's);
 * it is what the transmitter-side reports use.
 * @param idealGridIq the generator's grid (numSymbols × 12·N_RB, interleaved); @param waveformIq the transmitted samples
 */
export function measureGridEvm(
  plan: WaveformPlan,
  layouts: readonly SymbolLayout[],
  idealGridIq: Float64Array,
  waveformIq: Float64Array,
  options: GridEvmOptions = {},
): GridEvmResult {
  const k = plan.numerology.numGridSubcarriers;
  const demod = createSymbolDemodulator(plan);
  const row = new Float64Array(2 * k);
  const measured: Float64Array[] = [];
  const ideal: Float64Array[] = [];
  layouts.forEach((layout, s) => {
    demod.demodulate(waveformIq, layout, options.timingOffsetSamples ?? 0, row);
    const idealRow = idealGridIq.subarray(2 * k * s, 2 * k * (s + 1));
    const y: number[] = [];
    const x: number[] = [];
    for (const block of plan.allocations) {
      const subs = occupiedSubcarriers(block);
      if (options.gridKinds && options.gridKinds[k * s + block.dataSubcarriers[0]!] !== RE_DATA) continue;
      const gather = (source: Float64Array): Float64Array => {
        const out = new Float64Array(2 * subs.length);
        subs.forEach((g, i) => {
          out[2 * i] = source[2 * g]!;
          out[2 * i + 1] = source[2 * g + 1]!;
        });
        return block.shaping ? combineShapedSpectrum(block.shaping.plan, out, new Float64Array(2 * block.dataSubcarriers.length)) : out;
      };
      y.push(...gather(row));
      x.push(...gather(idealRow));
    }
    measured.push(Float64Array.from(y));
    ideal.push(Float64Array.from(x));
  });
  const fit = (ys: Float64Array[], xs: Float64Array[]): [number, number] => {
    let nRe = 0;
    let nIm = 0;
    let d = 0;
    ys.forEach((yv, s) => {
      const xv = xs[s]!;
      for (let i = 0; i < yv.length; i += 2) {
        // Σ y·conj(x)
        nRe += yv[i]! * xv[i]! + yv[i + 1]! * xv[i + 1]!;
        nIm += yv[i + 1]! * xv[i]! - yv[i]! * xv[i + 1]!;
        d += xv[i]! * xv[i]! + xv[i + 1]! * xv[i + 1]!;
      }
    });
    return d > 0 ? [nRe / d, nIm / d] : [1, 0];
  };
  const recordGain = fit(measured, ideal);
  const errorPower = new Float64Array(layouts.length);
  const refPower = new Float64Array(layouts.length);
  measured.forEach((yv, s) => {
    const xv = ideal[s]!;
    const [gRe, gIm] = options.gainPerSymbol ? fit([yv], [xv]) : recordGain;
    for (let i = 0; i < yv.length; i += 2) {
      const aRe = gRe * xv[i]! - gIm * xv[i + 1]!;
      const aIm = gRe * xv[i + 1]! + gIm * xv[i]!;
      errorPower[s]! += (yv[i]! - aRe) ** 2 + (yv[i + 1]! - aIm) ** 2;
      refPower[s]! += aRe * aRe + aIm * aIm;
    }
  });
  let errSum = 0;
  let refSum = 0;
  const perSymbolEvmPercent = new Float64Array(layouts.length);
  for (let s = 0; s < layouts.length; s++) {
    errSum += errorPower[s]!;
    refSum += refPower[s]!;
    perSymbolEvmPercent[s] = refPower[s]! > 0 ? 100 * Math.sqrt(errorPower[s]! / refPower[s]!) : 0;
  }
  const evm2 = refSum > 0 ? errSum / refSum : 0;
  // Standard error of the ratio estimate from per-symbol variation (delta method on Σe/Σr).
  const n = layouts.length;
  let spread = 0;
  const meanRef = refSum / n;
  for (let s = 0; s < n; s++) spread += ((errorPower[s]! - evm2 * refPower[s]!) / meanRef) ** 2;
  const evm2StdErr = n > 1 ? Math.sqrt(spread / (n - 1) / n) : 0;
  const evm = Math.sqrt(evm2);
  return {
    evmRmsPercent: 100 * evm,
    evmStandardErrorPercent: evm > 0 ? (100 * evm2StdErr) / (2 * evm) : 0,
    perSymbolEvmPercent,
    gainIq: recordGain,
  };
}
