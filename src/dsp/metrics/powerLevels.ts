import { DspError } from '../errors';

/**
 * Mean power, peak power and crest factor of a signal, in dB relative to |x|² = 1 (the unscaled formula units of the
 * generator) and, when a full scale is given, in dBFS: 10·log10(|x|²/A_fs²), so that a constant-envelope signal of
 * magnitude A_fs reads 0 dBFS (common practice for complex baseband).
 */
export interface PowerLevels {
  readonly meanPowerDb: number;
  readonly peakPowerDb: number;
  /** peak/mean, dB (= PAPR over the whole record). */
  readonly crestFactorDb: number;
  readonly meanPowerDbfs: number | null;
  readonly peakPowerDbfs: number | null;
  readonly fullScaleAmplitude: number | null;
}

/**
 * Levels from accumulated power statistics.
 * @param sumPower Σ|x[n]|²
 * @param peakPower max |x[n]|²
 * @param numSamples n ≥ 1
 * @param fullScaleAmplitude A_fs > 0 in sample units, or undefined for no dBFS figures
 */
export function powerLevelsFromStats(sumPower: number, peakPower: number, numSamples: number, fullScaleAmplitude?: number): PowerLevels {
  if (!(numSamples >= 1) || !(sumPower > 0)) throw new DspError('INVALID_CONFIG', 'Power levels need at least one sample of non-zero power.');
  if (fullScaleAmplitude !== undefined && !(fullScaleAmplitude > 0 && Number.isFinite(fullScaleAmplitude))) {
    throw new DspError('INVALID_CONFIG', `fullScale must be a positive amplitude in sample units; got ${fullScaleAmplitude}.`, { field: 'fullScale' });
  }
  const meanPower = sumPower / numSamples;
  const meanPowerDb = 10 * Math.log10(meanPower);
  const peakPowerDb = 10 * Math.log10(peakPower);
  const fsDb = fullScaleAmplitude === undefined ? null : 20 * Math.log10(fullScaleAmplitude);
  return {
    meanPowerDb,
    peakPowerDb,
    crestFactorDb: peakPowerDb - meanPowerDb,
    meanPowerDbfs: fsDb === null ? null : meanPowerDb - fsDb,
    peakPowerDbfs: fsDb === null ? null : peakPowerDb - fsDb,
    fullScaleAmplitude: fullScaleAmplitude ?? null,
  };
}

/** Levels of a signal held in memory (interleaved IQ). */
export function computePowerLevels(signalIq: Float64Array, fullScaleAmplitude?: number): PowerLevels {
  let sum = 0;
  let peak = 0;
  for (let i = 0; i < signalIq.length; i += 2) {
    const p = signalIq[i]! * signalIq[i]! + signalIq[i + 1]! * signalIq[i + 1]!;
    sum += p;
    if (p > peak) peak = p;
  }
  return powerLevelsFromStats(sum, peak, signalIq.length / 2, fullScaleAmplitude);
}
