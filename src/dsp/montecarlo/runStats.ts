import { addDbHistogram } from '../metrics/dbHistogram';
import { DspError } from '../errors';
import { createHistogramSet, type BlockRecord, type HistogramSet } from './blockMeasurer';

/**
 * What a run (or a shard of one) has measured so far: the merged histograms and one record per finished block.
 * Histograms add exactly in any order; totals are summed over the records in block order (`runTotals`), so the
 * result does not depend on how blocks were spread over workers, shards or machines.
 */
export interface RunStats {
  readonly histograms: HistogramSet;
  /** blockIndex → record. */
  readonly records: Map<number, BlockRecord>;
}

/** Empty counts: no blocks, empty histograms. */
export function createRunStats(): RunStats {
  return { histograms: createHistogramSet(), records: new Map() };
}

/** Records a finished block. @throws DspError INTERNAL when the block was already recorded */
export function addBlockRecord(stats: RunStats, record: BlockRecord): void {
  if (stats.records.has(record.blockIndex)) {
    throw new DspError('INTERNAL', `Block ${record.blockIndex} was measured twice.`);
  }
  stats.records.set(record.blockIndex, record);
}

/** Adds a lane's (or shard's) histograms. */
export function addHistogramSet(stats: RunStats, histograms: HistogramSet): void {
  addDbHistogram(stats.histograms.paprRunMean, histograms.paprRunMean);
  addDbHistogram(stats.histograms.paprSymbolMean, histograms.paprSymbolMean);
  addDbHistogram(stats.histograms.power, histograms.power);
}

/**
 * Merges `from` into `into`. Shards of one run hold disjoint blocks, so a block present in both is an error.
 * @throws DspError INVALID_FILE naming the repeated block
 */
export function mergeRunStats(into: RunStats, from: RunStats): RunStats {
  for (const [index, record] of from.records) {
    if (into.records.has(index)) {
      throw new DspError('INVALID_FILE', `Block ${index} appears in two of the shard results being merged; each shard must be merged once.`);
    }
    into.records.set(index, record);
  }
  addHistogramSet(into, from.histograms);
  return into;
}

/** Totals of a run, summed in ascending block order. */
export interface RunTotals {
  readonly numBlocks: number;
  readonly numSymbols: number;
  readonly sumPower: number;
  readonly sumPowerCubed: number;
  readonly peakPower: number;
  readonly maxPaprSymbolMean: number;
}

/** Sums the block records in ascending block order (the order that makes totals identical however blocks were run). */
export function runTotals(stats: RunStats): RunTotals {
  const indices = [...stats.records.keys()].sort((a, b) => a - b);
  let numSymbols = 0;
  let sumPower = 0;
  let sumPowerCubed = 0;
  let peakPower = 0;
  let maxPaprSymbolMean = 0;
  for (const i of indices) {
    const r = stats.records.get(i)!;
    numSymbols += r.numSymbols;
    sumPower += r.sumPower;
    sumPowerCubed += r.sumPowerCubed;
    peakPower = Math.max(peakPower, r.peakPower);
    maxPaprSymbolMean = Math.max(maxPaprSymbolMean, r.maxPaprSymbolMean);
  }
  return { numBlocks: indices.length, numSymbols, sumPower, sumPowerCubed, peakPower, maxPaprSymbolMean };
}
