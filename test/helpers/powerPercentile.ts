/** Level (dB over the mean) that the instantaneous power |x|² exceeds with probability 1 − q (q = 0.999 → the 10⁻³ CCDF point of the sample power). */
export function powerPercentileDb(iq: Float64Array, q: number): number {
  const n = iq.length / 2;
  const p = new Float64Array(n);
  let mean = 0;
  for (let i = 0; i < n; i++) {
    p[i] = iq[2 * i]! ** 2 + iq[2 * i + 1]! ** 2;
    mean += p[i]!;
  }
  mean /= n;
  p.sort();
  return 10 * Math.log10(p[Math.min(n - 1, Math.floor(q * n))]! / mean);
}
