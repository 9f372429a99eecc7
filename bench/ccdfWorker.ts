/**
 * Bench worker (Node worker_threads): runs the statistics power source and the per-symbol PAPR histogram for a
 * fixed wall time and reports how many symbols it finished. Block b uses seed deriveBlockSeed(runSeed, b); worker w
 * of W takes blocks w, w + W, w + 2W, …, as a Monte-Carlo run would.
 */
import { parentPort } from 'node:worker_threads';
import { parseWaveformConfig } from '../src/config/configParse';
import { deriveBlockSeed } from '../src/dsp/data/rng';
import { loadF32Fft } from '../src/dsp/fft/f32Fft';
import { createPowerSource, type PowerSource } from '../src/dsp/stats/powerSource';
import { createWaveformPlan } from '../src/dsp/waveform/waveformPlan';
import { accumulatePaprHistogram, NUM_BINS } from './paprHistogram';

export interface CcdfJob {
  config: unknown;
  precision: 'f64' | 'f32';
  durationMs: number;
  symbolsPerBlock: number;
  runSeed: number;
  /** This worker's share: blocks workerIndex, workerIndex + numWorkers, … */
  workerIndex: number;
  numWorkers: number;
}

export interface CcdfJobResult {
  symbols: number;
  elapsedMs: number;
  histogram: Float64Array;
  backend: string | null;
}

const loaded = await loadF32Fft([() => import('@echogarden/pffft-wasm/simd'), () => import('@echogarden/pffft-wasm')]);
const sources = new Map<string, PowerSource>();

function run(job: CcdfJob): CcdfJobResult {
  const key = JSON.stringify([job.config, job.precision]);
  let source = sources.get(key);
  if (!source) {
    source = createPowerSource(createWaveformPlan(parseWaveformConfig(job.config)), { precision: job.precision });
    sources.set(key, source);
  }
  const power = new Float32Array(job.symbolsPerBlock * source.samplesPerSymbol);
  const histogram = new Float64Array(NUM_BINS);
  const start = performance.now();
  let symbols = 0;
  for (let block = job.workerIndex; performance.now() - start < job.durationMs; block += job.numWorkers) {
    source.fillSymbolPowers(deriveBlockSeed(job.runSeed, block), 0, job.symbolsPerBlock, power);
    accumulatePaprHistogram(power, source.samplesPerSymbol, job.symbolsPerBlock, histogram);
    symbols += job.symbolsPerBlock;
  }
  return { symbols, elapsedMs: performance.now() - start, histogram, backend: loaded.backend };
}

parentPort!.on('message', (job: CcdfJob) => {
  const result = run(job);
  parentPort!.postMessage(result, [result.histogram.buffer as ArrayBuffer]);
});
parentPort!.postMessage({ ready: true, backend: loaded.backend });
