/**
 * Complementary error function by direct numerical integration of its definition,
 * erfc(x) = (2/√π)∫_x^∞ e^{−t²} dt (Simpson's rule over [x, x + 12], 20 000 intervals): an oracle independent
 * of any approximation formula, accurate to ~1e-12 for x ≥ 0.
 */
export function erfcByIntegration(x: number): number {
  const steps = 20000;
  const h = 12 / steps;
  let sum = 0;
  for (let i = 0; i <= steps; i++) {
    const t = x + i * h;
    const w = i === 0 || i === steps ? 1 : i % 2 === 1 ? 4 : 2;
    sum += w * Math.exp(-t * t);
  }
  return ((2 / Math.sqrt(Math.PI)) * sum * h) / 3;
}
