import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { runIdentityOf, statisticsFactsOf } from '../../src/dsp/montecarlo/measurementContext';
import { buildMeasureReport } from '../../src/dsp/montecarlo/measureReport';
import { createSetupMeasurer, resolveMeasurementSetup } from '../../src/dsp/montecarlo/measurementSetup';
import { addBlockRecord, addHistogramSet, createRunStats } from '../../src/dsp/montecarlo/runStats';
import { startCcdfRun } from '../../src/worker/ccdfRun';
import { createEngineClient, type CcdfResult } from '../../src/worker/client';
import { InProcessWorker } from './inProcessWorker';

// The statistics requests pass the measurement engine's results through unchanged, and a run spread over two
// workers in blocks gives exactly the single-thread result (the engine's block seeds and exact merge; the
// coordinator must not lose, repeat or reorder anything that matters).

/** LTE 1.4 MHz uplink, 6 RB (TS 36.101 Table 5.6-1), OFDM so the theory applies: small and quick. */
const config = { standard: 'lte', bandwidthMHz: 1.4, waveform: 'ofdm', modulation: 'qpsk' };
const run = { symbols: 640, blockSymbols: 64, seed: 7 };

/** What `crestline measure` computes for the same run, on this thread. */
function directReport() {
  const setup = resolveMeasurementSetup(parseWaveformConfig(config), run);
  const built = createSetupMeasurer(setup);
  const stats = createRunStats();
  for (let b = 0; b < setup.run.numBlocks; b++) addBlockRecord(stats, built.measurer.measureBlock(b));
  addHistogramSet(stats, built.measurer.histograms);
  const context = { identity: runIdentityOf(setup), statistics: statisticsFactsOf(built.plan, built.source), spectrum: null, warnings: [...built.plan.warnings, ...setup.warnings], notes: [...setup.notes] };
  return buildMeasureReport(context, stats);
}

function client(poolSize = 2) {
  return createEngineClient({ createWorker: () => new InProcessWorker(), poolSize });
}

describe('interactive statistics request', () => {
  it('returns the report crestline measure builds, with curves and the OFDM theory', async () => {
    const c = client(1);
    const result = await c.ccdf(config, run);
    c.dispose();
    expect(result.report).toEqual(directReport());
    expect(result.numBlocks).toBe(10);
    // CCDF curves are non-increasing, start at 1 (every value ≥ the lowest threshold) — common practice.
    const p = result.curves.power.probability;
    expect(p[0]!).toBeGreaterThan(0.99);
    expect(p[0]!).toBeLessThanOrEqual(1);
    for (let i = 1; i < p.length; i++) expect(p[i]!).toBeLessThanOrEqual(p[i - 1]!);
    // The curve starts where the CCDF leaves 1 (ccdfLevels.ts trims the flat start), so just below 1.
    // Power CCDF theory for large N: e^−γ (van Nee & Prasad 2000, ch. 6): at 10 dB, e^−10.
    const t = result.theory.power;
    const at10 = t.thresholdDb.findIndex((db) => Math.abs(db - 10) < 1e-9);
    expect(t.probability[at10]).toBeCloseTo(Math.exp(-10), 12);
  });
});

describe('long run over the pool', () => {
  it('streams partial reports and ends with exactly the single-thread report', async () => {
    const c = client(2);
    const partials: CcdfResult[] = [];
    const fractions: number[] = [];
    // One block at a time, so the partial merges (on the other worker) are answered before the next one supersedes them.
    const handle = startCcdfRun(c, { config, run, blocksPerTask: 1, concurrency: 1, mergeIntervalMs: 0 }, {
      onPartial: (r) => partials.push(r),
      onProgress: (p) => fractions.push(p.fraction),
    });
    const final = await handle.done;
    c.dispose();
    expect(final).not.toBeNull();
    expect(final!.report).toEqual(directReport());
    expect(final!.numBlocks).toBe(10);
    expect(partials.length).toBeGreaterThan(1);
    expect(partials[0]!.numBlocks).toBeLessThan(10);
    expect(fractions[0]).toBe(0);
    expect(fractions.at(-1)).toBe(1);
    for (let i = 1; i < fractions.length; i++) expect(fractions[i]!).toBeGreaterThanOrEqual(fractions[i - 1]!);
  });

  it('stops handing out blocks when cancelled and resolves with null', async () => {
    const workers: InProcessWorker[] = [];
    const c = createEngineClient({
      createWorker: () => {
        const w = new InProcessWorker();
        workers.push(w);
        return w;
      },
      poolSize: 2,
    });
    let handle: ReturnType<typeof startCcdfRun> | undefined;
    let progressCalls = 0;
    handle = startCcdfRun(c, { config, run: { ...run, symbols: 64 * 40 }, blocksPerTask: 1 }, {
      onProgress: () => {
        progressCalls += 1;
        if (progressCalls === 2) handle?.cancel();
      },
    });
    expect(await handle.done).toBeNull();
    await new Promise((resolve) => setTimeout(resolve, 50));
    const sent = workers.flatMap((w) => w.received).filter((m) => m.type === 'ccdf').length;
    expect(sent).toBeLessThan(10); // 40 blocks were planned; only those already handed out ran
    c.dispose();
  });

  it('hands a crashed worker’s blocks out again and still gets the exact report', async () => {
    const workers: InProcessWorker[] = [];
    const c = createEngineClient({
      createWorker: () => {
        const w = new InProcessWorker();
        workers.push(w);
        return w;
      },
      poolSize: 2,
    });
    let crashed = false;
    const handle = startCcdfRun(c, { config, run, blocksPerTask: 1, mergeIntervalMs: 0 }, {
      onProgress: (p) => {
        if (!crashed && p.symbolsDone > 0) {
          crashed = true;
          workers[0]!.crash('out of memory');
        }
      },
    });
    const final = await handle.done;
    c.dispose();
    expect(crashed).toBe(true);
    expect(final!.report).toEqual(directReport());
  });
});
