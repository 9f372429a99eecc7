/**
 * Bare fft.js timing, in its own worker thread so its JIT feedback stays separate: fft.js runs markedly slower
 * once one isolate has fed it both plain arrays (its own createComplexArray) and Float64Arrays (the engine's).
 * Here fft.js is used as its README shows: `new FFT(n)`, `createComplexArray()` buffers, `transform(out, data)`.
 * Each message { size } is answered with the best µs per transform of a short measurement.
 */
import { parentPort } from 'node:worker_threads';
import FFT from 'fft.js';
import { bestMicros } from './timing';

parentPort!.on('message', ({ size }: { size: number }) => {
  const f = new FFT(size);
  const data = f.createComplexArray() as number[];
  for (let i = 0; i < data.length; i++) data[i] = Math.sin(0.37 * i) + Math.cos(1.3 * i * i);
  const out = f.createComplexArray() as number[];
  parentPort!.postMessage(bestMicros(() => f.transform(out, data)));
});
parentPort!.postMessage('ready');
