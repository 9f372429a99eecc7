import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { aclrPlanFor, aclrSpanHz, computeAclr } from '../../../src/dsp/metrics/aclr';
import { filterPowerIntegralHz, filterPowerResponse, UTRA_FILTER } from '../../../src/dsp/metrics/channelFilter';
import { computeWelchPsd } from '../../../src/dsp/metrics/welchPsd';
import { resolveNumerology } from '../../../src/dsp/numerology/numerology';
import { TEST_SEED } from '../../helpers/seed';

/** RRC power response as REFERENCE.md §5.5 writes it (Proakis §9.2), coded here independently of src. */
function rrcPowerReference(offsetHz: number): number {
  const t = 1 / 3.84e6;
  const a = 0.22;
  const f = Math.abs(offsetHz);
  if (f <= (1 - a) / (2 * t)) return 1;
  if (f <= (1 + a) / (2 * t)) return 0.5 * (1 + Math.cos(((Math.PI * t) / a) * (f - (1 - a) / (2 * t))));
  return 0;
}

/** ∫ L(f)·W(f) df by the midpoint rule with 100 Hz steps over [lo, hi]. */
function integrateHz(level: (f: number) => number, weight: (f: number) => number, lo: number, hi: number): number {
  const step = 100;
  let s = 0;
  for (let f = lo + step / 2; f < hi; f += step) s += level(f) * weight(f) * step;
  return s;
}

/**
 * Band-limited noise with the PSD `level(f)`, built in the frequency domain of one long transform (fft.js, an
 * independent library): every bin gets magnitude √level and a uniformly random phase, then the inverse transform.
 * The record is circularly band-limited and each band holds exactly its analytic power, so the Welch estimate
 * differs from `level` only by its own segment-to-segment spread and the window's leakage.
 */
function shapedNoise(numSamples: number, sampleRateHz: number, level: (f: number) => number, seed: number): Float64Array {
  const rng = createRng(seed);
  const fft = new FFT(numSamples);
  const spectrum = fft.createComplexArray() as number[];
  for (let k = 0; k < numSamples; k++) {
    const f = (k < numSamples / 2 ? k : k - numSamples) * (sampleRateHz / numSamples);
    const g = Math.sqrt(level(f));
    const phase = 2 * Math.PI * rng.nextFloat();
    spectrum[2 * k] = g * Math.cos(phase);
    spectrum[2 * k + 1] = g * Math.sin(phase);
  }
  const out = fft.createComplexArray() as number[];
  fft.inverseTransform(out, spectrum);
  return Float64Array.from(out);
}

