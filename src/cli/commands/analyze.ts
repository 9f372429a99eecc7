import type { Command } from 'commander';
import { DspError } from '../../dsp/errors';
import { countErrors } from '../../dsp/receiver/errorCounting';
import { measureEvm } from '../../dsp/receiver/evmMeasurement';
import { describeConfig } from '../../dsp/waveform/configDescription';
import { generateWaveform } from '../../dsp/waveform/waveformGenerator';
import type { CliIo } from '../main';
import { readConfigFile } from '../readConfig';
import { readRecording } from '../readRecording';

interface AnalyzeOptions {
  config: string;
  iq: string;
  json?: boolean;
  timing: string;
}

/** JSON-safe number: NaN and ±Infinity become null. */
function num(x: number | undefined): number | null {
  return x === undefined || !Number.isFinite(x) ? null : x;
}

/**
 * `crestline analyze --config cfg.json --iq FILE [--json]`: demodulates a recording of the configured waveform and reports
 * EVM as TS 36.101 / 38.101-1 Annex F measure it (both window positions, the larger reported), the limit and verdict,
 * CFO, timing and BER against the configuration's known payload.
 */
export function registerAnalyze(program: Command, io: CliIo): void {
  program
    .command('analyze')
    .description('demodulate a recording of the configured waveform: EVM (RMS, peak, per symbol), limit and verdict, CFO, timing, BER')
    .requiredOption('--config <file>', 'waveform configuration (JSON) the recording was made with')
    .requiredOption('--iq <file>', 'SigMF recording: BASE, BASE.sigmf-data or BASE.sigmf-meta')
    .option('--json', 'print one JSON object')
    .option('--timing <mode>', 'cp (estimate timing and CFO from the cyclic prefix) or known (the waveform starts at sample 0)', 'cp')
    .action((opts: AnalyzeOptions) => {
      if (opts.timing !== 'cp' && opts.timing !== 'known') {
        throw new DspError('INVALID_CONFIG', `--timing "${opts.timing}" is not allowed: use cp or known.`);
      }
      const config = readConfigFile(opts.config);
      const wave = generateWaveform(config);
      const plan = wave.plan;
      const rec = readRecording(opts.iq, plan.sampleRateHz);
      const recordRateHz = rec.source.sampleRateHz;
      if (recordRateHz !== undefined && Math.abs(recordRateHz - plan.sampleRateHz) > 1e-6 * plan.sampleRateHz) {
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
            datatype: rec.source.datatype,
            sampleRateHz: plan.sampleRateHz,
            numSamples: rec.iq.length / 2,
            warnings,
          }),
        );
        return;
      }
      const fmt = (x: number | undefined, digits = 4): string => (x === undefined || !Number.isFinite(x) ? 'n/a' : x.toPrecision(digits));
      const verdict = report.pass === undefined ? 'no limit applies' : report.pass ? 'PASS' : 'FAIL';
      io.stdout(`${rec.source.dataName} (${rec.source.datatype}, ${rec.iq.length / 2} samples): ${describeConfig(config)}`);
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
