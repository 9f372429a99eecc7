import { applyMemoryless, dbToAmplitude, requirePositive, type AmplifierModel } from './amplifierModel';
import { pow } from '../math/expLog';

/** Optional AM/PM of the "modified Rapp" form Φ(r) = α·r^q / (1 + (r/β)^q) degrees, r the input amplitude. */
export interface RappAmPm {
  /** α, degrees per unit input amplitude^q. */
  readonly alphaDeg: number;
  /** β, input amplitude where the phase curve bends over (> 0). */
  readonly betaAmplitude: number;
  /** q, exponent (> 0). */
  readonly exponent: number;
}

export interface RappParams {
  /** Smoothness p (> 0); p → ∞ gives the ideal soft limiter. Typical solid-state PAs: 2…3. */
  readonly smoothness: number;
  /** A_sat: the OUTPUT saturation amplitude (default 1). */
  readonly outputSaturationAmplitude?: number;
  /** Small-signal gain G, dB (default 0). */
  readonly gainDb?: number;
  /** AM/PM; omitted = none (Rapp's original model has no AM/PM). */
  readonly amPm?: RappAmPm;
}

/**
 * Rapp's solid-state amplifier model (C. Rapp, "Effects of HPA-nonlinearity on a 4-DPSK/OFDM-signal for a
 * digital sound broadcasting system", 2nd European Conf. on Satellite Communications, Liège, 1991):
 *   A(r) = G·r / [1 + (G·r / A_sat)^{2p}]^{1/(2p)}.
 * Here **A_sat refers to the output**: A(r) → A_sat as r → ∞, and the input saturation amplitude is r_sat = A_sat/G
 * (where the linear gain line meets A_sat). At r = r_sat the gain has dropped by 10·log10(2)/p dB (derived:
 * A(r_sat) = A_sat·2^{−1/(2p)}, i.e. 1.505 dB at p = 2).
 * AM/PM (optional) uses the form given for the "modified Rapp" model in the IEEE 802.11ad evaluation
 * methodology and 3GPP NR PA studies (from memory — verify): Φ(r) = α·r^q / (1 + (r/β)^q) degrees.
 */
/** k when x = 2^k for a whole k ≥ 0 (x = 1, 2, 4, …, up to 2^10), else null. */
export function powerOfTwoExponent(x: number): number | null {
  let v = x;
  for (let k = 0; k <= 10; k++) {
    if (v === 1) return k;
    v /= 2;
  }
  return null;
}

export function createRappModel(params: RappParams): AmplifierModel {
  const p = params.smoothness;
  requirePositive(p, 'amplifier.smoothness');
  const aSat = params.outputSaturationAmplitude ?? 1;
  requirePositive(aSat, 'amplifier.outputSaturationAmplitude');
  const gain = dbToAmplitude(params.gainDb ?? 0);
  requirePositive(gain, 'amplifier.gainDb (as a linear gain)');
  const amPm = params.amPm;
  if (amPm) {
    requirePositive(amPm.betaAmplitude, 'amplifier.amPm.betaAmplitude');
    requirePositive(amPm.exponent, 'amplifier.amPm.exponent');
  }
  const twoP = 2 * p;
  const squarings = powerOfTwoExponent(twoP);
  const amAm =
    squarings === null
      ? (r: number): number => {
          const u = (gain * r) / aSat;
          // For large u, u^{2p} overflows: A → A_sat·u/(u^{2p})^{1/2p} = A_sat.
          const power = pow(u, twoP);
          if (!Number.isFinite(power)) return aSat;
          return (gain * r) / pow(1 + power, 1 / twoP);
        }
      : (r: number): number => {
          // 2p = 2^k (p = 0.5, 1, 2, 4, 8 …): u^{2p} by k squarings and the 2p-th root by k square roots — the same
          // function with correctly rounded operations only (IEEE 754 ×, √), several times faster than pow.
          const u = (gain * r) / aSat;
          let power = u;
          for (let i = 0; i < squarings; i++) power *= power;
          if (!Number.isFinite(power)) return aSat;
          let root = 1 + power;
          for (let i = 0; i < squarings; i++) root = Math.sqrt(root);
          return (gain * r) / root;
        };
  const amPmRad = amPm
    ? (r: number): number => ((amPm.alphaDeg * pow(r, amPm.exponent)) / (1 + pow(r / amPm.betaAmplitude, amPm.exponent))) * (Math.PI / 180)
    : (): number => 0;
  const model: AmplifierModel = {
    kind: 'rapp',
    description: `Rapp p = ${p}, G = ${(params.gainDb ?? 0).toFixed(2)} dB, A_sat = ${aSat} (output)${amPm ? `, AM/PM α = ${amPm.alphaDeg}°, β = ${amPm.betaAmplitude}, q = ${amPm.exponent}` : ''}`,
    smallSignalGainLinear: gain,
    inputSaturationAmplitude: aSat / gain,
    outputSaturationAmplitude: aSat,
    memoryless: true,
    amAm,
    amPmRad,
    apply: (inIq, inputScale, outIq) => applyMemoryless(model, amPm !== undefined, inIq, inputScale, outIq),
    warnings: [],
  };
  return model;
}
