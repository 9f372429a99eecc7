import { describe, expectTypeOf, it, expect } from 'vitest';
import type { WaveformConfig } from '../../src/config/schema';
import type { DspErrorCode } from '../../src/dsp/errors';
import type { ExportReport } from '../../src/io/exportMetadata';
import type { HistogramSetPayload } from '../../src/worker/ccdfTypes';
import { RE_DATA, RE_EMPTY, RE_REFERENCE, type GeneratedWaveform } from '../../src/dsp/waveform/waveformGenerator';
import {
  GRID_KIND,
  isWorkerRequest,
  isWorkerResponse,
  PROTOCOL_VERSION,
  waveformBufferKeys,
  type CancelRequest,
  type BackoffRequest,
  type CcdfMergedResponse,
  type CcdfMergeRequest,
  type CcdfRequest,
  type CcdfResponse,
  type BackoffResponse,
  type EvmRequest,
  type EvmResponse,
  type ExportedResponse,
  type SpectrumRequest,
  type SpectrumResponse,
  type ExportRequest,
  type EngineWaveform,
  type ErrorResponse,
  type GenerateRequest,
  type GeneratedResponse,
  type ReadyResponse,
  type ResponseFor,
  type TypedArrayKeys,
  type WaveformBufferKey,
  type WaveformBuffers,
  type WaveformMeta,
  type WorkerRequest,
  type WorkerRequestType,
  type WorkerResponse,
  type WorkerResponseType,
} from '../../src/worker/protocol';

// Compile-time checks of the message unions (house style STYLE.md §5): `npm run typecheck` fails
// when a union drifts. The runtime guards below are checked with vitest as usual.

describe('protocol unions (compile time)', () => {
  it('discriminates requests and responses on type', () => {
    expectTypeOf<WorkerRequestType>().toEqualTypeOf<'generate' | 'cancel' | 'export' | 'spectrum' | 'evm' | 'backoff' | 'ccdf' | 'ccdf-merge'>();
    expectTypeOf<WorkerResponseType>().toEqualTypeOf<'ready' | 'generated' | 'exported' | 'spectrum-result' | 'evm-result' | 'backoff-result' | 'ccdf-result' | 'ccdf-merged' | 'error'
    >();
    expectTypeOf<ResponseFor<CcdfRequest>>().toEqualTypeOf<CcdfResponse | ErrorResponse>();
    expectTypeOf<ResponseFor<CcdfMergeRequest>>().toEqualTypeOf<CcdfMergedResponse | ErrorResponse>();
    expectTypeOf<CcdfResponse['lane']>().toEqualTypeOf<HistogramSetPayload | null>();
    expectTypeOf<ResponseFor<BackoffRequest>>().toEqualTypeOf<BackoffResponse | ErrorResponse>();
    expectTypeOf<ResponseFor<SpectrumRequest>>().toEqualTypeOf<SpectrumResponse | ErrorResponse>();
    expectTypeOf<ResponseFor<EvmRequest>>().toEqualTypeOf<EvmResponse | ErrorResponse>();
    expectTypeOf<SpectrumResponse['waveform']['psdPerHz']>().toEqualTypeOf<ArrayBuffer>();
    expectTypeOf<Extract<WorkerRequest, { type: 'export' }>>().toEqualTypeOf<ExportRequest>();
    expectTypeOf<Extract<WorkerResponse, { type: 'exported' }>>().toEqualTypeOf<ExportedResponse>();
    expectTypeOf<Extract<WorkerRequest, { type: 'generate' }>>().toEqualTypeOf<GenerateRequest>();
    expectTypeOf<Extract<WorkerRequest, { type: 'cancel' }>>().toEqualTypeOf<CancelRequest>();
    expectTypeOf<Extract<WorkerResponse, { type: 'error' }>>().toEqualTypeOf<ErrorResponse>();
    expectTypeOf<Extract<WorkerResponse, { type: 'generated' }>>().toEqualTypeOf<GeneratedResponse>();
    expectTypeOf<Extract<WorkerResponse, { type: 'ready' }>>().toEqualTypeOf<ReadyResponse>();
  });

  it('puts id and protocolVersion on every message', () => {
    expectTypeOf<WorkerRequest['id']>().toEqualTypeOf<number>();
    expectTypeOf<WorkerResponse['id']>().toEqualTypeOf<number>();
    expectTypeOf<WorkerRequest['protocolVersion']>().toEqualTypeOf<typeof PROTOCOL_VERSION>();
    expectTypeOf<WorkerResponse['protocolVersion']>().toEqualTypeOf<typeof PROTOCOL_VERSION>();
  });

  it('shapes errors as {type, id, code, message} with the DspError codes', () => {
    expectTypeOf<ErrorResponse['type']>().toEqualTypeOf<'error'>();
    expectTypeOf<ErrorResponse['code']>().toEqualTypeOf<DspErrorCode>();
    expectTypeOf<ErrorResponse['message']>().toEqualTypeOf<string>();
    expectTypeOf<ErrorResponse>().toHaveProperty('details');
  });

  it('answers a generate request with a waveform or an error', () => {
    expectTypeOf<ResponseFor<GenerateRequest>>().toEqualTypeOf<GeneratedResponse | ErrorResponse>();
    expectTypeOf<GenerateRequest['config']>().toBeUnknown();
    expectTypeOf<GeneratedResponse['config']>().toEqualTypeOf<WaveformConfig>();
  });

  it('answers an export request with the files (data moved as a buffer) or an error', () => {
    expectTypeOf<ResponseFor<ExportRequest>>().toEqualTypeOf<ExportedResponse | ErrorResponse>();
    expectTypeOf<ExportedResponse['data']>().toEqualTypeOf<ArrayBuffer>();
    expectTypeOf<ExportedResponse['report']>().toEqualTypeOf<ExportReport>();
    expectTypeOf<ExportRequest['options']>().toBeUnknown();
  });

  it('moves every typed array of the waveform as an ArrayBuffer and clones the rest', () => {
    expectTypeOf<WaveformBufferKey>().toEqualTypeOf<'waveformIq' | 'gridIq' | 'gridKinds' | 'dataSymbolsIq' | 'bits'>();
    expectTypeOf<WaveformBufferKey>().toEqualTypeOf<TypedArrayKeys<GeneratedWaveform>>();
    expectTypeOf<WaveformBuffers['waveformIq']>().toEqualTypeOf<ArrayBuffer>();
    expectTypeOf<TypedArrayKeys<WaveformMeta>>().toBeNever();
    expectTypeOf<WaveformMeta>().not.toHaveProperty('plan');
    expectTypeOf<EngineWaveform['waveformIq']>().toEqualTypeOf<GeneratedWaveform['waveformIq']>();
    expectTypeOf<keyof EngineWaveform>().toEqualTypeOf<Exclude<keyof GeneratedWaveform, 'plan'> | 'summary'>();
  });
});

