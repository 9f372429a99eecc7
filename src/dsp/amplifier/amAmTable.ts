import { DspError } from '../errors';
import { applyMemoryless, dbToAmplitude, type AmplifierModel } from './amplifierModel';
import { createPchip, evaluatePchip } from './pchip';
import { log10 } from '../math/expLog';

/** One measured point: input power, gain and phase (AM/AM and AM/PM). */
export interface AmAmTableRow {
  /** Input power, in the table's unit (dBm or dBFS). */
  readonly inputDb: number;
  /** Power gain at that drive, dB. */
  readonly gainDb: number;
  /** Insertion phase at that drive, degrees. */
  readonly phaseDeg: number;
}

/** A measured AM/AM–AM/PM table. */
export interface AmAmTable {
  /** dBm: the model's amplitude r has r² in mW (Pin_dBm = 20·log10 r); dBFS: r = 1 is full scale. */
  readonly inputUnit: 'dBm' | 'dBFS';
  readonly rows: readonly AmAmTableRow[];
}

const MAX_ABS_GAIN_DB = 100;
const MAX_ABS_PHASE_DEG = 360;

/**
 * A PA model from a measured table. Between rows, output power P_out = P_in + gain (dB) and phase are interpolated
 * against P_in (dB) with the monotone cubic of Fritsch & Carlson 1980 (pchip.ts), so a monotone measured AM/AM
 * stays monotone and neither curve overshoots the data. Below the first row the gain and phase of the first row
 * hold (the small-signal region); above the last row the output power and phase of the last row hold (saturated).
 * AM/PM is reported relative to the first row's phase. Saturation is the row of highest output power.
 * Validation: ≥ 2 rows, finite values, input strictly increasing, |gain| ≤ 100 dB, |phase| ≤ 360°.
 * @param sourceName names the table in error messages (e.g. the CSV file)
 * @throws DspError INVALID_FILE naming the row and the broken rule
 */
export function createTableModel(table: AmAmTable, sourceName = 'AM/AM table'): AmplifierModel {
  const rows = table.rows;
  if (table.inputUnit !== 'dBm' && table.inputUnit !== 'dBFS') {
    throw new DspError('INVALID_FILE', `${sourceName}: input unit must be dBm or dBFS; got "${String(table.inputUnit)}".`);
  }
  if (rows.length < 2) throw new DspError('INVALID_FILE', `${sourceName}: needs at least 2 rows (input, gain, phase); got ${rows.length}.`);
  rows.forEach((row, i) => {
    for (const [key, limit] of [['inputDb', Infinity], ['gainDb', MAX_ABS_GAIN_DB], ['phaseDeg', MAX_ABS_PHASE_DEG]] as const) {
      const v = row[key];
      if (!Number.isFinite(v) || Math.abs(v) > limit) {
        throw new DspError('INVALID_FILE', `${sourceName}: row ${i + 1}: ${key} = ${v} is not ${limit === Infinity ? 'a finite number' : `a finite number within ±${limit}`}.`, {
          row: i + 1,
          column: key,
        });
      }
    }
    if (i > 0 && !(row.inputDb > rows[i - 1]!.inputDb)) {
      throw new DspError(
        'INVALID_FILE',
        `${sourceName}: row ${i + 1}: input ${row.inputDb} ${table.inputUnit} must be greater than the row before (${rows[i - 1]!.inputDb}); sort the table by input power without repeats.`,
        { row: i + 1, column: 'inputDb' },
      );
    }
  });
  const inputDb = rows.map((r) => r.inputDb);
  const outputDb = rows.map((r) => r.inputDb + r.gainDb);
  const phase0 = rows[0]!.phaseDeg;
  const amAmCurve = createPchip(inputDb, outputDb);
  const amPmCurve = createPchip(inputDb, rows.map((r) => r.phaseDeg - phase0));
  const first = rows[0]!;
  const last = rows[rows.length - 1]!;
  const gainSmall = dbToAmplitude(first.gainDb);
  let satIndex = 0;
  outputDb.forEach((p, i) => {
    if (p > outputDb[satIndex]!) satIndex = i;
  });
  const warnings: string[] = [];
  if (satIndex === rows.length - 1) {
    const slope = (outputDb[satIndex]! - outputDb[satIndex - 1]!) / (inputDb[satIndex]! - inputDb[satIndex - 1]!);
    warnings.push(
      `${sourceName}: output power still rises at the last row (${slope.toFixed(2)} dB/dB at ${last.inputDb} ${table.inputUnit}); saturation is taken at that row, so back-off is referred to P_out = ${outputDb[satIndex]!.toFixed(2)} ${table.inputUnit === 'dBm' ? 'dBm' : 'dB'}.`,
    );
  }
  if (outputDb.some((p, i) => i > 0 && p < outputDb[i - 1]!)) {
    warnings.push(`${sourceName}: output power falls between some rows (fold-back); interpolation keeps each segment monotone.`);
  }
  const amAm = (r: number): number => {
    if (r <= 0) return 0;
    const pin = 20 * log10(r);
    if (pin <= first.inputDb) return r * gainSmall;
    return dbToAmplitude(evaluatePchip(amAmCurve, pin));
  };
  const amPmRad = (r: number): number => (r <= 0 ? 0 : evaluatePchip(amPmCurve, 20 * log10(r)) * (Math.PI / 180));
  const model: AmplifierModel = {
    kind: 'table',
    description: `measured table (${rows.length} rows, ${first.inputDb}…${last.inputDb} ${table.inputUnit}, P_out,sat ${outputDb[satIndex]!.toFixed(2)} ${table.inputUnit === 'dBm' ? 'dBm' : 'dB'})`,
    smallSignalGainLinear: gainSmall,
    inputSaturationAmplitude: dbToAmplitude(inputDb[satIndex]!),
    outputSaturationAmplitude: dbToAmplitude(outputDb[satIndex]!),
    memoryless: true,
    amAm,
    amPmRad,
    apply: (inIq, inputScale, outIq) => applyMemoryless(model, true, inIq, inputScale, outIq),
    warnings,
  };
  return model;
}

/** Saturated output power in dBm of a dBm table (P_in + gain at the row of highest output); undefined for dBFS tables. */
export function tableSaturatedOutputDbm(table: AmAmTable): number | undefined {
  if (table.inputUnit !== 'dBm') return undefined;
  return Math.max(...table.rows.map((r) => r.inputDb + r.gainDb));
}
