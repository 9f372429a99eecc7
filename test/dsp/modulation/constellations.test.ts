import { describe, expect, it } from 'vitest';
import { bitsPerSymbol, getConstellation, MODULATIONS, type Modulation } from '../../../src/dsp/modulation/constellations';
import { mapBitsToSymbols } from '../../../src/dsp/modulation/mapper';
import { demapHard, demapMaxLogLlr } from '../../../src/dsp/modulation/demapper';
import { createRng } from '../../../src/dsp/data/rng';
import { TEST_SEED } from '../../helpers/seed';

const absTol = 1e-12;

function mapOne(modulation: Modulation, bits: string, index = 0): [number, number] {
  const out = new Float64Array(2);
  mapBitsToSymbols(modulation, Uint8Array.from(bits, Number), out, index);
  return [out[0]!, out[1]!];
}

// Check points derived from the TS 38.211 §5.1 formulas (REFERENCE.md §4 table, "derived"); they agree with the
// explicit tables of TS 36.211 §7.1.1–7.1.5 (from memory).
const CHECK_POINTS: [Modulation, string, number, number, number, number][] = [
  // modulation, bits (b0 first), symbol index, re, im, normalisation denominator
  ['bpsk', '0', 0, 1, 1, Math.SQRT2],
  ['bpsk', '1', 0, -1, -1, Math.SQRT2],
  ['pi/2-bpsk', '0', 0, 1, 1, Math.SQRT2],
  ['pi/2-bpsk', '0', 1, -1, 1, Math.SQRT2],
  ['pi/2-bpsk', '1', 1, 1, -1, Math.SQRT2],
  ['qpsk', '00', 0, 1, 1, Math.SQRT2],
  ['qpsk', '01', 0, 1, -1, Math.SQRT2],
  ['qpsk', '10', 0, -1, 1, Math.SQRT2],
  ['qpsk', '11', 0, -1, -1, Math.SQRT2],
  ['16qam', '0000', 0, 1, 1, Math.sqrt(10)],
  ['16qam', '0001', 0, 1, 3, Math.sqrt(10)],
  ['16qam', '0010', 0, 3, 1, Math.sqrt(10)],
  ['16qam', '0011', 0, 3, 3, Math.sqrt(10)],
  ['16qam', '1111', 0, -3, -3, Math.sqrt(10)],
  ['64qam', '000000', 0, 3, 3, Math.sqrt(42)],
  ['64qam', '111111', 0, -7, -7, Math.sqrt(42)],
  ['256qam', '00000000', 0, 5, 5, Math.sqrt(170)],
  ['256qam', '11111111', 0, -15, -15, Math.sqrt(170)],
  ['1024qam', '0000000000', 0, 11, 11, Math.sqrt(682)],
  ['1024qam', '1111111111', 0, -31, -31, Math.sqrt(682)],
];

describe('constellation mapping (TS 38.211 §5.1, TS 36.211 §7.1)', () => {
  for (const [mod, bits, index, re, im, denom] of CHECK_POINTS) {
    it(`${mod} bits ${bits} (symbol ${index}) → (${re}${im >= 0 ? '+' : ''}${im}j)/${denom.toFixed(3)}`, () => {
      const [gotRe, gotIm] = mapOne(mod, bits, index);
      expect(gotRe).toBeCloseTo(re / denom, 12);
      expect(gotIm).toBeCloseTo(im / denom, 12);
    });
  }

  // Mean power 1 over all M points, and peak/average 18/10, 98/42, 450/170, 1922/682 (REFERENCE.md §4, derived).
  const PEAK_TO_AVERAGE: Record<Modulation, number> = {
    bpsk: 1,
    'pi/2-bpsk': 1,
    qpsk: 1,
    '16qam': 18 / 10,
    '64qam': 98 / 42,
    '256qam': 450 / 170,
    '1024qam': 1922 / 682,
  };
  for (const mod of MODULATIONS) {
    it(`${mod}: unit mean power over all points, peak/average ${PEAK_TO_AVERAGE[mod].toFixed(4)}`, () => {
      const points = getConstellation(mod).pointsIq;
      let sum = 0;
      let peak = 0;
      for (let i = 0; i < points.length; i += 2) {
        const p = points[i]! ** 2 + points[i + 1]! ** 2;
        sum += p;
        peak = Math.max(peak, p);
      }
      const mean = sum / (points.length / 2);
      expect(Math.abs(mean - 1)).toBeLessThan(absTol);
      expect(peak / mean).toBeCloseTo(PEAK_TO_AVERAGE[mod], 12);
    });
  }

  it('gives every bit pattern a distinct point, and the QAM axes are Gray coded (neighbours differ in one bit)', () => {
    for (const mod of ['16qam', '64qam', '256qam', '1024qam'] as const) {
      const t = getConstellation(mod);
      const seen = new Set<string>();
      for (let i = 0; i < t.pointsIq.length; i += 2) seen.add(`${t.pointsIq[i]!.toFixed(9)},${t.pointsIq[i + 1]!.toFixed(9)}`);
      expect(seen.size).toBe(2 ** t.bitsPerSymbol);
      const h = t.bitsPerSymbol / 2;
      for (let l = 1; l < t.axisLevels.length; l++) {
        let differing = 0;
        for (let i = 0; i < h; i++) if (t.axisBits[l * h + i] !== t.axisBits[(l - 1) * h + i]) differing++;
        expect(differing).toBe(1);
      }
    }
  });
});

describe('demapping', () => {
  const rng = createRng(TEST_SEED);
  for (const mod of MODULATIONS) {
    it(`${mod}: hard decision recovers the bits of clean symbols; max-log LLR signs agree`, () => {
      const m = bitsPerSymbol(mod);
      const numSymbols = 400;
      const bits = Uint8Array.from({ length: numSymbols * m }, () => rng.nextUint32() & 1);
      const symbols = mapBitsToSymbols(mod, bits, new Float64Array(2 * numSymbols), 3);
      expect(Array.from(demapHard(mod, symbols, new Uint8Array(bits.length), 3))).toEqual(Array.from(bits));
      const llr = demapMaxLogLlr(mod, symbols, 0.1, new Float64Array(bits.length), 3);
      for (let i = 0; i < bits.length; i++) expect(Math.sign(llr[i]!)).toBe(bits[i] ? -1 : 1);
    });
  }

  it('max-log LLR of QPSK equals the closed form 2√2·y/N0 per axis (common practice)', () => {
    const y = Float64Array.from([0.3, -0.2]);
    const llr = demapMaxLogLlr('qpsk', y, 0.5, new Float64Array(2));
    // (|y − (−a)|² − |y − a|²)/N0 = 4·a·y/N0, a = 1/√2.
    expect(llr[0]).toBeCloseTo((4 * Math.SQRT1_2 * 0.3) / 0.5, 12);
    expect(llr[1]).toBeCloseTo((4 * Math.SQRT1_2 * -0.2) / 0.5, 12);
  });

  it('rejects a bit buffer of the wrong length', () => {
    expect(() => mapBitsToSymbols('16qam', new Uint8Array(7), new Float64Array(4))).toThrow(/8 are required/);
  });
});
