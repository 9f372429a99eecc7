/**
 * Deterministic exp, log, log10 and pow: the same bits on every JavaScript engine, unlike Math.exp/log/log10/pow
 * and `**`, which ECMA-262 §21.3.2 and §6.1.6.1.3 leave implementation-approximated.
 *
 * - exp: fdlibm algorithm (e_exp.c, common practice; constants from memory, checked against Math.exp by the tests):
 *   x = k·ln2 + r, |r| ≤ ln2/2, a degree-5 minimax rational form for e^r, then an exact scaling by 2^k.
 * - log: our own table method, in extended precision (hi + lo): x = 2^k·m, m = c·(1 + s)/(1 − s) with
 *   c = 1 + j/64 the nearest table step, so ln m = ln c + 2·atanh s with |s| < 2^−7.4 and the series
 *   2s + 2s³/3 + … + 2s¹¹/11 (from memory). ln c and ln 2 are computed once from their series in BigInt
 *   (bigConstants.ts). The sum is good to about 2^−100 relative, so log and log10 round to nearest almost always.
 * - pow: exp of y·ln x with ln x in extended precision and y·ln x formed exactly (two-product), the low part passed
 *   into exp's reduction as fdlibm's e_pow.c does; exact integer powers of integers are computed by multiplication.
 * Accuracy < 1 ulp (tested: max ulp against Math.* reported by test/dsp/math). Special values follow Math.* exactly.
 * Only IEEE 754 correctly rounded operations are used (IEEE 754-2019 §5.4).
 */
import { inverseLn10Fixed, ln2Fixed, logOfTableStepFixed } from './bigConstants';
import { dd as sharedDd, fastTwoSum, fixedToDouble, fromWords, highWord, lowWord, twoPow, twoProduct, twoSum } from './float64Bits';

// Local aliases: a module-level const is read directly, whatever a bundler or test runner does to imports.
const dd = sharedDd;

const LN2_HI = 6.93147180369123816490e-1; // 32 significant bits, so k·LN2_HI is exact for |k| < 2^21
const LN2_LO = 1.90821492927058770002e-10;
const INV_LN2 = 1.44269504088896338700;
const P1 = 1.66666666666666019037e-1;
const P2 = -2.77777777770155933842e-3;
const P3 = 6.61375632143793436117e-5;
const P4 = -1.65339022054652515390e-6;
const P5 = 4.13813679705723846039e-8;
const EXP_OVERFLOW = 7.09782712893383973096e2;
const EXP_UNDERFLOW = -7.45133219101941108420e2;
const HALF_LN2 = 0.34657359027997264;
const THREE_HALVES_LN2 = 1.0397207708399179;
const TWO_M28 = 3.725290298461914e-9;

/** e^(x − lo) for finite x in (EXP_UNDERFLOW, EXP_OVERFLOW]; `lo` is a correction far below ulp(x). */
function expReduced(x: number, lo: number): number {
  let k = 0;
  let hi = x;
  let tail = lo;
  const ax = Math.abs(x);
  if (ax > HALF_LN2) {
    if (ax < THREE_HALVES_LN2) k = x > 0 ? 1 : -1;
    else k = Math.trunc(INV_LN2 * x + (x > 0 ? 0.5 : -0.5));
    hi = x - k * LN2_HI;
    tail = k * LN2_LO + lo;
  } else if (ax < TWO_M28 && lo === 0) {
    return 1 + x;
  }
  const r = hi - tail;
  const t = r * r;
  const c = r - t * (P1 + t * (P2 + t * (P3 + t * (P4 + t * P5))));
  const y = 1 - (tail - (r * c) / (2 - c) - hi);
  if (k === 0) return y;
  // y·2^k: exact while the result is normal; below 2^−1022 a single rounding into the subnormals, as fdlibm does.
  if (k >= -1021) return k === 1024 ? y * 2 * twoPow(1023) : y * twoPow(k);
  return y * twoPow(k + 1000) * twoPow(-1000);
}

/** e^x, < 1 ulp, identical on every engine. exp(NaN) = NaN, exp(+∞) = +∞, exp(−∞) = +0. */
export function exp(x: number): number {
  if (x > EXP_OVERFLOW) return Number.POSITIVE_INFINITY;
  if (x < EXP_UNDERFLOW) return 0;
  if (x !== x) return Number.NaN;
  return expReduced(x, 0);
}

