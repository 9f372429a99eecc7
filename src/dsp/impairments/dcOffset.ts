import { assertLength } from '../errors';
import { cos, sin } from '../math/trig';
import { pow } from '../math/expLog';

/**
 * LO leakage (carrier feed-through) as a constant added to the baseband signal: y = x + d, with
 * |d|² = P_x·10^{levelDbc/10} and arg d = phaseDeg, where P_x is the mean power of `inIq` over the record.
 * levelDbc is the relative carrier leakage of TS 36.101 §6.5.2.2 / TS 38.101-1 §6.4.2.2 (leakage power over the
 * wanted signal's power; from memory — verify the clause numbers).
 * @param inIq 2N values; @param outIq 2N values (may be the same buffer)
 * @returns the offset added, [re, im]
 */
export function applyDcOffset(inIq: Float64Array, levelDbc: number, phaseDeg: number, outIq: Float64Array): [number, number] {
  assertLength(outIq, inIq.length, 'DC-offset output');
  let power = 0;
  for (let i = 0; i < inIq.length; i++) power += inIq[i]! * inIq[i]!;
  power /= inIq.length / 2;
  const magnitude = Math.sqrt(power * pow(10, levelDbc / 10));
  const phi = (phaseDeg * Math.PI) / 180;
  const dRe = magnitude * cos(phi);
  const dIm = magnitude * sin(phi);
  for (let i = 0; i < inIq.length; i += 2) {
    outIq[i] = inIq[i]! + dRe;
    outIq[i + 1] = inIq[i + 1]! + dIm;
  }
  return [dRe, dIm];
}
