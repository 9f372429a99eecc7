import { DspError } from '../errors';
import { createFftPlan, fftUnitary, type FftPlan } from '../fft/fftPlan';

/**
 * Transform precoding (DFT spreading) of TS 36.211 §5.3.3 / TS 38.211 §6.3.1.4:
 * z(k) = (1/√M_sc) Σ_{i=0}^{M_sc−1} x(i) e^{−j2πik/M_sc}, M_sc = 12·M_RB, M_RB = 2^α2·3^α3·5^α5.
 */

/** True when n = 2^a·3^b·5^c (n ≥ 1). */
export function isTwoThreeFiveSmooth(n: number): boolean {
  if (!Number.isInteger(n) || n < 1) return false;
  let m = n;
  for (const p of [2, 3, 5]) while (m % p === 0) m /= p;
  return m === 1;
}

/** Allowed transform-precoding allocations M_RB ≤ maxRb (34 values up to 100). */
export function allowedDftRbCounts(maxRb: number): number[] {
  const out: number[] = [];
  for (let m = 1; m <= maxRb; m++) if (isTwoThreeFiveSmooth(m)) out.push(m);
  return out;
}

/**
 * Checks a DFT-spreading size. Localized blocks follow the standard (M_sc = 12·M_RB, M_RB 2·3·5-smooth);
 * interleaved blocks (a research mapping) need M itself 2·3·5-smooth.
 * @throws DspError UNSUPPORTED_SIZE naming the nearest allowed sizes
 */
export function checkDftSpreadSize(numDataSubcarriers: number, numRb: number, what: string, mapping: 'localized' | 'interleaved'): void {
  if (mapping === 'localized') {
    if (isTwoThreeFiveSmooth(numRb)) return;
    const below = lastBelow(numRb);
    const above = firstAbove(numRb);
    throw new DspError(
      'UNSUPPORTED_SIZE',
      `${what}: DFT-s-OFDM needs M_RB = 2^a·3^b·5^c resource blocks (TS 36.211 §5.3.3, TS 38.211 §6.3.1.4); ${numRb} RB (M_sc = ${12 * numRb}) is not allowed. Nearest allowed: ${below} RB (M_sc ${12 * below}) or ${above} RB (M_sc ${12 * above}).`,
      { field: 'allocation', numRb, nearest: [below, above] },
    );
  }
  if (isTwoThreeFiveSmooth(numDataSubcarriers)) return;
  const below = lastBelow(numDataSubcarriers);
  const above = firstAbove(numDataSubcarriers);
  throw new DspError(
    'UNSUPPORTED_SIZE',
    `${what}: interleaved DFT-s-OFDM spreads over ${numDataSubcarriers} subcarriers, which is not 2^a·3^b·5^c. Nearest allowed sizes: ${below} or ${above}.`,
    { field: 'allocation', numDataSubcarriers, nearest: [below, above] },
  );
}

function lastBelow(n: number): number {
  for (let m = n - 1; m >= 1; m--) if (isTwoThreeFiveSmooth(m)) return m;
  return 1;
}

function firstAbove(n: number): number {
  for (let m = n + 1; ; m++) if (isTwoThreeFiveSmooth(m)) return m;
}

/** Plan for spreading blocks of `dftSize` symbols. */
export function createDftSpreadPlan(dftSize: number): FftPlan {
  return createFftPlan(dftSize);
}

/**
 * Unitary DFT spreading of one block (mean power unchanged).
 * @param symbolsIq M modulation symbols, interleaved (2M values)
 * @param outIq 2M values
 */
export function spreadDft(plan: FftPlan, symbolsIq: Float64Array, outIq: Float64Array): Float64Array {
  return fftUnitary(plan, symbolsIq, outIq);
}
