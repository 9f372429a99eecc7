import type { Command } from 'commander';
import { parseWaveformConfig } from '../../config/configParse';
import type { WaveformConfig } from '../../config/schema';
import { DspError } from '../../dsp/errors';
import { countErrors } from '../../dsp/receiver/errorCounting';
import { measureEvm } from '../../dsp/receiver/evmMeasurement';
import { describeConfig } from '../../dsp/waveform/configDescription';
import { generateWaveform } from '../../dsp/waveform/waveformGenerator';
import type { CliIo } from '../main';
import { readConfigFile } from '../readConfig';
import { BARE_RAW_FORMATS } from '../readIqFile';
import { readRecording, type Recording } from '../readRecording';

interface AnalyzeOptions {
  config?: string;
  iq: string;
  rawFormat?: string;
  rate?: string;
  json?: boolean;
  timing: string;
}

/** JSON-safe number: NaN and ±Infinity become null. */
function num(x: number | undefined): number | null {
  return x === undefined || !Number.isFinite(x) ? null : x;
}

/**
 * `crestline analyze [--config cfg.json] --iq FILE [--raw-format F --rate HZ] [--json]`: demodulates a recording of the configured waveform and reports
 * EVM as TS 36.101 / 38.101-1 Annex F measure it (both window positions, the larger reported), the limit and verdict,
 * CFO, timing and BER against the configuration's known payload. FILE is any format `generate` writes; without
 * --config the configuration comes from the file's metadata (SigMF crestline:config or the sidecar's config).
 */
