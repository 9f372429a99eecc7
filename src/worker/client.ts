/**
 * Promise API over the engine worker, for the page (src/ui) and later a worker pool.
 *
 * - `generate(config)` resolves with the validated configuration and the waveform (EngineWaveform:
 *   GeneratedWaveform with a plan summary), its typed arrays viewed again over the transferred buffers.
 * - The newest request wins: a new `generate` settles the previous one with SupersededError
 *   (callers ignore it) and tells the worker to drop it if it has not started.
 * - Engine failures reject with a DspError rebuilt from `{type: "error", code, message}`:
 *   a class does not survive structured cloning, so it is rebuilt here.
 * - A worker that crashes is terminated and replaced; pending requests reject with an INTERNAL
 *   DspError that says so, and `onRestart` reports it to the page.
 */
import type { WaveformConfig } from '../config/schema';
import { DspError } from '../dsp/errors';
import {
  isWorkerResponse,
  PROTOCOL_VERSION,
  waveformBufferKeys,
  waveformBufferViews,
  type EngineWaveform,
  type GeneratedResponse,
  type WorkerRequest,
} from './protocol';

/** The part of a Worker the client uses (a test passes a fake). */
export interface WorkerLike {
  postMessage(message: WorkerRequest, transfer: Transferable[]): void;
  terminate(): void;
  onmessage: ((event: MessageEvent) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
  onmessageerror: ((event: MessageEvent) => void) | null;
}

export interface EngineResult {
  requestId: number;
  /** The configuration after validation, defaults applied. */
  config: WaveformConfig;
  waveform: EngineWaveform;
  /** Worker time for validation and generation, milliseconds. */
  elapsedMs: number;
}

export interface EngineRestartNotice {
  /** What the browser said about the crash. */
  reason: string;
  /** Requests that were in flight and have been rejected. */
  failedRequestIds: number[];
  /** Crashes so far in this client. */
  restartCount: number;
}

export interface EngineClientOptions {
  /** Defaults to the module worker in engine.worker.ts. */
  createWorker?: () => WorkerLike;
  onRestart?: (notice: EngineRestartNotice) => void;
}

export interface EngineClient {
  generate(config: unknown): Promise<EngineResult>;
  /** Terminates the worker; pending requests settle with SupersededError. */
  dispose(): void;
}

/** A request overtaken by a newer one (or by dispose); not a failure to show. */
export class SupersededError extends Error {
  override readonly name = 'SupersededError';
  constructor(readonly requestId: number) {
    super(`Engine request ${requestId} was superseded by a newer request.`);
  }
}

export function isSuperseded(error: unknown): error is SupersededError {
  return error instanceof SupersededError;
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

interface Pending {
  resolve(result: EngineResult): void;
  reject(error: unknown): void;
}

export function createEngineClient(options: EngineClientOptions = {}): EngineClient {
  const createWorker = options.createWorker ?? createModuleWorker;
  const pending = new Map<number, Pending>();
  let worker: WorkerLike | null = null;
  let workerReady = false;
  let nextId = 1;
  let newestGenerateId = 0;
  let restartCount = 0;

  const rejectAll = (makeError: (id: number) => unknown): number[] => {
    const ids = [...pending.keys()];
    for (const id of ids) {
      pending.get(id)?.reject(makeError(id));
      pending.delete(id);
    }
    return ids;
  };

  const settle = (data: unknown): void => {
    if (!isWorkerResponse(data)) {
      rejectAll(() => new DspError('INTERNAL', 'The engine worker sent a message the page does not understand.'));
      return;
    }
    if (data.protocolVersion !== PROTOCOL_VERSION) {
      const message = `The engine worker speaks protocol v${String(data.protocolVersion)} but the page speaks v${PROTOCOL_VERSION}; reload the page.`;
      rejectAll(() => new DspError('INTERNAL', message));
      return;
    }
    if (data.type === 'ready') {
      workerReady = true;
      return;
    }
    const entry = pending.get(data.id);
    if (entry === undefined) return; // superseded: already settled
    pending.delete(data.id);
    if (data.type === 'error') {
      entry.reject(new DspError(data.code, data.message, data.details));
      return;
    }
    entry.resolve({ requestId: data.id, config: data.config, waveform: rebuildWaveform(data), elapsedMs: data.elapsedMs });
  };

  const handleCrash = (reason: string): void => {
    const loadedBeforeCrash = workerReady;
    worker?.terminate();
    worker = null;
    workerReady = false;
    restartCount += 1;
    const failedRequestIds = rejectAll(
      (id) =>
        new DspError(
          'INTERNAL',
          `The engine worker crashed (${reason}) while working on request ${id}. A fresh worker has been started; run the request again.`,
        ),
    );
    // A worker that crashed before it was ready (e.g. its script failed to load) would crash again at once:
    // start the next one only when a request needs it.
    if (loadedBeforeCrash) ensureWorker();
    options.onRestart?.({ reason, failedRequestIds, restartCount });
  };

  function ensureWorker(): WorkerLike {
    if (worker !== null) return worker;
    const created = createWorker();
    created.onmessage = (event) => settle(event.data);
    created.onerror = (event) => {
      event.preventDefault?.();
      handleCrash(event.message || 'the worker script failed or threw outside a request');
    };
    created.onmessageerror = () =>
      rejectAll(() => new DspError('INTERNAL', 'A message from the engine worker could not be read (structured clone failed).'));
    worker = created;
    return created;
  }

  const generate = (config: unknown): Promise<EngineResult> => {
    const target = ensureWorker();
    const previous = pending.get(newestGenerateId);
    if (previous !== undefined) {
      pending.delete(newestGenerateId);
      previous.reject(new SupersededError(newestGenerateId));
      target.postMessage({ type: 'cancel', id: nextId++, protocolVersion: PROTOCOL_VERSION, targetId: newestGenerateId }, []);
    }
    const id = nextId++;
    newestGenerateId = id;
    return new Promise<EngineResult>((resolve, reject) => {
      pending.set(id, { resolve, reject });
      try {
        target.postMessage({ type: 'generate', id, protocolVersion: PROTOCOL_VERSION, config }, []);
      } catch (error) {
        pending.delete(id);
        const reason = error instanceof Error ? error.message : String(error);
        reject(
          new DspError(
            'INVALID_CONFIG',
            `The configuration could not be sent to the engine: it must be plain JSON data (${reason}).`,
          ),
        );
      }
    });
  };

  const dispose = (): void => {
    worker?.terminate();
    worker = null;
    rejectAll((id) => new SupersededError(id));
  };

  return { generate, dispose };
}
