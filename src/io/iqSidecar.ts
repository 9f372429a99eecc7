import { z } from 'zod';
import { DspError } from '../dsp/errors';
import { parseJsonText } from '../dsp/jsonText';
import { READABLE_DATATYPES } from './iqDatatypes';

/**
 * Crestline's JSON sidecar for raw, WAV and CSV IQ files (`BASE.iq.json` beside `BASE.iq`, `BASE.wav.json`,
 * `BASE.csv.json`): our own small format, the same facts a SigMF meta holds.
 *
 * ```json
 * { "format": "crestline-iq-sidecar", "version": "1.0.0", "container": "raw", "datatype": "ci16_be",
 *   "sampleRateHz": 30720000, "numSamples": 30720, "dataOffsetBytes": 0, "dataLengthBytes": 122880,
 *   "sha512": "<128 hex digits of the whole data file>", "centerFrequencyHz": 2.6e9,
 *   "description": "...", "author": "...", "recorder": "crestline generate",
 *   "config": {...}, "scaling": {...}, "export": {...} }
 * ```
 * For WAV, `dataOffsetBytes` is the header length and `sampleRateHz` the exact rate (the header holds it rounded).
 * CSV files are decimal text: datatype "cf64_le" names the precision of the values, not a byte layout.
 */
export const SIDECAR_FORMAT = 'crestline-iq-sidecar';
export const SIDECAR_VERSION = '1.0.0';
/** Largest sidecar read (16 MiB). */
export const MAX_SIDECAR_BYTES = 16 << 20;

export const iqSidecarSchema = z
  .object({
    format: z.literal(SIDECAR_FORMAT),
    version: z.string().regex(/^1\.\d+\.\d+$/, 'must be a 1.x.y version'),
    container: z.enum(['raw', 'wav', 'csv']),
    datatype: z.enum(READABLE_DATATYPES as [string, ...string[]], { error: `must be one of ${READABLE_DATATYPES.join(', ')}` }),
    sampleRateHz: z.number({ error: 'must be a positive, finite number of Hz' }).positive().max(1e12),
    numSamples: z.number().int().min(0),
    dataOffsetBytes: z.number().int().min(0),
    dataLengthBytes: z.number().int().min(0),
    sha512: z.string().regex(/^[0-9a-f]{128}$/i, 'must be 128 hexadecimal digits').optional(),
    centerFrequencyHz: z.number().min(0).max(1e12).optional(),
    description: z.string().optional(),
    author: z.string().optional(),
    recorder: z.string().optional(),
    config: z.unknown().optional(),
    scaling: z.unknown().optional(),
    export: z.unknown().optional(),
  })
  .strict();

export type IqSidecar = z.output<typeof iqSidecarSchema>;

/**
 * Parses and checks sidecar text.
 * @throws DspError INVALID_FILE naming `sourceName`: bad JSON ("json"), a field out of its range ("sidecar"),
 *   a sample rate that is not positive and finite ("sample-rate")
 */
export function parseIqSidecar(text: string, sourceName: string): IqSidecar {
  const json = parseJsonText(text, sourceName, 'INVALID_FILE', { problem: 'json' });
  const parsed = iqSidecarSchema.safeParse(json);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => `${i.path.length ? i.path.join('.') : '(top level)'}: ${i.message}`);
    const rateIssue = parsed.error.issues.some((i) => i.path[0] === 'sampleRateHz');
    throw new DspError('INVALID_FILE', `${sourceName}: not a valid ${SIDECAR_FORMAT} file: ${issues.join('; ')}.`, {
      problem: rateIssue ? 'sample-rate' : 'sidecar',
    });
  }
  return parsed.data;
}
