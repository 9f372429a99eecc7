import { createFftPlan, fftForward, type FftPlan } from '../fft/fftPlan';
import { getConstellation } from '../modulation/constellations';
import type { WaveformPlan } from '../waveform/waveformPlan';
import type { RandomBitReader } from './randomBits';

/**
 * Builds the frequency-domain values of one OFDM symbol straight into IFFT bins, the way createWaveformGenerator
 * builds a grid row: bits in fill order (blocks in ascending frequency), mapping per TS 38.211 §5.1, DFT spreading
 * z(k) = (1/√M) Σ x(i) e^{−j2πik/M} per block for DFT-s-OFDM (TS 36.211 §5.3.3), times the block amplitude, at the
 * bin of each data subcarrier. Only data bins are written: a buffer that starts at zero stays zero elsewhere.
 */
export interface SubcarrierFiller {
  /** Number of bins written per symbol (the data subcarriers over all blocks). */
  readonly numDataSubcarriers: number;
  /** Bits one OFDM symbol consumes. */
  readonly bitsPerOfdmSymbol: number;
  /** Bin index (0…ifftSize−1) of each written value, in write order. */
  readonly binsInOrder: Int32Array;
  /**
   * Draws the bits of OFDM symbol `symbolIndex` from `reader` and writes its data subcarriers into `freqIq`.
   * @param freqIq interleaved IFFT input, 2·ifftSize values
   */
  fill(reader: RandomBitReader, symbolIndex: number, freqIq: Float64Array): void;
}

interface BlockState {
  readonly numData: number;
  readonly bitsPerSymbol: number;
  readonly pointsIq: Float64Array;
  readonly pi2Bpsk: boolean;
  readonly amplitude: number;
  readonly bins: Int32Array;
  readonly spread: FftPlan | null;
}

/** Prepares the filler for `plan` (its data source is ignored: bits come from the reader). */
export function createSubcarrierFiller(plan: WaveformPlan): SubcarrierFiller {
  const spreading = plan.waveform === 'dft-s-ofdm';
  const blocks: BlockState[] = plan.allocations.map((a) => {
    const table = getConstellation(a.modulation);
    const bins = new Int32Array(a.dataSubcarriers.length);
    for (let i = 0; i < bins.length; i++) bins[i] = plan.ofdm.bins[a.dataSubcarriers[i]!]!;
    return {
      numData: a.dataSubcarriers.length,
      bitsPerSymbol: table.bitsPerSymbol,
      pointsIq: table.pointsIq,
      pi2Bpsk: a.modulation === 'pi/2-bpsk',
      amplitude: a.amplitudeLinear,
      bins,
      spread: spreading ? createFftPlan(a.dataSubcarriers.length) : null,
    };
  });
  const maxBlock = Math.max(...blocks.map((b) => b.numData));
  const symbolsIq = new Float64Array(2 * maxBlock);
  const spreadIq = new Float64Array(2 * maxBlock);
  const blockViews = blocks.map((b) => ({ symbols: symbolsIq.subarray(0, 2 * b.numData), spread: spreadIq.subarray(0, 2 * b.numData) }));
  const binsInOrder = new Int32Array(blocks.reduce((s, b) => s + b.numData, 0));
  let at = 0;
  for (const b of blocks) {
    binsInOrder.set(b.bins, at);
    at += b.numData;
  }
  return {
    numDataSubcarriers: binsInOrder.length,
    bitsPerOfdmSymbol: plan.bitsPerOfdmSymbol,
    binsInOrder,
    fill(reader, symbolIndex, freqIq) {
      for (let j = 0; j < blocks.length; j++) {
        const b = blocks[j]!;
        const views = blockViews[j]!;
        mapRandomSymbols(reader, b, symbolIndex * b.numData, views.symbols);
        let source = views.symbols;
        let gain = b.amplitude;
        if (b.spread) {
          fftForward(b.spread, views.symbols, views.spread);
          source = views.spread;
          gain /= Math.sqrt(b.numData);
        }
        const bins = b.bins;
        for (let i = 0; i < b.numData; i++) {
          const k = 2 * bins[i]!;
          freqIq[k] = source[2 * i]! * gain;
          freqIq[k + 1] = source[2 * i + 1]! * gain;
        }
      }
    },
  };
}

/**
 * Maps the next numData·bitsPerSymbol bits to constellation points (index = bits read MSB first).
 * π/2-BPSK rotates element i by e^{jπ/2} when (firstIndex + i) is odd, as mapBitsToSymbols does.
 */
function mapRandomSymbols(reader: RandomBitReader, b: BlockState, firstIndex: number, outIq: Float64Array): void {
  const points = b.pointsIq;
  const m = b.bitsPerSymbol;
  const n = b.numData;
  let i = 0;
  if (m === 2) {
    // QPSK fast path: 16 symbols per aligned 32-bit word, two bits each, MSB first.
    while (i < n) {
      const word = n - i >= 16 ? reader.takeAlignedWord() : -1;
      if (word < 0) break;
      for (let s = 30; s >= 0; s -= 2, i++) {
        const index = (word >>> s) & 3;
        outIq[2 * i] = points[2 * index]!;
        outIq[2 * i + 1] = points[2 * index + 1]!;
      }
    }
  }
  for (; i < n; i++) {
    const index = reader.take(m);
    let re = points[2 * index]!;
    let im = points[2 * index + 1]!;
    if (b.pi2Bpsk && ((firstIndex + i) & 1) === 1) {
      const t = re;
      re = -im;
      im = t;
    }
    outIq[2 * i] = re;
    outIq[2 * i + 1] = im;
  }
}
