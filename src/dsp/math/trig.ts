/**
 * Deterministic sin and cos: the same bits on every JavaScript engine, unlike Math.sin/Math.cos, which ECMA-262
 * §21.3.2 leaves implementation-approximated (Node 20 and Chromium differ in the last bit).
 *
 * Method (fdlibm algorithm, common practice; constants from fdlibm's k_sin.c, k_cos.c and e_rem_pio2.c, from memory,
 * checked by the tests against Math.sin/Math.cos and the π/2 split against a BigInt π):
 * 1. Reduce x = n·π/2 + r, |r| ≤ π/4, with r carried as hi + lo. Up to |x| ≤ 2^19·π/2 (≈ 8.2e5) by Cody–Waite with
 *    π/2 split in three 33-bit parts (n·part is exact); beyond, exactly with BigInt arithmetic against π/2 to 1400
 *    bits, so every finite double is reduced correctly (slow, microseconds, but never used by the engine's phases).
 * 2. Evaluate the degree-13 sin or degree-14 cos minimax polynomial on r (FreeBSD's k_cos.c form for cos).
 * Accuracy: < 1 ulp (tested: max 1 ulp against Math.* on ±1e6 and on large arguments). NaN and ±Infinity give NaN.
 * Only IEEE 754 correctly rounded operations are used (IEEE 754-2019 §5.4).
 */
import { HALF_PI_FRACTION_BITS, halfPiFixed } from './bigConstants';
import { dd as sharedDd, fixedToDouble, highWord, lowWord } from './float64Bits';

const S1 = -1.66666666666666324348e-1;
const S2 = 8.33333333332248946124e-3;
const S3 = -1.98412698298579493134e-4;
const S4 = 2.75573137070700676789e-6;
const S5 = -2.50507602534068634195e-8;
const S6 = 1.58969099521155010221e-10;

const C1 = 4.16666666666666019037e-2;
const C2 = -1.38888888888741095749e-3;
const C3 = 2.48015872894767294178e-5;
const C4 = -2.75573143513906633035e-7;
const C5 = 2.08757232129817482790e-9;
const C6 = -1.13596475577881948265e-11;

const INV_PIO2 = 6.36619772367581382433e-1;
/** First 33 bits of π/2, and π/2 − PIO2_1. */
export const PIO2_1 = 1.57079632673412561417;
const PIO2_1T = 6.07710050650619224932e-11;
/** Next 33 bits, and π/2 − (PIO2_1 + PIO2_2). */
export const PIO2_2 = 6.07710050630396597660e-11;
const PIO2_2T = 2.02226624879595063154e-21;
/** Next 33 bits, and π/2 − (PIO2_1 + PIO2_2 + PIO2_3). */
export const PIO2_3 = 2.02226624871116645580e-21;
export const PIO2_3T = 8.47842766036889956997e-32;

const PIO4 = 0.7853981633974483;
/** Arguments above this go to the exact BigInt reduction (fdlibm's medium-size limit, 2^19·π/2). */
export const MEDIUM_REDUCTION_LIMIT = 823549.6653765104;
const TWO_M15 = 1 / 32768;
const TWO_M48 = 1 / 281474976710656;
const TWO_M27 = 7.450580596923828e-9;

const dd = sharedDd;
// Reduced argument r = reduced[0] + reduced[1] of the last reduceArgument call (a typed array: assigning doubles to
// module-level variables allocates a heap number each time in V8).
const reduced = new Float64Array(2);

/** Sin on [−π/4, π/4] of x + y (|y| ≤ ulp(x)/2); `exactX` says y is 0. */
function kernelSin(x: number, y: number, exactX: boolean): number {
  if (Math.abs(x) < TWO_M27) return x;
  const z = x * x;
  const v = z * x;
  const r = S2 + z * (S3 + z * (S4 + z * (S5 + z * S6)));
  if (exactX) return x + v * (S1 + z * r);
  return x - (z * (0.5 * y - v * r) - y - v * S1);
}

/** Cos on [−π/4, π/4] of x + y (FreeBSD's k_cos.c evaluation, which needs no bit manipulation). */
function kernelCos(x: number, y: number): number {
  if (Math.abs(x) < TWO_M27) return 1;
  const z = x * x;
  const w2 = z * z;
  const r = z * (C1 + z * (C2 + z * C3)) + w2 * w2 * (C4 + z * (C5 + z * C6));
  const hz = 0.5 * z;
  const w = 1 - hz;
  return w + (1 - w - hz + (z * r - x * y));
}

