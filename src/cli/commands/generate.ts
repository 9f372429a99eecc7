import type { Command } from 'commander';
import { DspError } from '../../dsp/errors';
import type { LevelSpec } from '../../dsp/level/levelScale';
import { EXPORT_FORMATS, isExportFormat } from '../../io/exportFormats';
import { isDefaultExport, parseExportOptions, type ExportOptionsInput } from '../../io/exportOptions';
import { planExport } from '../../io/exportPlan';
import type { CliIo } from '../main';
import { createProgressPrinter } from '../progress';
import { readConfigFile } from '../readConfig';
import { streamExportToFiles } from '../streamExport';

/** Printed on stderr for every export other than the plain default file. */
export const EXPORT_CAUTION =
  'caution: transmit this waveform only where you are licensed to; for tests use conducted set-ups (attenuators, shielded enclosure), stay within the instrument input limits and follow local regulations.';

interface GenerateFlags {
  config: string;
  out: string;
  format?: string;
  levelDbfs?: string;
  levelMode?: string;
  scale?: string;
  rate?: string;
  rippleDb?: string;
  attenuationDb?: string;
  freqOffset?: string;
  exactFreqOffset?: boolean;
  repeat?: string;
  centerFrequency?: string;
  description?: string;
  author?: string;
  progress: boolean;
}

/**
 * `crestline generate --config cfg.json --out BASE [export flags]`: writes BASE.sigmf-meta and BASE.sigmf-data (cf32_le,
 * formula scale, the waveform's own rate) by default; the flags choose another format, level, rate, offset or repeat.
 */
export function registerGenerate(program: Command, io: CliIo): void {
  program
    .command('generate')
    .description('generate a configured waveform and write it as an IQ file (default: SigMF cf32_le at the waveform rate)')
    .requiredOption('--config <file>', 'waveform configuration (JSON)')
    .requiredOption('--out <base>', 'output base name: writes BASE.sigmf-meta and BASE.sigmf-data (or BASE.iq/.wav/.csv with a .json sidecar, or the archive BASE.sigmf)')
    .option('--format <format>', `file format: ${EXPORT_FORMATS.join('|')}`, 'sigmf-cf32')
    .option('--level-dbfs <dB>', 'level in dBFS (0 dBFS = complex magnitude 1), RMS unless --level-mode peak')
    .option('--level-mode <mode>', 'rms|peak (with --level-dbfs), auto (RMS from the CCDF at 1e-4 with 1 dB margin) or formula (unscaled)')
    .option('--scale <factor>', 'fixed linear scale applied to the formula samples')
    .option('--rate <Hz>', 'output sample rate; other than the waveform rate it is resampled (rational polyphase, Kaiser FIR)')
    .option('--ripple-db <dB>', 'resampling filter passband ripple, peak to peak (default 0.01)')
    .option('--attenuation-db <dB>', 'resampling filter stopband attenuation (default 80)')
    .option('--freq-offset <Hz>', 'digital frequency offset (moved to the nearest seamless value for looping)')
    .option('--exact-freq-offset', 'keep --freq-offset exactly even if the loop then has a phase step')
    .option('--repeat <N>', 'copies of the record in the file')
    .option('--center-frequency <Hz>', 'RF centre frequency for the metadata (default the configuration carrierFrequencyHz)')
    .option('--description <text>', 'description for the metadata')
    .option('--author <text>', 'author for the metadata')
    .option('--no-progress', 'do not print progress on stderr')
    .action(async (flags: GenerateFlags) => {
      const config = readConfigFile(flags.config);
      const options = parseExportOptions(exportOptionsFromFlags(flags));
      const plan = planExport(config, options);
      const isDefault = isDefaultExport(options);
      const controller = new AbortController();
      const onSigint = (): void => controller.abort();
      process.once('SIGINT', onSigint);
      // Progress only where it helps: exports of a million samples or more.
      const printer = flags.progress && plan.numSamples >= 1 << 20 ? createProgressPrinter(io.stderr, plan.numSamples) : undefined;
      try {
        const result = await streamExportToFiles(plan, flags.out, { signal: controller.signal, onProgress: printer });
        printer?.(undefined);
        for (const w of result.report.warnings) io.stderr(`warning: ${w}`);
        if (!isDefault) io.stderr(EXPORT_CAUTION);
        const r = result.report;
        const durationS = r.numSamples / r.sampleRateHz;
        const head = `wrote ${result.dataPath}: ${r.numSamples} samples, ${(durationS * 1e3).toFixed(3)} ms at ${(r.sampleRateHz / 1e6).toFixed(3)} Msps`;
        if (r.level.mode === 'formula' && !plan.format.integer) {
          io.stdout(`${head}, mean power ${r.rmsDbfs.toFixed(2)} dB (re 1, unscaled formula)`);
        } else {
          io.stdout(`${head}, ${r.datatype}; level ${r.level.mode}: RMS ${r.rmsDbfs.toFixed(2)} dBFS, peak ${r.peakDbfs.toFixed(2)} dBFS, crest factor ${r.crestFactorDb.toFixed(2)} dB`);
        }
        if (r.quantisation) {
          const q = r.quantisation;
          io.stdout(`  ${r.datatype}: clipped ${q.clippedSamples} samples (${q.clippedPercent.toPrecision(3)} %), quantisation SNR ${q.quantisationSnrDb.toFixed(1)} dB, peak component ${r.peakComponentDbfs.toFixed(2)} dBFS`);
        }
        io.stdout(`  metadata ${result.metaPath}, sha512 ${result.sha512Hex.slice(0, 16)}…`);
      } finally {
        process.off('SIGINT', onSigint);
      }
    });
}

