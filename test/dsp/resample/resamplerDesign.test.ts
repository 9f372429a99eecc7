import { describe, expect, it } from 'vitest';
import { DspError } from '../../../src/dsp/errors';
import { besselI0, kaiserBeta, kaiserOrder, rippleDbToDelta } from '../../../src/dsp/resample/kaiserWindow';
import { findRateRatio } from '../../../src/dsp/resample/rationalRatio';
import { designResampler, type ResamplerDesign } from '../../../src/dsp/resample/resamplerDesign';

/** LTE 20 MHz downlink: outermost subcarrier k = ±600 at 15 kHz, ±7.5 kHz (TS 36.211 §6.12) → 9.0075 MHz. */
const LTE20_EDGE_HZ = 600 * 15e3 + 7.5e3;

/** |H(e^{jω})|/L by direct evaluation of Σ h[n]e^{−jωn} (independent of the engine's FFT). */
function magnitude(taps: Float64Array, gain: number, w: number): number {
  let re = 0;
  let im = 0;
  for (let n = 0; n < taps.length; n++) {
    re += taps[n]! * Math.cos(w * n);
    im -= taps[n]! * Math.sin(w * n);
  }
  return Math.hypot(re, im) / gain;
}

/** Ripple (peak-to-peak dB) and attenuation (dB) measured on a grid dense near the band edges. */
function measureDirect(d: ResamplerDesign): { rippleDb: number; attenuationDb: number } {
  const fs = d.inputRateHz * d.up;
  const wp = (2 * Math.PI * d.passbandEdgeHz) / fs;
  const ws = (2 * Math.PI * d.stopbandEdgeHz) / fs;
  const lobe = (2 * Math.PI) / d.numTaps;
  let maxP = 0;
  let minP = Infinity;
  for (let i = 0; i <= 600; i++) {
    const m = magnitude(d.taps, d.up, (wp * i) / 600);
    maxP = Math.max(maxP, m);
    minP = Math.min(minP, m);
  }
  let maxS = 0;
  const dense = Math.min(Math.PI, ws + 40 * lobe);
  for (let w = ws; w <= dense; w += lobe / 16) maxS = Math.max(maxS, magnitude(d.taps, d.up, w));
  for (let w = dense; w <= Math.PI; w += lobe / (d.numTaps > 1000 ? 4 : 6)) maxS = Math.max(maxS, magnitude(d.taps, d.up, w));
  return { rippleDb: 20 * Math.log10(maxP / minP), attenuationDb: -20 * Math.log10(maxS) };
}

describe('Kaiser-window resampler design', () => {
  it('Kaiser formulas (Oppenheim & Schafer 3rd ed. eqs. 7.62–7.63) and I0', () => {
    // I0(1) = 1.266065877752008 (Abramowitz & Stegun Table 9.8, from memory); I0(0) = 1.
    expect(besselI0(0)).toBe(1);
    expect(besselI0(1)).toBeCloseTo(1.266065877752008, 14);
    // A = 80 dB: β = 0.1102·(80 − 8.7) = 7.857 (derived); A = 40: 0.5842·19^0.4 + 0.07886·19 = 3.395 (derived).
    expect(kaiserBeta(80)).toBeCloseTo(7.85726, 5);
    expect(kaiserBeta(40)).toBeCloseTo(3.3953, 3);
    expect(kaiserBeta(10)).toBe(0);
    expect(kaiserOrder(80, 0.1)).toBe(Math.ceil(72 / 0.2285));
    // 0.01 dB peak-to-peak ripple ↔ δp = 5.756e-4 (derived from 20·log10((1+δ)/(1−δ))).
    expect(rippleDbToDelta(0.01)).toBeCloseTo(5.7564e-4, 7);
  });

  it('finds exact rate ratios (30.72 → 100 Msps is 625/192)', () => {
    expect(findRateRatio(30.72e6, 122.88e6)).toEqual({ up: 4, down: 1 });
    expect(findRateRatio(30.72e6, 100e6)).toEqual({ up: 625, down: 192 });
    expect(findRateRatio(122.88e6, 100e6)).toEqual({ up: 625, down: 768 });
    expect(findRateRatio(30.72e6, 1e8 / 3)).toEqual({ up: 625, down: 576 });
    expect(() => findRateRatio(30.72e6, 100.0001e6)).toThrow(DspError);
  });

  for (const [outHz, spec] of [
    [122.88e6, {}],
    [100e6, {}],
    [61.44e6, {}],
    [245.76e6, {}],
    [100e6, { passbandRippleDb: 0.1, stopbandAttenuationDb: 60 }],
  ] as const) {
    const ripple = (spec as { passbandRippleDb?: number }).passbandRippleDb ?? 0.01;
    const atten = (spec as { stopbandAttenuationDb?: number }).stopbandAttenuationDb ?? 80;
    it(`30.72 → ${outHz / 1e6} Msps meets ${ripple} dB ripple and ${atten} dB attenuation, measured independently`, () => {
      const d = designResampler({ inputRateHz: 30.72e6, outputRateHz: outHz, passbandEdgeHz: LTE20_EDGE_HZ, ...spec });
      const m = measureDirect(d);
      const gridToleranceDb = 0.02;
      expect(m.rippleDb).toBeLessThanOrEqual(ripple);
      expect(m.attenuationDb).toBeGreaterThanOrEqual(atten - gridToleranceDb);
      // The design’s own FFT-grid measurement agrees with the direct one (to the coarser grid far from the edge).
      expect(Math.abs(d.measured.stopbandAttenuationDb - m.attenuationDb)).toBeLessThan(0.4);
      expect(d.numTaps % 2).toBe(1);
      console.info(
        `resampler 30.72→${outHz / 1e6} Msps: ${d.up}/${d.down}, K=${d.numTaps} (${d.tapsPerPhase}/phase), β=${d.kaiserBeta.toFixed(3)}, ripple ${m.rippleDb.toExponential(2)} dB, attenuation ${m.attenuationDb.toFixed(2)} dB`,
      );
    }, 60_000);
  }

  it('looser specs give shorter filters', () => {
    const tight = designResampler({ inputRateHz: 30.72e6, outputRateHz: 100e6, passbandEdgeHz: LTE20_EDGE_HZ });
    const loose = designResampler({ inputRateHz: 30.72e6, outputRateHz: 100e6, passbandEdgeHz: LTE20_EDGE_HZ, stopbandAttenuationDb: 50 });
    expect(loose.numTaps).toBeLessThan(tight.numTaps);
  });

  it('rejects a band that does not fit and out-of-range specs, naming the field', () => {
    const expectConfig = (fn: () => unknown, field: string): void => {
      try {
        fn();
        expect.unreachable();
      } catch (err) {
        expect((err as DspError).code).toBe('INVALID_CONFIG');
        expect((err as DspError).details?.field).toBe(field);
      }
    };
    // ±9 MHz does not fit 15.36 Msps.
    expectConfig(() => designResampler({ inputRateHz: 30.72e6, outputRateHz: 15.36e6, passbandEdgeHz: LTE20_EDGE_HZ }), 'rate');
    expectConfig(() => designResampler({ inputRateHz: 30.72e6, outputRateHz: 61.44e6, passbandEdgeHz: 1e6, passbandRippleDb: 0 }), 'passbandRippleDb');
    expectConfig(() => designResampler({ inputRateHz: 30.72e6, outputRateHz: 61.44e6, passbandEdgeHz: 1e6, stopbandAttenuationDb: 500 }), 'stopbandAttenuationDb');
  });
});
