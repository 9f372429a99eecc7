import type { Command } from 'commander';
import { spectrumCsv } from './psdCsv';
import { measureSpectrum } from '../../dsp/metrics/spectrumMeasurement';
import { runIdentityOf, statisticsFactsOf, summariseSpectrum, type MeasurementContext } from '../../dsp/montecarlo/measurementContext';
import { buildMeasureReport } from '../../dsp/montecarlo/measureReport';
import { createSetupMeasurer, resolveMeasurementSetup } from '../../dsp/montecarlo/measurementSetup';
import { allBlockIndices, shardBlockIndices, type ShardSpec } from '../../dsp/montecarlo/runPlan';
import { createInlineLane, runMonteCarloBlocks, type MonteCarloLane, type MonteCarloProgress } from '../../dsp/montecarlo/runScheduler';
import { serializeShardFile } from '../../dsp/montecarlo/shardFile';
import { DspError } from '../../dsp/errors';
import { writeFilesAtomically } from '../atomicWrite';
import { CancelledError } from '../cliErrors';
import type { CliIo } from '../main';
import { loadCliF32Backend } from '../parallel/f32Backend';
import { startNodeWorkerLanes, type NodeWorkerLanes } from '../parallel/nodeWorkerLanes';
import { readConfigFile } from '../readConfig';
import { formatMeasureTable } from './measureFormat';
import {
  DEFAULT_MEASURE_SYMBOLS,
  defaultWorkerCount,
  parsePositive,
  parsePrecision,
  parseReportOptions,
  parseShard,
  parseWholeNumber,
  parseWindow,
  type ReportFlags,
} from './measureOptions';

interface MeasureFlags extends ReportFlags {
  config: string;
  symbols: string;
  workers?: string;
  seed?: string;
  blockSymbols?: string;
  oversampling?: string;
  rbw?: string;
  window: string;
  spectrumSymbols?: string;
  precision: string;
  shard?: string;
  out?: string;
  psdOut?: string;
  progress?: boolean;
  json?: boolean;
}

/**
 * `crestline measure --config cfg.json [--symbols N] [--workers W] [--json] [--shard k/n --out FILE]`: PAPR (both
 * definitions) and power CCDF with 95 % intervals from a Monte-Carlo run over worker threads, cubic metric, power
 * levels, and the spectrum, 99 % occupied bandwidth and ACLR of the configured waveform.
 */
export function registerMeasure(program: Command, io: CliIo): void {
  program
    .command('measure')
    .description('PAPR and power CCDF (with 95 % intervals), cubic metric, power levels, spectrum, occupied bandwidth and ACLR of a configured waveform')
    .requiredOption('--config <file>', 'waveform configuration (JSON)')
    .option('--symbols <n>', 'random OFDM symbols for the statistics (1e-4 needs about 100000)', String(DEFAULT_MEASURE_SYMBOLS))
    .option('--workers <w>', 'worker threads; results are identical for any count (default: one per core)')
    .option('--seed <n>', "run seed (default: the configuration's random-data seed, else 1)")
    .option('--block-symbols <n>', 'symbols per Monte-Carlo block; part of the run identity (default 128)')
    .option('--oversampling <n>', "oversampling of PAPR/CCDF/CM (default: the configuration's, at least 4)")
    .option('--papr-mean <run|symbol>', 'PAPR definition reported as paprDb: peak / run mean, or peak / symbol mean', 'run')
    .option('--rbw <hz>', 'resolution bandwidth of the spectrum (default: channel bandwidth / 1000)')
    .option('--window <name>', 'spectrum window: hann, flat-top or blackman-harris', 'hann')
    .option('--spectrum-symbols <n>', 'symbols of the configured waveform analysed for spectrum and ACLR (default ≥ 140)')
    .option('--cm-slope <k>', 'cubic-metric slope k (TS 25.101 §6.2.2: 1.56, or 1.85 for WCDMA with low codes)', '1.56')
    .option('--cm-round', 'round the cubic metric up to 0.5 dB as TS 25.101 does')
    .option('--full-scale <amplitude>', 'full-scale magnitude in sample units, for dBFS figures')
    .option('--precision <f64|f32>', 'arithmetic of the statistics path', 'f64')
    .option('--shard <k/n>', 'run only shard k of n of the blocks and write its counts to --out')
    .option('--out <file>', 'write the run counts (shard file) for crestline merge')
    .option('--psd-out <file>', 'write the spectrum as CSV (frequency, dBc/Hz, dBc per RBW)')
    .option('--progress', 'print progress lines (fraction, symbols/s, time left) to stderr')
    .option('--json', 'print one JSON object instead of the table')
    .action((flags: MeasureFlags) => runMeasure(flags, io));
}

