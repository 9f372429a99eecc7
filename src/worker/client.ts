/**
 * Promise API over the engine's worker pool (pool.ts), for the page (src/ui).
 *
 * - `generate(config)` resolves with the validated configuration and the waveform (EngineWaveform:
 *   GeneratedWaveform with a plan summary), its typed arrays viewed again over the transferred buffers.
 * - The newest request of each kind wins: a new `generate` settles the previous one with
 *   SupersededError (callers ignore it); the pool never sends a request that is already stale.
 * - Engine failures reject with a DspError rebuilt from `{type: "error", code, message}`:
 *   a class does not survive structured cloning, so it is rebuilt in the pool.
 * - A worker that crashes is terminated and replaced; its request rejects with an INTERNAL
 *   DspError that says so, and `onRestart` reports it to the page.
 */
import type { WaveformConfig } from '../config/schema';
import type { BackoffAnalysis } from '../dsp/backoff/backoffAnalysis';
import type { ExportReport } from '../io/exportMetadata';
import type { BlockRecord, CcdfReportPayload, CcdfRunSpec, CurvePayload, HistogramSetPayload } from './ccdfTypes';
import type { AmplifierPayload, EvmPayload, SpectrumPayload } from './measurementTypes';
import { waveformBufferKeys, waveformBufferViews, type EngineWaveform, type GeneratedResponse } from './protocol';
import {
  createWorkerPool,
  isSuperseded,
  SupersededError,
  type SuccessResponse,
  type WorkerLike,
  type WorkerPool,
  type WorkerRestartNotice,
} from './pool';

export { isSuperseded, SupersededError, type WorkerLike };

/** Workers in the page's pool: the two cores of the machines this runs on (interactive plots and Monte-Carlo blocks share them). */
export const DEFAULT_POOL_SIZE = 2;

/**
 * Requests of the configuration being edited (waveform, spectrum, EVM, quick statistics) that one worker may hold:
 * the one it runs and one waiting in its message queue, so it never idles while the page draws the last answer.
 */
export const EDIT_PIPELINE_DEPTH = 2;

export interface EngineResult {
  requestId: number;
  /** The configuration after validation, defaults applied. */
  config: WaveformConfig;
  waveform: EngineWaveform;
  /** Worker time for validation and generation, milliseconds. */
  elapsedMs: number;
}

export type EngineRestartNotice = WorkerRestartNotice;

export interface EngineClientOptions {
  /** Defaults to the module worker in engine.worker.ts. */
  createWorker?: () => WorkerLike;
  onRestart?: (notice: EngineRestartNotice) => void;
  /** Workers in the pool (default DEFAULT_POOL_SIZE). */
  poolSize?: number;
}

/** An IQ file built by the worker (src/io exportToMemory): the data, its metadata and the report. */
export interface ExportedFiles {
  data: Uint8Array;
  metaText: string;
  dataSuffix: string;
  metaSuffix: string;
  sha512Hex: string;
  report: ExportReport;
  elapsedMs: number;
}

/** A spectrum payload with its arrays viewed again. */
export type SpectrumData = SpectrumPayload<Float64Array>;
export type AmplifierData = AmplifierPayload<Float64Array>;
export type EvmData = EvmPayload<Float64Array>;

export interface SpectrumResult {
  config: WaveformConfig;
  waveform: SpectrumData;
  transmitted: SpectrumData | null;
  amplifier: AmplifierData | null;
  elapsedMs: number;
}

export interface BackoffResult {
  config: WaveformConfig;
  analysis: BackoffAnalysis;
  elapsedMs: number;
}

export interface EvmResult {
  config: WaveformConfig;
  evm: EvmData;
  elapsedMs: number;
}

function viewSpectrum(p: SpectrumPayload): SpectrumData {
  return { ...p, frequenciesHz: new Float64Array(p.frequenciesHz), psdPerHz: new Float64Array(p.psdPerHz) };
}

function viewAmplifier(p: AmplifierPayload): AmplifierData {
  return {
    ...p,
    inputDbRelSat: new Float64Array(p.inputDbRelSat),
    outputDbRelSat: new Float64Array(p.outputDbRelSat),
    gainCompressionDb: new Float64Array(p.gainCompressionDb),
    phaseDeg: new Float64Array(p.phaseDeg),
  };
}

