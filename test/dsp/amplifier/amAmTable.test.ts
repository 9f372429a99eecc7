import { describe, expect, it } from 'vitest';
import { createTableModel, tableSaturatedOutputDbm } from '../../../src/dsp/amplifier/amAmTable';
import { parseAmAmTableCsv } from '../../../src/dsp/amplifier/amAmTableCsv';
import { createRappModel } from '../../../src/dsp/amplifier/rapp';
import { DspError } from '../../../src/dsp/errors';

const toleranceDb = 0.02;

/** A table sampled from Rapp p = 2, G = 20 dB, A_sat² = 1 W (30 dBm) every 2 dB, with a Saleh-like phase. */
function rappCsv(): string {
  const rapp = createRappModel({ smoothness: 2, gainDb: 20, outputSaturationAmplitude: Math.sqrt(1000) });
  const lines = ['# invented test PA: Rapp p=2, 20 dB gain, 30 dBm saturation', 'input_dbm, gain_db, phase_deg'];
  for (let pin = -20; pin <= 24; pin += 2) {
    const r = 10 ** (pin / 20);
    lines.push(`${pin}, ${(20 * Math.log10(rapp.amAm(r) / r)).toFixed(6)}, ${(5 * (r / 10) ** 2 / (1 + (r / 10) ** 2)).toFixed(6)}`);
  }
  return lines.join('\n');
}

describe('measured AM/AM–AM/PM table (CSV, monotone interpolation)', () => {
  it('interpolates a table sampled from a known curve to within 0.02 dB between rows', () => {
    const table = parseAmAmTableCsv(rappCsv(), { sourceName: 'pa.csv' });
    expect(table.inputUnit).toBe('dBm');
    const model = createTableModel(table, 'pa.csv');
    const rapp = createRappModel({ smoothness: 2, gainDb: 20, outputSaturationAmplitude: Math.sqrt(1000) });
    for (let pin = -19; pin <= 23; pin += 0.5) {
      const r = 10 ** (pin / 20);
      expect(Math.abs(20 * Math.log10(model.amAm(r) / rapp.amAm(r)))).toBeLessThan(toleranceDb);
    }
    // Below the table: constant small-signal gain; above: output held.
    expect(20 * Math.log10(model.amAm(1e-3) / 1e-3)).toBeCloseTo(table.rows[0]!.gainDb, 9);
    expect(model.amAm(1e3)).toBeCloseTo(model.amAm(10 ** (24 / 20)), 9);
    // Saturation at the highest output row; the table says 30 dBm is never quite reached at +24 dBm input.
    expect(tableSaturatedOutputDbm(table)!).toBeLessThan(30);
    expect(model.warnings.join(' ')).toMatch(/still rises at the last row/);
  });

  it('keeps AM/PM relative to the first row and monotone', () => {
    const model = createTableModel(parseAmAmTableCsv(rappCsv()));
    expect(model.amPmRad(1e-4)).toBe(0);
    let previous = -1;
    for (let pin = -20; pin <= 24; pin += 0.1) {
      const phi = model.amPmRad(10 ** (pin / 20));
      expect(phi).toBeGreaterThanOrEqual(previous);
      previous = phi;
    }
  });

  it('reads dBFS tables, semicolons and headerless files with a given unit', () => {
    const t = parseAmAmTableCsv('input_dbfs;gain_db;phase_deg\n-30;0;0\n-10;-0.5;2\n0;-3;5\n', { sourceName: 'x.csv' });
    expect(t.inputUnit).toBe('dBFS');
    expect(tableSaturatedOutputDbm(t)).toBeUndefined();
    const h = parseAmAmTableCsv('-30 0 0\n-10 -0.5 2\n0 -3 5\n', { inputUnit: 'dBm' });
    expect(h.rows[2]).toEqual({ inputDb: 0, gainDb: -3, phaseDeg: 5 });
  });

  it('rejects bad tables with INVALID_FILE naming the line or row', () => {
    const bad = (text: string, pattern: RegExp, unit?: 'dBm'): void => {
      let caught: unknown;
      try {
        createTableModel(parseAmAmTableCsv(text, { sourceName: 'pa.csv', ...(unit ? { inputUnit: unit } : {}) }), 'pa.csv');
      } catch (err) {
        caught = err;
      }
      expect(caught).toBeInstanceOf(DspError);
      expect((caught as DspError).code).toBe('INVALID_FILE');
      expect((caught as DspError).message).toMatch(pattern);
    };
    bad('-30 0 0\n-10 -1 1\n', /dBm or dBFS/);
    bad('input_dbm,gain_db,phase_deg\n-30,0,0\n-30,1,0\n', /row 2: input -30 dBm must be greater/);
    bad('input_dbm,gain_db,phase_deg\n-30,0,0\n-20,abc,0\n', /line 3: gain "abc" is not a number/);
    bad('input_dbm,gain_db,phase_deg\n-30,0,0\n', /at least 2 data rows/);
    bad('input_dbm,gain_db\n-30,0\n-20,0\n', /no phase/);
    bad('input_dbm,gain_db,phase_deg\n-30,0,0\n-20,500,0\n', /gainDb = 500/);
    bad('input_dbm,gain_db,phase_deg\n-30,0,0\n-20,0\n', /expected 3 columns/);
  });
});
