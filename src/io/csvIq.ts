import { DspError } from '../dsp/errors';

/**
 * CSV IQ: one sample per line, "I,Q", as decimal numbers (ECMAScript Number::toString: the shortest text that reads
 * back to the same double, so a CSV round trip is bit-exact). A header line "I,Q" is accepted on reading, not written.
 * CSV is for short records you want to open in a spreadsheet: writing and reading refuse more than MAX_CSV_SAMPLES.
 */
export const MAX_CSV_SAMPLES = 1_000_000;

/** Encodes samples as CSV lines (UTF-8, "\n" line ends). */
export function encodeCsvIq(iq: Float64Array): Uint8Array {
  const lines: string[] = new Array<string>(iq.length / 2);
  for (let i = 0; i < iq.length; i += 2) lines[i / 2] = `${numberText(iq[i]!)},${numberText(iq[i + 1]!)}\n`;
  return new TextEncoder().encode(lines.join(''));
}

function numberText(x: number): string {
  return Object.is(x, -0) ? '-0' : String(x);
}

/**
 * Decodes CSV IQ text to interleaved doubles.
 * @throws DspError INVALID_FILE naming `sourceName` and the line: more than MAX_CSV_SAMPLES lines ("size"), a line
 *   without exactly two fields or with a non-number ("csv"), NaN or ±Infinity ("nan")
 */
export function decodeCsvIq(text: string, sourceName: string): Float64Array {
  const lines = text.split('\n');
  if (lines.length > 0 && lines[lines.length - 1]!.trim() === '') lines.pop();
  let first = 0;
  if (lines.length > 0 && /^\s*i\s*,\s*q\s*$/i.test(lines[0]!.replace(/\r$/, ''))) first = 1;
  const count = lines.length - first;
  if (count > MAX_CSV_SAMPLES) {
    throw new DspError('INVALID_FILE', `${sourceName}: ${count} CSV lines exceed the ${MAX_CSV_SAMPLES}-sample limit for CSV; use a binary format.`, {
      problem: 'size',
    });
  }
  const out = new Float64Array(2 * count);
  for (let l = first; l < lines.length; l++) {
    const line = lines[l]!.replace(/\r$/, '');
    const fields = line.split(',');
    if (fields.length !== 2) {
      throw new DspError('INVALID_FILE', `${sourceName}, line ${l + 1}: expected two fields "I,Q", found ${fields.length} in "${clip(line)}".`, {
        problem: 'csv',
        line: l + 1,
      });
    }
    for (let c = 0; c < 2; c++) {
      const field = fields[c]!.trim();
      const value = Number(field);
      if (field === '' || (Number.isNaN(value) && !/^[+-]?nan$/i.test(field))) {
        throw new DspError('INVALID_FILE', `${sourceName}, line ${l + 1}: "${clip(field)}" is not a number.`, { problem: 'csv', line: l + 1 });
      }
      if (!Number.isFinite(value)) {
        throw new DspError('INVALID_FILE', `${sourceName}, line ${l + 1}: sample ${l - first} has a non-finite ${c === 0 ? 'I' : 'Q'} value (${field}).`, {
          problem: 'nan',
          sampleIndex: l - first,
        });
      }
      out[2 * (l - first) + c] = value;
    }
  }
  return out;
}

function clip(s: string): string {
  return s.length > 40 ? `${s.slice(0, 40)}…` : s;
}
