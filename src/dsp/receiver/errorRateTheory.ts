import { DspError } from '../errors';
import type { Modulation } from '../modulation/constellations';

/**
 * Error rates in AWGN for comparison (J. G. Proakis, Digital Communications, 5th ed., ch. 4; REFERENCE.md §6):
 *   Q(x) = ½·erfc(x/√2);  BPSK and Gray QPSK: P_b = Q(√(2E_b/N0));
 *   square M-QAM, Gray (nearest-neighbour approximation): P_b ≈ (4/log2 M)(1 − 1/√M)·Q(√(3·log2 M·E_b/((M − 1)N0)));
 *   square M-QAM symbol error (exact): P_s = 1 − (1 − P_√M)², P_√M = 2(1 − 1/√M)·Q(√(3E_s/((M − 1)N0))).
 * erfc by the Chebyshev fit of Numerical Recipes (Press et al., 2nd ed., §6.2, "erfcc"), fractional error < 1.2e-7.
 */
/** Complementary error function (Chebyshev fit above). */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? r : 2 - r;
}

/** Gaussian tail Q(x) = ½·erfc(x/√2). */
export function qFunction(x: number): number {
  return 0.5 * erfc(x / Math.SQRT2);
}

/** BER of BPSK / Gray QPSK at Eb/N0 (dB). */
export function berBpskQpsk(ebN0Db: number): number {
  return qFunction(Math.sqrt(2 * 10 ** (ebN0Db / 10)));
}

/** Gray square M-QAM BER approximation at Eb/N0 (dB); M = 4 gives the exact QPSK value. */
export function berSquareQam(m: number, ebN0Db: number): number {
  const k = Math.log2(m);
  return (4 / k) * (1 - 1 / Math.sqrt(m)) * qFunction(Math.sqrt((3 * k * 10 ** (ebN0Db / 10)) / (m - 1)));
}

/** Exact square M-QAM symbol error rate at Es/N0 (dB). */
export function serSquareQam(m: number, esN0Db: number): number {
  const p = 2 * (1 - 1 / Math.sqrt(m)) * qFunction(Math.sqrt((3 * 10 ** (esN0Db / 10)) / (m - 1)));
  return 1 - (1 - p) ** 2;
}

/** Theoretical BER of a modulation in AWGN, or undefined where no closed form is used here. */
export function theoreticalBer(modulation: Modulation, ebN0Db: number): number | undefined {
  switch (modulation) {
    case 'bpsk':
    case 'pi/2-bpsk':
    case 'qpsk':
      return berBpskQpsk(ebN0Db);
    case '16qam':
      return berSquareQam(16, ebN0Db);
    case '64qam':
      return berSquareQam(64, ebN0Db);
    case '256qam':
      return berSquareQam(256, ebN0Db);
    case '1024qam':
      return berSquareQam(1024, ebN0Db);
    default:
      return undefined;
  }
}

/** The Eb/N0 (dB) at which a decreasing BER curve reaches `ber`, by bisection on [−10, 60] dB. */
export function ebN0DbForBer(curve: (ebN0Db: number) => number, ber: number): number {
  if (!(ber > 0 && ber < 0.5)) throw new DspError('INVALID_CONFIG', `BER ${ber} must lie strictly between 0 and 0.5.`);
  let lo = -10;
  let hi = 60;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (curve(mid) > ber) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