/** A statistics report with its curves viewed as Float64Arrays. */
export type CcdfResult = CcdfReportPayload<Float64Array>;

/** One lane task of a long run: the blocks it measured and the lane's counts so far (kept as buffers for the merge). */
export interface CcdfLaneResult {
  laneId: string;
  records: BlockRecord[];
  lane: HistogramSetPayload;
  elapsedMs: number;
}

function viewCurve(c: CurvePayload): CurvePayload<Float64Array> {
  return { thresholdDb: new Float64Array(c.thresholdDb), probability: new Float64Array(c.probability) };
}

export function viewCcdfResult(p: CcdfReportPayload): CcdfResult {
  return {
    ...p,
    curves: { power: viewCurve(p.curves.power), paprRunMean: viewCurve(p.curves.paprRunMean), paprSymbolMean: viewCurve(p.curves.paprSymbolMean) },
    theory: { power: viewCurve(p.theory.power), paprNyquist: viewCurve(p.theory.paprNyquist), paprOversampled: viewCurve(p.theory.paprOversampled) },
  };
}

/** Lane and priority of each kind of request (newest wins within a lane). */
export interface RequestRouting {
  lane?: string;
  priority?: 'interactive' | 'background';
}

export interface EngineClient {
  generate(config: unknown): Promise<EngineResult>;
  /** Builds an export (newest wins: a new export supersedes one still running). */
  exportFile(config: unknown, options: unknown): Promise<ExportedFiles>;
  /** Spectrum, ACLR, OBW (and after the transmitter chain, with amplifier curves). Default lane "spectrum". */
  spectrum(config: unknown, routing?: RequestRouting): Promise<SpectrumResult>;
  /** EVM of the transmitted waveform. Default lane "evm". */
  evm(config: unknown, routing?: RequestRouting): Promise<EvmResult>;
  /** Back-off sweep and solver with the configuration's amplifier. Default lane "backoff", background priority. */
  backoff(config: unknown, routing?: RequestRouting, psatDbm?: number): Promise<BackoffResult>;
  /** Power CCDF, PAPR and cubic metric of a short Monte-Carlo run, in one request. Default lane "ccdf". */
  ccdf(config: unknown, run: CcdfRunSpec, routing?: RequestRouting): Promise<CcdfResult>;
  /** Long runs (ccdfRun.ts): measure `blocks` into a worker's lane for `laneRunKey`. */
  ccdfLane(config: unknown, run: CcdfRunSpec, blocks: number[], laneRunKey: string, routing: RequestRouting): Promise<CcdfLaneResult>;
  /** Long runs: merge the lanes' latest counts and all block records into a report. */
  ccdfMerge(config: unknown, run: CcdfRunSpec, lanes: HistogramSetPayload[], records: BlockRecord[], routing: RequestRouting): Promise<CcdfResult>;
  /** The pool behind the client, for long runs that spread blocks over the workers (ccdfRun.ts). */
  readonly pool: WorkerPool;
  /** Terminates the workers; pending requests settle with SupersededError. */
  dispose(): void;
}

function createModuleWorker(): WorkerLike {
  return new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'crestline-engine' });
}

/** Views the transferred buffers as the typed arrays EngineWaveform declares. */
export function rebuildWaveform(response: GeneratedResponse): EngineWaveform {
  const views: Partial<EngineWaveform> = {};
  for (const key of waveformBufferKeys) {
    const View = waveformBufferViews[key];
    (views as Record<string, unknown>)[key] = new View(response.buffers[key]);
  }
  return { ...response.meta, ...views } as EngineWaveform;
}

/** Narrows a pool answer to the type a request expects (a mismatch is a bug in the worker). */
export function expectResponse<TType extends SuccessResponse['type']>(
  response: SuccessResponse,
  type: TType,
): Extract<SuccessResponse, { type: TType }> {
  if (response.type !== type) throw new Error(`The engine answered "${response.type}" where "${type}" was expected.`);
  return response as Extract<SuccessResponse, { type: TType }>;
}

