/**
 * Messages between the page and the engine worker (src/worker/engine.worker.ts).
 *
 * Every message is a member of a discriminated union on `type`, carries the `id` of the request it
 * belongs to and the `protocolVersion` both sides were built with. Payloads are plain data; sample
 * buffers travel as transferable ArrayBuffers (moved, not copied). Failures come back as
 * `{ type: "error", id, code, message }`; client.ts rebuilds a DspError from them.
 *
 * To add a request: see DEVELOPERS.md, "Adding a worker request".
 */
import type { WaveformConfig } from '../config/schema';
import type { DspErrorCode } from '../dsp/errors';
import type { AllocationPlan } from '../dsp/waveform/allocation';
import type { GeneratedWaveform } from '../dsp/waveform/waveformGenerator';
import type { WaveformPlan } from '../dsp/waveform/waveformPlan';
import type { BackoffAnalysis } from '../dsp/backoff/backoffAnalysis';
import type { ExportReport } from '../io/exportMetadata';
import type { BlockRecord, CcdfReportPayload, CcdfRunSpec, HistogramSetPayload } from './ccdfTypes';
import type { AmplifierPayload, EvmPayload, SpectrumPayload } from './measurementTypes';

/** Bump when a message changes shape; a page and a worker from different builds then refuse each other. */
export const PROTOCOL_VERSION = 2;
export type ProtocolVersion = typeof PROTOCOL_VERSION;

/** Id of the `ready` message the worker posts once at start-up (requests count from 1). */
export const READY_ID = 0;

interface Envelope<TType extends string> {
  type: TType;
  id: number;
  protocolVersion: ProtocolVersion;
}

// ---------------------------------------------------------------------------------------------
// Requests (page -> worker)

/** Generate a waveform from a raw configuration; the worker validates it with the zod schema. */
export interface GenerateRequest extends Envelope<'generate'> {
  /** Configuration input as the CLI reads it from JSON (defaults not yet applied). */
  config: unknown;
}

/** Drop request `targetId` if the worker has not started it yet. */
export interface CancelRequest extends Envelope<'cancel'> {
  targetId: number;
}

/**
 * Build an IQ file in memory with the same src/io code the CLI streams to disk (exportToMemory), so
 * the bytes are identical to `crestline generate` with the same configuration and options.
 */
export interface ExportRequest extends Envelope<'export'> {
  /** Configuration input, validated by the worker. */
  config: unknown;
  /** Export options as `exportOptionsSchema` takes them (format, level, rate, offset, repeat…). */
  options: unknown;
}

/** Spectrum (Welch PSD, ACLR, OBW) of the waveform and, with a transmitter chain, of what it transmits; amplifier curves. */
export interface SpectrumRequest extends Envelope<'spectrum'> {
  config: unknown;
  /** Symbols analysed (default: the configuration's, at least 14). */
  symbols?: number;
}

/** EVM of the transmitted waveform through the reference receiver. */
export interface EvmRequest extends Envelope<'evm'> {
  config: unknown;
}

/** Least amplifier back-off meeting the EVM and ACLR limits (src/dsp/backoff), with the configuration's amplifier. */
export interface BackoffRequest extends Envelope<'backoff'> {
  config: unknown;
  /** Saturated output power, dBm, for absolute usable power (optional). */
  psatDbm?: number;
}

/**
 * Monte-Carlo statistics of a configuration (src/dsp/montecarlo). Without `laneRunKey`: measure `blocks` (default all)
 * with fresh counts and answer with the report (the interactive CCDF). With it: add the blocks to this worker's
 * counts for that run (a lane) and answer with the block records and a snapshot of the lane's counts.
 */
export interface CcdfRequest extends Envelope<'ccdf'> {
  config: unknown;
  run: CcdfRunSpec;
  blocks?: number[];
  laneRunKey?: string;
}

/** Merges the lanes of a long run (their latest snapshots and all block records) into a report. */
export interface CcdfMergeRequest extends Envelope<'ccdf-merge'> {
  config: unknown;
  run: CcdfRunSpec;
  lanes: HistogramSetPayload[];
  records: BlockRecord[];
}