/** Turns CLI flags into export options; a flag that is not a number, or a conflicting pair, names itself. */
export function exportOptionsFromFlags(flags: Omit<GenerateFlags, 'config' | 'out' | 'progress'>): ExportOptionsInput {
  const format = flags.format ?? 'sigmf-cf32';
  if (!isExportFormat(format)) {
    throw new DspError('INVALID_CONFIG', `--format "${format}" is not a format; allowed: ${EXPORT_FORMATS.join(', ')}.`, { field: 'format' });
  }
  const options: Record<string, unknown> = { format };
  const level = levelFromFlags(flags);
  if (level) options.level = level;
  if (flags.rate !== undefined) options.sampleRateHz = numberFlag('--rate', flags.rate);
  if (flags.rippleDb !== undefined) options.passbandRippleDb = numberFlag('--ripple-db', flags.rippleDb);
  if (flags.attenuationDb !== undefined) options.stopbandAttenuationDb = numberFlag('--attenuation-db', flags.attenuationDb);
  if (flags.freqOffset !== undefined) options.freqOffsetHz = numberFlag('--freq-offset', flags.freqOffset);
  if (flags.exactFreqOffset) options.exactFreqOffset = true;
  if (flags.repeat !== undefined) {
    const n = numberFlag('--repeat', flags.repeat);
    if (!Number.isInteger(n) || n < 1) throw new DspError('INVALID_CONFIG', `--repeat ${flags.repeat} must be a whole number ≥ 1.`, { field: 'repeat' });
    options.repeat = n;
  }
  if (flags.centerFrequency !== undefined) options.centerFrequencyHz = numberFlag('--center-frequency', flags.centerFrequency);
  if (flags.description !== undefined) options.description = flags.description;
  if (flags.author !== undefined) options.author = flags.author;
  return options as ExportOptionsInput;
}

function levelFromFlags(flags: Pick<GenerateFlags, 'levelDbfs' | 'levelMode' | 'scale'>): LevelSpec | undefined {
  const mode = flags.levelMode;
  if (mode !== undefined && !['rms', 'peak', 'auto', 'formula'].includes(mode)) {
    throw new DspError('INVALID_CONFIG', `--level-mode "${mode}" is not a mode; allowed: rms, peak (with --level-dbfs), auto, formula.`, { field: 'level' });
  }
  if (flags.scale !== undefined) {
    if (flags.levelDbfs !== undefined || mode !== undefined) {
      throw new DspError('INVALID_CONFIG', '--scale sets a fixed factor; it cannot be combined with --level-dbfs or --level-mode.', { field: 'level' });
    }
    return { mode: 'linear', scaleLinear: numberFlag('--scale', flags.scale) };
  }
  if (flags.levelDbfs !== undefined) {
    const levelDbfs = numberFlag('--level-dbfs', flags.levelDbfs);
    if (mode === 'auto' || mode === 'formula') {
      throw new DspError('INVALID_CONFIG', `--level-mode ${mode} takes no --level-dbfs; use rms or peak.`, { field: 'level' });
    }
    return { mode: mode === 'peak' ? 'peak' : 'rms', levelDbfs };
  }
  if (mode === 'rms' || mode === 'peak') {
    throw new DspError('INVALID_CONFIG', `--level-mode ${mode} needs --level-dbfs <dB>.`, { field: 'level' });
  }
  if (mode === 'auto') return { mode: 'auto' };
  if (mode === 'formula') return { mode: 'formula' };
  return undefined;
}

function numberFlag(flag: string, text: string): number {
  const value = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(value)) {
    throw new DspError('INVALID_CONFIG', `${flag} "${text}" is not a number (examples: 100e6, 122880000, -12.5).`, { field: flag.slice(2) });
  }
  return value;
}
