import { DspError } from '../errors';
import { LTE_PHI_12, LTE_PHI_24, NR_PHI_12, NR_PHI_18, NR_PHI_24, NR_PHI_6 } from './lowPaprTables';
import { cos, sin } from '../math/trig';

/**
 * Zadoff–Chu based low-PAPR base sequences r̄_{u,v}(n) and their cyclic shifts r^{(α)}_{u,v}(n) = e^{jαn} r̄_{u,v}(n):
 * TS 36.211 §5.5.1 (LTE uplink reference signals) and TS 38.211 §5.2.2 (NR low-PAPR sequence type 1).
 * For length M ≥ 36: r̄(n) = x_q(n mod N_ZC), x_q(m) = e^{−jπqm(m+1)/N_ZC}, N_ZC the largest prime below M,
 * q = ⌊q̄ + 1/2⌋ + v·(−1)^⌊2q̄⌋, q̄ = N_ZC(u + 1)/31. Shorter lengths use the φ tables (lowPaprTables.ts),
 * and NR length 30 uses r̄(n) = e^{−jπ(u+1)(n+1)(n+2)/31}.
 */
export type BaseSequenceFamily = 'lte' | 'nr';

/** Largest prime strictly below `n` (n > 2). */
export function largestPrimeBelow(n: number): number {
  for (let p = n - 1; p >= 2; p--) if (isPrime(p)) return p;
  throw new DspError('INTERNAL', `No prime below ${n}.`);
}

function isPrime(p: number): boolean {
  if (p < 2) return false;
  for (let d = 2; d * d <= p; d++) if (p % d === 0) return false;
  return true;
}

/** Root index q of TS 36.211 §5.5.1.1 / TS 38.211 §5.2.2.1 for group u (0…29), sequence v (0/1) and prime N_ZC. */
export function zadoffChuRootIndex(u: number, v: number, nZc: number): number {
  const qBar = (nZc * (u + 1)) / 31;
  return Math.floor(qBar + 0.5) + v * (Math.floor(2 * qBar) % 2 === 0 ? 1 : -1);
}

/**
 * The root Zadoff–Chu sequence x_q(m) = e^{−jπqm(m+1)/N_ZC}, m = 0…N_ZC−1 (odd N_ZC).
 * The phase q·m(m+1) is reduced modulo 2N_ZC in integers, so long sequences keep full precision.
 * @param outIq 2·N_ZC values
 */
export function fillZadoffChuRoot(q: number, nZc: number, outIq: Float64Array): Float64Array {
  const period = 2 * nZc;
  for (let m = 0; m < nZc; m++) {
    const k = (((q * ((m * (m + 1)) % period)) % period) + period) % period;
    const angle = (-Math.PI * k) / nZc;
    outIq[2 * m] = cos(angle);
    outIq[2 * m + 1] = sin(angle);
  }
  return outIq;
}

/** The φ table for a short length, or undefined when the length uses another rule. */
function phiTable(family: BaseSequenceFamily, length: number): readonly Int8Array[] | undefined {
  if (family === 'lte') return length === 12 ? LTE_PHI_12 : length === 24 ? LTE_PHI_24 : undefined;
  switch (length) {
    case 6:
      return NR_PHI_6;
    case 12:
      return NR_PHI_12;
    case 18:
      return NR_PHI_18;
    case 24:
      return NR_PHI_24;
    default:
      return undefined;
  }
}

/** True when `family` defines a base sequence of `length`. */
export function isBaseSequenceLength(family: BaseSequenceFamily, length: number): boolean {
  if (!Number.isInteger(length) || length < 1) return false;
  if (length >= 36) return true;
  if (phiTable(family, length)) return true;
  return family === 'nr' && length === 30;
}

/**
 * Base sequence r̄_{u,v}(n), n = 0…M−1, of group `u` (0…29) and number `v` (0/1; v is used only for M ≥ 72, where each
 * group holds two sequences; shorter lengths have v = 0).
 * @param outIq 2·M values
 * @throws DspError UNSUPPORTED_SIZE when the family defines no sequence of this length
 */
export function fillBaseSequence(family: BaseSequenceFamily, u: number, v: number, length: number, outIq: Float64Array): Float64Array {
  if (!isBaseSequenceLength(family, length)) {
    throw new DspError(
      'UNSUPPORTED_SIZE',
      `No ${family === 'lte' ? 'TS 36.211 §5.5.1' : 'TS 38.211 §5.2.2'} base sequence of length ${length}: allowed are ${family === 'lte' ? '12, 24 and any length ≥ 36' : '6, 12, 18, 24, 30 and any length ≥ 36'}.`,
      { length },
    );
  }
  const table = phiTable(family, length);
  if (table) {
    const row = table[u]!;
    for (let n = 0; n < length; n++) {
      const angle = (row[n]! * Math.PI) / 4;
      outIq[2 * n] = cos(angle);
      outIq[2 * n + 1] = sin(angle);
    }
    return outIq;
  }
  if (length === 30) {
    for (let n = 0; n < length; n++) {
      const k = ((u + 1) * (n + 1) * (n + 2)) % 62;
      const angle = (-Math.PI * k) / 31;
      outIq[2 * n] = cos(angle);
      outIq[2 * n + 1] = sin(angle);
    }
    return outIq;
  }
  const nZc = largestPrimeBelow(length);
  const q = zadoffChuRootIndex(u, length >= 72 ? v : 0, nZc);
  const root = fillZadoffChuRoot(q, nZc, new Float64Array(2 * nZc));
  for (let n = 0; n < length; n++) {
    const m = n % nZc;
    outIq[2 * n] = root[2 * m]!;
    outIq[2 * n + 1] = root[2 * m + 1]!;
  }
  return outIq;
}

/**
 * Reference-signal sequence r^{(α)}_{u,v}(n) = e^{jαn} r̄_{u,v}(n) (TS 36.211 §5.5.1; TS 38.211 §5.2.2 with δ folded into
 * the length). LTE PUSCH uses α = 2π·n_cs/12; NR transform-precoded PUSCH uses α = 0.
 * @param outIq 2·length values
 */
export function fillShiftedBaseSequence(
  family: BaseSequenceFamily,
  u: number,
  v: number,
  alphaRad: number,
  length: number,
  outIq: Float64Array,
): Float64Array {
  fillBaseSequence(family, u, v, length, outIq);
  if (alphaRad === 0) return outIq;
  for (let n = 0; n < length; n++) {
    const c = cos(alphaRad * n);
    const s = sin(alphaRad * n);
    const re = outIq[2 * n]!;
    const im = outIq[2 * n + 1]!;
    outIq[2 * n] = re * c - im * s;
    outIq[2 * n + 1] = re * s + im * c;
  }
  return outIq;
}
