import { applyMemoryless, requirePositive, type AmplifierModel } from './amplifierModel';

export interface SalehParams {
  /** α_a, AM/AM scale (linear gain at small signal). */
  readonly alphaA: number;
  /** β_a, AM/AM knee (1/amplitude²). */
  readonly betaA: number;
  /** α_φ, AM/PM scale (rad per amplitude²). */
  readonly alphaPhi: number;
  /** β_φ, AM/PM knee (1/amplitude²). */
  readonly betaPhi: number;
}

/**
 * The classic travelling-wave-tube fit of Saleh 1981: α_a = 2.1587, β_a = 1.1517, α_φ = 4.0033, β_φ = 9.1040
 * (values as published and widely reproduced in public code; REFERENCE.md §7 [S2]).
 */
export const SALEH_TWT_PRESET: SalehParams = { alphaA: 2.1587, betaA: 1.1517, alphaPhi: 4.0033, betaPhi: 9.104 };

/**
 * Saleh's frequency-independent TWT model (A. A. M. Saleh, "Frequency-independent and frequency-dependent
 * nonlinear models of TWT amplifiers", IEEE Trans. Commun. COM-29(11):1715–1720, 1981):
 *   A(r) = α_a·r / (1 + β_a·r²),   Φ(r) = α_φ·r² / (1 + β_φ·r²) rad.
 * Saturation is the AM/AM peak (derived by dA/dr = 0): r_sat = 1/√β_a, A_sat = α_a/(2√β_a). Above r_sat the output
 * falls (fold-back), so output back-off has a minimum near 0 dB.
 */
export function createSalehModel(params: SalehParams = SALEH_TWT_PRESET): AmplifierModel {
  const { alphaA, betaA, alphaPhi, betaPhi } = params;
  requirePositive(alphaA, 'amplifier.alphaA');
  requirePositive(betaA, 'amplifier.betaA');
  if (!Number.isFinite(alphaPhi)) requirePositive(Number.NaN, 'amplifier.alphaPhi');
  if (!(betaPhi >= 0)) requirePositive(Number.NaN, 'amplifier.betaPhi');
  const amAm = (r: number): number => (alphaA * r) / (1 + betaA * r * r);
  const amPmRad = (r: number): number => (alphaPhi * r * r) / (1 + betaPhi * r * r);
  const model: AmplifierModel = {
    kind: 'saleh',
    description: `Saleh α_a = ${alphaA}, β_a = ${betaA}, α_φ = ${alphaPhi}, β_φ = ${betaPhi}`,
    smallSignalGainLinear: alphaA,
    inputSaturationAmplitude: 1 / Math.sqrt(betaA),
    outputSaturationAmplitude: alphaA / (2 * Math.sqrt(betaA)),
    memoryless: true,
    amAm,
    amPmRad,
    apply: (inIq, inputScale, outIq) => applyMemoryless(model, alphaPhi !== 0, inIq, inputScale, outIq),
    warnings: [],
  };
  return model;
}
