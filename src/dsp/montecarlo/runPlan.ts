import { deriveBlockSeed } from '../data/rng';
import { DspError } from '../errors';

/**
 * A Monte-Carlo run: `totalSymbols` random OFDM symbols cut into blocks of `blockSymbols` (the last may be shorter).
 * Block b draws its data from createRng(deriveBlockSeed(runSeed, b)), so what a block contains depends only on the
 * run seed, the block size and b — never on which worker, shard or machine runs it. Changing the block size
 * changes the random data, so it is part of the run's identity (and of every shard file).
 */
export interface MonteCarloRun {
  readonly totalSymbols: number;
  readonly blockSymbols: number;
  readonly numBlocks: number;
  readonly runSeed: number;
}

/** Symbols per block unless the user chooses (small enough for smooth progress and load balance, large enough to amortise hand-offs). */
export const DEFAULT_BLOCK_SYMBOLS = 128;
/** Most symbols one run may ask for (10^9). */
export const MAX_RUN_SYMBOLS = 1e9;

/** Validates and creates a run. Errors name the option and the allowed range. */
export function createMonteCarloRun(input: { totalSymbols: number; blockSymbols?: number | undefined; runSeed: number }): MonteCarloRun {
  const { totalSymbols, runSeed } = input;
  const blockSymbols = input.blockSymbols ?? DEFAULT_BLOCK_SYMBOLS;
  if (!Number.isInteger(totalSymbols) || totalSymbols < 1 || totalSymbols > MAX_RUN_SYMBOLS) {
    throw new DspError('INVALID_CONFIG', `symbols must be a whole number from 1 to ${MAX_RUN_SYMBOLS}; got ${totalSymbols}.`, { field: 'symbols' });
  }
  if (!Number.isInteger(blockSymbols) || blockSymbols < 1 || blockSymbols > 1e6) {
    throw new DspError('INVALID_CONFIG', `blockSymbols must be a whole number from 1 to 1000000; got ${blockSymbols}.`, { field: 'blockSymbols' });
  }
  if (!Number.isSafeInteger(runSeed) || runSeed < 0) {
    throw new DspError('INVALID_CONFIG', `The run seed must be a whole number from 0 to ${Number.MAX_SAFE_INTEGER}; got ${runSeed}.`, { field: 'seed' });
  }
  return { totalSymbols, blockSymbols, numBlocks: Math.ceil(totalSymbols / blockSymbols), runSeed };
}

/** Symbols in block `blockIndex` (blockSymbols, or fewer for the last block). */
export function blockSymbolCount(run: MonteCarloRun, blockIndex: number): number {
  checkBlock(run, blockIndex);
  return Math.min(run.blockSymbols, run.totalSymbols - blockIndex * run.blockSymbols);
}

/** Seed of block `blockIndex`'s random data: deriveBlockSeed(runSeed, blockIndex) (src/dsp/data/rng.ts). */
export function blockSeedOf(run: MonteCarloRun, blockIndex: number): number {
  checkBlock(run, blockIndex);
  return deriveBlockSeed(run.runSeed, blockIndex);
}

/** A shard k of n (1-based, as the CLI writes "--shard k/n"). */
export interface ShardSpec {
  readonly index: number;
  readonly count: number;
}

/**
 * Blocks of shard k/n: the contiguous range [⌊(k−1)·B/n⌋, ⌊k·B/n⌋) of the run's B blocks, so the n shards cover every
 * block exactly once.
 * @throws DspError INVALID_CONFIG when k is outside 1…n or the run has fewer blocks than shards
 */
export function shardBlockIndices(run: MonteCarloRun, shard: ShardSpec): number[] {
  const { index: k, count: n } = shard;
  if (!Number.isInteger(n) || n < 1 || !Number.isInteger(k) || k < 1 || k > n) {
    throw new DspError('INVALID_CONFIG', `--shard must be k/n with whole numbers 1 ≤ k ≤ n; got ${k}/${n}.`, { field: 'shard' });
  }
  if (n > run.numBlocks) {
    throw new DspError(
      'INVALID_CONFIG',
      `--shard ${k}/${n}: the run has only ${run.numBlocks} blocks of ${run.blockSymbols} symbols, so at most ${run.numBlocks} shards; use fewer shards, more symbols or smaller blocks.`,
      { field: 'shard' },
    );
  }
  const first = Math.floor(((k - 1) * run.numBlocks) / n);
  const end = Math.floor((k * run.numBlocks) / n);
  return Array.from({ length: end - first }, (_, i) => first + i);
}

/** All block indices of the run, 0 … numBlocks − 1. */
export function allBlockIndices(run: MonteCarloRun): number[] {
  return Array.from({ length: run.numBlocks }, (_, i) => i);
}

function checkBlock(run: MonteCarloRun, blockIndex: number): void {
  if (!Number.isInteger(blockIndex) || blockIndex < 0 || blockIndex >= run.numBlocks) {
    throw new DspError('INTERNAL', `Block ${blockIndex} is outside the run's ${run.numBlocks} blocks.`);
  }
}
