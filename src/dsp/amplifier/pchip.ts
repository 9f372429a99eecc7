import { DspError } from '../errors';

/** A monotone piecewise-cubic Hermite interpolant: knots x (strictly increasing), values y, slopes m. Plain data. */
export interface PchipInterpolant {
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly slopes: Float64Array;
}

/**
 * Builds the monotone cubic interpolant of F. N. Fritsch & R. E. Carlson, "Monotone piecewise cubic interpolation",
 * SIAM J. Numer. Anal. 17(2):238–246, 1980: secants δ_k; initial slopes the mean of neighbouring secants (0 where
 * they differ in sign or either is 0; one-sided at the ends); then, on each interval with δ_k ≠ 0, α = m_k/δ_k and
 * β = m_{k+1}/δ_k are pulled back onto the circle α² + β² ≤ 9, which is sufficient for monotonicity (their §4).
 * The result passes through every knot, is monotone on every interval where the data are, and never overshoots.
 * @throws DspError INTERNAL when x is not strictly increasing or the lengths differ (callers validate first)
 */
export function createPchip(x: ArrayLike<number>, y: ArrayLike<number>): PchipInterpolant {
  const n = x.length;
  if (n !== y.length || n < 2) throw new DspError('INTERNAL', `PCHIP needs ≥ 2 knots with one value each; got ${n} knots, ${y.length} values.`);
  const xs = Float64Array.from(x);
  const ys = Float64Array.from(y);
  const secant = new Float64Array(n - 1);
  for (let k = 0; k < n - 1; k++) {
    const h = xs[k + 1]! - xs[k]!;
    if (!(h > 0)) throw new DspError('INTERNAL', `PCHIP knots must increase strictly; x[${k}] = ${xs[k]}, x[${k + 1}] = ${xs[k + 1]}.`);
    secant[k] = (ys[k + 1]! - ys[k]!) / h;
  }
  const m = new Float64Array(n);
  m[0] = secant[0]!;
  m[n - 1] = secant[n - 2]!;
  for (let k = 1; k < n - 1; k++) {
    const a = secant[k - 1]!;
    const b = secant[k]!;
    m[k] = a * b > 0 ? (a + b) / 2 : 0;
  }
  for (let k = 0; k < n - 1; k++) {
    const d = secant[k]!;
    if (d === 0) {
      m[k] = 0;
      m[k + 1] = 0;
      continue;
    }
    const alpha = m[k]! / d;
    const beta = m[k + 1]! / d;
    const radius2 = alpha * alpha + beta * beta;
    if (radius2 > 9) {
      const tau = 3 / Math.sqrt(radius2);
      m[k] = tau * alpha * d;
      m[k + 1] = tau * beta * d;
    }
  }
  return { x: xs, y: ys, slopes: m };
}

/**
 * Evaluates the interpolant at `at` (cubic Hermite basis on the interval holding it). Outside the knots it
 * holds the end value; callers that want another extrapolation handle it before calling.
 */
export function evaluatePchip(p: PchipInterpolant, at: number): number {
  const { x, y, slopes } = p;
  const n = x.length;
  if (at <= x[0]!) return y[0]!;
  if (at >= x[n - 1]!) return y[n - 1]!;
  // Binary search for the interval k with x[k] ≤ at < x[k+1].
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid]! <= at) lo = mid;
    else hi = mid;
  }
  const h = x[lo + 1]! - x[lo]!;
  const t = (at - x[lo]!) / h;
  const t2 = t * t;
  const t3 = t2 * t;
  const h00 = 2 * t3 - 3 * t2 + 1;
  const h10 = t3 - 2 * t2 + t;
  const h01 = -2 * t3 + 3 * t2;
  const h11 = t3 - t2;
  return h00 * y[lo]! + h10 * h * slopes[lo]! + h01 * y[lo + 1]! + h11 * h * slopes[lo + 1]!;
}
