/**
 * The worker's Monte-Carlo statistics requests, composed of src/dsp/montecarlo exactly as `crestline measure`
 * composes them (resolveMeasurementSetup → createSetupMeasurer → measureBlock → buildMeasureReport), so the page
 * shows the numbers the CLI prints for the same configuration, symbols, seed, block size and precision.
 *
 * - interactive (`ccdf` without laneRunKey): fresh counts for the requested blocks, answered with the report;
 * - long runs (`ccdf` with laneRunKey): this worker is one lane of the run; its counts accumulate across
 *   requests and each answer carries the block records and a snapshot of the lane's counts;
 * - `ccdf-merge`: the lanes' snapshots (disjoint blocks) and all records merged into one report — the engine's
 *   exact merge (runStats.ts), so the result does not depend on how blocks were spread over the workers.
 */
import { parseWaveformConfig } from '../../config/configParse';
import { cloneDbHistogram, type DbHistogram } from '../../dsp/metrics/dbHistogram';
import { ccdfCurve } from '../../dsp/metrics/ccdfLevels';
import { gaussianPowerCcdf, ofdmPaprCcdfTheory, VAN_NEE_ALPHA_OVERSAMPLED } from '../../dsp/metrics/paprTheory';
import { f32FftBackendName } from '../../dsp/fft/f32Fft';
import type { BlockMeasurer, HistogramSet } from '../../dsp/montecarlo/blockMeasurer';
import { runIdentityOf, statisticsFactsOf, type MeasurementContext } from '../../dsp/montecarlo/measurementContext';
import { buildMeasureReport } from '../../dsp/montecarlo/measureReport';
import { createSetupMeasurer, resolveMeasurementSetup, type MeasurementSetup } from '../../dsp/montecarlo/measurementSetup';
import { allBlockIndices } from '../../dsp/montecarlo/runPlan';
import { addBlockRecord, addHistogramSet, createRunStats, type RunStats } from '../../dsp/montecarlo/runStats';
import type { CcdfReportPayload, CcdfRunSpec, CurvePayload, HistogramPayload, HistogramSetPayload } from '../ccdfTypes';
import type { EngineDispatchHost, HandlerOutput } from '../engineDispatch';
import { PROTOCOL_VERSION, type CcdfMergeRequest, type CcdfMergedResponse, type CcdfRequest, type CcdfResponse } from '../protocol';

/** Theory curves are evaluated on this grid of thresholds, dB. */
const THEORY_FROM_DB = 0;
const THEORY_TO_DB = 16;
const THEORY_STEP_DB = 0.05;

function setupOf(config: unknown, run: CcdfRunSpec): MeasurementSetup {
  return resolveMeasurementSetup(parseWaveformConfig(config), {
    symbols: run.symbols,
    blockSymbols: run.blockSymbols,
    seed: run.seed,
    precision: run.precision,
  });
}

/** What `crestline measure` records beside the counts (without the spectrum, which has its own request). */
function contextOf(setup: MeasurementSetup, built: ReturnType<typeof createSetupMeasurer>): MeasurementContext {
  return {
    identity: runIdentityOf(setup),
    statistics: statisticsFactsOf(built.plan, built.source),
    spectrum: null,
    warnings: [...built.plan.warnings, ...setup.warnings],
    notes: [...setup.notes],
  };
}

const curveOf = (c: { thresholdDb: Float64Array; probability: Float64Array }): CurvePayload => ({
  thresholdDb: c.thresholdDb.buffer as ArrayBuffer,
  probability: c.probability.buffer as ArrayBuffer,
});

function theoryCurve(f: (db: number) => number): CurvePayload {
  const n = Math.round((THEORY_TO_DB - THEORY_FROM_DB) / THEORY_STEP_DB) + 1;
  const thresholdDb = new Float64Array(n);
  const probability = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    thresholdDb[i] = THEORY_FROM_DB + i * THEORY_STEP_DB;
    probability[i] = f(thresholdDb[i]!);
  }
  return curveOf({ thresholdDb, probability });
}

/** The report and the curves of `stats`, and the buffers to move. */
export function reportPayload(context: MeasurementContext, stats: RunStats): { payload: CcdfReportPayload; transfer: ArrayBuffer[] } {
  const n = context.statistics.numDataSubcarriers;
  const payload: CcdfReportPayload = {
    report: buildMeasureReport(context, stats),
    numBlocks: stats.records.size,
    curves: {
      power: curveOf(ccdfCurve(stats.histograms.power)),
      paprRunMean: curveOf(ccdfCurve(stats.histograms.paprRunMean)),
      paprSymbolMean: curveOf(ccdfCurve(stats.histograms.paprSymbolMean)),
    },
    theory: {
      power: theoryCurve(gaussianPowerCcdf),
      paprNyquist: theoryCurve((db) => ofdmPaprCcdfTheory(db, n, 1)),
      paprOversampled: theoryCurve((db) => ofdmPaprCcdfTheory(db, n, VAN_NEE_ALPHA_OVERSAMPLED)),
    },
    f32Backend: context.identity.precision === 'f32' ? f32FftBackendName() : null,
  };
  const transfer = [payload.curves, payload.theory].flatMap((set) => Object.values(set).flatMap((c) => [c.thresholdDb, c.probability]));
  return { payload, transfer };
}

