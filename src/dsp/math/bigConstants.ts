/**
 * High-precision constants as BigInt fixed-point numbers, computed from their series with exact integer
 * arithmetic (so no digit table has to be trusted): π/2 for the large-argument reduction of sin/cos, and
 * natural logarithms for the extended-precision log behind pow and log10.
 */

/** atanh(p/q)·2^bits, truncated, for 0 ≤ p < q (series Σ (p/q)^(2i+1)/(2i+1); from memory). */
function atanhFixed(p: bigint, q: bigint, bits: bigint): bigint {
  let term = (p << bits) / q; // (p/q)^(2i+1)·2^bits
  const q2 = q * q;
  const p2 = p * p;
  let sum = 0n;
  for (let i = 1n; term !== 0n; i += 2n) {
    sum += term / i;
    term = (term * p2) / q2;
  }
  return sum;
}

/** atan(1/q)·2^bits, truncated (series Σ (−1)^i q^−(2i+1)/(2i+1); from memory). */
function atanInverseFixed(q: bigint, bits: bigint): bigint {
  let term = (1n << bits) / q;
  const q2 = q * q;
  let sum = 0n;
  let sign = 1n;
  for (let i = 1n; term !== 0n; i += 2n) {
    sum += (sign * term) / i;
    term /= q2;
    sign = -sign;
  }
  return sum;
}

/** Fractional bits of `halfPiFixed()`: enough for the reduction of any finite double (exponent ≤ 1023). */
export const HALF_PI_FRACTION_BITS = 1400;

let halfPi: bigint | null = null;

/**
 * π/2 · 2^1400 (error a few units in the last place), from Machin's formula π/4 = 4·atan(1/5) − atan(1/239)
 * (John Machin, 1706; from memory). Computed once, on first use.
 */
export function halfPiFixed(): bigint {
  if (halfPi === null) {
    const guard = 32n;
    const bits = BigInt(HALF_PI_FRACTION_BITS) + guard;
    const quarterPi = 4n * atanInverseFixed(5n, bits) - atanInverseFixed(239n, bits);
    halfPi = (2n * quarterPi) >> guard;
  }
  return halfPi;
}

/** ln(1 + j/64)·2^bits for integer j > −64: 2·atanh(j / (128 + j)), since (c − 1)/(c + 1) = j/(128 + j) for c = 1 + j/64. */
export function logOfTableStepFixed(j: number, bits: bigint): bigint {
  if (j === 0) return 0n;
  const magnitude = 2n * atanhFixed(BigInt(Math.abs(j)), BigInt(128 + j), bits);
  return j < 0 ? -magnitude : magnitude;
}

/** ln 2 · 2^bits = 2·atanh(1/3)·2^bits. */
export function ln2Fixed(bits: bigint): bigint {
  return 2n * atanhFixed(1n, 3n, bits);
}

/** (1/ln 10)·2^bits, from ln 10 = 3·ln 2 + ln(5/4) = 3·ln 2 + 2·atanh(1/9). */
export function inverseLn10Fixed(bits: bigint): bigint {
  const guard = 16n;
  const ln10 = 3n * ln2Fixed(bits + guard) + 2n * atanhFixed(1n, 9n, bits + guard);
  return (1n << (2n * (bits + guard))) / ln10 >> guard;
}
