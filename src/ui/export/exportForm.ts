/**
 * The export dialog's form, turned into export options as src/io's exportOptionsSchema takes them
 * (the same object the CLI builds from its flags). Pure; the schema's messages mark the fields.
 */
import { EXPORT_FORMATS, exportFormatInfo, type ExportFormat } from '../../io/exportFormats';
import { encodeSigmfArchive, sigmfArchiveNames } from '../../io/sigmfArchive';
import { exportOptionsSchema } from '../../io/exportOptions';

export type LevelMode = 'default' | 'formula' | 'linear' | 'rms' | 'peak' | 'auto';

/** What the form holds: text as typed, so a half-typed number is shown, not lost. */
export interface ExportFormState {
  baseName: string;
  format: ExportFormat;
  levelMode: LevelMode;
  levelDbfs: string;
  scaleLinear: string;
  autoMarginDb: string;
  autoProbability: string;
  sampleRateHz: string;
  freqOffsetHz: string;
  repeat: string;
  centerFrequencyHz: string;
  description: string;
  author: string;
}

export const initialExportForm = (baseName: string): ExportFormState => ({
  baseName,
  format: 'sigmf-cf32',
  levelMode: 'default',
  levelDbfs: '-15',
  scaleLinear: '1',
  autoMarginDb: '',
  autoProbability: '',
  sampleRateHz: '',
  freqOffsetHz: '',
  repeat: '',
  centerFrequencyHz: '',
  description: '',
  author: '',
});

/** Labels of our own for the formats (terms of the trade: container, sample type, byte order). */
export const FORMAT_LABELS: Record<ExportFormat, string> = {
  'sigmf-cf32': 'SigMF, complex float32 LE (cf32_le)',
  'sigmf-ci16': 'SigMF, complex int16 LE (ci16_le)',
  'sigmf-ci8': 'SigMF, complex int8 (ci8)',
  'sigmf-archive': 'SigMF archive (.sigmf tar), complex float32 LE (cf32_le)',
  'raw-f32': 'Raw IQ, float32 LE + JSON sidecar',
  'raw-i16le': 'Raw IQ, int16 LE + JSON sidecar',
  'raw-i16be': 'Raw IQ, int16 BE + JSON sidecar',
  'raw-i8': 'Raw IQ, int8 + JSON sidecar',
  wav16: 'WAV, 16-bit stereo (I left, Q right)',
  wavf32: 'WAV, float32 stereo (I left, Q right)',
  csv: 'CSV text, one I,Q pair per line',
};

/** Formats the dialog offers: every format `crestline generate` writes. */
export const FORMAT_ORDER: readonly ExportFormat[] = EXPORT_FORMATS;

/** What "default" means for a format (src/io's rule: formula scale for SigMF cf32, auto otherwise). */
export function defaultLevelLabel(format: ExportFormat): string {
  return format === 'sigmf-cf32' ? 'formula scale (unscaled)' : 'auto (CCDF 1e-4 level 1 dB under full scale)';
}

/** Dotted paths of the options (as the schema reports them) each form field shows. */
export const FIELD_PATHS: Record<string, readonly string[]> = {
  format: ['format'],
  levelDbfs: ['level.levelDbfs'],
  scaleLinear: ['level.scaleLinear'],
  autoMarginDb: ['level.marginDb'],
  autoProbability: ['level.probability'],
  levelMode: ['level', 'level.mode'],
  sampleRateHz: ['sampleRateHz'],
  freqOffsetHz: ['freqOffsetHz'],
  repeat: ['repeat'],
  centerFrequencyHz: ['centerFrequencyHz'],
  description: ['description'],
  author: ['author'],
};

const numberOrText = (text: string): number | string => {
  const trimmed = text.trim();
  const value = Number(trimmed);
  return trimmed !== '' && Number.isFinite(value) ? value : trimmed;
};

