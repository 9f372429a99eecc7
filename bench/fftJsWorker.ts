/**
 * Bare fft.js timing, in its own worker thread so its JIT feedback stays separate: fft.js runs markedly slower
 * once one isolate has fed it both plain arrays (its own createComplexArray) and Float64Arrays (the engine's).
 * Here fft.js is used as its README shows: `new FFT(n)`, `createComplexArray()` buffers, `transform(out, data)`.
 */
import { parentPort, workerData } from 'node:worker_threads';
import FFT from 'fft.js';
import { bestMicros } from './timing';

const sizes = (workerData as { sizes: number[] }).sizes;
const micros: Record<number, number> = {};
for (const n of sizes) {
  const f = new FFT(n);
  const data = f.createComplexArray() as number[];
  for (let i = 0; i < data.length; i++) data[i] = Math.sin(0.37 * i) + Math.cos(1.3 * i * i);
  const out = f.createComplexArray() as number[];
  micros[n] = bestMicros(() => f.transform(out, data), 15, 25);
}
parentPort!.postMessage(micros);