describe('protocol guards', () => {
  const envelope = { id: 3, protocolVersion: PROTOCOL_VERSION };

  it('repeats the engine’s resource-element kinds exactly', () => {
    expect(GRID_KIND).toEqual({ empty: RE_EMPTY, data: RE_DATA, reference: RE_REFERENCE });
  });

  it('lists one view constructor per transferred buffer', () => {
    expect([...waveformBufferKeys].sort()).toEqual(['bits', 'dataSymbolsIq', 'gridIq', 'gridKinds', 'waveformIq']);
  });

  it('accepts well-formed requests and rejects others', () => {
    expect(isWorkerRequest({ ...envelope, type: 'generate', config: {} })).toBe(true);
    expect(isWorkerRequest({ ...envelope, type: 'cancel', targetId: 2 })).toBe(true);
    expect(isWorkerRequest({ ...envelope, type: 'export', config: {}, options: {} })).toBe(true);
    expect(isWorkerRequest({ ...envelope, type: 'cancel' })).toBe(false);
    expect(isWorkerRequest({ ...envelope, type: 'explode' })).toBe(false);
    expect(isWorkerRequest({ type: 'generate', config: {} })).toBe(false);
    expect(isWorkerRequest({ ...envelope, id: '3', type: 'generate' })).toBe(false);
    expect(isWorkerRequest(null)).toBe(false);
    expect(isWorkerRequest('generate')).toBe(false);
  });

  it('accepts known responses only', () => {
    expect(isWorkerResponse({ ...envelope, type: 'ready' })).toBe(true);
    expect(isWorkerResponse({ ...envelope, type: 'error', code: 'INTERNAL', message: 'x' })).toBe(true);
    expect(isWorkerResponse({ ...envelope, type: 'progress' })).toBe(false);
    expect(isWorkerResponse(undefined)).toBe(false);
  });
});
