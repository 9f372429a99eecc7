import { DspError } from '../errors';
import type { DbHistogram, DbHistogramSpec } from './dbHistogram';

/**
 * Sorts linear power values into the 0.01 dB bins of a DbHistogram without a logarithm per sample.
 *
 * The bin edges are fixed in the linear domain, edge(c) = referencePower · 10^((c − ½)/1000) for bin centre c
 * (hundredths of a dB), so a value's bin is decided by comparisons with those numbers alone; the result is the
 * same in every worker. A lookup table indexed by the exponent and the top 12 mantissa bits of the value's IEEE-754
 * representation (cells 10·log10(1 + 2^−12) ≈ 0.0011 dB wide, narrower than a bin) gives the bin of the cell's
 * lowest value; one comparison with the next edge settles values in a cell that an edge splits. There is one table
 * for doubles (the high 32-bit word, shifted right by 8) and one for floats (the 32 bits, shifted right by 11); the
 * bits are read through a Uint32Array view of the caller's buffer, so nothing is written per sample.
 */
export interface PowerBinner {
  readonly spec: DbHistogramSpec;
  /** Linear power that reads 0 dB. */
  readonly referencePower: number;
  /**
   * lowerEdges[j] = lower edge of counts[j] (linear power); lowerEdges[0] = −∞. lowerEdges[numBins + 2] is NaN, a
   * sentinel no `p >= edge` test passes, so even +∞ stays in the overflow bin.
   */
  readonly lowerEdges: Float64Array;
  readonly f64Cells: CellTable;
  /** Null when the edges leave the single-precision range (floats are then binned through the f64 table). */
  readonly f32Cells: CellTable | null;
}

/** Bin (index into counts) holding the lowest value of each table cell, from `firstCell` on. */
export interface CellTable {
  readonly bins: Uint16Array | Uint32Array;
  readonly firstCell: number;
}

const f64Scratch = new Float64Array(1);
const f64Words = new Uint32Array(f64Scratch.buffer);
const f32Scratch = new Float32Array(1);
const f32Word = new Uint32Array(f32Scratch.buffer);
f64Scratch[0] = 1;
/** Index of the word holding sign, exponent and top mantissa bits (1 on little-endian machines). */
export const HIGH_WORD = f64Words[1] === 0x3ff00000 ? 1 : 0;
/** Mantissa bits dropped from a double's high word and from a float, leaving 12 per cell. */
export const F64_CELL_SHIFT = 8;
/** The same for a float's 32-bit word (23 mantissa bits − 11 = 12 kept). */
export const F32_CELL_SHIFT = 11;

function f64Cell(value: number): number {
  f64Scratch[0] = value;
  return f64Words[HIGH_WORD]! >>> F64_CELL_SHIFT;
}

function f64CellLow(cell: number): number {
  f64Words[HIGH_WORD] = (cell << F64_CELL_SHIFT) >>> 0;
  f64Words[1 - HIGH_WORD] = 0;
  return f64Scratch[0]!;
}

function f32Cell(value: number): number {
  f32Scratch[0] = value;
  return f32Word[0]! >>> F32_CELL_SHIFT;
}

function f32CellLow(cell: number): number {
  f32Word[0] = (cell << F32_CELL_SHIFT) >>> 0;
  return f32Scratch[0]!;
}

function buildTable(lowerEdges: Float64Array, cellOf: (v: number) => number, cellLow: (c: number) => number): CellTable {
  const numBins = lowerEdges.length - 3;
  // Cells from the one holding the first edge to the one holding the last: outside them every value under- or overflows.
  const firstCell = cellOf(lowerEdges[1]!);
  const lastCell = cellOf(lowerEdges[numBins + 1]!);
  const bins = numBins + 2 < 65536 ? new Uint16Array(lastCell - firstCell + 1) : new Uint32Array(lastCell - firstCell + 1);
  let j = 0;
  for (let cell = firstCell; cell <= lastCell; cell++) {
    const low = cellLow(cell);
    while (lowerEdges[j + 1]! <= low) j++;
    bins[cell - firstCell] = j;
  }
  return { bins, firstCell };
}

/**
 * Prepares the bin edges of `spec` for powers measured against `referencePower`.
 * @param referencePower linear power that reads 0 dB (> 0, finite), e.g. the waveform's mean power
 */
