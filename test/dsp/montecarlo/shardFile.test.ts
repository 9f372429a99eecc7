import { describe, expect, it } from 'vitest';
import { createSetupMeasurer } from '../../../src/dsp/montecarlo/measurementSetup';
import { buildMeasureReport } from '../../../src/dsp/montecarlo/measureReport';
import { shardBlockIndices } from '../../../src/dsp/montecarlo/runPlan';
import { createInlineLane, runMonteCarloBlocks } from '../../../src/dsp/montecarlo/runScheduler';
import { mergeShardFiles, parseShardFile, serializeShardFile } from '../../../src/dsp/montecarlo/shardFile';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { resolveMeasurementSetup } from '../../../src/dsp/montecarlo/measurementSetup';
import { runIdentityOf, statisticsFactsOf, type MeasurementContext } from '../../../src/dsp/montecarlo/measurementContext';
import { TEST_SEED } from '../../helpers/seed';

const config = parseWaveformConfig({ standard: 'lte', bandwidthMHz: 3, link: 'downlink', modulation: '64qam' });
const setup = resolveMeasurementSetup(config, { symbols: 1000, blockSymbols: 40, seed: TEST_SEED });
const local = createSetupMeasurer(setup);
const context: MeasurementContext = {
  identity: runIdentityOf(setup),
  statistics: statisticsFactsOf(local.plan, local.source),
  spectrum: null,
  warnings: [],
  notes: [],
};

async function shard(k: number, n: number) {
  const lane = createInlineLane(createSetupMeasurer(setup).measurer);
  const stats = await runMonteCarloBlocks([lane], setup.run, shardBlockIndices(setup.run, { index: k, count: n }));
  return serializeShardFile({ context, shard: { index: k, count: n }, stats });
}

describe('shard files merge exactly', () => {
  it('three shards written to JSON and merged give bit-identical counts and the same report as one run', async () => {
    const whole = parseShardFile(await shard(1, 1), 'whole.json');
    const parts = await Promise.all([3, 1, 2].map(async (k) => ({ name: `s${k}.json`, file: parseShardFile(await shard(k, 3), `s${k}.json`) })));
    const merged = mergeShardFiles(parts);
    for (const key of ['paprRunMean', 'paprSymbolMean', 'power'] as const) {
      expect(Array.from(merged.stats.histograms[key].counts)).toEqual(Array.from(whole.stats.histograms[key].counts));
    }
    expect(JSON.stringify(buildMeasureReport(merged.context, merged.stats))).toBe(JSON.stringify(buildMeasureReport(whole.context, whole.stats)));
    // Re-serialised merged counts are byte-identical to the single run's file.
    expect(serializeShardFile({ context: merged.context, shard: { index: 1, count: 1 }, stats: merged.stats })).toBe(await shard(1, 1));
  });

  it('refuses missing, repeated, foreign and tampered shards with the file named', async () => {
    const s1 = { name: 'a.json', file: parseShardFile(await shard(1, 2), 'a.json') };
    const s2 = { name: 'b.json', file: parseShardFile(await shard(2, 2), 'b.json') };
    expect(() => mergeShardFiles([s1])).toThrow(/Shard 2\/2 missing; merge needs all 2/);
    expect(() => mergeShardFiles([s1, s2, { ...s1, name: 'c.json' }])).toThrow(/c\.json and a\.json are both shard 1\/2/);
    const otherSeed = JSON.parse(await shard(2, 2));
    otherSeed.context.identity.run.runSeed += 1;
    expect(() => mergeShardFiles([s1, { name: 'd.json', file: parseShardFile(JSON.stringify(otherSeed), 'd.json') }])).toThrow(/d\.json belongs to a different run/);
    const truncated = JSON.parse(await shard(2, 2));
    truncated.blocks.pop();
    expect(() => parseShardFile(JSON.stringify(truncated), 'e.json')).toThrow(/e\.json: shard 2\/2 should hold blocks 12…24; 1 missing/);
    const badCount = JSON.parse(await shard(2, 2));
    badCount.histograms.power.counts[0] = 1.5;
    expect(() => parseShardFile(JSON.stringify(badCount), 'f.json')).toThrow(/f\.json: histogram "power" holds a count that is not a whole number/);
    expect(() => parseShardFile('{"format":"something"}', 'g.json')).toThrow(/g\.json: not a Crestline shard result/);
    expect(() => parseShardFile('{', 'h.json')).toThrow(/h\.json: not valid JSON/);
  });
});
