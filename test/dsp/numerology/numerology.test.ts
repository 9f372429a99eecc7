import { describe, expect, it } from 'vitest';
import { resolveNumerology, type NumerologyInput } from '../../../src/dsp/numerology/numerology';
import { NR_KAPPA, NR_TC_PER_SECOND } from '../../../src/dsp/numerology/nrNumerology';
import { DspError } from '../../../src/dsp/errors';

const lte = (bandwidthMHz: number, extra: Partial<NumerologyInput> = {}) =>
  resolveNumerology({ standard: 'lte', link: 'uplink', bandwidthMHz, cyclicPrefix: 'normal', ...extra });
const nr = (bandwidthMHz: number, subcarrierSpacingKHz: number, extra: Partial<NumerologyInput> = {}) =>
  resolveNumerology({ standard: 'nr', link: 'uplink', bandwidthMHz, subcarrierSpacingKHz, cyclicPrefix: 'normal', ...extra });

describe('LTE numerology', () => {
  // N_RB: TS 36.101 Table 5.6-1. FFT size and rate: common practice (REFERENCE.md §1). CP 160/144 Ts at 2048
  // scaled by N/2048: TS 36.211 Table 5.6-1; scaled values 10/9 … 160/144 as in TS 36.101 Table F.5.3-1.
  const rows: [number, number, number, number, number, number][] = [
    [1.4, 6, 128, 1.92e6, 10, 9],
    [3, 15, 256, 3.84e6, 20, 18],
    [5, 25, 512, 7.68e6, 40, 36],
    [10, 50, 1024, 15.36e6, 80, 72],
    [15, 75, 1536, 23.04e6, 120, 108],
    [20, 100, 2048, 30.72e6, 160, 144],
  ];
  for (const [bw, numRb, fftSize, rate, cp0, cp1] of rows) {
    it(`${bw} MHz: ${numRb} RB, FFT ${fftSize}, ${rate / 1e6} Msps, CP ${cp0}/${cp1}, slot = 0.5 ms`, () => {
      const n = lte(bw);
      expect(n.numRb).toBe(numRb);
      expect(n.fftSize).toBe(fftSize);
      expect(n.sampleRateHz).toBe(rate);
      expect(n.cpPatternSamples).toEqual([cp0, cp1, cp1, cp1, cp1, cp1, cp1]);
      expect(n.symbolsPerSlot).toBe(7);
      // Slot 0.5 ms = 15360 Ts (TS 36.211 §4): 160 + 2048 + 6·(144 + 2048) at 2048, scaled.
      expect(n.slotLengthSamples).toBe(rate * 0.5e-3);
      // Transmission bandwidth N_RB × 180 kHz (TS 36.101 §5.6).
      expect(n.transmissionBandwidthHz).toBe(numRb * 180e3);
      const ext = lte(bw, { cyclicPrefix: 'extended' });
      // Extended CP 512 Ts (TS 36.211 Table 5.6-1), 6 symbols a slot: 6·(512 + 2048) = 15360.
      expect(ext.cpPatternSamples).toEqual(Array(6).fill((512 * fftSize) / 2048));
      expect(ext.slotLengthSamples).toBe(rate * 0.5e-3);
    });
  }
  it('LTE 20 MHz: a slot is 15360 samples and a subframe 30720 at 30.72 Msps (REFERENCE.md §10 #2)', () => {
    expect(lte(20).slotLengthSamples).toBe(15360);
    expect(2 * lte(20).slotLengthSamples).toBe(30720);
  });
  it('downlink leaves DC unused; uplink shifts by half a subcarrier (TS 36.211 §6.12, §5.6)', () => {
    expect(lte(20, { link: 'downlink' }).dcNull).toBe(true);
    expect(lte(20).halfSubcarrierShift).toBe(true);
    expect(lte(20).dcNull).toBe(false);
  });
  it('rejects a bandwidth that Table 5.6-1 does not list, naming the allowed ones', () => {
    expect(() => lte(7)).toThrow(/allowed: 1.4, 3, 5, 10, 15, 20/);
  });
});

describe('NR FR1 numerology', () => {
  it('Tc = 1/(480 kHz·4096) ≈ 0.5086 ns and κ = 64 (TS 38.211 §4.1)', () => {
    expect(1e9 / NR_TC_PER_SECOND).toBeCloseTo(0.5086, 4);
    expect(NR_KAPPA).toBe(64);
  });
  it('100 MHz at 30 kHz: 273 RB, FFT 4096 at 122.88 Msps, CP 288 (352 on the long symbol), 61440 samples per 0.5 ms', () => {
    const n = nr(100, 30);
    expect(n.numRb).toBe(273); // TS 38.101-1 Table 5.3.2-1
    expect(n.fftSize).toBe(4096); // common practice (REFERENCE.md §3)
    expect(n.sampleRateHz).toBe(122.88e6);
    expect(n.cpPatternSamples[0]).toBe(352);
    expect(n.cpPatternSamples.slice(1)).toEqual(Array(13).fill(288));
    // One slot at μ = 1 is 0.5 ms: 14·4096 + 13·288 + 352 = 61440 (derived, REFERENCE.md §3).
    expect(n.slotLengthSamples).toBe(61440);
  });
  it('20 MHz at 15 kHz: 106 RB, FFT 2048 at 30.72 Msps, CP 160/144 like LTE', () => {
    const n = nr(20, 15);
    expect(n.numRb).toBe(106);
    expect(n.fftSize).toBe(2048);
    expect(n.cpPatternSamples).toEqual([160, 144, 144, 144, 144, 144, 144]);
    expect(n.slotLengthSamples).toBe(30720); // 1 ms slot at μ = 0
    // Minimum guard band (38.101-1 Table 5.3.3-1 note): (BW − N_RB·SCS·12)/2 − SCS/2 = 452.5 kHz.
    expect((20e6 - n.transmissionBandwidthHz) / 2 - 7.5e3).toBeCloseTo(452.5e3, 6);
  });
  it('N_RB from TS 38.101-1 Table 5.3.2-1 for the listed bandwidths', () => {
    // 15 and 30 kHz rows [S2 in REFERENCE.md]; 60 kHz 10/15 MHz [S2].
    const cases: [number, number, number][] = [
      [5, 15, 25], [10, 15, 52], [50, 15, 270], [5, 30, 11], [40, 30, 106], [60, 30, 162], [80, 30, 217], [10, 60, 11], [15, 60, 18],
    ];
    for (const [bw, scs, numRb] of cases) expect(nr(bw, scs).numRb).toBe(numRb);
  });
  it('60 kHz extended CP: 512κ·2^−2 Tc on every symbol, 12 symbols a slot', () => {
    const n = nr(20, 60, { cyclicPrefix: 'extended' });
    expect(n.symbolsPerSlot).toBe(12);
    // N_CP = 512κ·2^−μ Tc; samples = N_CP·f_s·Tc, f_s = fftSize·60 kHz.
    const expected = (512 * 64 * 2 ** -2 * n.fftSize * 60e3) / NR_TC_PER_SECOND;
    expect(new Set(n.cpPatternSamples)).toEqual(new Set([expected]));
    expect(expected).toBe(n.fftSize / 4);
  });
  it('rejects extended CP at 30 kHz, unknown spacings and unlisted bandwidths', () => {
    expect(() => nr(20, 30, { cyclicPrefix: 'extended' })).toThrow(/only at 60 kHz/);
    expect(() => nr(20, 120)).toThrow(/allowed: 15, 30, 60/);
    expect(() => nr(5, 60)).toThrow(DspError);
  });
});
