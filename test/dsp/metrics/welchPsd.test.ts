import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { createSpectralWindow, equivalentNoiseBandwidthBins, nominalEnbwBins } from '../../../src/dsp/metrics/spectralWindows';
import { computeWelchPsd, createWelchAccumulator, createWelchPlan, finishWelch, pushWelchSamples } from '../../../src/dsp/metrics/welchPsd';
import { TEST_SEED } from '../../helpers/seed';

function tone(n: number, amplitude: number, cyclesPerSample: number): Float64Array {
  const iq = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    iq[2 * i] = amplitude * Math.cos(2 * Math.PI * cyclesPerSample * i);
    iq[2 * i + 1] = amplitude * Math.sin(2 * Math.PI * cyclesPerSample * i);
  }
  return iq;
}

function integrate(psd: { psdPerHz: Float64Array; binWidthHz: number }): number {
  let s = 0;
  for (const v of psd.psdPerHz) s += v * psd.binWidthHz;
  return s;
}

describe('spectral windows (Harris 1978)', () => {
  it('equivalent noise bandwidth: Hann 1.5 bins (derived), Blackman–Harris 2.00, flat-top 3.77 (from memory — verify)', () => {
    const absTol = 1e-9;
    expect(Math.abs(equivalentNoiseBandwidthBins(createSpectralWindow('hann', 1024)) - 1.5)).toBeLessThan(absTol);
    expect(Math.abs(nominalEnbwBins('hann') - 1.5)).toBeLessThan(absTol);
    expect(equivalentNoiseBandwidthBins(createSpectralWindow('blackman-harris', 4096))).toBeCloseTo(2.0044, 3);
    expect(equivalentNoiseBandwidthBins(createSpectralWindow('flat-top', 4096))).toBeCloseTo(3.77, 2);
    expect(() => createSpectralWindow('kaiser' as never, 8)).toThrow(/allowed: hann, flat-top, blackman-harris/);
  });
});

describe('Welch PSD (Welch 1967)', () => {
  const fs = 30.72e6;

  it('integrates to the mean power (Parseval) for a tone and for noise, whatever the window', () => {
    const relTol = 1e-9;
    for (const window of ['hann', 'flat-top', 'blackman-harris'] as const) {
      const psd = computeWelchPsd(tone(200000, 2, 0.1234), { sampleRateHz: fs, rbwHz: 30e3, window });
      expect(Math.abs(integrate(psd) / 4 - 1)).toBeLessThan(relTol);
    }
    const rng = createRng(TEST_SEED);
    const noise = new Float64Array(2 * 300000);
    let power = 0;
    for (let i = 0; i < noise.length; i++) {
      noise[i] = rng.nextGaussian();
      power += noise[i]! ** 2;
    }
    const psd = computeWelchPsd(noise, { sampleRateHz: fs, rbwHz: 30e3, window: 'hann' });
    // Overlapped segments weight samples unevenly, so noise agrees to the estimate's spread, not to rounding.
    expect(Math.abs(integrate(psd) / (power / 300000) - 1), `seed ${TEST_SEED}`).toBeLessThan(0.01);
  });

  it('the RBW is the window ENBW × f_s / N, close to the request; a flat-top bin reads a tone to 0.02 dB anywhere in a bin', () => {
    const plan = createWelchPlan({ sampleRateHz: fs, rbwHz: 30e3, window: 'flat-top' });
    expect(Math.abs(plan.rbwHz / 30e3 - 1)).toBeLessThan(0.05);
    for (const offsetBins of [0, 0.25, 0.5]) {
      const f = (1000 + offsetBins) / plan.segmentLength;
      const psd = computeWelchPsd(tone(plan.segmentLength * 20, 1, f), { sampleRateHz: fs, rbwHz: 30e3, window: 'flat-top' });
      let peak = 0;
      for (const v of psd.psdPerHz) peak = Math.max(peak, v);
      // Tone power read as peak PSD × RBW (common practice); flat-top scalloping < 0.02 dB (from memory — verify).
      expect(Math.abs(10 * Math.log10(peak * psd.rbwHz))).toBeLessThan(0.02);
    }
  });

  it('feeding the signal in pieces gives the same spectrum as in one go; frequencies ascend from −f_s/2', () => {
    const signal = tone(50000, 1, -0.2);
    const options = { sampleRateHz: fs, rbwHz: 100e3, window: 'hann' as const };
    const whole = computeWelchPsd(signal, options);
    const acc = createWelchAccumulator(createWelchPlan(options));
    for (let s = 0; s < 50000; s += 777) pushWelchSamples(acc, signal.subarray(2 * s, 2 * Math.min(50000, s + 777)));
    const pieces = finishWelch(acc);
    expect(Array.from(pieces.psdPerHz)).toEqual(Array.from(whole.psdPerHz));
    expect(whole.frequenciesHz[0]).toBeCloseTo(-fs / 2, 6);
    let argmax = 0;
    for (let i = 0; i < whole.psdPerHz.length; i++) if (whole.psdPerHz[i]! > whole.psdPerHz[argmax]!) argmax = i;
    expect(Math.abs(whole.frequenciesHz[argmax]! - -0.2 * fs)).toBeLessThanOrEqual(whole.binWidthHz);
  });

  it('refuses an RBW the record cannot resolve', () => {
    expect(() => createWelchPlan({ sampleRateHz: fs, rbwHz: 1, window: 'hann' })).toThrow(/rbwHz 1 at a sample rate/);
    expect(() => computeWelchPsd(tone(100, 1, 0), { sampleRateHz: fs, rbwHz: 30e3, window: 'hann' })).toThrow(/at least one full/);
  });
});