describe('adjacent channels of the standards (REFERENCE.md §5.5, from memory — verify)', () => {
  it('LTE 20 MHz uplink: E-UTRA at ±20 MHz over 18 MHz, UTRA at ±12.5 and ±17.5 MHz', () => {
    const plan = aclrPlanFor(resolveNumerology({ standard: 'lte', link: 'uplink', bandwidthMHz: 20, cyclicPrefix: 'normal' }));
    expect(plan.assignedFilter).toEqual({ kind: 'rect', bandwidthHz: 18e6 });
    const byKey = Object.fromEntries(plan.channels.map((c) => [c.key, c]));
    expect(Object.keys(byKey).sort()).toEqual(['eutraLower', 'eutraUpper', 'utra1Lower', 'utra1Upper', 'utra2Lower', 'utra2Upper']);
    expect(byKey.eutraUpper!.offsetHz).toBe(20e6);
    expect(byKey.utra1Lower!.offsetHz).toBe(-12.5e6);
    expect(byKey.utra2Upper!.offsetHz).toBe(17.5e6);
    // Outermost edge: 20 + 9 MHz.
    expect(aclrSpanHz(plan)).toBe(29e6);
  });

  it('LTE 3 MHz has no UTRA ACLR2; the LTE downlink adds E-UTRA at ±2·BW; NR uses the N_RB·12·Δf measurement BW', () => {
    const lte3 = aclrPlanFor(resolveNumerology({ standard: 'lte', link: 'uplink', bandwidthMHz: 3, cyclicPrefix: 'normal' }));
    expect(lte3.channels.map((c) => c.key)).not.toContain('utra2Upper');
    const lteDl = aclrPlanFor(resolveNumerology({ standard: 'lte', link: 'downlink', bandwidthMHz: 10, cyclicPrefix: 'normal' }));
    expect(lteDl.channels.find((c) => c.key === 'eutra2Upper')!.offsetHz).toBe(20e6);
    const nr = aclrPlanFor(resolveNumerology({ standard: 'nr', link: 'uplink', bandwidthMHz: 100, subcarrierSpacingKHz: 30, cyclicPrefix: 'normal' }));
    // 273 RB × 12 × 30 kHz = 98.28 MHz (TS 38.101-1 Table 5.3.2-1).
    expect(nr.assignedFilter).toEqual({ kind: 'rect', bandwidthHz: 273 * 12 * 30e3 });
    expect(nr.channels.find((c) => c.key === 'nrUpper')!.offsetHz).toBe(100e6);
    // UTRA_ACLR1/2 at 2.5 / 7.5 MHz beyond the NR channel edge (TS 38.101-1 §6.5.2.4.2 via 38.521-1 text) [S2].
    expect(nr.channels.find((c) => c.key === 'utra1Upper')!.offsetHz).toBe(50e6 + 2.5e6);
    expect(nr.channels.find((c) => c.key === 'utra2Lower')!.offsetHz).toBe(-(50e6 + 7.5e6));
    expect(nr.channels.find((c) => c.key === 'utra1Upper')!.source).toMatch(/6\.5\.2\.4\.2 \(offsets \[S2\]/);
  });

  it('the UTRA filter follows the raised-cosine power response and integrates to 1/T = 3.84 MHz (derived)', () => {
    for (const f of [0, 1.0e6, 1.4976e6, 1.7e6, 1.92e6, 2.2e6, 2.3424e6, 3e6]) {
      expect(Math.abs(filterPowerResponse(UTRA_FILTER, f) - rrcPowerReference(f))).toBeLessThan(1e-12);
    }
    expect(filterPowerResponse(UTRA_FILTER, 1.92e6)).toBeCloseTo(0.5, 12);
    expect(filterPowerIntegralHz(UTRA_FILTER, 1e9)).toBeCloseTo(3.84e6, 3);
    const numeric = integrateHz(() => 1, rrcPowerReference, -2.5e6, 1.7e6);
    expect(Math.abs(filterPowerIntegralHz(UTRA_FILTER, 1.7e6) - numeric)).toBeLessThan(1);
  });
});

describe('ACLR of band-limited white noise equals the analytic ratio of filtered powers', () => {
  // Piecewise-flat PSD: 1 in the assigned channel, narrow bands at −40/−37 dB inside the UTRA ACLR1 roll-off, −60 dB floor.
  const fs = 61.44e6;
  const floor = 1e-6;
  const level = (f: number): number => {
    if (Math.abs(f) <= 9e6) return 1;
    if (f >= 14.1e6 && f <= 14.3e6) return 1e-4;
    if (f <= -14.1e6 && f >= -14.3e6) return 2e-4;
    return floor;
  };
  const plan = aclrPlanFor(resolveNumerology({ standard: 'lte', link: 'uplink', bandwidthMHz: 20, cyclicPrefix: 'normal' }));
  const signal = shapedNoise(1 << 21, fs, level, TEST_SEED);

  for (const window of ['hann', 'blackman-harris'] as const) {
    it(`${window} window, RBW 30 kHz: every channel within 0.05 dB`, () => {
      const psd = computeWelchPsd(signal, { sampleRateHz: fs, rbwHz: 30e3, window });
      const result = computeAclr(psd, plan);
      const assigned = integrateHz(level, (f) => (Math.abs(f) <= 9e6 ? 1 : 0), -9.5e6, 9.5e6);
      const toleranceDb = 0.05; // the Welch estimate spreads by ≈ 0.02 dB here (narrowest feature 200 kHz)
      for (const c of plan.channels) {
        const weight = c.filter.kind === 'rect' ? (f: number) => (Math.abs(f - c.offsetHz) <= 9e6 ? 1 : 0) : (f: number) => rrcPowerReference(f - c.offsetHz);
        const adjacent = integrateHz(level, weight, c.offsetHz - 9.5e6, c.offsetHz + 9.5e6);
        const expectedDb = 10 * Math.log10(assigned / adjacent);
        const measured = result.values.find((v) => v.key === c.key)!.aclrDb;
        expect(Math.abs(measured - expectedDb), `${c.key}: measured ${measured}, analytic ${expectedDb}, seed ${TEST_SEED}`).toBeLessThan(toleranceDb);
      }
    });
  }

  it('the roll-off matters: a square 3.84 MHz UTRA filter would read the narrow band ≥ 0.4 dB differently', () => {
    const rrc = integrateHz(level, (f) => rrcPowerReference(f - 12.5e6), 10e6, 15e6);
    const square = integrateHz(level, (f) => (Math.abs(f - 12.5e6) <= 1.92e6 ? 1 : 0), 10e6, 15e6);
    expect(10 * Math.log10(square / rrc)).toBeGreaterThan(0.4);
  });
});
