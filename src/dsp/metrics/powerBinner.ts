import { DspError } from '../errors';
import type { DbHistogram, DbHistogramSpec } from './dbHistogram';

/**
 * Sorts linear power values into the 0.01 dB bins of a DbHistogram without a logarithm per sample.
 *
 * The bin edges are fixed in the linear domain, edge(c) = referencePower · 10^((c − ½)/1000) for bin centre c
 * (hundredths of a dB), so a value's bin is decided by comparisons with those numbers alone; the result is the
 * same in every worker. A lookup table indexed by the top 23 bits of the value's IEEE-754 double (exponent and 12
 * mantissa bits: cells 10·log10(1 + 2^−12) ≈ 0.0011 dB wide, narrower than a bin) gives the bin of the cell's lower
 * end; one comparison with the next edge settles values in a cell that an edge splits.
 */
export interface PowerBinner {
  readonly spec: DbHistogramSpec;
  /** Linear power that reads 0 dB. */
  readonly referencePower: number;
  /** lowerEdges[j] = lower edge of counts[j] (linear power); lowerEdges[0] = −∞, lowerEdges[numBins + 2] = +∞. */
  readonly lowerEdges: Float64Array;
  /** Bin (index into counts) holding the lowest value of each table cell. */
  readonly cellBins: Uint16Array | Uint32Array;
  /** Table cell of the first regular bin's lower edge. */
  readonly firstCell: number;
}

const scratch = new Float64Array(1);
const words = new Uint32Array(scratch.buffer);
scratch[0] = 1;
/** Index of the word holding sign, exponent and top mantissa bits (1 on little-endian machines). */
const HI = words[1] === 0x3ff00000 ? 1 : 0;
const LO = 1 - HI;
/** Mantissa bits below the 12 kept in a table cell, within the high word. */
const CELL_SHIFT = 8;

function cellOf(value: number): number {
  scratch[0] = value;
  return words[HI]! >>> CELL_SHIFT;
}

function lowestValueOfCell(cell: number): number {
  words[HI] = (cell << CELL_SHIFT) >>> 0;
  words[LO] = 0;
  return scratch[0]!;
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
  lowerEdges[numBins + 2] = Number.POSITIVE_INFINITY;
  const firstCell = cellOf(lowerEdges[1]!);
  const lastCell = cellOf(lowerEdges[numBins + 1]!);
  const cellBins = numBins + 2 < 65536 ? new Uint16Array(lastCell - firstCell + 1) : new Uint32Array(lastCell - firstCell + 1);
  let j = 0;
  for (let cell = firstCell; cell <= lastCell; cell++) {
    const low = lowestValueOfCell(cell);
    while (lowerEdges[j + 1]! <= low) j++;
    cellBins[cell - firstCell] = j;
  }
  return { spec, referencePower, lowerEdges, cellBins, firstCell };
}

/** Index into `counts` of the bin holding `power` (0 = underflow, numBins + 1 = overflow; NaN counts as overflow). */
export function binIndexOfPower(binner: PowerBinner, power: number): number {
  scratch[0] = power;
  const c = (words[HI]! >>> CELL_SHIFT) - binner.firstCell;
  const table = binner.cellBins;
  if (c < 0) return 0;
  if (c >= table.length) return binner.lowerEdges.length - 2;
  const j = table[c]!;
  return power >= binner.lowerEdges[j + 1]! ? j + 1 : j;
}

/**
 * Adds `count` linear power values, powers[start …], to `histogram` (whose range must be the binner's).
 * NOTE: the hot loop of the power CCDF: one table read and one comparison per sample, no allocation.
 */
export function binPowersInto(
  binner: PowerBinner,
  powers: Float64Array | Float32Array,
  start: number,
  count: number,
  histogram: DbHistogram,
): void {
  if (histogram.minCentiDb !== binner.spec.minCentiDb || histogram.maxCentiDb !== binner.spec.maxCentiDb) {
    throw new DspError('INTERNAL', 'binPowersInto: the histogram range differs from the binner range.');
  }
  if (start < 0 || start + count > powers.length) {
    throw new DspError('LENGTH_MISMATCH', `Power buffer has ${powers.length} values; ${start}+${count} were asked for.`);
  }
  const counts = histogram.counts;
  const table = binner.cellBins;
  const edges = binner.lowerEdges;
  const first = binner.firstCell;
  const tableLength = table.length;
  const overflow = edges.length - 2;
  for (let n = start; n < start + count; n++) {
    const p = powers[n]!;
    scratch[0] = p;
    const c = (words[HI]! >>> CELL_SHIFT) - first;
    let j: number;
    if (c < 0) j = 0;
    else if (c >= tableLength) j = overflow;
    else {
      j = table[c]!;
      if (p >= edges[j + 1]!) j++;
    }
    counts[j]!++;
  }
}
