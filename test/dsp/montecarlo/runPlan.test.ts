import { describe, expect, it } from 'vitest';
import { deriveBlockSeed } from '../../../src/dsp/data/rng';
import { allBlockIndices, blockSeedOf, blockSymbolCount, createMonteCarloRun, shardBlockIndices } from '../../../src/dsp/montecarlo/runPlan';

describe('Monte-Carlo run plan', () => {
  it('cuts the run into blocks, the last one shorter, each seeded by deriveBlockSeed(runSeed, b)', () => {
    const run = createMonteCarloRun({ totalSymbols: 1000, blockSymbols: 128, runSeed: 42 });
    expect(run.numBlocks).toBe(8);
    expect(blockSymbolCount(run, 0)).toBe(128);
    expect(blockSymbolCount(run, 7)).toBe(1000 - 7 * 128);
    expect(blockSeedOf(run, 5)).toBe(deriveBlockSeed(42, 5));
    expect(new Set(allBlockIndices(run).map((b) => blockSeedOf(run, b))).size).toBe(8);
  });

  it('n shards cover every block exactly once, in contiguous ranges', () => {
    const run = createMonteCarloRun({ totalSymbols: 5000, blockSymbols: 64, runSeed: 1 });
    for (const n of [1, 2, 3, 7, run.numBlocks]) {
      const all = Array.from({ length: n }, (_, k) => shardBlockIndices(run, { index: k + 1, count: n })).flat();
      expect(all).toEqual(allBlockIndices(run));
    }
  });

  it('names the option and the allowed range in its errors', () => {
    expect(() => createMonteCarloRun({ totalSymbols: 0, runSeed: 1 })).toThrow(/symbols must be a whole number from 1/);
    expect(() => createMonteCarloRun({ totalSymbols: 10, blockSymbols: 0.5, runSeed: 1 })).toThrow(/blockSymbols/);
    expect(() => createMonteCarloRun({ totalSymbols: 10, runSeed: -1 })).toThrow(/run seed/);
    const run = createMonteCarloRun({ totalSymbols: 256, blockSymbols: 128, runSeed: 1 });
    expect(() => shardBlockIndices(run, { index: 3, count: 2 })).toThrow(/1 ≤ k ≤ n; got 3\/2/);
    expect(() => shardBlockIndices(run, { index: 1, count: 3 })).toThrow(/only 2 blocks of 128 symbols, so at most 2 shards/);
  });
});
