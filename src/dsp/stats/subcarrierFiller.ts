import { getF32Transform, type F32ComplexTransform } from '../fft/f32Fft';
import { createFftPlan, fftForward, type FftPlan } from '../fft/fftPlan';
import { getConstellation } from '../modulation/constellations';
import type { WaveformPlan } from '../waveform/waveformPlan';
import type { RandomBitReader } from './randomBits';

/**
 * Builds the frequency-domain values of one OFDM symbol straight into IFFT input positions, the way
 * createWaveformGenerator builds a grid row: bits in fill order (blocks in ascending frequency), mapping per
 * TS 38.211 §5.1, DFT spreading z(k) = (1/√M) Σ x(i) e^{−j2πik/M} per block for DFT-s-OFDM (TS 36.211 §5.3.3),
 * times the block amplitude, at the bin of each data subcarrier. Only data bins are written: a buffer that starts
 * at zero stays zero elsewhere.
 *
 * Two variants: `fill64` writes a natural-order interleaved Float64Array (value of bin k at 2k, 2k + 1) through the
 * f64 transforms; `fill32` writes a Float32Array at given positions (a PFFFT input in its internal z-order) and
 * spreads with PFFFT where the block size allows. NOTE: each variant calls its own copy of the scatter loop, so the
 * element accesses stay monomorphic (one array type per call site) when both run in one thread.
 */
export interface SubcarrierFiller {
  /** Bits one OFDM symbol consumes. */
  readonly bitsPerOfdmSymbol: number;
  /** Bin index (0…ifftSize−1) of each data subcarrier, in fill order. */
  readonly binsInOrder: Int32Array;
  /** Draws the bits of OFDM symbol `symbolIndex` and writes its data bins into `freqIq` (2·ifftSize values). */
  fill64(reader: RandomBitReader, symbolIndex: number, freqIq: Float64Array): void;
  /** Same into `target`: data subcarrier i (fill order) at target[positionsRe[i]], target[positionsIm[i]]. */
  fill32(reader: RandomBitReader, symbolIndex: number, target: Float32Array, positionsRe: Int32Array, positionsIm: Int32Array): void;
}

interface BlockState {
  readonly numData: number;
  readonly bitsPerSymbol: number;
  readonly pointsIq: Float64Array;
  readonly pi2Bpsk: boolean;
  readonly amplitude: number;
  /** First index in binsInOrder. */
  readonly offset: number;
  readonly spread: FftPlan | null;
  /** PFFFT plan of the spreading size, or null (f64 spreading) when PFFFT cannot do it or none is installed. */
  readonly spread32: F32ComplexTransform | null;
  /** The block's symbols (then, for f64 spreading, its spread values) in natural order, 2·numData values. */
  readonly symbolsIq: Float64Array;
  readonly spreadIq: Float64Array;
  /** Scratch: the 4 QPSK points times the current gain. */
  readonly scaledQpsk: Float64Array;
}

