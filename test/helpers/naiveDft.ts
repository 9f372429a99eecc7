/**
 * O(N²) DFT written straight from the definition X[k] = Σ x[n] e^{∓j2πkn/N}, with the angle reduced mod N
 * so large sizes stay exact. The reference every fast transform is checked against.
 */
export function naiveDft(iq: Float64Array, inverse = false): Float64Array {
  const n = iq.length / 2;
  const out = new Float64Array(2 * n);
  const sign = inverse ? 1 : -1;
  for (let k = 0; k < n; k++) {
    let re = 0;
    let im = 0;
    for (let t = 0; t < n; t++) {
      const angle = (sign * 2 * Math.PI * ((k * t) % n)) / n;
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      re += iq[2 * t]! * c - iq[2 * t + 1]! * s;
      im += iq[2 * t]! * s + iq[2 * t + 1]! * c;
    }
    out[2 * k] = re;
    out[2 * k + 1] = im;
  }
  return out;
}

/** Complex Gaussian test vector from a seeded generator. */
export function randomIq(n: number, next: () => number): Float64Array {
  const out = new Float64Array(2 * n);
  for (let i = 0; i < out.length; i++) out[i] = next();
  return out;
}
