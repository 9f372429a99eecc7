import { DspError } from '../errors';
import { twoPow } from '../math/float64Bits';

/**
 * Modulation schemes of TS 38.211 §5.1 (the same points as the tables of TS 36.211 §7.1).
 */
export const MODULATIONS = ['bpsk', 'pi/2-bpsk', 'qpsk', '16qam', '64qam', '256qam', '1024qam'] as const;

export type Modulation = (typeof MODULATIONS)[number];

/** Bits carried by one symbol. */
export function bitsPerSymbol(modulation: Modulation): number {
  switch (modulation) {
    case 'bpsk':
    case 'pi/2-bpsk':
      return 1;
    case 'qpsk':
      return 2;
    case '16qam':
      return 4;
    case '64qam':
      return 6;
    case '256qam':
      return 8;
    case '1024qam':
      return 10;
    default:
      throw new DspError('INVALID_CONFIG', `Unknown modulation "${String(modulation)}"; allowed: ${MODULATIONS.join(', ')}.`);
  }
}

/**
 * Unnormalised amplitude of one axis of square QAM from its bits e_0…e_{h−1} (b0, b2, b4… for I; b1, b3… for Q),
 * TS 38.211 §5.1.3–5.1.7 nesting: s0·(2^{h−1} − s1·(2^{h−2} − s2·(… (2 − s_{h−1})))), s_i = 1 − 2e_i.
 */
export function qamAxisLevel(axisBits: readonly number[]): number {
  const h = axisBits.length;
  let inner = 1 - 2 * axisBits[h - 1]!;
  for (let i = h - 2; i >= 0; i--) {
    inner = (1 - 2 * axisBits[i]!) * (twoPow(h - 1 - i) - inner);
  }
  return inner;
}

/** 1/√(2(M−1)/3): unit mean power for square M-QAM (1/√2, 1/√10, 1/√42, 1/√170, 1/√682). */
export function qamNormalisation(bitsPerSym: number): number {
  const m = twoPow(bitsPerSym);
  return 1 / Math.sqrt((2 * (m - 1)) / 3);
}

export interface ConstellationTable {
  readonly modulation: Modulation;
  readonly bitsPerSymbol: number;
  /** Point of each bit pattern, index = b0·2^{m−1} + b1·2^{m−2} + … + b_{m−1}; interleaved re, im. */
  readonly pointsIq: Float64Array;
  /** Amplitude levels of one axis in ascending order (QPSK and above), normalised. */
  readonly axisLevels: Float64Array;
  /** Bits of each axis level, `axisBits[level * h + i]` = e_i (QPSK and above). */
  readonly axisBits: Uint8Array;
}

const tables = new Map<Modulation, ConstellationTable>();

/**
 * The constellation of `modulation` as a lookup table. For π/2-BPSK the table holds the even-index points
 * (i mod 2 = 0); odd indices are rotated by e^{jπ/2} by the mapper.
 */
export function getConstellation(modulation: Modulation): ConstellationTable {
  const hit = tables.get(modulation);
  if (hit) return hit;
  const m = bitsPerSymbol(modulation);
  const points = new Float64Array(2 * twoPow(m));
  let axisLevels = new Float64Array(0);
  let axisBits = new Uint8Array(0);
  if (m === 1) {
    const a = Math.SQRT1_2;
    points.set([a, a, -a, -a]);
  } else {
    const h = m / 2;
    const norm = qamNormalisation(m);
    for (let pattern = 0; pattern < twoPow(m); pattern++) {
      const bits = Array.from({ length: m }, (_, i) => (pattern >>> (m - 1 - i)) & 1);
      points[2 * pattern] = norm * qamAxisLevel(bits.filter((_, i) => i % 2 === 0));
      points[2 * pattern + 1] = norm * qamAxisLevel(bits.filter((_, i) => i % 2 === 1));
    }
    const levels: { level: number; bits: number[] }[] = [];
    for (let pattern = 0; pattern < twoPow(h); pattern++) {
      const bits = Array.from({ length: h }, (_, i) => (pattern >>> (h - 1 - i)) & 1);
      levels.push({ level: norm * qamAxisLevel(bits), bits });
    }
    levels.sort((x, y) => x.level - y.level);
    axisLevels = Float64Array.from(levels.map((l) => l.level));
    axisBits = Uint8Array.from(levels.flatMap((l) => l.bits));
  }
  const table: ConstellationTable = { modulation, bitsPerSymbol: m, pointsIq: points, axisLevels, axisBits };
  tables.set(modulation, table);
  return table;
}