async function runMeasure(flags: MeasureFlags, io: CliIo): Promise<void> {
  const config = readConfigFile(flags.config);
  const reportOptions = parseReportOptions(flags);
  const shard: ShardSpec | undefined = flags.shard === undefined ? undefined : parseShard(flags.shard);
  if (shard && flags.out === undefined) throw new DspError('INVALID_CONFIG', '--shard needs --out FILE to write the shard counts to.', { field: 'out' });
  const extraWarnings: string[] = [];
  const extraNotes: string[] = [];
  let precision = parsePrecision(flags.precision);
  let f32Backend: string | null = null;
  if (precision === 'f32') {
    const loaded = await loadCliF32Backend();
    f32Backend = loaded.backend;
    if (f32Backend === null) {
      precision = 'f64';
      extraWarnings.push(`--precision f32: no f32 FFT backend could be loaded (${loaded.failures.join('; ')}); the statistics ran in f64.`);
    } else {
      extraNotes.push(`Statistics ran in single precision on ${f32Backend} (PAPR within 1e-4 dB of f64, tested in test/dsp/stats).`);
    }
  }
  const setup = resolveMeasurementSetup(config, {
    symbols: parseWholeNumber(flags.symbols, '--symbols', 1, 1e9),
    blockSymbols: flags.blockSymbols === undefined ? undefined : parseWholeNumber(flags.blockSymbols, '--block-symbols', 1, 1e6),
    seed: flags.seed === undefined ? undefined : parseWholeNumber(flags.seed, '--seed', 0, Number.MAX_SAFE_INTEGER),
    oversampling: flags.oversampling === undefined ? undefined : parseWholeNumber(flags.oversampling, '--oversampling', 1, 16),
    precision,
  });
  const blocks = shard ? shardBlockIndices(setup.run, shard) : allBlockIndices(setup.run);
  const requestedWorkers = flags.workers === undefined ? defaultWorkerCount() : parseWholeNumber(flags.workers, '--workers', 1, 256);
  const workers = Math.min(requestedWorkers, blocks.length);
  const window = parseWindow(flags.window);
  const rbwHz = flags.rbw === undefined ? undefined : parsePositive(flags.rbw, '--rbw');
  const spectrumSymbols = flags.spectrumSymbols === undefined ? undefined : parseWholeNumber(flags.spectrumSymbols, '--spectrum-symbols', 1, 1e7);

  const local = createSetupMeasurer(setup);
  // Threads start first: they load and plan while this thread measures the spectrum.
  const pool: NodeWorkerLanes | undefined = workers > 1 ? startNodeWorkerLanes(setup, workers, f32Backend) : undefined;
  const controller = new AbortController();
  const onSigint = (): void => controller.abort(new CancelledError('measurement cancelled (Ctrl-C).'));
  process.once('SIGINT', onSigint);
  try {
    const needSpectrum = !shard || shard.index === 1;
    const spectrum = needSpectrum ? measureSpectrum(config, { oversampling: setup.oversampling, rbwHz, window, symbols: spectrumSymbols }) : undefined;
    const context: MeasurementContext = {
      identity: runIdentityOf(setup),
      statistics: statisticsFactsOf(local.plan, local.source),
      spectrum: spectrum ? summariseSpectrum(spectrum) : null,
      warnings: [...local.plan.warnings, ...setup.warnings, ...extraWarnings],
      notes: [...setup.notes, ...extraNotes],
    };
    const lanes: MonteCarloLane[] = pool ? [...pool.lanes] : [createInlineLane(local.measurer)];
    let lastPrint = -Infinity;
    const onProgress = flags.progress
      ? (p: MonteCarloProgress) => {
          const now = performance.now();
          if (now - lastPrint < 1000 && p.fraction < 1) return;
          lastPrint = now;
          io.stderr(formatProgress(p));
        }
      : undefined;
    // Rates and time left count from here: the threads have loaded while the spectrum was measured.
    await pool?.ready;
    let done = 0;
    const stats = await runMonteCarloBlocks(lanes, setup.run, blocks, {
      signal: controller.signal,
      onProgress: (p) => {
        done = p.symbolsDone;
        onProgress?.(p);
      },
      clock: () => performance.now(),
      yieldBetweenBlocks: pool ? undefined : () => new Promise<void>((resolve) => setImmediate(resolve)),
    }).catch((err: unknown) => {
      if (controller.signal.aborted) throw new CancelledError(`measurement cancelled after ${done} of ${setup.run.totalSymbols} symbols; nothing was written.`);
      throw err;
    });
    const files: { path: string; bytes: string }[] = [];
    if (flags.out !== undefined) files.push({ path: flags.out, bytes: serializeShardFile({ context, shard: shard ?? { index: 1, count: 1 }, stats }) });
    if (flags.psdOut !== undefined && spectrum) files.push({ path: flags.psdOut, bytes: spectrumCsv(spectrum) });
    if (files.length > 0) writeFilesAtomically(files);
    if (shard) {
      io.stdout(`wrote ${flags.out}: shard ${shard.index}/${shard.count}, blocks ${blocks[0]}…${blocks[blocks.length - 1]} (${stats.records.size} blocks); combine all ${shard.count} with crestline merge`);
      return;
    }
    const report = buildMeasureReport(context, stats, reportOptions);
    if (flags.json) io.stdout(JSON.stringify(report, null, 2));
    else for (const line of formatMeasureTable(report)) io.stdout(line);
  } finally {
    process.removeListener('SIGINT', onSigint);
    await pool?.close();
  }
}

function formatProgress(p: MonteCarloProgress): string {
  const rate = p.symbolsPerSecond === null ? '' : `, ${Math.round(p.symbolsPerSecond)} symbols/s`;
  const left = p.secondsLeft === null ? '' : `, ${p.secondsLeft.toFixed(1)} s left`;
  return `progress ${(100 * p.fraction).toFixed(1)} % (${p.symbolsDone}/${p.symbolsTotal} symbols${rate}${left})`;
}