export function createEngineClient(options: EngineClientOptions = {}): EngineClient {
  const pool = createWorkerPool({
    size: options.poolSize ?? DEFAULT_POOL_SIZE,
    pipeline: EDIT_PIPELINE_DEPTH,
    createWorker: options.createWorker ?? createModuleWorker,
    ...(options.onRestart !== undefined ? { onRestart: options.onRestart } : {}),
  });

  const generate = async (config: unknown): Promise<EngineResult> => {
    const { result } = pool.run({ type: 'generate', config }, { lane: 'generate', priority: 'interactive', queueable: true });
    const response = expectResponse(await result, 'generated');
    return { requestId: response.id, config: response.config, waveform: rebuildWaveform(response), elapsedMs: response.elapsedMs };
  };

  const exportFile = async (config: unknown, options: unknown): Promise<ExportedFiles> => {
    const { result } = pool.run({ type: 'export', config, options }, { lane: 'export', priority: 'interactive' });
    const r = expectResponse(await result, 'exported');
    return {
      data: new Uint8Array(r.data),
      metaText: r.metaText,
      dataSuffix: r.dataSuffix,
      metaSuffix: r.metaSuffix,
      sha512Hex: r.sha512Hex,
      report: r.report,
      elapsedMs: r.elapsedMs,
    };
  };

  // The edited configuration's own requests (no routing given) are short and may queue in a busy worker.
  const route = (routing: RequestRouting | undefined, lane: string) => ({ lane: routing?.lane ?? lane, priority: routing?.priority ?? 'interactive', queueable: routing === undefined });

  const spectrum = async (config: unknown, routing?: RequestRouting): Promise<SpectrumResult> => {
    const { result } = pool.run({ type: 'spectrum', config }, route(routing, 'spectrum'));
    const r = expectResponse(await result, 'spectrum-result');
    return {
      config: r.config,
      waveform: viewSpectrum(r.waveform),
      transmitted: r.transmitted === null ? null : viewSpectrum(r.transmitted),
      amplifier: r.amplifier === null ? null : viewAmplifier(r.amplifier),
      elapsedMs: r.elapsedMs,
    };
  };

  const evm = async (config: unknown, routing?: RequestRouting): Promise<EvmResult> => {
    const { result } = pool.run({ type: 'evm', config }, route(routing, 'evm'));
    const r = expectResponse(await result, 'evm-result');
    return {
      config: r.config,
      evm: { ...r.evm, constellationIq: r.evm.constellationIq === null ? null : new Float64Array(r.evm.constellationIq) },
      elapsedMs: r.elapsedMs,
    };
  };

  const backoff = async (config: unknown, routing?: RequestRouting, psatDbm?: number): Promise<BackoffResult> => {
    const { result } = pool.run(
      { type: 'backoff', config, ...(psatDbm !== undefined ? { psatDbm } : {}) },
      { lane: routing?.lane ?? 'backoff', priority: routing?.priority ?? 'background' },
    );
    const r = expectResponse(await result, 'backoff-result');
    return { config: r.config, analysis: r.analysis, elapsedMs: r.elapsedMs };
  };

  const ccdf = async (config: unknown, run: CcdfRunSpec, routing?: RequestRouting): Promise<CcdfResult> => {
    const { result } = pool.run({ type: 'ccdf', config, run }, route(routing, 'ccdf'));
    const r = expectResponse(await result, 'ccdf-result');
    if (r.result === null) throw new Error('The engine answered a statistics request without its report.');
    return viewCcdfResult(r.result);
  };

  const ccdfLane = async (config: unknown, run: CcdfRunSpec, blocks: number[], laneRunKey: string, routing: RequestRouting): Promise<CcdfLaneResult> => {
    const { result } = pool.run({ type: 'ccdf', config, run, blocks, laneRunKey }, route(routing, 'ccdf-lane'));
    const r = expectResponse(await result, 'ccdf-result');
    if (r.lane === null) throw new Error('The engine answered a lane request without the lane counts.');
    return { laneId: r.laneId, records: r.records, lane: r.lane, elapsedMs: r.elapsedMs };
  };

  const ccdfMerge = async (config: unknown, run: CcdfRunSpec, lanes: HistogramSetPayload[], records: BlockRecord[], routing: RequestRouting): Promise<CcdfResult> => {
    // The lanes' buffers are copied, not moved: the run keeps them for the next merge.
    const { result } = pool.run({ type: 'ccdf-merge', config, run, lanes, records }, route(routing, 'ccdf-merge'));
    return viewCcdfResult(expectResponse(await result, 'ccdf-merged').result);
  };

  return { generate, exportFile, spectrum, evm, backoff, ccdf, ccdfLane, ccdfMerge, pool, dispose: () => pool.dispose() };
}