export type WorkerRequest =
  | GenerateRequest
  | CancelRequest
  | ExportRequest
  | SpectrumRequest
  | EvmRequest
  | BackoffRequest
  | CcdfRequest
  | CcdfMergeRequest;
export type WorkerRequestType = WorkerRequest['type'];

// ---------------------------------------------------------------------------------------------
// A generated waveform as the page receives it

/** One allocation block as resolved by the engine (its subcarrier index table stays in the worker). */
export interface AllocationSummary extends Omit<AllocationPlan, 'dataSubcarriers'> {
  /** Data subcarriers of the block per OFDM symbol (M_sc for DFT-s-OFDM). */
  numDataSubcarriers: number;
}

/** What the page needs of a WaveformPlan; the plan's FFT plans and phase tables stay in the worker. */
export interface WaveformPlanSummary extends Pick<
  WaveformPlan,
  'waveform' | 'numerology' | 'dataSymbolsPerOfdmSymbol' | 'bitsPerOfdmSymbol'
> {
  allocations: AllocationSummary[];
}

/** GeneratedWaveform with its plan replaced by the summary. */
export interface EngineWaveform extends Omit<GeneratedWaveform, 'plan'> {
  summary: WaveformPlanSummary;
}

/**
 * Values of `gridKinds`, repeated here so the page can read the grid without loading engine code
 * (test/worker/protocol.test.ts checks them against RE_EMPTY / RE_DATA / RE_REFERENCE).
 */
export const GRID_KIND = { empty: 0, data: 1, reference: 2 } as const;

type TypedArray = Float64Array | Float32Array | Int32Array | Int16Array | Uint8Array;

/** Keys of T whose values are typed arrays: these travel as transferable ArrayBuffers. */
export type TypedArrayKeys<T> = { [K in keyof T]-?: T[K] extends TypedArray ? K : never }[keyof T];

export type WaveformBufferKey = TypedArrayKeys<EngineWaveform>;

/** The typed-array fields of an EngineWaveform, as raw buffers. */
export type WaveformBuffers = { [K in WaveformBufferKey]: ArrayBuffer };

/** Everything else in an EngineWaveform: structured-cloned. */
export type WaveformMeta = Omit<EngineWaveform, WaveformBufferKey>;

/**
 * How each buffer is viewed again on the page. A Record over the derived key type, so a new
 * typed-array field in GeneratedWaveform does not compile until it is listed here.
 */
export const waveformBufferViews: { [K in WaveformBufferKey]: new (buffer: ArrayBuffer) => EngineWaveform[K] } = {
  waveformIq: Float64Array,
  gridIq: Float64Array,
  gridKinds: Uint8Array,
  dataSymbolsIq: Float64Array,
  bits: Uint8Array,
};

export const waveformBufferKeys = Object.keys(waveformBufferViews) as WaveformBufferKey[];

// ---------------------------------------------------------------------------------------------
// Responses (worker -> page)

/** Posted once when the worker has loaded, so the page can check the protocol version. */
export interface ReadyResponse extends Envelope<'ready'> {}

export interface GeneratedResponse extends Envelope<'generated'> {
  /** The configuration after validation, defaults applied. */
  config: WaveformConfig;
  meta: WaveformMeta;
  buffers: WaveformBuffers;
  /** Worker time for validation and generation, milliseconds. */
  elapsedMs: number;
}

export interface ErrorResponse extends Envelope<'error'> {
  code: DspErrorCode;
  /** Written for the person at the form: field, value given, what is allowed. */
  message: string;
  /** DspError details (e.g. `issues: {path, message}[]` for INVALID_CONFIG). */
  details?: Record<string, unknown>;
}

export interface ExportedResponse extends Envelope<'exported'> {
  /** The data file, moved. */
  data: ArrayBuffer;
  /** The metadata file (SigMF meta or our sidecar), UTF-8 text. */
  metaText: string;
  dataSuffix: string;
  metaSuffix: string;
  sha512Hex: string;
  dataBytes: number;
  /** Level, peak, clipping, warnings: what the export dialog shows before the files are saved. */
  report: ExportReport;
  elapsedMs: number;
}