export function registerAnalyze(program: Command, io: CliIo): void {
  program
    .command('analyze')
    .description('demodulate a recording of the configured waveform: EVM (RMS, peak, per symbol), limit and verdict, CFO, timing, BER')
    .option('--config <file>', 'waveform configuration (JSON) the recording was made with (default: the one in its metadata)')
    .requiredOption('--iq <file>', 'recording: SigMF (BASE, BASE.sigmf-data or .sigmf-meta, or a .sigmf archive), .iq (with .iq.json), .wav or .csv')
    .option('--raw-format <format>', `file without metadata: sample format, ${Object.keys(BARE_RAW_FORMATS).join('|')}`)
    .option('--rate <Hz>', 'file without metadata (raw, CSV): sample rate')
    .option('--json', 'print one JSON object')
    .option('--timing <mode>', 'cp (estimate timing and CFO from the cyclic prefix) or known (the waveform starts at sample 0)', 'cp')
    .action((opts: AnalyzeOptions) => {
      if (opts.timing !== 'cp' && opts.timing !== 'known') {
        throw new DspError('INVALID_CONFIG', `--timing "${opts.timing}" is not allowed: use cp or known.`);
      }
      let rateHz: number | undefined;
      if (opts.rate !== undefined) {
        rateHz = Number(opts.rate);
        if (opts.rate.trim() === '' || !Number.isFinite(rateHz)) throw new DspError('INVALID_CONFIG', `--rate "${opts.rate}" is not a number of Hz (example: 7.68e6).`, { field: 'rate' });
      }
      const given = opts.config === undefined ? undefined : readConfigFile(opts.config);
      // With --config its rate stands in for a metadata-less .sigmf-data; without, the file must say its rate.
      const rec = readRecording(opts.iq, given ? generateWaveform(given).plan.sampleRateHz : Number.NaN, { rawFormat: opts.rawFormat, rateHz });
      const config = given ?? embeddedConfig(rec);
      const wave = generateWaveform(config);
      const plan = wave.plan;
      const recordRateHz = rec.source.sampleRateHz;
      if (recordRateHz === undefined) {
        throw new DspError('INVALID_CONFIG', `${rec.source.dataName}: the sample rate is not known (no sidecar); give it with --rate <Hz>.`, { field: 'rate' });
      }
      if (Math.abs(recordRateHz - plan.sampleRateHz) > 1e-6 * plan.sampleRateHz) {
        throw new DspError(
          'INVALID_CONFIG',
          `The recording's sample rate ${recordRateHz} Hz differs from the configuration's ${plan.sampleRateHz} Hz (check bandwidthMHz, subcarrierSpacingKHz and oversampling).`,
        );
      }
      const rsOn = plan.referenceSignals.kind !== 'none';
      const { report, nominal } = measureEvm(plan, rec.iq, {
        timing: opts.timing,
        channelEstimation: rsOn ? 'reference' : 'known-grid',
        transmittedGridIq: wave.gridIq,
      });
      const errors = countErrors(plan, wave.bits, nominal.bits);
      const warnings = [...rec.warnings, ...plan.warnings, ...report.warnings];
      if (opts.json) {
        io.stdout(
          JSON.stringify({
            evmRmsPercent: num(report.evmRmsPercent),
            evmPeakPercent: num(report.evmPeakPercent),
            evmLimitPercent: num(report.evmLimitPercent),
            pass: report.pass ?? null,
            ber: num(errors.ber),
            ser: num(errors.ser),
            bitErrors: errors.bitErrors,
            numBits: errors.numBits,
            cfoHz: report.cfoHz,
            timingOffsetSamples: report.timingOffsetSamples,
            limitSource: report.limitSource,
            perModulation: report.perModulation.map((m) => ({ ...m, evmRmsPercent: num(m.evmRmsPercent), limitPercent: num(m.limitPercent), pass: m.pass ?? null })),
            evmWindow: {
              windowLengthSamples: report.window.windowLengthSamples,
              source: report.window.source,
              lowAdvanceSamples: report.window.lowAdvanceSamples,
              highAdvanceSamples: report.window.highAdvanceSamples,
              evmLowPercent: num(report.evmLowPercent),
              evmHighPercent: num(report.evmHighPercent),
              reported: report.reportedPosition,
            },
            perSymbolEvmPercent: report.perSymbolPercent.map(num),
            perSubcarrierEvmPercent: report.perSubcarrierPercent.map(num),
            channelEstimation: report.channelEstimationNote,
            referenceSignals: plan.referenceSignals.description,
            format: rec.source.formatLabel,
            datatype: rec.source.datatype,
            configSource: given ? opts.config : `${rec.source.metaName} (embedded)`,
            sampleRateHz: plan.sampleRateHz,
            numSamples: rec.iq.length / 2,
            warnings,
          }),
        );
        return;
      }
      const fmt = (x: number | undefined, digits = 4): string => (x === undefined || !Number.isFinite(x) ? 'n/a' : x.toPrecision(digits));
      const verdict = report.pass === undefined ? 'no limit applies' : report.pass ? 'PASS' : 'FAIL';
      io.stdout(`${rec.source.dataName} (${rec.source.formatLabel}, ${rec.iq.length / 2} samples): ${describeConfig(config)}`);
      if (!given) io.stdout(`configuration: from ${rec.source.metaName}`);
      io.stdout(`EVM ${fmt(report.evmRmsPercent)} % RMS, ${fmt(report.evmPeakPercent)} % peak; limit ${fmt(report.evmLimitPercent, 3)} % → ${verdict}`);
      for (const m of report.perModulation) io.stdout(`  ${m.modulation}: ${fmt(m.evmRmsPercent)} % (limit ${fmt(m.limitPercent, 3)} %)`);
      io.stdout(
        `EVM window W = ${report.window.windowLengthSamples} samples (${report.window.source}): ${fmt(report.evmLowPercent)} % at Δt_l, ${fmt(report.evmHighPercent)} % at Δt_h; ${report.reportedPosition} reported`,
      );
      io.stdout(`per symbol: ${report.perSymbolPercent.map((p) => fmt(p, 3)).join(' ')} %`);
      io.stdout(`CFO ${report.cfoHz.toFixed(3)} Hz, timing offset ${report.timingOffsetSamples} samples`);
      io.stdout(`BER ${fmt(errors.ber, 3)} (${errors.bitErrors} of ${errors.numBits} bits), SER ${fmt(errors.ser, 3)}`);
      io.stdout(`channel: ${report.channelEstimationNote}`);
      for (const w of warnings) io.stderr(`warning: ${w}`);
    });
}

/** The configuration a recording's metadata carries (SigMF crestline:config, or the sidecar's config). */
function embeddedConfig(rec: Recording): WaveformConfig {
  const embedded = rec.source.crestline.config;
  if (embedded === undefined) {
    throw new DspError(
      'INVALID_CONFIG',
      `${rec.source.dataName}: ${rec.source.metaName ? `${rec.source.metaName} holds no configuration` : 'no metadata file, so no configuration'}; give --config <file>.`,
      { field: 'config' },
    );
  }
  return parseWaveformConfig(embedded);
}
