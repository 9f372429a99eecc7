import { F32_CELL_SHIFT, F64_CELL_SHIFT, HIGH_WORD, binIndexOfPower, type PowerBinner } from '../metrics/powerBinner';

/** Sums of one symbol's powers, written by the kernels (one shared object: the kernels run on one thread). */
export interface SymbolSums {
  /** Σ|x|². */
  sum: number;
  /** Σ|x|⁶. */
  sumCubed: number;
  /** max |x|². */
  peak: number;
}

/**
 * Two whole-number sub-histograms, for even- and odd-numbered samples. Neighbouring samples of an oversampled symbol
 * often fall in the same 0.01 dB bin; counting them into separate arrays breaks the chain of increments to one
 * memory cell (measured about 2.5× faster than one array). `foldSubHistograms` adds them into a DbHistogram's counts
 * and clears them; fold before 2^32 samples have been counted.
 */
export interface SubHistograms {
  readonly even: Uint32Array;
  readonly odd: Uint32Array;
}

/** Empty sub-histograms for a histogram with `length` count entries. */
export function createSubHistograms(length: number): SubHistograms {
  return { even: new Uint32Array(length), odd: new Uint32Array(length) };
}

/** counts += even + odd, then even = odd = 0 (exact: whole numbers). */
export function foldSubHistograms(sub: SubHistograms, counts: Float64Array): void {
  const { even, odd } = sub;
  for (let j = 0; j < counts.length; j++) {
    const add = even[j]! + odd[j]!;
    if (add !== 0) counts[j] = counts[j]! + add;
  }
  even.fill(0);
  odd.fill(0);
}

/**
 * One pass over the `n` powers of a symbol starting at `start`: counts each in `sub` (bins of `binner`, see
 * powerBinner.ts) and accumulates Σp, Σp³ and max p in sample order.
 * @param bits bitsViewOf(powers)
 * NOTE: the hot loop of every Monte-Carlo run. Binning and moments share one read of each sample; there are two
 * copies, for Float64Array and Float32Array powers, so that each stays monomorphic.
 */
export function accumulateSymbolF64(
  powers: Float64Array,
  bits: Uint32Array,
  start: number,
  n: number,
  binner: PowerBinner,
  sub: SubHistograms,
  out: SymbolSums,
): SymbolSums {
  const { bins, firstCell } = binner.f64Cells;
  const edges = binner.lowerEdges;
  const tableLength = bins.length;
  const overflow = edges.length - 2;
  const high = HIGH_WORD;
  const { even, odd } = sub;
  let sum = 0;
  let sumCubed = 0;
  let peak = 0;
  const end = start + n;
  let i = start;
  // NOTE: two samples per turn, one into each sub-histogram, so consecutive increments never hit the same array.
  for (; i + 1 < end; i += 2) {
    const p = powers[i]!;
    const q = powers[i + 1]!;
    sum += p + q;
    sumCubed += p * p * p + q * q * q;
    if (p > peak) peak = p;
    if (q > peak) peak = q;
    const cp = (bits[2 * i + high]! >>> F64_CELL_SHIFT) - firstCell;
    const cq = (bits[2 * i + 2 + high]! >>> F64_CELL_SHIFT) - firstCell;
    let jp = cp < 0 ? 0 : cp >= tableLength ? overflow : bins[cp]!;
    let jq = cq < 0 ? 0 : cq >= tableLength ? overflow : bins[cq]!;
    if (p >= edges[jp + 1]!) jp++;
    if (q >= edges[jq + 1]!) jq++;
    even[jp]!++;
    odd[jq]!++;
  }
  if (i < end) {
    const p = powers[i]!;
    sum += p;
    sumCubed += p * p * p;
    if (p > peak) peak = p;
    const c = (bits[2 * i + high]! >>> F64_CELL_SHIFT) - firstCell;
    let j = c < 0 ? 0 : c >= tableLength ? overflow : bins[c]!;
    if (p >= edges[j + 1]!) j++;
    even[j]!++;
  }
  out.sum = sum;
  out.sumCubed = sumCubed;
  out.peak = peak;
  return out;
}

/**
 * Float32Array twin of accumulateSymbolF64 (the sums are still accumulated in double precision).
 * NOTE: a deliberate copy of the f64 loop, so each stays monomorphic in its element type; keep the two in step.
 */
export function accumulateSymbolF32(
  powers: Float32Array,
  bits: Uint32Array,
  start: number,
  n: number,
  binner: PowerBinner,
  sub: SubHistograms,
  out: SymbolSums,
): SymbolSums {
  const table = binner.f32Cells;
  const { even, odd } = sub;
  let sum = 0;
  let sumCubed = 0;
  let peak = 0;
  const end = start + n;
  if (!table) {
    for (let i = start; i < end; i++) {
      const p = powers[i]!;
      sum += p;
      sumCubed += p * p * p;
      if (p > peak) peak = p;
      even[binIndexOfPower(binner, p)]!++;
    }
  } else {
    const { bins, firstCell } = table;
    const edges = binner.lowerEdges;
    const tableLength = bins.length;
    const overflow = edges.length - 2;
    let i = start;
    for (; i + 1 < end; i += 2) {
      const p = powers[i]!;
      const q = powers[i + 1]!;
      sum += p + q;
      sumCubed += p * p * p + q * q * q;
      if (p > peak) peak = p;
      if (q > peak) peak = q;
      const cp = (bits[i]! >>> F32_CELL_SHIFT) - firstCell;
      const cq = (bits[i + 1]! >>> F32_CELL_SHIFT) - firstCell;
      let jp = cp < 0 ? 0 : cp >= tableLength ? overflow : bins[cp]!;
      let jq = cq < 0 ? 0 : cq >= tableLength ? overflow : bins[cq]!;
      if (p >= edges[jp + 1]!) jp++;
      if (q >= edges[jq + 1]!) jq++;
      even[jp]!++;
      odd[jq]!++;
    }
    if (i < end) {
      const p = powers[i]!;
      sum += p;
      sumCubed += p * p * p;
      if (p > peak) peak = p;
      const c = (bits[i]! >>> F32_CELL_SHIFT) - firstCell;
      let j = c < 0 ? 0 : c >= tableLength ? overflow : bins[c]!;
      if (p >= edges[j + 1]!) j++;
      even[j]!++;
    }
  }
  out.sum = sum;
  out.sumCubed = sumCubed;
  out.peak = peak;
  return out;
}
