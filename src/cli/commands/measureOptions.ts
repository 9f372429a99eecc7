import { availableParallelism } from 'node:os';
import { DspError } from '../../dsp/errors';
import { SPECTRAL_WINDOWS, type SpectralWindowKind } from '../../dsp/metrics/spectralWindows';
import type { PaprMeanDefinition, ReportOptions } from '../../dsp/montecarlo/measureReport';
import type { ShardSpec } from '../../dsp/montecarlo/runPlan';

/** Default number of random symbols for the statistics: 1e-3 well resolved, 1e-4 needs --symbols 100000. */
export const DEFAULT_MEASURE_SYMBOLS = 20000;

/** Options shared by `measure` and `merge` that only change how the counts are reported. */
export interface ReportFlags {
  paprMean?: string;
  cmSlope?: string;
  cmRound?: boolean;
  fullScale?: string;
}

export function parseReportOptions(flags: ReportFlags): ReportOptions {
  const paprMean = flags.paprMean ?? 'run';
  if (paprMean !== 'run' && paprMean !== 'symbol') {
    throw new DspError('INVALID_CONFIG', `--papr-mean must be "run" (peak / whole-run mean) or "symbol" (peak / that symbol's mean); got "${paprMean}".`, {
      field: 'paprMean',
    });
  }
  return {
    paprMean: paprMean as PaprMeanDefinition,
    cubicMetric: { slope: parsePositive(flags.cmSlope ?? '1.56', '--cm-slope'), roundUpToHalfDb: Boolean(flags.cmRound) },
    fullScale: flags.fullScale === undefined ? undefined : parsePositive(flags.fullScale, '--full-scale'),
  };
}

/** A whole number from an option, with a message naming the option and the range. */
export function parseWholeNumber(text: string, option: string, min: number, max: number): number {
  const value = Number(text);
  if (!/^\s*\d+\s*$/.test(text) || !Number.isSafeInteger(value) || value < min || value > max) {
    throw new DspError('INVALID_CONFIG', `${option} must be a whole number from ${min} to ${max}; got "${text}".`, { field: option });
  }
  return value;
}

export function parsePositive(text: string, option: string): number {
  const value = Number(text);
  if (text.trim() === '' || !Number.isFinite(value) || value <= 0) {
    throw new DspError('INVALID_CONFIG', `${option} must be a positive number; got "${text}".`, { field: option });
  }
  return value;
}

/** "--shard k/n" → {index k, count n}. */
export function parseShard(text: string): ShardSpec {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const index = m ? Number(m[1]) : Number.NaN;
  const count = m ? Number(m[2]) : Number.NaN;
  if (!m || index < 1 || count < 1 || index > count) {
    throw new DspError('INVALID_CONFIG', `--shard must be k/n with whole numbers 1 ≤ k ≤ n (e.g. 2/8); got "${text}".`, { field: 'shard' });
  }
  return { index, count };
}

export function parseWindow(text: string): SpectralWindowKind {
  if (!(SPECTRAL_WINDOWS as readonly string[]).includes(text)) {
    throw new DspError('INVALID_CONFIG', `--window must be one of ${SPECTRAL_WINDOWS.join(', ')}; got "${text}".`, { field: 'window' });
  }
  return text as SpectralWindowKind;
}

export function parsePrecision(text: string): 'f64' | 'f32' {
  if (text !== 'f64' && text !== 'f32') throw new DspError('INVALID_CONFIG', `--precision must be "f64" or "f32"; got "${text}".`, { field: 'precision' });
  return text;
}

/** Worker threads by default: one per core the OS offers us. */
export function defaultWorkerCount(): number {
  return Math.max(1, availableParallelism());
}
