import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { addAwgn } from '../../../src/dsp/channel/awgn';
import { applyFrequencyOffset, applyTimingOffset } from '../../../src/dsp/channel/impairments';
import { resolveNoiseLevel } from '../../../src/dsp/channel/noiseLevels';
import { createRng, deriveBlockSeed } from '../../../src/dsp/data/rng';
import { noiseReferenceOf } from '../../../src/dsp/link/linkSimulation';
import { estimateCpTimingAndCfo } from '../../../src/dsp/receiver/cpSynchronisation';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { TEST_SEED } from '../../helpers/seed';

const wave = generateWaveform(parseWaveformConfig({ standard: 'lte', bandwidthMHz: 5, symbols: 28, referenceSignals: { enabled: true } }));
const plan = wave.plan;
const spacingHz = plan.numerology.subcarrierSpacingHz;

function impaired(cfoHz: number, delaySamples: number, esN0Db: number | undefined, seed: number): Float64Array {
  let x = applyFrequencyOffset(wave.waveformIq, cfoHz, plan.sampleRateHz, new Float64Array(wave.waveformIq.length));
  x = applyTimingOffset(x, delaySamples);
  const padded = new Float64Array(x.length + 2 * 200);
  padded.set(x);
  if (esN0Db === undefined) return padded;
  const { noiseVariance } = resolveNoiseLevel({ esN0Db }, noiseReferenceOf(wave));
  return addAwgn(padded, noiseVariance, createRng(seed), new Float64Array(padded.length));
}

function sync(rx: Float64Array) {
  return estimateCpTimingAndCfo(rx, {
    symbols: wave.symbolLayout,
    fftSize: plan.ofdm.ifftSize,
    cpSign: -1, // LTE uplink: CP = −tail (half-subcarrier shift)
    maxOffsetSamples: 300,
    snrDb: 10,
  });
}

describe('van de Beek CP estimator (IEEE Trans. SP 45(7), 1997)', () => {
  it('is exact on a noiseless signal: timing 0…300, CFO ±0.45 subcarrier', () => {
    for (const [cfo, delay] of [
      [0.45 * spacingHz, 0],
      [-0.3 * spacingHz, 123],
      [1000, 300],
    ] as const) {
      const r = sync(impaired(cfo, delay, undefined, 0));
      expect(r.timingOffsetSamples).toBe(delay);
      expect(Math.abs(r.cfoSubcarriers * spacingHz - cfo)).toBeLessThan(1e-6);
      expect(r.correlationQuality).toBeCloseTo(1, 9);
    }
  });

  it(`at Es/N0 = 10 dB: timing within 2 samples and CFO within 4σ of the estimator's variance, seed ${TEST_SEED}`, () => {
    // Derived bound: var(ε̂) ≈ (1/ρ + 1/(2ρ²)) / (4π²·L_eff) with ρ the per-sample SNR in the CP correlation
    // (Es/N0·K/N) and L_eff = L·K/N the CP samples' independent degrees of freedom (K = 300 of N = 512 bins occupied).
    const k = 300;
    const n = 512;
    const rho = 10 ** (10 / 10) * (k / n);
    const cpSamples = wave.symbolLayout.reduce((s, l) => s + l.cpLengthSamples, 0);
    const sigma = Math.sqrt((1 / rho + 1 / (2 * rho * rho)) / (4 * Math.PI ** 2 * cpSamples * (k / n)));
    const cfoHz = 0.23 * spacingHz;
    for (let trial = 0; trial < 4; trial++) {
      const delay = 57.4 + 31 * trial;
      const r = sync(impaired(cfoHz, delay, 10, deriveBlockSeed(TEST_SEED, trial)));
      expect(Math.abs(r.timingOffsetSamples - delay), `trial ${trial}`).toBeLessThanOrEqual(2);
      expect(Math.abs(r.cfoSubcarriers - 0.23), `trial ${trial}: σ = ${sigma}`).toBeLessThan(4 * sigma);
    }
  });
});