const LOG_TABLE_STEPS = 64;
const LOG_TABLE_MIN_J = -20; // c = 1 + j/64 covers m ∈ [√2/2, √2]
const LOG_TABLE_MAX_J = 27;
const TABLE_BITS = 160n;
const { LOG_C_HI, LOG_C_LO, LN2_DD_HI, LN2_DD_LO } = (() => {
  const hi = new Float64Array(LOG_TABLE_MAX_J - LOG_TABLE_MIN_J + 1);
  const lo = new Float64Array(hi.length);
  for (let j = LOG_TABLE_MIN_J; j <= LOG_TABLE_MAX_J; j++) {
    const v = logOfTableStepFixed(j, TABLE_BITS);
    fixedToDouble(v < 0n ? -v : v, Number(TABLE_BITS));
    hi[j - LOG_TABLE_MIN_J] = v < 0n ? -dd[0]! : dd[0]!;
    lo[j - LOG_TABLE_MIN_J] = v < 0n ? -dd[1]! : dd[1]!;
  }
  fixedToDouble(ln2Fixed(TABLE_BITS), Number(TABLE_BITS));
  return { LOG_C_HI: hi, LOG_C_LO: lo, LN2_DD_HI: dd[0]!, LN2_DD_LO: dd[1]! };
})();
const SQRT2 = 1.4142135623730951;
const TWO_54 = 18014398509481984;
const ATANH_3 = 1 / 3;
const ATANH_5 = 1 / 5;
const ATANH_7 = 1 / 7;
const ATANH_9 = 1 / 9;
const ATANH_11 = 1 / 11;

// Result of logExtended: ln x = logResult[0] + logResult[1]. A typed array, because assigning doubles to module-level
// variables allocates a heap number each time in V8.
const logResult = new Float64Array(2);

/** ln x in extended precision for finite x > 0; sets logResult (hi, lo), |lo| ≤ ulp(hi)/2. */
function logExtended(x: number): void {
  let k = 0;
  let v = x;
  if (v < 2.2250738585072014e-308) {
    v *= TWO_54; // subnormal: scale into the normal range first (exact)
    k = -54;
  }
  const hx = highWord(v);
  k += (hx >> 20) - 1023;
  let m = fromWords((hx & 0x000fffff) | 0x3ff00000, lowWord(v)); // m ∈ [1, 2)
  if (m > SQRT2) {
    m *= 0.5;
    k += 1;
  }
  const j = Math.round((m - 1) * LOG_TABLE_STEPS);
  const c = 1 + j / LOG_TABLE_STEPS;
  // s = (m − c)/(m + c) in double-double: m − c is exact (Sterbenz), m + c by two-sum, the quotient's residual by
  // two-product.
  const num = m - c;
  twoSum(m, c);
  const denHi = dd[0]!;
  const denLo = dd[1]!;
  const sHi = num / denHi;
  twoProduct(sHi, denHi);
  const sLo = (num - dd[0]! - dd[1]! - sHi * denLo) / denHi;
  const s2 = sHi * sHi;
  const series = 2 * sHi * s2 * (ATANH_3 + s2 * (ATANH_5 + s2 * (ATANH_7 + s2 * (ATANH_9 + s2 * ATANH_11))));
  // k·ln2 exactly as a double-double, then add ln c, 2s and the series, smallest terms gathered in `lo`.
  twoProduct(k, LN2_DD_HI);
  let hi = dd[0]!;
  let lo = dd[1]! + k * LN2_DD_LO;
  twoSum(hi, LOG_C_HI[j - LOG_TABLE_MIN_J]!);
  hi = dd[0]!;
  lo += dd[1]! + LOG_C_LO[j - LOG_TABLE_MIN_J]!;
  twoSum(hi, 2 * sHi);
  hi = dd[0]!;
  lo += dd[1]! + (2 * sLo + series);
  fastTwoSum(hi, lo);
  logResult[0] = dd[0]!;
  logResult[1] = dd[1]!;
}

/** ln x, < 1 ulp (nearly always correctly rounded), identical on every engine. NaN below 0, −∞ at ±0, log(1) = 0. */
export function log(x: number): number {
  if (!(x > 0)) return x === 0 ? Number.NEGATIVE_INFINITY : Number.NaN;
  if (x === Number.POSITIVE_INFINITY) return x;
  logExtended(x);
  return logResult[0]!;
}

