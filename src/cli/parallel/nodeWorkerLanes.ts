import { Worker } from 'node:worker_threads';
import { DspError, type DspErrorCode } from '../../dsp/errors';
import type { BlockRecord, HistogramSet } from '../../dsp/montecarlo/blockMeasurer';
import type { MeasurementSetup } from '../../dsp/montecarlo/measurementSetup';
import type { MonteCarloLane } from '../../dsp/montecarlo/runScheduler';
import type { FromLaneWorker, ToLaneWorker } from './laneProtocol';

/** A set of worker-thread lanes; `close` terminates the threads (also mid-block, on cancel). */
export interface NodeWorkerLanes {
  readonly lanes: readonly MonteCarloLane[];
  /** Resolves when every worker has its plan. */
  readonly ready: Promise<void>;
  close(): Promise<void>;
}

const BOOTSTRAP = new URL('./laneWorkerBootstrap.mjs', import.meta.url);

/**
 * Starts `count` worker threads, each building its own power source from `setup` (and loading the f32 backend for
 * an f32 setup, which must come out as `f32Backend`, the one the main thread loaded). Each lane handles one request at a
 * time (the scheduler awaits every block), so a single pending slot per worker suffices.
 */
export function startNodeWorkerLanes(setup: MeasurementSetup, count: number, f32Backend: string | null = null): NodeWorkerLanes {
  const workers: Worker[] = [];
  const lanes: MonteCarloLane[] = [];
  const readies: Promise<void>[] = [];
  for (let i = 0; i < count; i++) {
    const worker = new Worker(BOOTSTRAP);
    workers.push(worker);
    let pending: { resolve: (m: FromLaneWorker) => void; reject: (e: unknown) => void } | undefined;
    let failure: unknown;
    const fail = (err: unknown): void => {
      failure ??= err;
      pending?.reject(err);
      pending = undefined;
    };
    worker.on('message', (m: FromLaneWorker) => {
      const p = pending;
      pending = undefined;
      if (m.type === 'error') p?.reject(new DspError(m.code as DspErrorCode, m.message));
      else p?.resolve(m);
    });
    worker.on('error', (err) => fail(new DspError('INTERNAL', `Monte-Carlo worker ${i + 1} failed: ${err.message}`)));
    worker.on('exit', (code) => fail(new DspError('INTERNAL', `Monte-Carlo worker ${i + 1} stopped (exit code ${code}).`)));
    const request = (message: ToLaneWorker): Promise<FromLaneWorker> =>
      new Promise((resolve, reject) => {
        if (failure) return reject(failure);
        if (pending) return reject(new DspError('INTERNAL', `Monte-Carlo worker ${i + 1} was sent a second request before answering the first.`));
        pending = { resolve, reject };
        worker.postMessage(message);
      });
    const ready = request({ type: 'init', setup }).then((m) => {
      // Lanes must compute alike: an f32 run needs the same backend in every thread.
      if (m.type === 'ready' && m.f32Backend !== f32Backend) {
        throw new DspError('INTERNAL', `Monte-Carlo worker ${i + 1} loaded f32 backend "${String(m.f32Backend)}", the main thread "${String(f32Backend)}"; lanes would disagree.`);
      }
    });
    // Marked handled here; the rejection still reaches whoever awaits `ready` (runBlock, takeHistograms).
    ready.catch(() => undefined);
    readies.push(ready);
    lanes.push({
      async runBlock(blockIndex): Promise<BlockRecord> {
        await ready;
        const m = await request({ type: 'block', blockIndex });
        if (m.type !== 'record') throw new DspError('INTERNAL', `Worker ${i + 1} answered a block with "${m.type}".`);
        return m.record;
      },
      async takeHistograms(): Promise<HistogramSet> {
        await ready;
        const m = await request({ type: 'take' });
        if (m.type !== 'histograms') throw new DspError('INTERNAL', `Worker ${i + 1} answered for histograms with "${m.type}".`);
        return { paprRunMean: m.paprRunMean, paprSymbolMean: m.paprSymbolMean, power: m.power };
      },
    });
  }
  const allReady = Promise.all(readies).then(() => undefined);
  allReady.catch(() => undefined);
  return {
    lanes,
    ready: allReady,
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}
