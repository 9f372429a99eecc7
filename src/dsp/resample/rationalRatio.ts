import { DspError } from '../errors';

/** Largest interpolation factor L the resampler accepts (the prototype filter grows with L). */
export const MAX_UP_FACTOR = 4096;
/** Largest decimation factor M. */
export const MAX_DOWN_FACTOR = 1 << 20;

/** An exact rate ratio outputRate / inputRate = up / down in lowest terms. */
export interface RateRatio {
  readonly up: number;
  readonly down: number;
}

/**
 * Finds L/M = outputRateHz / inputRateHz in lowest terms. Rates that are whole numbers of Hz (to 1 µHz) use their
 * greatest common divisor, so 30.72 Msps → 100 Msps gives 625/192 exactly; other rates use the continued fraction of
 * the ratio and accept it when it matches to 1e-12.
 * @throws DspError INVALID_CONFIG when the ratio needs L > MAX_UP_FACTOR or M > MAX_DOWN_FACTOR
 */
export function findRateRatio(inputRateHz: number, outputRateHz: number): RateRatio {
  for (const [name, v] of [
    ['input sample rate', inputRateHz],
    ['output sample rate', outputRateHz],
  ] as const) {
    if (!Number.isFinite(v) || v <= 0) throw new DspError('INVALID_CONFIG', `The ${name} must be a positive, finite number of Hz; got ${v}.`);
  }
  const ri = Math.round(inputRateHz);
  const ro = Math.round(outputRateHz);
  let ratio: RateRatio | undefined;
  if (Math.abs(ri - inputRateHz) < 1e-6 && Math.abs(ro - outputRateHz) < 1e-6 && ri < 2 ** 53 && ro < 2 ** 53) {
    const g = gcd(ri, ro);
    ratio = { up: ro / g, down: ri / g };
  } else {
    ratio = continuedFraction(outputRateHz / inputRateHz);
  }
  if (!ratio || ratio.up > MAX_UP_FACTOR || ratio.down > MAX_DOWN_FACTOR) {
    const shown = ratio ? `${ratio.up}/${ratio.down}` : 'no small fraction';
    throw new DspError(
      'INVALID_CONFIG',
      `rate: resampling ${inputRateHz} Hz to ${outputRateHz} Hz needs the ratio ${shown}; the resampler allows up to ${MAX_UP_FACTOR}/${MAX_DOWN_FACTOR} (interpolation/decimation). Choose an output rate with a simpler ratio to ${inputRateHz} Hz.`,
      { field: 'rate' },
    );
  }
  return ratio;
}

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

function continuedFraction(x: number): RateRatio | undefined {
  // Convergents p/q of x; stop at the first that matches to 1e-12 relative.
  let [p0, q0, p1, q1] = [0, 1, 1, 0];
  let rest = x;
  for (let i = 0; i < 64; i++) {
    const a = Math.floor(rest);
    [p0, p1] = [p1, a * p1 + p0];
    [q0, q1] = [q1, a * q1 + q0];
    if (p1 > MAX_UP_FACTOR * 16 || q1 > MAX_DOWN_FACTOR * 16) return { up: p1, down: q1 };
    if (Math.abs(p1 / q1 - x) <= 1e-12 * x) return { up: p1, down: q1 };
    const frac = rest - a;
    if (frac < 1e-15) return undefined;
    rest = 1 / frac;
  }
  return undefined;
}
