import type { WaveformConfig } from '../../config/schema';
import { DspError } from '../errors';
import { createPowerSource, type PowerSource } from '../stats/powerSource';
import { createWaveformPlan, type WaveformPlan } from '../waveform/waveformPlan';
import { createBlockMeasurer, type BlockMeasurer } from './blockMeasurer';
import { createMonteCarloRun, type MonteCarloRun } from './runPlan';

/** Oversampling of PAPR/CCDF statistics unless the user insists on another (Tellambura, IEEE Commun. Lett. 5(5), 2001: 4× matches the continuous-time PAPR). */
export const DEFAULT_STATISTICS_OVERSAMPLING = 4;
/** Run seed when the configuration's data source is not seeded random data. */
export const DEFAULT_RUN_SEED = 1;

/** What the user asked for: symbols, block size, seed, oversampling, precision. */
export interface MeasurementRequest {
  readonly symbols: number;
  readonly blockSymbols?: number | undefined;
  /** Run seed; default the configuration's random-data seed, else DEFAULT_RUN_SEED. */
  readonly seed?: number | undefined;
  /** Oversampling the user insists on; undefined = max(configuration's, 4). */
  readonly oversampling?: number | undefined;
  readonly precision?: 'f64' | 'f32' | undefined;
}

/**
 * Everything a worker needs to rebuild the statistics side of a measurement: plain data, identical in every lane,
 * so each lane derives the same plan and the same block data.
 */
export interface MeasurementSetup {
  readonly config: WaveformConfig;
  /** Oversampling of the PAPR/CCDF/CM statistics. */
  readonly oversampling: number;
  readonly precision: 'f64' | 'f32';
  readonly run: MonteCarloRun;
  readonly warnings: readonly string[];
  readonly notes: readonly string[];
}

/**
 * Resolves oversampling and seed for a measurement of `config`. When the configuration says less than 4× and the
 * user did not insist, statistics run at 4×; below 4× a warning says that peaks are underestimated.
 */
export function resolveMeasurementSetup(config: WaveformConfig, request: MeasurementRequest): MeasurementSetup {
  const warnings: string[] = [];
  const notes: string[] = [];
  let oversampling: number;
  if (request.oversampling !== undefined) {
    if (!Number.isInteger(request.oversampling) || request.oversampling < 1 || request.oversampling > 16) {
      throw new DspError('INVALID_CONFIG', `--oversampling must be a whole number from 1 to 16; got ${request.oversampling}.`, { field: 'oversampling' });
    }
    oversampling = request.oversampling;
  } else {
    oversampling = Math.max(config.oversampling, DEFAULT_STATISTICS_OVERSAMPLING);
    if (oversampling !== config.oversampling) {
      notes.push(
        `PAPR, CCDF and cubic metric run at oversampling ${oversampling} (the configuration says ${config.oversampling}); pass --oversampling ${config.oversampling} to insist.`,
      );
    }
  }
  if (oversampling < DEFAULT_STATISTICS_OVERSAMPLING) {
    warnings.push(
      `Oversampling ${oversampling}: peaks between samples are missed, so PAPR and CCDF levels are underestimated (by about 0.3–0.5 dB at 1×, common practice); ${DEFAULT_STATISTICS_OVERSAMPLING}× matches the continuous-time PAPR (Tellambura 2001).`,
    );
  }
  const seed = request.seed ?? (config.data.source === 'random' ? config.data.seed : DEFAULT_RUN_SEED);
  const run = createMonteCarloRun({ totalSymbols: request.symbols, blockSymbols: request.blockSymbols, runSeed: seed });
  if (config.data.source !== 'random') {
    notes.push(
      `Statistics use seeded random data (run seed ${seed}, one derived seed per block of ${run.blockSymbols} symbols); the configured "${config.data.source}" data feeds only the spectrum and ACLR waveform.`,
    );
  }
  return { config, oversampling, precision: request.precision ?? 'f64', run, warnings, notes };
}

/** The waveform plan the statistics use: the configuration at the measurement oversampling. */
export function createStatisticsPlan(setup: MeasurementSetup): WaveformPlan {
  return createWaveformPlan({ ...setup.config, oversampling: setup.oversampling });
}

/** Power source plus block measurer for one lane (each worker calls this with the same setup). */
export function createSetupMeasurer(setup: MeasurementSetup): { plan: WaveformPlan; source: PowerSource; measurer: BlockMeasurer } {
  const plan = createStatisticsPlan(setup);
  const source = createPowerSource(plan, { precision: setup.precision });
  return { plan, source, measurer: createBlockMeasurer(source, setup.run, setup.precision) };
}
