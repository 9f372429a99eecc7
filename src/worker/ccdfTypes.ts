/**
 * Payloads of the Monte-Carlo statistics requests (power CCDF, per-symbol PAPR, cubic metric) between worker and
 * page: the measurement engine's own results (src/dsp/montecarlo), histogram counts as transferable buffers. Types only.
 */
import type { BlockRecord } from '../dsp/montecarlo/blockMeasurer';
import type { MeasureReport } from '../dsp/montecarlo/measureReport';

/** What a Monte-Carlo run is: as `crestline measure --symbols --seed --block-symbols --precision` takes it. */
export interface CcdfRunSpec {
  symbols: number;
  /** Run seed (default: the configuration's random-data seed, else 1). */
  seed?: number;
  blockSymbols?: number;
  precision?: 'f64' | 'f32';
}

/** One histogram of a run (0.01 dB bins, src/dsp/metrics/dbHistogram.ts) with its counts as a buffer. */
export interface HistogramPayload<TBuffer = ArrayBuffer> {
  minCentiDb: number;
  maxCentiDb: number;
  numBins: number;
  counts: TBuffer;
}

/** The three histograms of a run (blockMeasurer.ts HistogramSet). */
export interface HistogramSetPayload<TBuffer = ArrayBuffer> {
  paprRunMean: HistogramPayload<TBuffer>;
  paprSymbolMean: HistogramPayload<TBuffer>;
  power: HistogramPayload<TBuffer>;
}

/** A CCDF curve: P(X ≥ threshold) at each threshold (src/dsp/metrics/ccdfLevels.ts ccdfCurve). */
export interface CurvePayload<TBuffer = ArrayBuffer> {
  thresholdDb: TBuffer;
  probability: TBuffer;
}

/** The report of a run and the curves to plot. */
export interface CcdfReportPayload<TBuffer = ArrayBuffer> {
  report: MeasureReport;
  /** Blocks the report covers. */
  numBlocks: number;
  curves: { power: CurvePayload<TBuffer>; paprRunMean: CurvePayload<TBuffer>; paprSymbolMean: CurvePayload<TBuffer> };
  /** Theory for OFDM with N data subcarriers: power e^−γ (complex Gaussian), PAPR at α = 1 and α = 2.8 (van Nee & Prasad). */
  theory: { power: CurvePayload<TBuffer>; paprNyquist: CurvePayload<TBuffer>; paprOversampled: CurvePayload<TBuffer> };
  /** The f32 FFT backend used, or null (f64). */
  f32Backend: string | null;
}

export type { BlockRecord };
