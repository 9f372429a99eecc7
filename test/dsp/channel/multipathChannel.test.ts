import { describe, expect, it } from 'vitest';
import { applyMultipathChannel, createMultipathChannel, tapFrequencyResponses } from '../../../src/dsp/channel/multipathChannel';
import { applyFractionalDelay, designFractionalDelay } from '../../../src/dsp/channel/fractionalDelay';
import { applyFrequencyOffset, applyTimingOffset } from '../../../src/dsp/channel/impairments';
import { createRng, deriveBlockSeed } from '../../../src/dsp/data/rng';
import { dspErrorOf } from '../../helpers/dspErrorOf';
import { TEST_SEED } from '../../helpers/seed';

function tone(frequencyHz: number, sampleRateHz: number, n: number, delaySamples = 0): Float64Array {
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const angle = (2 * Math.PI * frequencyHz * (i - delaySamples)) / sampleRateHz;
    out[2 * i] = Math.cos(angle);
    out[2 * i + 1] = Math.sin(angle);
  }
  return out;
}

describe('fractional delay (band-limited interpolation, common practice)', () => {
  it('delays a tone at 0.3·f_s by 0.37 samples to within 2e-3 (Blackman-windowed sinc, H = 16)', () => {
    const fs = 1;
    const x = tone(0.3, fs, 400);
    const y = applyFractionalDelay(designFractionalDelay(0.37), x, new Float64Array(x.length));
    const ref = tone(0.3, fs, 400, 0.37);
    for (let i = 40; i < 360; i++) expect(Math.hypot(y[2 * i]! - ref[2 * i]!, y[2 * i + 1]! - ref[2 * i + 1]!)).toBeLessThan(2e-3);
  });
  it('names the buffer or option, the value given and what is allowed when a length is wrong', () => {
    // Interleaved IQ: 2 values per complex sample (src/dsp complex-buffer convention, common practice).
    const filter = designFractionalDelay(0.5);
    const odd = dspErrorOf(() => applyFractionalDelay(filter, new Float64Array(8), new Float64Array(7)));
    expect(odd.code).toBe('LENGTH_MISMATCH');
    expect(odd.message).toBe('applyFractionalDelay outIq has 7 values; allowed: an even number (2 per complex sample, re then im), e.g. 6 or 8.');
    expect(dspErrorOf(() => applyFractionalDelay(filter, new Float64Array(5), new Float64Array(8))).message).toMatch(/^applyFractionalDelay inIq has 5 values; allowed: an even number/);
    // Any even output length is allowed: the output covers as many samples as it holds (fractionalDelay.ts doc).
    expect(applyFractionalDelay(filter, new Float64Array(8), new Float64Array(12)).length).toBe(12);
    const same = new Float64Array(8);
    expect(dspErrorOf(() => applyFractionalDelay(filter, same, same)).code).toBe('INTERNAL');
    // H = halfLength sets the 2H taps of a fractional delay (fractionalDelay.ts); it must be a whole number ≥ 1.
    for (const halfLength of [0, 2.5, Number.NaN]) {
      const bad = dspErrorOf(() => designFractionalDelay(0.5, halfLength));
      expect(bad.code, `halfLength ${halfLength}`).toBe('INVALID_CONFIG');
      expect(bad.message).toBe(`Fractional-delay halfLength ${halfLength} must be a whole number ≥ 1 (the filter has 2·halfLength taps; default 16).`);
    }
    expect(designFractionalDelay(0.5, 1).taps.length).toBe(2);
  });
  it('is exact for whole-sample delays', () => {
    const x = tone(0.1, 1, 50);
    const y = applyTimingOffset(x, 3);
    expect(y.length).toBe(x.length + 6);
    for (let i = 0; i < 50; i++) expect(y[2 * (i + 3)]).toBe(x[2 * i]);
    expect(y[0]).toBe(0);
  });
});

