/// <reference lib="webworker" />
/**
 * Module Web Worker entry point for the waveform engine. All message handling lives in
 * engineDispatch.ts (testable under Node); this file only wires it to the worker's global scope.
 * Started by client.ts with `new Worker(new URL("./engine.worker.ts", import.meta.url), { type: "module" })`.
 */
import { loadF32Fft } from '../dsp/fft/f32Fft';
import { createEngineDispatcher } from './engineDispatch';
import { PROTOCOL_VERSION, READY_ID, type ReadyResponse } from './protocol';

declare const self: DedicatedWorkerGlobalScope;

const dispatch = createEngineDispatcher({
  post: (message, transfer) => self.postMessage(message, transfer),
  schedule: (task) => setTimeout(task, 0),
  now: () => performance.now(),
  laneId: crypto.randomUUID(),
});

// The single-precision FFT for Monte-Carlo statistics (PFFFT WebAssembly, SIMD build first). Until it has loaded,
// or if it cannot, f32 requests run on the f64 transforms and their reports say so.
void loadF32Fft([() => import('@echogarden/pffft-wasm/simd'), () => import('@echogarden/pffft-wasm')]);

self.onmessage = (event: MessageEvent<unknown>) => dispatch(event.data);

const ready: ReadyResponse = { type: 'ready', id: READY_ID, protocolVersion: PROTOCOL_VERSION };
self.postMessage(ready);
