import type { IqDatatype } from './iqDatatypes';

/** File formats `generate` and the browser export write. */
export const EXPORT_FORMATS = [
  'sigmf-cf32',
  'sigmf-ci16',
  'sigmf-ci8',
  'sigmf-archive',
  'raw-f32',
  'raw-i16le',
  'raw-i16be',
  'raw-i8',
  'wav16',
  'wavf32',
  'csv',
] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** How each format lays out its files. */
export interface ExportFormatInfo {
  readonly format: ExportFormat;
  readonly container: 'sigmf' | 'raw' | 'wav' | 'csv';
  /** Sample encoding of the data (CSV: decimal text). */
  readonly datatype: IqDatatype;
  /** Appended to the base name: the data file and its metadata (SigMF meta or our JSON sidecar). */
  readonly dataSuffix: string;
  readonly metaSuffix: string;
  /** SigMF archive: the one file written is BASE + this (a tar of BASE/BASE.sigmf-meta and BASE/BASE.sigmf-data). */
  readonly archiveSuffix: string | undefined;
  readonly integer: boolean;
}

const TABLE: Record<ExportFormat, ExportFormatInfo> = {
  'sigmf-cf32': row('sigmf-cf32', 'sigmf', 'cf32_le', '.sigmf-data', '.sigmf-meta'),
  'sigmf-ci16': row('sigmf-ci16', 'sigmf', 'ci16_le', '.sigmf-data', '.sigmf-meta'),
  'sigmf-ci8': row('sigmf-ci8', 'sigmf', 'ci8', '.sigmf-data', '.sigmf-meta'),
  'sigmf-archive': row('sigmf-archive', 'sigmf', 'cf32_le', '.sigmf-data', '.sigmf-meta', '.sigmf'),
  'raw-f32': row('raw-f32', 'raw', 'cf32_le', '.iq', '.iq.json'),
  'raw-i16le': row('raw-i16le', 'raw', 'ci16_le', '.iq', '.iq.json'),
  'raw-i16be': row('raw-i16be', 'raw', 'ci16_be', '.iq', '.iq.json'),
  'raw-i8': row('raw-i8', 'raw', 'ci8', '.iq', '.iq.json'),
  wav16: row('wav16', 'wav', 'ci16_le', '.wav', '.wav.json'),
  wavf32: row('wavf32', 'wav', 'cf32_le', '.wav', '.wav.json'),
  csv: row('csv', 'csv', 'cf64_le', '.csv', '.csv.json'),
};

function row(
  format: ExportFormat,
  container: ExportFormatInfo['container'],
  datatype: IqDatatype,
  dataSuffix: string,
  metaSuffix: string,
  archiveSuffix?: string,
): ExportFormatInfo {
  const integer = datatype.startsWith('ci') || datatype.startsWith('cu');
  return { format, container, datatype, dataSuffix, metaSuffix, archiveSuffix, integer };
}

export function isExportFormat(value: unknown): value is ExportFormat {
  return typeof value === 'string' && (EXPORT_FORMATS as readonly string[]).includes(value);
}

export function exportFormatInfo(format: ExportFormat): ExportFormatInfo {
  return TABLE[format];
}