/** Prepares the filler for `plan` (its data source is ignored: bits come from the reader). */
export function createSubcarrierFiller(plan: WaveformPlan): SubcarrierFiller {
  const spreading = plan.waveform === 'dft-s-ofdm';
  let offset = 0;
  const blocks: BlockState[] = plan.allocations.map((a) => {
    const numData = a.dataSubcarriers.length;
    const table = getConstellation(a.modulation);
    offset += numData;
    return {
      numData,
      bitsPerSymbol: table.bitsPerSymbol,
      pointsIq: table.pointsIq,
      pi2Bpsk: a.modulation === 'pi/2-bpsk',
      amplitude: a.amplitudeLinear,
      offset: offset - numData,
      spread: spreading ? createFftPlan(numData) : null,
      spread32: spreading ? getF32Transform(numData) : null,
      symbolsIq: new Float64Array(2 * numData),
      spreadIq: new Float64Array(spreading ? 2 * numData : 0),
      scaledQpsk: new Float64Array(8),
    };
  });
  const binsInOrder = new Int32Array(offset);
  for (const [j, a] of plan.allocations.entries()) {
    for (let i = 0; i < a.dataSubcarriers.length; i++) binsInOrder[blocks[j]!.offset + i] = plan.ofdm.bins[a.dataSubcarriers[i]!]!;
  }
  const binRe = binsInOrder.map((b) => 2 * b);
  const binIm = binsInOrder.map((b) => 2 * b + 1);
  const maxBlock = Math.max(...blocks.map((b) => b.numData));
  const naturalRe = new Int32Array(maxBlock).map((_, i) => 2 * i);
  const naturalIm = new Int32Array(maxBlock).map((_, i) => 2 * i + 1);
  return {
    bitsPerOfdmSymbol: plan.bitsPerOfdmSymbol,
    binsInOrder,
    fill64(reader, symbolIndex, freqIq) {
      for (const b of blocks) {
        mapRandomSymbols(reader, b, symbolIndex * b.numData, b.symbolsIq);
        if (b.spread) {
          fftForward(b.spread, b.symbolsIq, b.spreadIq);
          scatter64To64(b.spreadIq, freqIq, binRe, binIm, b.offset, b.numData, b.amplitude / Math.sqrt(b.numData));
        } else {
          scatter64To64(b.symbolsIq, freqIq, binRe, binIm, b.offset, b.numData, b.amplitude);
        }
      }
    },
    fill32(reader, symbolIndex, target, positionsRe, positionsIm) {
      for (const b of blocks) {
        const first = symbolIndex * b.numData;
        if (b.spread32) {
          // Symbols straight into PFFFT's natural-order input; the ordered output is read in natural order,
          // which costs less than gathering the internal order.
          const t = b.spread32;
          t.owner = b;
          mapRandomSymbolsTo32(reader, b, first, t.input(), naturalRe, naturalIm, 0, 1);
          t.run('forward', true);
          scatter32To32(t.output(), target, positionsRe, positionsIm, b.offset, b.numData, b.amplitude / Math.sqrt(b.numData));
        } else if (b.spread) {
          mapRandomSymbols(reader, b, first, b.symbolsIq);
          fftForward(b.spread, b.symbolsIq, b.spreadIq);
          scatter64To32(b.spreadIq, target, positionsRe, positionsIm, b.offset, b.numData, b.amplitude / Math.sqrt(b.numData));
        } else {
          mapRandomSymbolsTo32(reader, b, first, target, positionsRe, positionsIm, b.offset, b.amplitude);
        }
      }
    },
  };
}

/** to[toRe[o + i]] = gain · from[2i] (and Im), i < n. */
function scatter64To64(from: Float64Array, to: Float64Array, toRe: Int32Array, toIm: Int32Array, o: number, n: number, gain: number): void {
  for (let i = 0; i < n; i++) {
    to[toRe[o + i]!] = from[2 * i]! * gain;
    to[toIm[o + i]!] = from[2 * i + 1]! * gain;
  }
}

/** As scatter64To64, into a Float32Array (spread values computed in f64). */
function scatter64To32(from: Float64Array, to: Float32Array, toRe: Int32Array, toIm: Int32Array, o: number, n: number, gain: number): void {
  for (let i = 0; i < n; i++) {
    to[toRe[o + i]!] = from[2 * i]! * gain;
    to[toIm[o + i]!] = from[2 * i + 1]! * gain;
  }
}

/** As scatter64To64, from and into Float32Arrays. */
function scatter32To32(from: Float32Array, to: Float32Array, toRe: Int32Array, toIm: Int32Array, o: number, n: number, gain: number): void {
  for (let i = 0; i < n; i++) {
    to[toRe[o + i]!] = from[2 * i]! * gain;
    to[toIm[o + i]!] = from[2 * i + 1]! * gain;
  }
}

/**
 * Maps the block's next numData·bitsPerSymbol bits to constellation points (index = bits read MSB first) into
 * `outIq` (2·numData values, natural order). π/2-BPSK rotates element i by e^{jπ/2} when (firstIndex + i) is odd,
 * as mapBitsToSymbols does.
 */
function mapRandomSymbols(reader: RandomBitReader, b: BlockState, firstIndex: number, outIq: Float64Array): void {
  const points = b.pointsIq;
  const m = b.bitsPerSymbol;
  const n = b.numData;
  let i = 0;
  if (m === 2) {
    // QPSK fast path: 16 symbols per 32-bit word, two bits each, MSB first; unaligned bits go one symbol at a time.
    while (n - i >= 16) {
      const word = reader.takeAlignedWord();
      if (word < 0) {
        const index = reader.take(2);
        outIq[2 * i] = points[2 * index]!;
        outIq[2 * i + 1] = points[2 * index + 1]!;
        i++;
        continue;
      }
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

/**
 * As mapRandomSymbols, times `gain`, straight into a Float32Array at target[toRe[o + i]], target[toIm[o + i]].
 * NOTE: a second copy on purpose, so each copy's element accesses see one array type (see the file comment).
 */
function mapRandomSymbolsTo32(
  reader: RandomBitReader,
  b: BlockState,
  firstIndex: number,
  target: Float32Array,
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