fixedToDouble(inverseLn10Fixed(TABLE_BITS), Number(TABLE_BITS));
const INV_LN10_HI = dd[0]!;
const INV_LN10_LO = dd[1]!;

/** log10 x, < 1 ulp, identical on every engine; exact at powers of ten. NaN below 0, −∞ at ±0. */
export function log10(x: number): number {
  if (!(x > 0)) return x === 0 ? Number.NEGATIVE_INFINITY : Number.NaN;
  if (x === Number.POSITIVE_INFINITY) return x;
  logExtended(x);
  const hi = logResult[0]!;
  twoProduct(hi, INV_LN10_HI);
  return dd[0]! + (dd[1]! + hi * INV_LN10_LO + logResult[1]! * INV_LN10_HI);
}

const TWO_53 = 9007199254740992;

/** True when y is an odd integer (so a negative base keeps its sign). */
function isOddInteger(y: number): boolean {
  return Math.abs(y) < TWO_53 && Math.floor(y) === y && y % 2 !== 0;
}

/** |x|^y for integer x and integer |y| ≤ 64 when every partial product is exact; else NaN. */
function exactIntegerPower(ax: number, y: number): number {
  const n = Math.abs(y);
  let acc = 1;
  for (let i = 0; i < n; i++) {
    // Stop at the first product that is not exact (its two-product error term is non-zero).
    twoProduct(acc, ax);
    if (dd[1] !== 0 || !Number.isFinite(dd[0]!)) return Number.NaN;
    acc = dd[0]!;
  }
  // 1/acc is one correctly rounded division, so a negative exponent is correctly rounded too.
  return y < 0 ? 1 / acc : acc;
}

/**
 * x^y as ECMA-262's Number::exponentiate defines the special cases (the same results as Math.pow and `**`,
 * including 1^∞ = NaN), < 1 ulp, identical on every engine. Integer powers of integers that fit in 2^53 are exact.
 */
export function pow(x: number, y: number): number {
  if (y !== y) return Number.NaN;
  if (y === 0) return 1;
  if (x !== x) return Number.NaN;
  const ax = Math.abs(x);
  if (!Number.isFinite(y)) {
    if (ax === 1) return Number.NaN;
    return ax > 1 === y > 0 ? Number.POSITIVE_INFINITY : 0;
  }
  const negativeResult = x < 0 || Object.is(x, -0) ? isOddInteger(y) : false;
  if (ax === 0 || ax === Number.POSITIVE_INFINITY) {
    const big = ax === 0 ? y < 0 : y > 0;
    if (big) return negativeResult ? Number.NEGATIVE_INFINITY : Number.POSITIVE_INFINITY;
    return negativeResult ? -0 : 0;
  }
  if (x < 0 && Math.floor(y) !== y) return Number.NaN;
  if (y === 1) return x;
  if (ax === 1) return negativeResult ? -1 : 1;
  let magnitude: number;
  const exact = Math.floor(ax) === ax && Math.abs(y) <= 64 && Math.floor(y) === y ? exactIntegerPower(ax, y) : Number.NaN;
  if (exact === exact) {
    magnitude = exact;
  } else {
    logExtended(ax);
    const rough = y * logResult[0]!;
    // Decide overflow on the rounded product first: it also keeps huge |y| away from the two-product's split.
    if (rough > EXP_OVERFLOW + 1) magnitude = Number.POSITIVE_INFINITY;
    else if (rough < EXP_UNDERFLOW - 1) magnitude = 0;
    else {
      // z = y·ln|x| = zHi + zLo, the product's rounding error kept exactly.
      twoProduct(y, logResult[0]!);
      fastTwoSum(dd[0]!, dd[1]! + y * logResult[1]!);
      const zHi = dd[0]!;
      const zLo = dd[1]!;
      if (zHi > EXP_OVERFLOW) magnitude = Number.POSITIVE_INFINITY;
      else if (zHi < EXP_UNDERFLOW) magnitude = 0;
      else magnitude = expReduced(zHi, -zLo);
    }
  }
  return negativeResult ? -magnitude : magnitude;
}
