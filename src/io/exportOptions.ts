import { z } from 'zod';
import { DspError } from '../dsp/errors';
import type { LevelSpec } from '../dsp/level/levelScale';
import { EXPORT_FORMATS, exportFormatInfo, type ExportFormat } from './exportFormats';

/**
 * Everything about an export besides the waveform configuration. The same object comes from CLI flags and from the
 * browser's export form, and is recorded in the file (`crestline:export`) so the file can be regenerated bit-exactly.
 */
const levelSchema = z.discriminatedUnion(
  'mode',
  [
    z.object({ mode: z.literal('formula') }).strict(),
    z.object({ mode: z.literal('linear'), scaleLinear: z.number().positive().finite() }).strict(),
    z.object({ mode: z.literal('rms'), levelDbfs: z.number().min(-150).max(20) }).strict(),
    z.object({ mode: z.literal('peak'), levelDbfs: z.number().min(-150).max(20) }).strict(),
    z
      .object({ mode: z.literal('auto'), marginDb: z.number().min(0).max(40).optional(), probability: z.number().gt(0).lt(1).optional() })
      .strict(),
  ],
  { error: 'mode must be one of formula, linear (with scaleLinear), rms or peak (with levelDbfs), auto' },
);

export const exportOptionsSchema = z
  .object({
    format: z.enum(EXPORT_FORMATS, { error: `must be one of ${EXPORT_FORMATS.join(', ')}` }).default('sigmf-cf32'),
    /** Default: formula scale for sigmf-cf32 (as before), auto (RMS from the CCDF at 1e-4 with 1 dB margin) otherwise. */
    level: levelSchema.optional(),
    /** Output sample rate, Hz; default the waveform's own rate. Other rates go through the rational resampler. */
    sampleRateHz: z.number().positive().max(1e12).optional(),
    passbandRippleDb: z.number().min(1e-4).max(3).optional(),
    stopbandAttenuationDb: z.number().min(20).max(180).optional(),
    /** Digital frequency offset applied at the output rate, Hz. */
    freqOffsetHz: z.number().finite().default(0),
    /** Keep the offset exactly even if the loop then has a phase seam (default: move it to the nearest seamless value). */
    exactFreqOffset: z.boolean().default(false),
    /** Copies of the record in the file. */
    repeat: z.number().int().min(1).max(1_000_000).default(1),
    /** RF centre frequency recorded in the metadata, Hz; default the configuration's carrierFrequencyHz. */
    centerFrequencyHz: z.number().min(0).max(1e12).optional(),
    description: z.string().max(10_000).optional(),
    author: z.string().max(1_000).optional(),
  })
  .strict();

export type ExportOptionsInput = z.input<typeof exportOptionsSchema>;
export type ExportOptions = z.output<typeof exportOptionsSchema>;

/**
 * Validates export options and applies defaults.
 * @throws DspError INVALID_CONFIG naming each bad field and what is allowed
 */
export function parseExportOptions(input: unknown): ExportOptions {
  const parsed = exportOptionsSchema.safeParse(input ?? {});
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => ({ path: i.path.length ? i.path.map(String).join('.') : '(top level)', message: i.message }));
    throw new DspError('INVALID_CONFIG', `Invalid export options: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}.`, { issues });
  }
  return parsed.data;
}

/** The level a format gets when none is given. */
export function defaultLevelFor(format: ExportFormat): LevelSpec {
  return format === 'sigmf-cf32' ? { mode: 'formula' } : { mode: 'auto' };
}

/** True for the plain `generate` output: SigMF cf32 at the waveform's rate, formula scale, nothing added. */
export function isDefaultExport(options: ExportOptions): boolean {
  return (
    options.format === 'sigmf-cf32' &&
    (options.level === undefined || options.level.mode === 'formula') &&
    options.sampleRateHz === undefined &&
    options.freqOffsetHz === 0 &&
    options.repeat === 1 &&
    exportFormatInfo(options.format).container === 'sigmf'
  );
}
