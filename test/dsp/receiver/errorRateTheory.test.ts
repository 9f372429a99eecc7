import { describe, expect, it } from 'vitest';
import { berBpskQpsk, berSquareQam, ebN0DbForBer, erfc, serSquareQam } from '../../../src/dsp/receiver/errorRateTheory';

// Check values of REFERENCE.md §6 (derived there from Proakis ch. 4); relative tolerance 1 %.
const relTol = 0.01;
function expectRel(actual: number, expected: number): void {
  expect(Math.abs(actual / expected - 1), `${actual} vs ${expected}`).toBeLessThan(relTol);
}

describe('AWGN error-rate formulas', () => {
  it('erfc agrees with known values (Abramowitz & Stegun Table 7.1): erfc(0) = 1, erfc(1) = 0.157299, erfc(2) = 0.004678', () => {
    expect(erfc(0)).toBeCloseTo(1, 7);
    expectRel(erfc(1), 0.1572992);
    expectRel(erfc(2), 0.004677735);
    expectRel(erfc(-1), 2 - 0.1572992);
  });
  it('BPSK/QPSK BER at 0, 4, 6, 8, 9.6, 10 dB', () => {
    const table: [number, number][] = [
      [0, 7.865e-2],
      [4, 1.25e-2],
      [6, 2.388e-3],
      [8, 1.909e-4],
      [9.6, 9.736e-6],
      [10, 3.872e-6],
    ];
    for (const [eb, ber] of table) expectRel(berBpskQpsk(eb), ber);
  });
  it('16QAM BER at 10, 12, 14 dB; 64QAM at 18 dB; 16QAM SER at Es/N0 16 and 20 dB', () => {
    expectRel(berSquareQam(16, 10), 1.754e-3);
    expectRel(berSquareQam(16, 12), 1.387e-4);
    expectRel(berSquareQam(16, 14), 2.763e-6);
    expectRel(berSquareQam(64, 18), 6.35e-6);
    expectRel(serSquareQam(16, 16), 7.152e-3);
    expectRel(serSquareQam(16, 20), 1.162e-5);
  });
  it('Eb/N0 for BER 1e-3 / 1e-5 / 1e-6 (QPSK) and for 1e-5 (16…1024QAM), 0.02 dB', () => {
    expect(ebN0DbForBer(berBpskQpsk, 1e-3)).toBeCloseTo(6.79, 1);
    expect(Math.abs(ebN0DbForBer(berBpskQpsk, 1e-5) - 9.59)).toBeLessThan(0.02);
    expect(Math.abs(ebN0DbForBer(berBpskQpsk, 1e-6) - 10.53)).toBeLessThan(0.02);
    for (const [m, db] of [
      [16, 13.43],
      [64, 17.79],
      [256, 22.5],
      [1024, 27.47],
    ] as const) {
      expect(Math.abs(ebN0DbForBer((x) => berSquareQam(m, x), 1e-5) - db)).toBeLessThan(0.02);
    }
  });
});
