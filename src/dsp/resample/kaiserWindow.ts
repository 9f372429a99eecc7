import { DspError } from '../errors';
import { log10, pow } from '../math/expLog';

/**
 * Kaiser-window FIR design formulas (J. F. Kaiser, "Nonrecursive digital filter design using the I0-sinh window
 * function", Proc. IEEE ISCAS 1974; as given in Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.5.3,
 * eqs. 7.62–7.63).
 */

/**
 * Modified Bessel function of the first kind, order 0, by its power series I0(x) = Σ_k ((x/2)^k / k!)².
 * The terms fall quickly once k > x/2; summing until a term is below 1e-17 of the total gives full double precision
 * for the arguments a Kaiser window uses (β ≤ 20).
 */
export function besselI0(x: number): number {
  const half = x / 2;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 500; k++) {
    term *= (half / k) * (half / k);
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  return sum;
}

/**
 * Kaiser's β for a stopband attenuation A = −20·log10(δ) dB (Oppenheim & Schafer eq. 7.62):
 * β = 0.1102(A − 8.7) for A > 50; 0.5842(A − 21)^0.4 + 0.07886(A − 21) for 21 ≤ A ≤ 50; 0 below 21.
 */
export function kaiserBeta(attenuationDb: number): number {
  if (attenuationDb > 50) return 0.1102 * (attenuationDb - 8.7);
  if (attenuationDb >= 21) return 0.5842 * pow(attenuationDb - 21, 0.4) + 0.07886 * (attenuationDb - 21);
  return 0;
}

/**
 * Kaiser's order estimate N = (A − 8) / (2.285·Δω) (Oppenheim & Schafer eq. 7.63); the filter has N + 1 taps.
 * @param attenuationDb A, dB
 * @param transitionWidthRad Δω = ωs − ωp, rad/sample (0 < Δω < π)
 */
export function kaiserOrder(attenuationDb: number, transitionWidthRad: number): number {
  if (!(transitionWidthRad > 0)) {
    throw new DspError('INVALID_CONFIG', `The filter's transition band must be wider than 0 rad/sample; got ${transitionWidthRad}.`);
  }
  return Math.max(1, Math.ceil((attenuationDb - 8) / (2.285 * transitionWidthRad)));
}

/**
 * Fills `out` (length K) with the Kaiser window w[n] = I0(β·√(1 − ((n − D)/D)²)) / I0(β), D = (K − 1)/2.
 * K = 1 gives [1].
 */
export function kaiserWindow(beta: number, out: Float64Array): Float64Array {
  const k = out.length;
  if (k === 1) {
    out[0] = 1;
    return out;
  }
  const d = (k - 1) / 2;
  const norm = besselI0(beta);
  for (let n = 0; n < k; n++) {
    const r = (n - d) / d;
    out[n] = besselI0(beta * Math.sqrt(Math.max(0, 1 - r * r))) / norm;
  }
  return out;
}

/** Passband deviation δp for a peak-to-peak passband ripple Rp dB: 20·log10((1 + δp)/(1 − δp)) = Rp. */
export function rippleDbToDelta(rippleDb: number): number {
  const g = pow(10, rippleDb / 20);
  return (g - 1) / (g + 1);
}

/** Peak-to-peak ripple in dB for a passband deviation δp (the inverse of rippleDbToDelta). */
export function deltaToRippleDb(delta: number): number {
  return 20 * log10((1 + delta) / (1 - delta));
}