/** The options object for `form` (empty fields left out so the defaults apply). */
export function exportOptionsInput(form: ExportFormState): Record<string, unknown> {
  const options: Record<string, unknown> = { format: form.format };
  switch (form.levelMode) {
    case 'default':
      break;
    case 'formula':
      options.level = { mode: 'formula' };
      break;
    case 'linear':
      options.level = { mode: 'linear', scaleLinear: numberOrText(form.scaleLinear) };
      break;
    case 'rms':
    case 'peak':
      options.level = { mode: form.levelMode, levelDbfs: numberOrText(form.levelDbfs) };
      break;
    case 'auto': {
      const level: Record<string, unknown> = { mode: 'auto' };
      if (form.autoMarginDb.trim() !== '') level.marginDb = numberOrText(form.autoMarginDb);
      if (form.autoProbability.trim() !== '') level.probability = numberOrText(form.autoProbability);
      options.level = level;
      break;
    }
  }
  const optionalNumbers: [keyof ExportFormState, string][] = [
    ['sampleRateHz', 'sampleRateHz'],
    ['freqOffsetHz', 'freqOffsetHz'],
    ['repeat', 'repeat'],
    ['centerFrequencyHz', 'centerFrequencyHz'],
  ];
  for (const [field, key] of optionalNumbers) {
    const text = form[field].trim();
    if (text !== '') options[key] = numberOrText(text);
  }
  if (form.description.trim() !== '') options.description = form.description;
  if (form.author.trim() !== '') options.author = form.author;
  return options;
}

export type CheckedExportForm =
  | { ok: true; options: Record<string, unknown>; baseName: string }
  | { ok: false; errors: Record<string, string> };

/** Checks the form with the export options schema; errors keyed by form field. */
export function checkExportForm(form: ExportFormState): CheckedExportForm {
  const errors: Record<string, string> = {};
  const baseName = form.baseName.trim();
  if (baseName === '' || /[\\/:*?"<>|]/.test(baseName)) errors.baseName = 'a file name without \\ / : * ? " < > |';
  else if (exportFormatInfo(form.format).archiveSuffix !== undefined) {
    // The archive's members are NAME/NAME.sigmf-data and must fit a tar name: src/io says what is allowed.
    try {
      sigmfArchiveNames(baseName);
    } catch (error) {
      errors.baseName = error instanceof Error ? error.message : String(error);
    }
  }
  const options = exportOptionsInput(form);
  const parsed = exportOptionsSchema.safeParse(options);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = issue.path.map(String).join('.');
      const field = Object.entries(FIELD_PATHS).find(([, paths]) => paths.includes(path))?.[0] ?? 'levelMode';
      errors[field] = errors[field] === undefined ? issue.message : `${errors[field]}; ${issue.message}`;
    }
  }
  if (Object.keys(errors).length > 0) return { ok: false, errors };
  return { ok: true, options, baseName };
}

/** MIME type of each file the format writes. */
/**
 * The files the browser saves for an export: the data file and its metadata, or — for the SigMF archive — one
 * `.sigmf` tar holding both (the layout `crestline generate --format sigmf-archive` writes).
 */
export function exportDownloads(
  format: ExportFormat,
  baseName: string,
  files: { data: Uint8Array; metaText: string; dataSuffix: string; metaSuffix: string },
  mtimeS: number,
): { name: string; content: Uint8Array | string; mimeType: string }[] {
  const info = exportFormatInfo(format);
  if (info.archiveSuffix !== undefined) {
    return [{ name: `${baseName}${info.archiveSuffix}`, content: encodeSigmfArchive(baseName, files.metaText, files.data, mtimeS), mimeType: 'application/x-tar' }];
  }
  const mime = exportMimeTypes(format);
  return [
    { name: `${baseName}${files.dataSuffix}`, content: files.data, mimeType: mime.data },
    { name: `${baseName}${files.metaSuffix}`, content: files.metaText, mimeType: mime.meta },
  ];
}

export function exportMimeTypes(format: ExportFormat): { data: string; meta: string } {
  const info = exportFormatInfo(format);
  const data = info.container === 'wav' ? 'audio/wav' : info.container === 'csv' ? 'text/csv' : 'application/octet-stream';
  return { data, meta: 'application/json' };
}