export function createPowerBinner(spec: DbHistogramSpec, referencePower: number): PowerBinner {
  if (!(referencePower > 0) || !Number.isFinite(referencePower)) {
    throw new DspError('INVALID_CONFIG', `The reference power for dB bins must be positive and finite; got ${referencePower}.`);
  }
  const numBins = spec.maxCentiDb - spec.minCentiDb + 1;
  const lowerEdges = new Float64Array(numBins + 3);
  lowerEdges[0] = Number.NEGATIVE_INFINITY;
  for (let j = 1; j <= numBins + 1; j++) {
    const centre = spec.minCentiDb + j - 1;
    lowerEdges[j] = referencePower * 10 ** ((2 * centre - 1) / 2000);
  }
  lowerEdges[numBins + 2] = Number.NaN;
  const floatRange = lowerEdges[1]! > 1.2e-38 && lowerEdges[numBins + 1]! < 3.4e38;
  return {
    spec,
    referencePower,
    lowerEdges,
    f64Cells: buildTable(lowerEdges, f64Cell, f64CellLow),
    f32Cells: floatRange ? buildTable(lowerEdges, f32Cell, f32CellLow) : null,
  };
}

/** Index into `counts` of the bin holding `power` (0 = underflow, numBins + 1 = overflow; NaN counts as overflow). */
export function binIndexOfPower(binner: PowerBinner, power: number): number {
  const { bins, firstCell } = binner.f64Cells;
  const c = f64Cell(power) - firstCell;
  if (c < 0) return 0;
  if (c >= bins.length) return binner.lowerEdges.length - 2;
  const j = bins[c]!;
  return power >= binner.lowerEdges[j + 1]! ? j + 1 : j;
}

/** A Uint32Array over the same bytes as `powers` (the bits the cell tables read). */
export function bitsViewOf(powers: Float64Array | Float32Array): Uint32Array {
  return new Uint32Array(powers.buffer, powers.byteOffset, (powers.length * powers.BYTES_PER_ELEMENT) / 4);
}

/**
 * Adds `count` linear power values, powers[start …], to `histogram` (whose range must be the binner's).
 * @param bits optional bitsViewOf(powers), to save making the view on every call
 */
export function binPowersInto(
  binner: PowerBinner,
  powers: Float64Array | Float32Array,
  start: number,
  count: number,
  histogram: DbHistogram,
  bits: Uint32Array = bitsViewOf(powers),
): void {
  if (histogram.minCentiDb !== binner.spec.minCentiDb || histogram.maxCentiDb !== binner.spec.maxCentiDb) {
    throw new DspError('INTERNAL', 'binPowersInto: the histogram range differs from the binner range.');
  }
  if (start < 0 || start + count > powers.length) {
    throw new DspError('LENGTH_MISMATCH', `Power buffer has ${powers.length} values; ${start}+${count} were asked for.`);
  }
  if (powers instanceof Float64Array) binF64(binner, powers, bits, start, count, histogram.counts);
  else binF32(binner, powers, bits, start, count, histogram.counts);
}

// NOTE: the hot loops of the power CCDF, one per element type so that each stays monomorphic: one table read and
// one comparison per sample, no allocation.
function binF64(binner: PowerBinner, powers: Float64Array, bits: Uint32Array, start: number, count: number, counts: Float64Array): void {
  const { bins, firstCell } = binner.f64Cells;
  const edges = binner.lowerEdges;
  const tableLength = bins.length;
  const overflow = edges.length - 2;
  for (let n = start; n < start + count; n++) {
    const c = (bits[2 * n + HIGH_WORD]! >>> F64_CELL_SHIFT) - firstCell;
    let j: number;
    if (c < 0) j = 0;
    else if (c >= tableLength) j = overflow;
    else {
      j = bins[c]!;
      if (powers[n]! >= edges[j + 1]!) j++;
    }
    counts[j]!++;
  }
}

function binF32(binner: PowerBinner, powers: Float32Array, bits: Uint32Array, start: number, count: number, counts: Float64Array): void {
  if (!binner.f32Cells) {
    for (let n = start; n < start + count; n++) counts[binIndexOfPower(binner, powers[n]!)]!++;
    return;
  }
  const { bins, firstCell } = binner.f32Cells;
  const edges = binner.lowerEdges;
  const tableLength = bins.length;
  const overflow = edges.length - 2;
  for (let n = start; n < start + count; n++) {
    const c = (bits[n]! >>> F32_CELL_SHIFT) - firstCell;
    let j: number;
    if (c < 0) j = 0;
    else if (c >= tableLength) j = overflow;
    else {
      j = bins[c]!;
      if (powers[n]! >= edges[j + 1]!) j++;
    }
    counts[j]!++;
  }
}
