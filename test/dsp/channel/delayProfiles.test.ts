import { describe, expect, it } from 'vitest';
import { DELAY_PROFILES, normalisedTapPowers, rmsDelaySpreadS } from '../../../src/dsp/channel/delayProfiles';

describe('EPA / EVA / ETU tap tables (TS 36.101 Annex B.2.1, Tables B.2.1-2…-4)', () => {
  it('EPA: 7 taps, delays 0…410 ns and powers 0…−20.8 dB [S2]', () => {
    expect(DELAY_PROFILES.epa.delaysNs).toEqual([0, 30, 70, 90, 110, 190, 410]);
    expect(DELAY_PROFILES.epa.powersDb).toEqual([0, -1, -2, -3, -8, -17.2, -20.8]);
  });
  it('EVA: 9 taps, delays 0…2510 ns [S2]', () => {
    expect(DELAY_PROFILES.eva.delaysNs).toEqual([0, 30, 150, 310, 370, 710, 1090, 1730, 2510]);
    expect(DELAY_PROFILES.eva.powersDb).toEqual([0, -1.5, -1.4, -3.6, -0.6, -9.1, -7, -12, -16.9]);
  });
  it('ETU: 9 taps, delays 0…5000 ns [S2]; powers (from memory — verify, backed by the r.m.s. spread below)', () => {
    expect(DELAY_PROFILES.etu.delaysNs).toEqual([0, 50, 120, 200, 230, 500, 1600, 2300, 5000]);
    expect(DELAY_PROFILES.etu.powersDb).toEqual([-1, -1, -1, 0, 0, 0, -3, -5, -7]);
  });

  // Table B.2.1-1 lists 43 / 357 / 991 ns; computed from the taps: 43.1 / 356.7 / 990.9 ns (REFERENCE.md §8, derived).
  const toleranceNs = 0.05;
  for (const [name, expectedNs] of [
    ['epa', 43.1],
    ['eva', 356.7],
    ['etu', 990.9],
  ] as const) {
    it(`${name.toUpperCase()} r.m.s. delay spread ${expectedNs} ns`, () => {
      expect(Math.abs(rmsDelaySpreadS(DELAY_PROFILES[name]) * 1e9 - expectedNs)).toBeLessThan(toleranceNs);
    });
  }

  it('normalised tap powers sum to 1 (common practice: the channel keeps the mean power)', () => {
    for (const p of Object.values(DELAY_PROFILES)) expect(normalisedTapPowers(p).reduce((a, b) => a + b, 0)).toBeCloseTo(1, 14);
  });
});
