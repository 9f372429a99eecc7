import type { WaveformConfig } from '../../config/schema';
import type { SpectrumMeasurement } from '../metrics/spectrumMeasurement';
import type { WaveformPlan } from '../waveform/waveformPlan';
import type { PowerSource } from '../stats/powerSource';
import type { MeasurementSetup } from './measurementSetup';
import type { MonteCarloRun } from './runPlan';

/**
 * What identifies a run: two shard results merge only when these are equal. Plain JSON.
 */
export interface RunIdentity {
  readonly config: WaveformConfig;
  readonly oversampling: number;
  readonly precision: 'f64' | 'f32';
  readonly run: MonteCarloRun;
}

/** Facts about the statistics' waveform the report needs (from the plan and the power source). */
export interface StatisticsFacts {
  readonly waveform: 'ofdm' | 'dft-s-ofdm';
  /** Sample rate of the statistics (oversampling included), Hz. */
  readonly sampleRateHz: number;
  /** Useful-part samples per symbol (fftSize·os). */
  readonly samplesPerSymbol: number;
  /** Exact expected |x|² per sample: the 0 dB reference of the CCDF and of the run-mean PAPR. */
  readonly expectedMeanPower: number;
  /** Data subcarriers per symbol: N of the OFDM theory, and the degrees of freedom per symbol. */
  readonly numDataSubcarriers: number;
}

/** The spectrum part of a measurement as plain JSON (no PSD arrays); ACLR values that are unbounded are null. */
export interface SpectrumSummary {
  readonly oversampling: number;
  readonly sampleRateHz: number;
  readonly symbols: number;
  readonly dataSource: string;
  readonly window: string;
  readonly rbwHz: number;
  readonly segmentLength: number;
  readonly numSegments: number;
  readonly occupiedBandwidthHz: number;
  readonly occupiedLowerHz: number;
  readonly occupiedUpperHz: number;
  readonly aclrMethod: string;
  readonly aclrAssignedFilter: string;
  readonly aclr: readonly {
    readonly key: string;
    readonly label: string;
    readonly offsetHz: number;
    readonly filter: string;
    readonly aclrDb: number | null;
    readonly source: string;
  }[];
  readonly warnings: readonly string[];
}

/** Everything about a measurement except its Monte-Carlo counts; a shard file stores it beside its counts. */
export interface MeasurementContext {
  readonly identity: RunIdentity;
  readonly statistics: StatisticsFacts;
  /** Present in a full run and in shard 1 of a sharded one. */
  readonly spectrum: SpectrumSummary | null;
  readonly warnings: readonly string[];
  readonly notes: readonly string[];
}

/** The identity of the run a setup describes. */
export function runIdentityOf(setup: MeasurementSetup): RunIdentity {
  return { config: setup.config, oversampling: setup.oversampling, precision: setup.precision, run: setup.run };
}

/** Facts about the statistics' waveform, from its plan and power source. */
export function statisticsFactsOf(plan: WaveformPlan, source: PowerSource): StatisticsFacts {
  return {
    waveform: plan.waveform,
    sampleRateHz: plan.sampleRateHz,
    samplesPerSymbol: source.samplesPerSymbol,
    expectedMeanPower: source.expectedMeanPower,
    numDataSubcarriers: plan.dataSymbolsPerOfdmSymbol,
  };
}

/** The JSON summary of a spectrum measurement (unbounded ACLR values become null). */
export function summariseSpectrum(m: SpectrumMeasurement): SpectrumSummary {
  return {
    oversampling: m.oversampling,
    sampleRateHz: m.sampleRateHz,
    symbols: m.symbols,
    dataSource: m.dataSource,
    window: m.psd.window,
    rbwHz: m.psd.rbwHz,
    segmentLength: m.psd.segmentLength,
    numSegments: m.psd.numSegments,
    occupiedBandwidthHz: m.occupiedBandwidth.occupiedBandwidthHz,
    occupiedLowerHz: m.occupiedBandwidth.lowerHz,
    occupiedUpperHz: m.occupiedBandwidth.upperHz,
    aclrMethod: m.aclr.method,
    aclrAssignedFilter: m.aclr.assignedFilter,
    aclr: m.aclr.values.map((v) => ({ ...v, aclrDb: Number.isFinite(v.aclrDb) ? v.aclrDb : null })),
    warnings: m.warnings,
  };
}

/** Key-sorted JSON: equal for equal plain values whatever the key order (used to compare run identities). */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}
