import { DspError } from '../errors';
import type { BlockMeasurer, BlockRecord, HistogramSet } from './blockMeasurer';
import { blockSymbolCount, type MonteCarloRun } from './runPlan';
import { addBlockRecord, addHistogramSet, createRunStats, type RunStats } from './runStats';

/**
 * One place blocks run: the calling thread (createInlineLane), a Node worker thread (src/cli/parallel) or, later,
 * a Web Worker. A lane keeps its own histograms and hands them over once, at the end.
 */
export interface MonteCarloLane {
  runBlock(blockIndex: number): Promise<BlockRecord>;
  takeHistograms(): Promise<HistogramSet>;
}

/** Progress after each finished block. Rates need a clock; without one they are null. */
export interface MonteCarloProgress {
  /** Symbols done / symbols to do, 0…1. */
  readonly fraction: number;
  readonly symbolsDone: number;
  readonly symbolsTotal: number;
  readonly elapsedSeconds: number | null;
  readonly symbolsPerSecond: number | null;
  /** Estimated from the rate so far. */
  readonly secondsLeft: number | null;
}

/** Cancel, progress, clock and yielding for `runMonteCarloBlocks`. */
export interface RunBlocksOptions {
  /** Cancels the run: the promise rejects with `signal.reason` and no more blocks start. */
  readonly signal?: AbortSignal | undefined;
  readonly onProgress?: ((progress: MonteCarloProgress) => void) | undefined;
  /** Milliseconds from any origin (performance.now in the caller); src/dsp reads no clock itself. */
  readonly clock?: (() => number) | undefined;
  /** Awaited between blocks on inline lanes so that the caller's event loop (and an abort) can run. */
  readonly yieldBetweenBlocks?: (() => Promise<void>) | undefined;
}

/**
 * Runs `blockIndices` of `run` on `lanes`, each lane taking the next unstarted block when it finishes one (so fast
 * lanes do more), then merges every lane's histograms. The result is the same for any number of lanes: blocks
 * carry their own seeds, histograms add exactly, and totals are summed in block order (runStats.ts).
 */
export async function runMonteCarloBlocks(
  lanes: readonly MonteCarloLane[],
  run: MonteCarloRun,
  blockIndices: readonly number[],
  options: RunBlocksOptions = {},
): Promise<RunStats> {
  if (lanes.length === 0) throw new DspError('INTERNAL', 'runMonteCarloBlocks needs at least one lane.');
  const { signal, onProgress, clock, yieldBetweenBlocks } = options;
  const stats = createRunStats();
  const symbolsTotal = blockIndices.reduce((s, b) => s + blockSymbolCount(run, b), 0);
  const started = clock?.();
  let symbolsDone = 0;
  let next = 0;
  let stopped = false;

  const report = (): void => {
    if (!onProgress) return;
    const elapsedSeconds = started === undefined || !clock ? null : (clock() - started) / 1000;
    const rate = elapsedSeconds !== null && elapsedSeconds > 0 && symbolsDone > 0 ? symbolsDone / elapsedSeconds : null;
    onProgress({
      fraction: symbolsTotal > 0 ? symbolsDone / symbolsTotal : 1,
      symbolsDone,
      symbolsTotal,
      elapsedSeconds,
      symbolsPerSecond: rate,
      secondsLeft: rate !== null && rate > 0 ? (symbolsTotal - symbolsDone) / rate : null,
    });
  };

  const laneLoop = async (lane: MonteCarloLane): Promise<void> => {
    while (!stopped && next < blockIndices.length) {
      if (signal?.aborted) return;
      const blockIndex = blockIndices[next++]!;
      const record = await lane.runBlock(blockIndex);
      if (stopped || signal?.aborted) return;
      addBlockRecord(stats, record);
      symbolsDone += record.numSymbols;
      report();
      if (yieldBetweenBlocks) await yieldBetweenBlocks();
    }
  };

  let onAbort: (() => void) | undefined;
  const aborted = new Promise<never>((_, reject) => {
    if (!signal) return;
    onAbort = () => reject(abortReason(signal));
    if (signal.aborted) onAbort();
    else signal.addEventListener('abort', onAbort, { once: true });
  });
  aborted.catch(() => undefined);
  try {
    report();
    await Promise.race([Promise.all(lanes.map(laneLoop)), aborted]);
    if (signal?.aborted) throw abortReason(signal);
    for (const lane of lanes) addHistogramSet(stats, await Promise.race([lane.takeHistograms(), aborted]));
  } finally {
    stopped = true;
    if (signal && onAbort) signal.removeEventListener('abort', onAbort);
  }
  return stats;
}

/** A lane on the calling thread, around a BlockMeasurer. */
export function createInlineLane(measurer: BlockMeasurer): MonteCarloLane {
  return {
    runBlock: (blockIndex) => Promise.resolve().then(() => measurer.measureBlock(blockIndex)),
    takeHistograms: () => Promise.resolve(measurer.histograms),
  };
}

function abortReason(signal: AbortSignal): unknown {
  return signal.reason ?? new Error('The Monte-Carlo run was cancelled.');
}