const toPayload = (h: DbHistogram): HistogramPayload => {
  const copy = cloneDbHistogram(h);
  return { minCentiDb: copy.minCentiDb, maxCentiDb: copy.maxCentiDb, numBins: copy.numBins, counts: copy.counts.buffer as ArrayBuffer };
};
const fromPayload = (h: HistogramPayload): DbHistogram => ({ minCentiDb: h.minCentiDb, maxCentiDb: h.maxCentiDb, numBins: h.numBins, counts: new Float64Array(h.counts) });

export function histogramSetPayload(set: HistogramSet): HistogramSetPayload {
  return { paprRunMean: toPayload(set.paprRunMean), paprSymbolMean: toPayload(set.paprSymbolMean), power: toPayload(set.power) };
}

function histogramSetOf(payload: HistogramSetPayload): HistogramSet {
  return { paprRunMean: fromPayload(payload.paprRunMean), paprSymbolMean: fromPayload(payload.paprSymbolMean), power: fromPayload(payload.power) };
}

/** Per worker (dispatcher host): the lane of the current long run and the last merge context. */
interface LaneState {
  runKey: string;
  measurer: BlockMeasurer;
}
const lanes = new WeakMap<EngineDispatchHost, LaneState>();
const contexts = new WeakMap<EngineDispatchHost, { key: string; context: MeasurementContext }>();

export function runCcdfRequest(request: CcdfRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const setup = setupOf(request.config, request.run);
  const blocks = request.blocks ?? allBlockIndices(setup.run);
  let measurer: BlockMeasurer;
  let result: CcdfReportPayload | null = null;
  let transfer: ArrayBuffer[] = [];
  if (request.laneRunKey === undefined) {
    const built = createSetupMeasurer(setup);
    measurer = built.measurer;
    const stats = createRunStats();
    const records = blocks.map((b) => measurer.measureBlock(b));
    for (const record of records) addBlockRecord(stats, record);
    addHistogramSet(stats, measurer.histograms);
    ({ payload: result, transfer } = reportPayload(contextOf(setup, built), stats));
    const response: CcdfResponse = { type: 'ccdf-result', id: request.id, protocolVersion: PROTOCOL_VERSION, config: setup.config, laneId: host.laneId ?? 'lane', records, lane: null, result, elapsedMs: host.now() - startMs };
    return { response, transfer };
  }
  let lane = lanes.get(host);
  if (lane === undefined || lane.runKey !== request.laneRunKey) {
    lane = { runKey: request.laneRunKey, measurer: createSetupMeasurer(setup).measurer };
    lanes.set(host, lane);
  }
  const records = blocks.map((b) => lane.measurer.measureBlock(b));
  const snapshot = histogramSetPayload(lane.measurer.histograms);
  transfer = [snapshot.paprRunMean.counts, snapshot.paprSymbolMean.counts, snapshot.power.counts];
  const response: CcdfResponse = {
    type: 'ccdf-result',
    id: request.id,
    protocolVersion: PROTOCOL_VERSION,
    config: setup.config,
    laneId: host.laneId ?? 'lane',
    records,
    lane: snapshot,
    result: null,
    elapsedMs: host.now() - startMs,
  };
  return { response, transfer };
}

export function runCcdfMergeRequest(request: CcdfMergeRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const setup = setupOf(request.config, request.run);
  const key = JSON.stringify([setup.config, setup.run, setup.oversampling, setup.precision]);
  let cached = contexts.get(host);
  if (cached === undefined || cached.key !== key) {
    cached = { key, context: contextOf(setup, createSetupMeasurer(setup)) };
    contexts.set(host, cached);
  }
  const stats = createRunStats();
  for (const lane of request.lanes) addHistogramSet(stats, histogramSetOf(lane));
  for (const record of request.records) addBlockRecord(stats, record);
  const { payload, transfer } = reportPayload(cached.context, stats);
  const response: CcdfMergedResponse = { type: 'ccdf-merged', id: request.id, protocolVersion: PROTOCOL_VERSION, result: payload, elapsedMs: host.now() - startMs };
  return { response, transfer };
}
