/**
 * The worker's message handling, kept apart from `self` so it runs under Node in the unit tests.
 *
 * It does no DSP of its own: it checks each message, validates the configuration with the zod
 * schema (parseWaveformConfig), calls generateWaveform and posts the result with its buffers
 * transferred. The newest request wins: requests are queued for one task turn, and a generate
 * request that a newer one has overtaken, or that was cancelled, is dropped unanswered (the client
 * has already settled it).
 */
import { parseWaveformConfig } from '../config/configParse';
import { DspError } from '../dsp/errors';
import { generateWaveform, type GeneratedWaveform } from '../dsp/waveform/waveformGenerator';
import type { WaveformPlan } from '../dsp/waveform/waveformPlan';
import {
  isWorkerRequest,
  PROTOCOL_VERSION,
  waveformBufferKeys,
  type ErrorResponse,
  type GenerateRequest,
  type GeneratedResponse,
  type WaveformBuffers,
  type WaveformMeta,
  type WaveformPlanSummary,
  type WorkerRequest,
  type WorkerResponse,
} from './protocol';
import { runBackoffRequest } from './handlers/backoffHandler';
import { runCcdfMergeRequest, runCcdfRequest } from './handlers/ccdfHandler';
import { runEvmRequest } from './handlers/evmHandler';
import { runExportRequest } from './handlers/exportHandler';
import { runSpectrumRequest } from './handlers/spectrumHandler';

export interface EngineDispatchHost {
  /** Posts a response, moving the listed buffers. */
  post(message: WorkerResponse, transfer: Transferable[]): void;
  /** Runs `task` after the messages already queued (setTimeout(0) in the worker). */
  schedule(task: () => void): void;
  /** Milliseconds from a monotonic clock (performance.now()). */
  now(): number;
  /** Names this worker instance (a Monte-Carlo lane); set once at start-up. */
  laneId?: string;
}

/** Returns the buffer behind `view` if the view spans all of it, else a copy's buffer, so it can be transferred alone. */
function toOwnBuffer(view: ArrayBufferView, alreadyMoved: Set<ArrayBufferLike>): ArrayBuffer {
  const { buffer } = view;
  const spansBuffer = view.byteOffset === 0 && view.byteLength === buffer.byteLength;
  if (spansBuffer && buffer instanceof ArrayBuffer && !alreadyMoved.has(buffer)) {
    alreadyMoved.add(buffer);
    return buffer;
  }
  const copy = new Uint8Array(view.byteLength);
  copy.set(new Uint8Array(buffer, view.byteOffset, view.byteLength));
  return copy.buffer;
}

export function errorResponse(id: number, error: unknown): ErrorResponse {
  if (error instanceof DspError) {
    const response: ErrorResponse = {
      type: 'error',
      id,
      protocolVersion: PROTOCOL_VERSION,
      code: error.code,
      message: error.message,
    };
    if (error.details !== undefined) response.details = error.details;
    return response;
  }
  const reason = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
  return {
    type: 'error',
    id,
    protocolVersion: PROTOCOL_VERSION,
    code: 'INTERNAL',
    message: `The engine failed unexpectedly (${reason}). This is a bug in Crestline; please report it with the configuration.`,
  };
}

/** The plain-data part of a plan that the page needs (no FFT plans, index or phase tables). */
export function summarizePlan(plan: WaveformPlan): WaveformPlanSummary {
  return {
    waveform: plan.waveform,
    numerology: plan.numerology,
    dataSymbolsPerOfdmSymbol: plan.dataSymbolsPerOfdmSymbol,
    bitsPerOfdmSymbol: plan.bitsPerOfdmSymbol,
    allocations: plan.allocations.map(({ dataSubcarriers, ...block }) => ({
      ...block,
      numDataSubcarriers: dataSubcarriers.length,
    })),
  };
}

