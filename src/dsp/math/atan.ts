/**
 * Deterministic atan and atan2 (ECMA-262 §21.3.2 leaves Math.atan/Math.atan2 implementation-approximated).
 *
 * fdlibm algorithm (s_atan.c, e_atan2.c; common practice, constants from memory and checked against Math.atan by the
 * tests): |x| is mapped into [−7/16, 7/16] by atan x = atan c + atan((x − c)/(1 + c·x)) for c ∈ {0, ½, 1, 3/2, ∞},
 * atan c held as hi + lo, then an odd degree-23 minimax polynomial. atan2 adds the quadrant with π split as hi + lo.
 * Accuracy < 1 ulp; special values (±0, ±Infinity, NaN) as ECMA-262 §21.3.2.8 lists them.
 */
import { highWord } from './float64Bits';

const ATAN_HI = [4.63647609000806093515e-1, 7.85398163397448278999e-1, 9.82793723247329054082e-1, 1.57079632679489655800];
const ATAN_LO = [2.26987774529616870924e-17, 3.06161699786838301793e-17, 1.39033110312309984516e-17, 6.12323399573676603587e-17];
const AT0 = 3.33333333333329318027e-1;
const AT1 = -1.99999999998764832476e-1;
const AT2 = 1.42857142725034663711e-1;
const AT3 = -1.11111104054623557880e-1;
const AT4 = 9.09088713343650656196e-2;
const AT5 = -7.69187620504482999495e-2;
const AT6 = 6.66107313738753120669e-2;
const AT7 = -5.83357013379057348645e-2;
const AT8 = 4.97687799461593236017e-2;
const AT9 = -3.65315727442169155270e-2;
const AT10 = 1.62858201153657823623e-2;
const TWO_66 = 7.378697629483821e19;
const TWO_M29 = 1.862645149230957e-9;

/** atan(x) in radians, < 1 ulp, identical on every engine. atan(±∞) = ±π/2, atan(NaN) = NaN, atan(−0) = −0. */
export function atan(x: number): number {
  let ax = Math.abs(x);
  if (!(ax < TWO_66)) {
    if (x !== x) return x;
    return x > 0 ? ATAN_HI[3]! + ATAN_LO[3]! : -ATAN_HI[3]! - ATAN_LO[3]!;
  }
  let id: number;
  if (ax < 0.4375) {
    if (ax < TWO_M29) return x;
    id = -1;
    ax = x;
  } else if (ax < 1.1875) {
    if (ax < 0.6875) {
      id = 0;
      ax = (2 * ax - 1) / (2 + ax);
    } else {
      id = 1;
      ax = (ax - 1) / (ax + 1);
    }
  } else if (ax < 2.4375) {
    id = 2;
    ax = (ax - 1.5) / (1 + 1.5 * ax);
  } else {
    id = 3;
    ax = -1 / ax;
  }
  const z = ax * ax;
  const w = z * z;
  // Odd and even parts of the polynomial, evaluated separately for speed (as fdlibm does).
  const s1 = z * (AT0 + w * (AT2 + w * (AT4 + w * (AT6 + w * (AT8 + w * AT10)))));
  const s2 = w * (AT1 + w * (AT3 + w * (AT5 + w * (AT7 + w * AT9))));
  if (id < 0) return ax - ax * (s1 + s2);
  const r = ATAN_HI[id]! - (ax * (s1 + s2) - ATAN_LO[id]! - ax);
  return x < 0 ? -r : r;
}

const PI = 3.1415926535897931160;
const PI_LO = 1.2246467991473531772e-16;
const PI_O_2 = 1.5707963267948965580;
const PI_O_4 = 7.8539816339744827900e-1;

/** True for negative numbers and −0. */
function signBit(v: number): boolean {
  return v < 0 || Object.is(v, -0);
}

/**
 * atan2(y, x): the angle of the point (x, y) in radians, in [−π, π], < 1 ulp, identical on every engine.
 * Special values as ECMA-262 §21.3.2.8 (the same as C's atan2): e.g. atan2(±0, −0) = ±π, atan2(±∞, +∞) = ±π/4.
 */
export function atan2(y: number, x: number): number {
  if (x !== x || y !== y) return Number.NaN;
  if (x === 1) return atan(y);
  const m = (signBit(y) ? 1 : 0) | (signBit(x) ? 2 : 0);
  if (y === 0) return m === 0 || m === 1 ? y : m === 2 ? PI : -PI;
  if (x === 0) return y < 0 ? -PI_O_2 : PI_O_2;
  if (!Number.isFinite(x)) {
    if (!Number.isFinite(y)) return [PI_O_4, -PI_O_4, 3 * PI_O_4, -3 * PI_O_4][m]!;
    return [0, -0, PI, -PI][m]!;
  }
  if (!Number.isFinite(y)) return y < 0 ? -PI_O_2 : PI_O_2;
  // Exponent difference decides whether y/x is huge or negligible (fdlibm's 60-binade limits).
  const k = ((highWord(y) & 0x7fffffff) - (highWord(x) & 0x7fffffff)) >> 20;
  let z: number;
  let quadrant = m;
  if (k > 60) {
    z = PI_O_2 + 0.5 * PI_LO;
    quadrant &= 1;
  } else if (x < 0 && k < -60) {
    z = 0;
  } else {
    z = atan(Math.abs(y / x));
  }
  switch (quadrant) {
    case 0:
      return z;
    case 1:
      return -z;
    case 2:
      return PI - (z - PI_LO);
    default:
      return z - PI_LO - PI;
  }
}
