/**
 * Length-31 Gold sequence c(n) of TS 38.211 §5.2.1 (identical to TS 36.211 §7.2):
 *   c(n) = (x1(n + Nc) + x2(n + Nc)) mod 2,  Nc = 1600,
 *   x1(n + 31) = (x1(n + 3) + x1(n)) mod 2,                      x1(0) = 1, x1(n) = 0 for n = 1…30,
 *   x2(n + 31) = (x2(n + 3) + x2(n + 2) + x2(n + 1) + x2(n)) mod 2,   c_init = Σ_{i=0}^{30} x2(i)·2^i.
 */
export const GOLD_NC = 1600;

/**
 * Writes c(0)…c(out.length − 1) for initialisation `cInit` (0 ≤ c_init < 2^31) into `out`, one bit per byte.
 * Each register is a 31-bit word whose bit i holds x(n + i); the new value x(n + 31) enters at bit 30.
 */
export function fillGoldSequence(cInit: number, out: Uint8Array): Uint8Array {
  let x1 = 1;
  let x2 = cInit & 0x7fffffff;
  const total = GOLD_NC + out.length;
  for (let n = 0; n < total; n++) {
    if (n >= GOLD_NC) out[n - GOLD_NC] = (x1 ^ x2) & 1;
    const f1 = ((x1 >>> 3) ^ x1) & 1;
    const f2 = ((x2 >>> 3) ^ (x2 >>> 2) ^ (x2 >>> 1) ^ x2) & 1;
    x1 = (x1 >>> 1) | (f1 << 30);
    x2 = (x2 >>> 1) | (f2 << 30);
  }
  return out;
}

/**
 * QPSK reference symbols from the Gold sequence, r(m) = (1/√2)(1 − 2c(2m)) + j(1/√2)(1 − 2c(2m + 1)),
 * as TS 36.211 §6.10.1.1 (CRS) and TS 38.211 §6.4.1.1.1.1 (PUSCH DMRS without transform precoding) define them.
 * @param outIq interleaved r(0)…r(M − 1), 2M values
 */
export function fillGoldQpsk(cInit: number, outIq: Float64Array): Float64Array {
  const c = fillGoldSequence(cInit, new Uint8Array(outIq.length));
  for (let i = 0; i < outIq.length; i++) outIq[i] = Math.SQRT1_2 * (1 - 2 * c[i]!);
  return outIq;
}