/** Splits a waveform into its cloned metadata and its transferable buffers. */
export function packWaveform(waveform: GeneratedWaveform): { meta: WaveformMeta; buffers: WaveformBuffers } {
  const moved = new Set<ArrayBufferLike>();
  const buffers = {} as WaveformBuffers;
  for (const key of waveformBufferKeys) buffers[key] = toOwnBuffer(waveform[key], moved);
  const meta: WaveformMeta = {
    firstSymbol: waveform.firstSymbol,
    numSymbols: waveform.numSymbols,
    sampleRateHz: waveform.sampleRateHz,
    numSamples: waveform.numSamples,
    numGridSubcarriers: waveform.numGridSubcarriers,
    symbolLayout: waveform.symbolLayout,
    warnings: waveform.warnings,
    summary: summarizePlan(waveform.plan),
  };
  return { meta, buffers };
}

/** What a handler returns: the response and the buffers to move with it. */
export interface HandlerOutput {
  response: WorkerResponse;
  transfer: Transferable[];
}

type Handled = Exclude<WorkerRequest, { type: 'cancel' }>;
type Handler<T extends Handled> = (request: T, startMs: number, host: EngineDispatchHost) => HandlerOutput;

function runGenerate(request: GenerateRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const config = parseWaveformConfig(request.config);
  const { meta, buffers } = packWaveform(generateWaveform(config));
  const response: GeneratedResponse = {
    type: 'generated',
    id: request.id,
    protocolVersion: PROTOCOL_VERSION,
    config,
    meta,
    buffers,
    elapsedMs: host.now() - startMs,
  };
  return { response, transfer: Object.values(response.buffers) };
}

/** One handler per request type: validate, call src/dsp or src/io, pack the answer. */
const handlers: { [K in Handled['type']]: Handler<Extract<Handled, { type: K }>> } = {
  generate: runGenerate,
  export: runExportRequest,
  spectrum: runSpectrumRequest,
  evm: runEvmRequest,
  backoff: runBackoffRequest,
  ccdf: runCcdfRequest,
  'ccdf-merge': runCcdfMergeRequest,
};

function handle(request: Handled, host: EngineDispatchHost): void {
  const startMs = host.now();
  let output: HandlerOutput;
  try {
    output = (handlers[request.type] as Handler<Handled>)(request, startMs, host);
  } catch (error) {
    host.post(errorResponse(request.id, error), []);
    return;
  }
  host.post(output.response, output.transfer);
}

/**
 * Creates the `onmessage` handler: call it with each `event.data`. Requests are queued for one task
 * turn, so a cancel or a newer generate request that arrives meanwhile can overtake them.
 */
export function createEngineDispatcher(host: EngineDispatchHost): (data: unknown) => void {
  const queue: Handled[] = [];
  const cancelledIds = new Set<number>();
  let newestGenerateId = -1;
  let drainScheduled = false;

  const drain = (): void => {
    drainScheduled = false;
    const batch = queue.splice(0, queue.length);
    for (const request of batch) {
      const stale = cancelledIds.has(request.id) || (request.type === 'generate' && request.id !== newestGenerateId);
      cancelledIds.delete(request.id);
      if (!stale) handle(request, host);
    }
    // A cancel that arrived after its request ran would otherwise stay in the set for good.
    const newestId = Math.max(-1, ...batch.map((r) => r.id));
    for (const id of cancelledIds) if (id <= newestId) cancelledIds.delete(id);
  };

  return (data: unknown): void => {
    if (!isWorkerRequest(data)) {
      const id = typeof (data as { id?: unknown } | null)?.id === 'number' ? (data as { id: number }).id : -1;
      host.post(errorResponse(id, new DspError('INTERNAL', 'The engine worker received a message it does not understand.')), []);
      return;
    }
    if (data.protocolVersion !== PROTOCOL_VERSION) {
      const message = `The page speaks engine protocol v${String(data.protocolVersion)} but this worker speaks v${PROTOCOL_VERSION}; reload the page.`;
      host.post(errorResponse(data.id, new DspError('INTERNAL', message)), []);
      return;
    }
    if (data.type === 'cancel') {
      cancelledIds.add(data.targetId);
      return;
    }
    if (data.type === 'generate') newestGenerateId = Math.max(newestGenerateId, data.id);
    queue.push(data);
    if (!drainScheduled) {
      drainScheduled = true;
      host.schedule(drain);
    }
  };
}
