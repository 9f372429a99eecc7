import { assertLength } from '../errors';
import { log10, pow } from '../math/expLog';
import { cos, sin } from '../math/trig';

/**
 * IQ-modulator gain and phase imbalance. The I branch is the reference; the Q branch has gain g = 10^{gainDb/20}
 * and its LO is φ away from quadrature:
 *   y = x_I + j·g·(x_Q·cos φ − x_I·sin φ),
 * which is the widely used widely-linear form y = μ·x + ν·x* with μ = (1 + g·e^{−jφ})/2, ν = (1 − g·e^{jφ})/2
 * (e.g. Tarighat, Bagheri & Sayed, IEEE Trans. Signal Process. 53(8):3257–3268, 2005 (from memory — verify);
 * Razavi, RF Microelectronics, 2nd ed., §4.2 for the image-rejection ratio).
 * A tone at +f then leaves an image at −f of relative power |ν|²/|μ|².
 * @param inIq 2N values; @param outIq 2N values (may be the same buffer: each sample is read before it is written)
 */
export function applyIqImbalance(inIq: Float64Array, gainDb: number, phaseDeg: number, outIq: Float64Array): Float64Array {
  assertLength(outIq, inIq.length, 'IQ-imbalance output');
  const g = pow(10, gainDb / 20);
  const phi = (phaseDeg * Math.PI) / 180;
  const gc = g * cos(phi);
  const gs = g * sin(phi);
  for (let i = 0; i < inIq.length; i += 2) {
    const xi = inIq[i]!;
    const xq = inIq[i + 1]!;
    outIq[i] = xi;
    outIq[i + 1] = gc * xq - gs * xi;
  }
  return outIq;
}

/** μ and ν of y = μx + νx* for the imbalance above, each as [re, im]. */
export function iqImbalanceCoefficients(gainDb: number, phaseDeg: number): { mu: [number, number]; nu: [number, number] } {
  const g = pow(10, gainDb / 20);
  const phi = (phaseDeg * Math.PI) / 180;
  return {
    mu: [(1 + g * cos(phi)) / 2, (-g * sin(phi)) / 2],
    nu: [(1 - g * cos(phi)) / 2, (-g * sin(phi)) / 2],
  };
}

/**
 * Image-rejection ratio |μ|²/|ν|² in dB: IRR = 10·log10[(1 + 2g·cos φ + g²) / (1 − 2g·cos φ + g²)]
 * (Razavi, RF Microelectronics, 2nd ed., §4.2; derived from μ, ν above). Infinity for a perfect modulator.
 */
export function imageRejectionRatioDb(gainDb: number, phaseDeg: number): number {
  const g = pow(10, gainDb / 20);
  const c = cos((phaseDeg * Math.PI) / 180);
  return 10 * log10((1 + 2 * g * c + g * g) / (1 - 2 * g * c + g * g));
}
