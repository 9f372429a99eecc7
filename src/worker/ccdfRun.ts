/**
 * A long Monte-Carlo statistics run spread over the worker pool (page side; bookkeeping only, no DSP).
 *
 * The run's blocks (src/dsp/montecarlo/runPlan.ts: block b draws its data from a seed derived from the run seed and
 * b) are handed out a few at a time as background requests; each worker keeps its own counts for the run (a lane)
 * and answers with the blocks' records and a snapshot of its counts. Every `mergeIntervalMs` — and at the end — a
 * worker merges the lanes' latest snapshots and all records into a report (the engine's exact merge), which is
 * streamed to the page as a partial result. Results therefore do not depend on how many workers ran which blocks,
 * and equal `crestline measure` with the same symbols, seed, block size and precision.
 * Cancel stops handing out blocks and drops what is queued; a worker that crashes has its blocks handed out again.
 */
import { DspError } from '../dsp/errors';
import { DEFAULT_BLOCK_SYMBOLS } from '../dsp/montecarlo/runPlan';
import type { BlockRecord, CcdfRunSpec, HistogramSetPayload } from './ccdfTypes';
import { isSuperseded, type CcdfResult, type EngineClient } from './client';

export interface CcdfRunProgress {
  /** Symbols done / symbols to do, 0…1. */
  fraction: number;
  symbolsDone: number;
  symbolsTotal: number;
  elapsedSeconds: number;
  /** Null until the first blocks are in. */
  symbolsPerSecond: number | null;
  secondsLeft: number | null;
}

export interface CcdfRunCallbacks {
  onProgress?(progress: CcdfRunProgress): void;
  /** A merged report of the blocks done so far (the last one covers the whole run). */
  onPartial?(result: CcdfResult): void;
}

export interface CcdfRunOptions {
  config: unknown;
  run: CcdfRunSpec;
  /** Blocks per request (default 2: a few hundred milliseconds per request at LTE 20 MHz). */
  blocksPerTask?: number;
  /** Requests in flight (default: pool size + 1, so no worker waits for the next one). */
  concurrency?: number;
  /** Least time between partial reports, ms (default 600). */
  mergeIntervalMs?: number;
  /** Milliseconds from a monotonic clock. */
  now?: () => number;
  /** Tries per block group after a worker crash (default 2). */
  maxAttempts?: number;
}

export interface CcdfRunHandle {
  readonly runKey: string;
  /** Stops the run: no more blocks; `done` resolves with null. */
  cancel(): void;
  /** The final report, null when cancelled; rejects with the engine's error. */
  readonly done: Promise<CcdfResult | null>;
}

let runCounter = 0;

