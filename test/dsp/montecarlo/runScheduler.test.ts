import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { BlockRecord } from '../../../src/dsp/montecarlo/blockMeasurer';
import { createSetupMeasurer, resolveMeasurementSetup } from '../../../src/dsp/montecarlo/measurementSetup';
import { allBlockIndices } from '../../../src/dsp/montecarlo/runPlan';
import { createInlineLane, runMonteCarloBlocks, type MonteCarloLane, type MonteCarloProgress } from '../../../src/dsp/montecarlo/runScheduler';
import { runTotals } from '../../../src/dsp/montecarlo/runStats';
import { TEST_SEED } from '../../helpers/seed';

const setup = resolveMeasurementSetup(parseWaveformConfig({ standard: 'lte', bandwidthMHz: 1.4, modulation: '16qam' }), {
  symbols: 700,
  blockSymbols: 50,
  seed: TEST_SEED,
});

function lanes(n: number): MonteCarloLane[] {
  return Array.from({ length: n }, () => createInlineLane(createSetupMeasurer(setup).measurer));
}

describe('Monte-Carlo scheduler', () => {
  it('1 lane and 3 lanes give bit-identical histograms and totals (blocks carry their seeds; counts add exactly)', async () => {
    const one = await runMonteCarloBlocks(lanes(1), setup.run, allBlockIndices(setup.run));
    // Three lanes that finish blocks in a scrambled order: each yields a different number of times.
    const three = lanes(3).map((lane, i): MonteCarloLane => ({
      runBlock: async (b) => {
        for (let k = 0; k < ((b * 7 + i) % 5); k++) await Promise.resolve();
        return lane.runBlock(b);
      },
      takeHistograms: () => lane.takeHistograms(),
    }));
    const many = await runMonteCarloBlocks(three, setup.run, allBlockIndices(setup.run));
    expect(Array.from(many.histograms.power.counts)).toEqual(Array.from(one.histograms.power.counts));
    expect(Array.from(many.histograms.paprRunMean.counts)).toEqual(Array.from(one.histograms.paprRunMean.counts));
    expect(Array.from(many.histograms.paprSymbolMean.counts)).toEqual(Array.from(one.histograms.paprSymbolMean.counts));
    expect(runTotals(many)).toEqual(runTotals(one));
    expect(runTotals(one).numSymbols).toBe(700);
  });

  it('reports progress after every block: fraction, symbols per second and time left from the given clock', async () => {
    let now = 0;
    const seen: MonteCarloProgress[] = [];
    await runMonteCarloBlocks(lanes(2), setup.run, allBlockIndices(setup.run), {
      clock: () => (now += 100),
      onProgress: (p) => seen.push(p),
    });
    expect(seen[0]!.fraction).toBe(0);
    expect(seen.at(-1)!.fraction).toBe(1);
    expect(seen.at(-1)!.secondsLeft).toBe(0);
    for (let i = 1; i < seen.length; i++) expect(seen[i]!.symbolsDone).toBeGreaterThan(seen[i - 1]!.symbolsDone);
    const mid = seen[3]!;
    expect(mid.symbolsPerSecond).toBeCloseTo(mid.symbolsDone / mid.elapsedSeconds!, 9);
    expect(mid.secondsLeft).toBeCloseTo((700 - mid.symbolsDone) / mid.symbolsPerSecond!, 9);
  });

  it('an abort stops the run: the promise rejects with the signal reason and no more blocks start', async () => {
    const controller = new AbortController();
    const started: number[] = [];
    const lane = lanes(1)[0]!;
    const counting: MonteCarloLane = {
      runBlock: (b) => {
        started.push(b);
        if (b === 3) controller.abort(new Error('stop here'));
        return lane.runBlock(b);
      },
      takeHistograms: () => lane.takeHistograms(),
    };
    await expect(
      runMonteCarloBlocks([counting], setup.run, allBlockIndices(setup.run), {
        signal: controller.signal,
        yieldBetweenBlocks: () => new Promise((r) => setTimeout(r, 0)),
      }),
    ).rejects.toThrow('stop here');
    expect(started).toEqual([0, 1, 2, 3]);
  });

  it('a failing lane fails the run with its error', async () => {
    const broken: MonteCarloLane = {
      runBlock: (): Promise<BlockRecord> => Promise.reject(new Error('lane broke')),
      takeHistograms: () => Promise.reject(new Error('unused')),
    };
    await expect(runMonteCarloBlocks([broken, ...lanes(1)], setup.run, allBlockIndices(setup.run))).rejects.toThrow('lane broke');
  });
});
