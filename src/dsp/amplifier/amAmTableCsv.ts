import { DspError } from '../errors';
import type { AmAmTable, AmAmTableRow } from './amAmTable';

/**
 * Parses a measured AM/AM–AM/PM table from CSV text: three columns, input power (dBm or dBFS), gain (dB) and
 * phase (degrees). Separators: comma, semicolon, tab or spaces. Lines starting with '#' and blank lines are skipped.
 * An optional header row names the columns; the input column's name gives the unit when it contains "dBm" or
 * "dBFS" (e.g. `input_dbm,gain_db,phase_deg`). Without a header the columns are taken in that order and the
 * unit must be passed as `inputUnit`.
 * @throws DspError INVALID_FILE naming the line and what is wrong
 */
export function parseAmAmTableCsv(text: string, options: { inputUnit?: 'dBm' | 'dBFS'; sourceName?: string } = {}): AmAmTable {
  const source = options.sourceName ?? 'AM/AM table';
  const lines = text.split(/\r?\n/);
  let columns: [number, number, number] = [0, 1, 2];
  let headerUnit: 'dBm' | 'dBFS' | undefined;
  let sawHeader = false;
  const rows: AmAmTableRow[] = [];
  lines.forEach((raw, index) => {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) return;
    const cells = line.split(/\s*[,;\t]\s*|\s+/).filter((c) => c !== '');
    const lineNo = index + 1;
    if (!sawHeader && rows.length === 0 && cells.some((c) => /[a-z]/i.test(c) && Number.isNaN(Number(c)))) {
      sawHeader = true;
      const find = (re: RegExp, what: string): number => {
        const i = cells.findIndex((c) => re.test(c));
        if (i < 0) throw new DspError('INVALID_FILE', `${source}: line ${lineNo}: header has no ${what} column (got ${cells.join(', ')}).`, { line: lineNo });
        return i;
      };
      const input = find(/^(input|in|pin|p_?in)/i, 'input power ("input_dbm" or "input_dbfs")');
      columns = [input, find(/gain/i, 'gain ("gain_db")'), find(/phase|pm/i, 'phase ("phase_deg")')];
      const name = cells[input]!.toLowerCase();
      headerUnit = name.includes('dbfs') ? 'dBFS' : name.includes('dbm') ? 'dBm' : undefined;
      return;
    }
    const need = Math.max(...columns) + 1;
    if (cells.length < need) {
      throw new DspError('INVALID_FILE', `${source}: line ${lineNo}: expected ${need} columns (input, gain, phase), found ${cells.length}: "${line}".`, { line: lineNo });
    }
    const values = columns.map((c) => Number(cells[c]));
    const bad = values.findIndex((v) => !Number.isFinite(v));
    if (bad >= 0) {
      const name = ['input power', 'gain', 'phase'][bad];
      throw new DspError('INVALID_FILE', `${source}: line ${lineNo}: ${name} "${cells[columns[bad]!]}" is not a number.`, { line: lineNo });
    }
    rows.push({ inputDb: values[0]!, gainDb: values[1]!, phaseDeg: values[2]! });
  });
  if (headerUnit && options.inputUnit && headerUnit !== options.inputUnit) {
    throw new DspError('INVALID_FILE', `${source}: the header says input in ${headerUnit} but ${options.inputUnit} was requested.`);
  }
  const inputUnit = options.inputUnit ?? headerUnit;
  if (!inputUnit) {
    throw new DspError(
      'INVALID_FILE',
      `${source}: cannot tell whether input power is in dBm or dBFS; name the column "input_dbm" or "input_dbfs" in a header row, or pass the unit.`,
    );
  }
  if (rows.length < 2) throw new DspError('INVALID_FILE', `${source}: needs at least 2 data rows; found ${rows.length}.`);
  return { inputUnit, rows };
}