export function startCcdfRun(client: EngineClient, options: CcdfRunOptions, callbacks: CcdfRunCallbacks = {}): CcdfRunHandle {
  const now = options.now ?? (() => performance.now());
  const blockSymbols = options.run.blockSymbols ?? DEFAULT_BLOCK_SYMBOLS;
  const numBlocks = Math.ceil(options.run.symbols / blockSymbols);
  const perTask = Math.max(1, options.blocksPerTask ?? 2);
  const concurrency = Math.max(1, options.concurrency ?? client.pool.size + 1);
  const mergeIntervalMs = options.mergeIntervalMs ?? 600;
  const maxAttempts = options.maxAttempts ?? 2;
  runCounter += 1;
  const runKey = `ccdf-run-${runCounter}-${Math.round(now())}`;

  const queue: { blocks: number[]; attempts: number }[] = [];
  for (let b = 0; b < numBlocks; b += perTask) queue.push({ blocks: Array.from({ length: Math.min(perTask, numBlocks - b) }, (_, i) => b + i), attempts: 0 });
  const lanes = new Map<string, HistogramSetPayload>();
  const records: BlockRecord[] = [];
  const activeLanes = new Set<string>();
  const started = now();
  let symbolsDone = 0;
  let inFlight = 0;
  let taskCounter = 0;
  let stopped = false;
  let lastMergeAt = -Infinity;
  let mergeScheduled: ReturnType<typeof setTimeout> | null = null;
  let finalMergeSent = false;

  let resolveDone!: (result: CcdfResult | null) => void;
  let rejectDone!: (error: unknown) => void;
  const done = new Promise<CcdfResult | null>((resolve, reject) => {
    resolveDone = resolve;
    rejectDone = reject;
  });

  const progress = (): CcdfRunProgress => {
    const elapsedSeconds = (now() - started) / 1000;
    const rate = elapsedSeconds > 0 && symbolsDone > 0 ? symbolsDone / elapsedSeconds : null;
    return {
      fraction: options.run.symbols > 0 ? Math.min(1, symbolsDone / options.run.symbols) : 1,
      symbolsDone,
      symbolsTotal: options.run.symbols,
      elapsedSeconds,
      symbolsPerSecond: rate,
      secondsLeft: rate === null ? null : (options.run.symbols - symbolsDone) / rate,
    };
  };

  const stop = (): void => {
    stopped = true;
    if (mergeScheduled !== null) clearTimeout(mergeScheduled);
    for (const lane of activeLanes) client.pool.cancelLane(lane);
    activeLanes.clear();
  };

  const fail = (error: unknown): void => {
    if (stopped) return;
    stop();
    rejectDone(error);
  };

  const merge = (final: boolean): void => {
    if (stopped || records.length === 0) return;
    lastMergeAt = now();
    const lane = `${runKey}:merge`;
    activeLanes.add(lane);
    client.ccdfMerge(options.config, options.run, [...lanes.values()], [...records], { lane, priority: final ? 'interactive' : 'background' }).then(
      (result) => {
        if (stopped) return;
        callbacks.onPartial?.(result);
        if (final) {
          stopped = true;
          activeLanes.clear();
          resolveDone(result);
        }
      },
      (error: unknown) => {
        if (!isSuperseded(error)) fail(error);
      },
    );
  };

  const maybeMerge = (): void => {
    const allDone = records.length === numBlocks;
    if (allDone) {
      if (!finalMergeSent) {
        finalMergeSent = true;
        if (mergeScheduled !== null) clearTimeout(mergeScheduled);
        merge(true);
      }
      return;
    }
    if (mergeScheduled !== null) return;
    const wait = Math.max(0, lastMergeAt + mergeIntervalMs - now());
    mergeScheduled = setTimeout(() => {
      mergeScheduled = null;
      merge(false);
    }, wait);
  };

  const pump = (): void => {
    while (!stopped && inFlight < concurrency && queue.length > 0) {
      const task = queue.shift()!;
      task.attempts += 1;
      const lane = `${runKey}:task:${taskCounter++}`;
      activeLanes.add(lane);
      inFlight += 1;
      client.ccdfLane(options.config, options.run, task.blocks, runKey, { lane, priority: 'background' }).then(
        (result) => {
          inFlight -= 1;
          activeLanes.delete(lane);
          if (stopped) return;
          lanes.set(result.laneId, result.lane);
          records.push(...result.records);
          for (const r of result.records) symbolsDone += r.numSymbols;
          callbacks.onProgress?.(progress());
          maybeMerge();
          pump();
        },
        (error: unknown) => {
          inFlight -= 1;
          activeLanes.delete(lane);
          if (stopped || isSuperseded(error)) return;
          // A crashed worker loses only the blocks it was measuring (its earlier snapshot stays valid): hand them out again.
          const crashed = error instanceof DspError && error.code === 'INTERNAL' && /crashed/.test(error.message);
          if (crashed && task.attempts < maxAttempts) {
            queue.unshift(task);
            pump();
            return;
          }
          fail(error);
        },
      );
    }
  };

  // Report the start after the caller has the handle (callbacks may refer to it).
  queueMicrotask(() => {
    if (!stopped) callbacks.onProgress?.(progress());
  });
  pump();
  return {
    runKey,
    cancel: () => {
      if (stopped) return;
      stop();
      resolveDone(null);
    },
    done,
  };
}