/** Sets reduced[0] + reduced[1] = x − n·π/2, at most about π/4 in size, (about) and returns n mod 4 (0…3). x is finite, |x| > π/4. */
function reduceArgument(x: number): number {
  const t = Math.abs(x);
  let n: number;
  if (t <= MEDIUM_REDUCTION_LIMIT) {
    n = Math.floor(t * INV_PIO2 + 0.5);
    // n < 2^20 and each PIO2_k has 33 bits, so n·PIO2_k is exact; the tails carry the rest of π/2.
    let r = t - n * PIO2_1;
    let w = n * PIO2_1T;
    let a = r - w;
    // Cancellation: when r lost more than ~16 bits against t, take the next 33 bits of π/2 (fdlibm's rounds 2 and 3).
    if (Math.abs(a) < t * TWO_M15) {
      let u = r;
      w = n * PIO2_2;
      r = u - w;
      w = n * PIO2_2T - (u - r - w);
      a = r - w;
      if (Math.abs(a) < t * TWO_M48) {
        u = r;
        w = n * PIO2_3;
        r = u - w;
        w = n * PIO2_3T - (u - r - w);
        a = r - w;
      }
    }
    reduced[0] = a;
    reduced[1] = r - a - w;
  } else {
    n = reduceLarge(t);
  }
  if (x < 0) {
    reduced[0] = -reduced[0]!;
    reduced[1] = -reduced[1]!;
    n = -n;
  }
  return n & 3;
}

const SIGNIFICAND_BITS = 52;

/** Exact reduction of t ≥ 2^19 against π/2 to 1400 bits; sets `reduced` and returns n mod 4. */
function reduceLarge(t: number): number {
  const hi = highWord(t);
  const exponent = ((hi >>> 20) & 0x7ff) - 1023 - SIGNIFICAND_BITS;
  const significand = (BigInt((hi & 0xfffff) | 0x100000) << 32n) | BigInt(lowWord(t));
  // t = significand·2^exponent. Working with F fractional bits, the truncation of π/2 (< 1 unit) times the quotient
  // (< 2^(exponent + 53)) stays below 2^(exponent + 53 − F) = 2^−150.
  const fractionBits = exponent + 53 + 150;
  const halfPi = halfPiFixed() >> BigInt(HALF_PI_FRACTION_BITS - fractionBits);
  const scaled = significand << BigInt(exponent + fractionBits);
  let quotient = scaled / halfPi;
  let remainder = scaled - quotient * halfPi;
  if (2n * remainder > halfPi) {
    remainder -= halfPi;
    quotient += 1n;
  }
  const negative = remainder < 0n;
  fixedToDouble(negative ? -remainder : remainder, fractionBits);
  reduced[0] = negative ? -dd[0]! : dd[0]!;
  reduced[1] = negative ? -dd[1]! : dd[1]!;
  return Number(quotient & 3n);
}

/** sin(x), x in radians, < 1 ulp, identical on every engine. NaN for NaN and ±Infinity; sin(−0) = −0. */
export function sin(x: number): number {
  if (Math.abs(x) <= PIO4) return kernelSin(x, 0, true);
  if (!Number.isFinite(x)) return Number.NaN;
  switch (reduceArgument(x)) {
    case 0:
      return kernelSin(reduced[0]!, reduced[1]!, false);
    case 1:
      return kernelCos(reduced[0]!, reduced[1]!);
    case 2:
      return -kernelSin(reduced[0]!, reduced[1]!, false);
    default:
      return -kernelCos(reduced[0]!, reduced[1]!);
  }
}

/** cos(x), x in radians, < 1 ulp, identical on every engine. NaN for NaN and ±Infinity. */
export function cos(x: number): number {
  if (Math.abs(x) <= PIO4) return kernelCos(x, 0);
  if (!Number.isFinite(x)) return Number.NaN;
  switch (reduceArgument(x)) {
    case 0:
      return kernelCos(reduced[0]!, reduced[1]!);
    case 1:
      return -kernelSin(reduced[0]!, reduced[1]!, false);
    case 2:
      return -kernelCos(reduced[0]!, reduced[1]!);
    default:
      return kernelSin(reduced[0]!, reduced[1]!, false);
  }
}

/**
 * Writes cos(angleRad) to out[index] and sin(angleRad) to out[index + 1] with one argument reduction: the
 * interleaved (re, im) layout of e^{j·angle}. Same values as `cos` and `sin`.
 * @param angleRad angle in radians
 * @param out interleaved IQ buffer; two values are written
 * @param index even index of the real part
 */
export function writeCosSin(angleRad: number, out: Float64Array, index: number): void {
  if (Math.abs(angleRad) <= PIO4) {
    out[index] = kernelCos(angleRad, 0);
    out[index + 1] = kernelSin(angleRad, 0, true);
    return;
  }
  if (!Number.isFinite(angleRad)) {
    out[index] = Number.NaN;
    out[index + 1] = Number.NaN;
    return;
  }
  const quadrant = reduceArgument(angleRad);
  const s = kernelSin(reduced[0]!, reduced[1]!, false);
  const c = kernelCos(reduced[0]!, reduced[1]!);
  out[index] = quadrant === 0 ? c : quadrant === 1 ? -s : quadrant === 2 ? -c : s;
  out[index + 1] = quadrant === 0 ? s : quadrant === 1 ? c : quadrant === 2 ? -s : -c;
}
