import { DspError } from '../errors';
import type { AmplifierModel } from './amplifierModel';

/** Static AM/AM and AM/PM curves of a model, sampled for plotting. All arrays have numPoints values. */
export interface AmplifierCurves {
  /** Input power relative to input saturation, 20·log10(r / r_sat), dB (ascending). */
  readonly inputDbRelSat: Float64Array;
  /** Output power relative to output saturation, 20·log10(A(r) / A_sat), dB. */
  readonly outputDbRelSat: Float64Array;
  /** Gain relative to the small-signal gain, 20·log10(A(r) / (G·r)), dB (0 in the linear region, negative in compression). */
  readonly gainCompressionDb: Float64Array;
  /** AM/PM, degrees. */
  readonly phaseDeg: Float64Array;
  /** Input level of 1 dB gain compression relative to r_sat, dB (NaN if not reached in the range). */
  readonly inputP1dbRelSatDb: number;
}

/**
 * Samples a model's AM/AM and AM/PM from `fromDb` to `toDb` relative to input saturation (constant-envelope input,
 * so for a memory polynomial these are its static curves). The 1 dB compression point is located by linear
 * interpolation of the sampled gain curve.
 */
export function computeAmplifierCurves(model: AmplifierModel, fromDb = -30, toDb = 10, numPoints = 201): AmplifierCurves {
  if (!(toDb > fromDb) || !Number.isInteger(numPoints) || numPoints < 2) {
    throw new DspError('INVALID_CONFIG', `Amplifier curves need fromDb < toDb and numPoints ≥ 2 (whole); got ${fromDb}, ${toDb}, ${numPoints}.`);
  }
  const inputDbRelSat = new Float64Array(numPoints);
  const outputDbRelSat = new Float64Array(numPoints);
  const gainCompressionDb = new Float64Array(numPoints);
  const phaseDeg = new Float64Array(numPoints);
  const rSat = model.inputSaturationAmplitude;
  const aSat = model.outputSaturationAmplitude;
  const g = model.smallSignalGainLinear;
  let p1db = Number.NaN;
  for (let i = 0; i < numPoints; i++) {
    const db = fromDb + ((toDb - fromDb) * i) / (numPoints - 1);
    const r = rSat * 10 ** (db / 20);
    const a = model.amAm(r);
    inputDbRelSat[i] = db;
    outputDbRelSat[i] = 20 * Math.log10(a / aSat);
    gainCompressionDb[i] = 20 * Math.log10(a / (g * r));
    phaseDeg[i] = (model.amPmRad(r) * 180) / Math.PI;
    if (Number.isNaN(p1db) && i > 0 && gainCompressionDb[i]! <= -1 && gainCompressionDb[i - 1]! > -1) {
      const t = (-1 - gainCompressionDb[i - 1]!) / (gainCompressionDb[i]! - gainCompressionDb[i - 1]!);
      p1db = inputDbRelSat[i - 1]! + t * (db - inputDbRelSat[i - 1]!);
    }
  }
  return { inputDbRelSat, outputDbRelSat, gainCompressionDb, phaseDeg, inputP1dbRelSatDb: p1db };
}
