import { assertLength } from '../errors';
import type { Rng } from '../data/rng';

/**
 * Adds circularly symmetric complex white Gaussian noise of variance σ² = E|n|² per sample (σ²/2 per component).
 * @param inIq interleaved input; @param outIq same length, may be the same buffer as `inIq`
 * @param rng seeded generator (data/rng.ts) — the same seed gives the same noise
 */
export function addAwgn(inIq: Float64Array, noiseVariance: number, rng: Rng, outIq: Float64Array): Float64Array {
  assertLength(outIq, inIq.length, 'AWGN output');
  const sigma = Math.sqrt(noiseVariance / 2);
  for (let i = 0; i < inIq.length; i++) outIq[i] = inIq[i]! + sigma * rng.nextGaussian();
  return outIq;
}

/** Mean |x[n]|² of an interleaved buffer (0 for an empty one). */
export function meanPowerOf(iq: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < iq.length; i++) sum += iq[i]! * iq[i]!;
  return iq.length === 0 ? 0 : sum / (iq.length / 2);
}