export interface SpectrumResponse extends Envelope<'spectrum-result'> {
  config: WaveformConfig;
  /** The generated waveform's spectrum (src/dsp/metrics/spectrumMeasurement.ts). */
  waveform: SpectrumPayload;
  /** After PAPR reduction, windowing, impairments and the amplifier, when any is configured. */
  transmitted: SpectrumPayload | null;
  amplifier: AmplifierPayload | null;
  elapsedMs: number;
}

export interface EvmResponse extends Envelope<'evm-result'> {
  config: WaveformConfig;
  evm: EvmPayload;
  elapsedMs: number;
}

export interface BackoffResponse extends Envelope<'backoff-result'> {
  config: WaveformConfig;
  analysis: BackoffAnalysis;
  elapsedMs: number;
}

export interface CcdfResponse extends Envelope<'ccdf-result'> {
  config: WaveformConfig;
  /** Identifies the worker instance whose lane `lane` is (long runs). */
  laneId: string;
  records: BlockRecord[];
  /** Long runs: the lane's counts so far. */
  lane: HistogramSetPayload | null;
  /** Interactive runs: the report of these blocks. */
  result: CcdfReportPayload | null;
  elapsedMs: number;
}

export interface CcdfMergedResponse extends Envelope<'ccdf-merged'> {
  result: CcdfReportPayload;
  elapsedMs: number;
}

export type WorkerResponse =
  | ReadyResponse
  | CcdfResponse
  | CcdfMergedResponse
  | GeneratedResponse
  | ExportedResponse
  | SpectrumResponse
  | EvmResponse
  | BackoffResponse
  | ErrorResponse;
export type WorkerResponseType = WorkerResponse['type'];

/** The responses a request can be answered with. */
export type ResponseFor<TRequest extends WorkerRequest> = TRequest extends GenerateRequest
  ? GeneratedResponse | ErrorResponse
  : TRequest extends ExportRequest
    ? ExportedResponse | ErrorResponse
    : TRequest extends SpectrumRequest
      ? SpectrumResponse | ErrorResponse
      : TRequest extends EvmRequest
        ? EvmResponse | ErrorResponse
        : TRequest extends BackoffRequest
          ? BackoffResponse | ErrorResponse
          : TRequest extends CcdfRequest
            ? CcdfResponse | ErrorResponse
            : TRequest extends CcdfMergeRequest
              ? CcdfMergedResponse | ErrorResponse
              : never;

// ---------------------------------------------------------------------------------------------
// Guards (messages arrive as `unknown`)

function isEnvelope(value: unknown): value is { type: unknown; id: unknown; protocolVersion: unknown } {
  return typeof value === 'object' && value !== null && 'type' in value && 'id' in value && 'protocolVersion' in value;
}

const requestTypes: readonly WorkerRequestType[] = ['generate', 'cancel', 'export', 'spectrum', 'evm', 'backoff', 'ccdf', 'ccdf-merge'];
const responseTypes: readonly WorkerResponseType[] = [
  'ready',
  'generated',
  'exported',
  'spectrum-result',
  'evm-result',
  'backoff-result',
  'ccdf-result',
  'ccdf-merged',
  'error',
];

/** True when `value` looks like a request of a known type (its version is checked separately). */
export function isWorkerRequest(value: unknown): value is WorkerRequest {
  return (
    isEnvelope(value) &&
    typeof value.id === 'number' &&
    requestTypes.includes(value.type as WorkerRequestType) &&
    (value.type !== 'cancel' || typeof (value as { targetId?: unknown }).targetId === 'number')
  );
}

/** True when `value` looks like a response of a known type (its version is checked separately). */
export function isWorkerResponse(value: unknown): value is WorkerResponse {
  return isEnvelope(value) && typeof value.id === 'number' && responseTypes.includes(value.type as WorkerResponseType);
}
