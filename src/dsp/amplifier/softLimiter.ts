import { applyMemoryless, dbToAmplitude, requirePositive, type AmplifierModel } from './amplifierModel';

export interface SoftLimiterParams {
  /** A_sat: output clipping amplitude (default 1). */
  readonly outputSaturationAmplitude?: number;
  /** Linear gain below clipping, dB (default 0). */
  readonly gainDb?: number;
}

/**
 * The ideal soft limiter (clipper): linear up to the clipping level, constant beyond it, no AM/PM:
 *   A(r) = G·r for G·r ≤ A_sat, A_sat otherwise
 * (the limit of Rapp's model as p → ∞; the nonlinearity analysed by Ochiai & Imai, IEEE Trans. Commun.
 * 50(1):89–101, 2002, and by Dardari, Tralli & Vaccari, IEEE Trans. Commun. 48(10):1755–1764, 2000).
 * r_sat = A_sat/G.
 */
export function createSoftLimiterModel(params: SoftLimiterParams = {}): AmplifierModel {
  const aSat = params.outputSaturationAmplitude ?? 1;
  requirePositive(aSat, 'amplifier.outputSaturationAmplitude');
  const gain = dbToAmplitude(params.gainDb ?? 0);
  const rSat = aSat / gain;
  const model: AmplifierModel = {
    kind: 'limiter',
    description: `ideal soft limiter, G = ${(params.gainDb ?? 0).toFixed(2)} dB, A_sat = ${aSat} (output)`,
    smallSignalGainLinear: gain,
    inputSaturationAmplitude: rSat,
    outputSaturationAmplitude: aSat,
    memoryless: true,
    amAm: (r) => (r <= rSat ? gain * r : aSat),
    amPmRad: () => 0,
    apply: (inIq, inputScale, outIq) => applyMemoryless(model, false, inIq, inputScale, outIq),
    warnings: [],
  };
  return model;
}
