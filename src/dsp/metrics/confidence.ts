/**
 * Two-sided 95 % quantile of the standard normal distribution, z = Φ^−1(0.975) (any table of the normal distribution).
 */
export const Z_95 = 1.959963984540054;

/** A probability interval [lower, upper]. */
export interface ProbabilityInterval {
  readonly lower: number;
  readonly upper: number;
}

/**
 * Wilson score interval for a binomial proportion (E. B. Wilson, "Probable inference, the law of succession, and
 * statistical inference", J. Amer. Statist. Assoc. 22 (1927) 209–212):
 *   centre = (k + z²/2) / (n + z²),  half-width = z·√(k(n − k)/n + z²/4) / (n + z²).
 * Unlike the normal approximation it stays inside [0, 1] and is useful at k = 0 (upper bound ≈ z²/n).
 * @param exceedances k, number of trials in which the event happened (0 ≤ k ≤ n; need not be whole when n is an
 *   effective sample size)
 * @param trials n > 0
 * @param z normal quantile of the confidence level (default Z_95, 95 %)
 */
export function wilsonInterval(exceedances: number, trials: number, z = Z_95): ProbabilityInterval {
  if (!(trials > 0)) return { lower: 0, upper: 1 };
  const k = Math.min(Math.max(exceedances, 0), trials);
  const n = trials;
  const z2 = z * z;
  const denominator = n + z2;
  const centre = (k + z2 / 2) / denominator;
  const halfWidth = (z * Math.sqrt((k * (n - k)) / n + z2 / 4)) / denominator;
  return { lower: Math.max(0, centre - halfWidth), upper: Math.min(1, centre + halfWidth) };
}