describe('carrier frequency offset', () => {
  it('rotates sample n by e^{j2πΔf·n/f_s}', () => {
    const x = new Float64Array(20).fill(0);
    for (let i = 0; i < 10; i++) x[2 * i] = 1;
    const y = applyFrequencyOffset(x, 100, 1000, new Float64Array(20));
    for (let i = 0; i < 10; i++) {
      expect(y[2 * i]).toBeCloseTo(Math.cos((2 * Math.PI * 100 * i) / 1000), 14);
      expect(y[2 * i + 1]).toBeCloseTo(Math.sin((2 * Math.PI * 100 * i) / 1000), 14);
    }
  });
});

describe(`tapped-delay-line channel with exact tap delays, seed ${TEST_SEED}`, () => {
  const sampleRateHz = 7.68e6;

  it('with Doppler 0 acts on a tone as H(f) = Σ g_p e^{−j2πfτ_p} at the exact (fractional) delays (TS 36.101 B.2; 2e-3)', () => {
    const channel = createMultipathChannel({ profile: 'eva', dopplerHz: 0, sampleRateHz, seed: TEST_SEED });
    const f = 1.2e6;
    const x = tone(f, sampleRateHz, 600);
    const gains: Float64Array[] = [];
    const y = applyMultipathChannel(channel, x, 0, new Float64Array(x.length), gains);
    let hRe = 0;
    let hIm = 0;
    channel.taps.forEach((tap, p) => {
      const g = gains[p]!;
      const angle = -2 * Math.PI * f * tap.delayS;
      hRe += g[0]! * Math.cos(angle) - g[1]! * Math.sin(angle);
      hIm += g[0]! * Math.sin(angle) + g[1]! * Math.cos(angle);
    });
    for (let i = 100; i < 580; i++) {
      const eRe = hRe * x[2 * i]! - hIm * x[2 * i + 1]!;
      const eIm = hRe * x[2 * i + 1]! + hIm * x[2 * i]!;
      expect(Math.hypot(y[2 * i]! - eRe, y[2 * i + 1]! - eIm)).toBeLessThan(2e-3);
    }
    // The per-tap interpolator responses agree with e^{−j2πfτ} in the band too.
    const r = tapFrequencyResponses(channel, [f]);
    channel.taps.forEach((tap, p) => {
      const angle = -2 * Math.PI * f * tap.delayS;
      expect(Math.hypot(r[p]![0]! - Math.cos(angle), r[p]![1]! - Math.sin(angle))).toBeLessThan(2e-3);
    });
  });

  it('keeps the mean power over many drops (Σ P_p = 1, unit-power Rayleigh taps): a 4σ z-test over 400 drops', () => {
    // White input: a drop's output power is Σ_p P_p|g_p|² plus cross terms of taps closer than a sample, all with mean
    // 1 over drops (independent zero-mean taps). The bound uses the drops' own standard deviation.
    const n = 1000;
    const rng = createRng(TEST_SEED);
    const x = new Float64Array(2 * n);
    for (let i = 0; i < x.length; i++) x[i] = Math.SQRT1_2 * rng.nextGaussian();
    let inputPower = 0;
    for (let i = 2 * 100; i < 2 * n; i++) inputPower += x[i]! * x[i]!;
    const drops = 400;
    const ratios: number[] = [];
    for (let d = 0; d < drops; d++) {
      const channel = createMultipathChannel({ profile: 'etu', dopplerHz: 300, sampleRateHz, seed: deriveBlockSeed(TEST_SEED, d) });
      const y = applyMultipathChannel(channel, x, 0, new Float64Array(x.length));
      let power = 0;
      for (let i = 2 * 100; i < 2 * n; i++) power += y[i]! * y[i]!;
      ratios.push(power / inputPower);
    }
    const mean = ratios.reduce((a, b) => a + b, 0) / drops;
    const std = Math.sqrt(ratios.reduce((a, b) => a + (b - mean) ** 2, 0) / (drops - 1));
    expect(Math.abs(mean - 1), `mean ${mean}, σ per drop ${std}`).toBeLessThan((4 * std) / Math.sqrt(drops));
  });
});
