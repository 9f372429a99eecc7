import { getF32Transform, type F32ComplexTransform } from '../fft/f32Fft';
import { createFftPlan, fftForward, type FftPlan } from '../fft/fftPlan';
import { getConstellation } from '../modulation/constellations';
import type { WaveformPlan } from '../waveform/waveformPlan';
import type { RandomBitReader } from './randomBits';

/**
 * Builds the frequency-domain values of one OFDM symbol straight into IFFT bins, the way createWaveformGenerator
 * builds a grid row: bits in fill order (blocks in ascending frequency), mapping per TS 38.211 §5.1, DFT spreading
 * z(k) = (1/√M) Σ x(i) e^{−j2πik/M} per block for DFT-s-OFDM (TS 36.211 §5.3.3), times the block amplitude, at the
 * bin of each data subcarrier. Only data bins are written: a buffer that starts at zero stays zero elsewhere.
 * The target is any float array addressed through per-subcarrier positions (2·bin and 2·bin + 1 for an interleaved
 * natural-order buffer, or a transform's internal z-order positions).
 */
export interface SubcarrierFiller {
  /** Number of bins written per symbol (the data subcarriers over all blocks). */
  readonly numDataSubcarriers: number;
  /** Bits one OFDM symbol consumes. */
  readonly bitsPerOfdmSymbol: number;
  /** Bin index (0…ifftSize−1) of each written value, in write order. */
  readonly binsInOrder: Int32Array;
  /**
   * Draws the bits of OFDM symbol `symbolIndex` from `reader` and writes its data subcarriers into `target`:
   * data subcarrier i (in binsInOrder order) goes to target[positionsRe[i]] and target[positionsIm[i]].
   */
  fill(reader: RandomBitReader, symbolIndex: number, target: Float32Array | Float64Array, positionsRe: Int32Array, positionsIm: Int32Array): void;
}

/** Options of createSubcarrierFiller. */
export interface SubcarrierFillerOptions {
  /** Spread DFT-s-OFDM blocks with the f32 backend where it can (PFFFT sizes); default false (f64 transforms). */
  f32Spreading?: boolean;
}

interface BlockState {
  readonly numData: number;
  readonly bitsPerSymbol: number;
  readonly pointsIq: Float64Array;
  readonly pi2Bpsk: boolean;
  readonly amplitude: number;
  readonly bins: Int32Array;
  readonly spread: FftPlan | null;
  readonly spread32: F32ComplexTransform | null;
  /** First position in binsInOrder. */
  readonly offset: number;
  /** Scratch: the 4 QPSK points times the current gain. */
  readonly scaledQpsk: Float64Array;
}

/** Prepares the filler for `plan` (its data source is ignored: bits come from the reader). */
export function createSubcarrierFiller(plan: WaveformPlan, options: SubcarrierFillerOptions = {}): SubcarrierFiller {
  const spreading = plan.waveform === 'dft-s-ofdm';
  let offset = 0;
  const blocks: BlockState[] = plan.allocations.map((a) => {
    const spread32 = spreading && options.f32Spreading === true ? getF32Transform(a.dataSubcarriers.length) : null;
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
      spread: spreading && !spread32 ? createFftPlan(a.dataSubcarriers.length) : null,
      spread32,
      offset: (offset += a.dataSubcarriers.length) - a.dataSubcarriers.length,
      scaledQpsk: new Float64Array(8),
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
  const naturalRe = new Int32Array(maxBlock).map((_, i) => 2 * i);
  const naturalIm = new Int32Array(maxBlock).map((_, i) => 2 * i + 1);
  return {
    numDataSubcarriers: binsInOrder.length,
    bitsPerOfdmSymbol: plan.bitsPerOfdmSymbol,
    binsInOrder,
    fill(reader, symbolIndex, target, positionsRe, positionsIm) {
      for (let j = 0; j < blocks.length; j++) {
        const b = blocks[j]!;
        const o = b.offset;
        const n = b.numData;
        const first = symbolIndex * n;
        if (b.spread32) {
          // f32 DFT: symbols into its natural-order input, internal-order output read through its z positions.
          const t = b.spread32;
          t.owner = b;
          mapRandomSymbols(reader, b, first, t.input(), naturalRe, naturalIm, 0, 1);
          t.run('forward', false);
          scatter(t.output(), t.zRe, t.zIm, target, positionsRe, positionsIm, o, n, b.amplitude / Math.sqrt(n));
        } else if (b.spread) {
          const views = blockViews[j]!;
          mapRandomSymbols(reader, b, first, views.symbols, naturalRe, naturalIm, 0, 1);
          fftForward(b.spread, views.symbols, views.spread);
          scatter(views.spread, naturalRe, naturalIm, target, positionsRe, positionsIm, o, n, b.amplitude / Math.sqrt(n));
        } else {
          mapRandomSymbols(reader, b, first, target, positionsRe, positionsIm, o, b.amplitude);
        }
      }
    },
  };
}

/** target[toRe[o + i]] = gain · source[fromRe[i]] (and Im) for i < n. */
function scatter(
  source: Float32Array | Float64Array,
  fromRe: Int32Array,
  fromIm: Int32Array,
  target: Float32Array | Float64Array,
  toRe: Int32Array,
  toIm: Int32Array,
  o: number,
  n: number,
  gain: number,
): void {
  for (let i = 0; i < n; i++) {
    target[toRe[o + i]!] = source[fromRe[i]!]! * gain;
    target[toIm[o + i]!] = source[fromIm[i]!]! * gain;
  }
}

/**
 * Maps the next numData·bitsPerSymbol bits to constellation points (index = bits read MSB first), times `gain`,
 * into target[toRe[o + i]], target[toIm[o + i]].
 * π/2-BPSK rotates element i by e^{jπ/2} when (firstIndex + i) is odd, as mapBitsToSymbols does.
 */
function mapRandomSymbols(
  reader: RandomBitReader,
  b: BlockState,
  firstIndex: number,
  target: Float32Array | Float64Array,
  toRe: Int32Array,
  toIm: Int32Array,
  o: number,
  gain: number,
): void {
  const points = b.pointsIq;
  const m = b.bitsPerSymbol;
  const n = b.numData;
  let i = 0;
  if (m === 2) {
    // QPSK fast path: 16 symbols per 32-bit word, two bits each, MSB first; unaligned bits go one symbol at a time.
    const q = b.scaledQpsk;
    for (let k = 0; k < 8; k++) q[k] = points[k]! * gain;
    while (n - i >= 16) {
      const word = reader.takeAlignedWord();
      if (word < 0) {
        const index = reader.take(2);
        target[toRe[o + i]!] = q[2 * index]!;
        target[toIm[o + i]!] = q[2 * index + 1]!;
        i++;
        continue;
      }
      for (let s = 30; s >= 0; s -= 2, i++) {
        const index = (word >>> s) & 3;
        target[toRe[o + i]!] = q[2 * index]!;
        target[toIm[o + i]!] = q[2 * index + 1]!;
      }
    }
  }
  for (; i < n; i++) {
    const index = reader.take(m);
    let re = points[2 * index]! * gain;
    let im = points[2 * index + 1]! * gain;
    if (b.pi2Bpsk && ((firstIndex + i) & 1) === 1) {
      const t = re;
      re = -im;
      im = t;
    }
    target[toRe[o + i]!] = re;
    target[toIm[o + i]!] = im;
  }
}
