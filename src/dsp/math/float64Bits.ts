/**
 * Helpers for the deterministic math functions: the two 32-bit words of a double, exact powers of two, and the
 * error-free transformations (two-sum, two-product) that carry a value as an unevaluated sum hi + lo.
 *
 * Everything here uses only IEEE 754 operations that are correctly rounded (+ − × ÷; IEEE 754-2019 §5.4), so the
 * results are the same on every conforming JavaScript engine.
 */

// Float64Array and Int32Array views of one buffer. Typed arrays use the platform's byte order, so find which
// 32-bit word holds the sign and exponent once (little-endian on every platform we know of, but not assumed).
const f64 = new Float64Array(1);
const i32 = new Int32Array(f64.buffer);
f64[0] = -0;
const HI = i32[1] === 0 ? 0 : 1;
const LO = 1 - HI;

/** The upper 32 bits of `x` (sign, exponent, 20 mantissa bits), as a signed int32. */
export function highWord(x: number): number {
  f64[0] = x;
  return i32[HI]!;
}

/** The lower 32 bits of `x`'s mantissa, as an unsigned int32. */
export function lowWord(x: number): number {
  f64[0] = x;
  return i32[LO]! >>> 0;
}

/** The double whose upper and lower words are `hi` and `lo`. */
export function fromWords(hi: number, lo: number): number {
  i32[HI] = hi | 0;
  i32[LO] = lo | 0;
  return f64[0]!;
}

const MIN_EXPONENT = -1074;
const MAX_EXPONENT = 1023;
// 2^k for k = −1074 … 1023, built by halving and doubling (every step is exact).
const POWERS_OF_TWO = (() => {
  const table = new Float64Array(MAX_EXPONENT - MIN_EXPONENT + 1);
  let p = 1;
  for (let k = 0; k <= MAX_EXPONENT; k++, p *= 2) table[k - MIN_EXPONENT] = p;
  p = 1;
  for (let k = 0; k >= MIN_EXPONENT; k--, p /= 2) table[k - MIN_EXPONENT] = p;
  return table;
})();

/** 2^k exactly, for integer k in [−1074, 1023]; 0 below and Infinity above. */
export function twoPow(k: number): number {
  if (k < MIN_EXPONENT) return 0;
  if (k > MAX_EXPONENT) return Number.POSITIVE_INFINITY;
  return POWERS_OF_TWO[k - MIN_EXPONENT]!;
}

/**
 * Scratch result of the error-free transformations below: the exact value is `dd[0] + dd[1]`. A shared typed array
 * rather than exported variables, so that reading it stays fast however a bundler rewrites module bindings.
 */
export const dd = new Float64Array(2);

/** a + b = dd[0] + dd[1] exactly (Knuth's two-sum; from memory, common practice). */
export function twoSum(a: number, b: number): void {
  const s = a + b;
  const bb = s - a;
  dd[0] = s;
  dd[1] = a - (s - bb) + (b - bb);
}

/** a + b = dd[0] + dd[1] exactly when |a| ≥ |b| or a is 0 (Dekker's fast two-sum; from memory). */
export function fastTwoSum(a: number, b: number): void {
  const s = a + b;
  dd[0] = s;
  dd[1] = b - (s - a);
}

// Dekker's split: 2^27 + 1 cuts a double into two halves of ≤ 26 bits, so their products are exact.
const SPLITTER = 134217729;

/** a × b = dd[0] + dd[1] exactly, barring overflow or underflow (Dekker/Veltkamp two-product; from memory). */
export function twoProduct(a: number, b: number): void {
  const p = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  dd[0] = p;
  dd[1] = ah * bh - p + ah * bl + al * bh + al * bl;
}

/** A non-negative BigInt fixed-point value v·2^−fractionBits as dd[0] + dd[1] (dd[0] = round(v), dd[1] the rest). */
export function fixedToDouble(value: bigint, fractionBits: number): void {
  // Keep 120 fractional bits: the truncation costs < 2^−120, far below what the callers need.
  const shift = fractionBits - 120;
  const v = shift > 0 ? value >> BigInt(shift) : value << BigInt(-shift);
  // Number(bigint) rounds to nearest (ECMA-262 §21.1.1.1 Number(value) → ℝ to Number), so it is the same everywhere.
  const hi = Number(v);
  const lo = Number(v - BigInt(hi));
  const scale = twoPow(-120);
  dd[0] = hi * scale;
  dd[1] = lo * scale;
}
