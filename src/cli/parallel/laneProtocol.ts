import type { BlockRecord } from '../../dsp/montecarlo/blockMeasurer';
import type { MeasurementSetup } from '../../dsp/montecarlo/measurementSetup';

/** Messages between the CLI and a Monte-Carlo worker thread (structured-cloned; histogram buffers transferred). */
export type ToLaneWorker =
  | { readonly type: 'init'; readonly setup: MeasurementSetup }
  | { readonly type: 'block'; readonly blockIndex: number }
  | { readonly type: 'take' };

export interface TransferredHistogram {
  readonly minCentiDb: number;
  readonly maxCentiDb: number;
  readonly numBins: number;
  readonly counts: Float64Array;
}

export type FromLaneWorker =
  | { readonly type: 'ready'; readonly f32Backend: string | null }
  | { readonly type: 'record'; readonly record: BlockRecord }
  | {
      readonly type: 'histograms';
      readonly paprRunMean: TransferredHistogram;
      readonly paprSymbolMean: TransferredHistogram;
      readonly power: TransferredHistogram;
    }
  | { readonly type: 'error'; readonly code: string; readonly message: string };
