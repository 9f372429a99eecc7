import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { amplifyAtDrive } from '../../../src/dsp/amplifier/drive';
import { createSoftLimiterModel } from '../../../src/dsp/amplifier/softLimiter';
import { measureGridEvm } from '../../../src/dsp/txcheck/gridEvm';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { erfcByIntegration } from '../../helpers/erfc';
import { TEST_SEED } from '../../helpers/seed';

const relTol = 0.03;

/**
 * Clipping theory for a complex Gaussian input of power σ² through an ideal soft limiter at A = γσ
 * (H. Ochiai & H. Imai, "Performance analysis of deliberately clipped OFDM signals", IEEE Trans. Commun.
 * 50(1):89–101, 2002, eqs. for the attenuation α and the output power; also Dardari, Tralli & Vaccari 2000):
 *   α = 1 − e^{−γ²} + (√π·γ/2)·erfc(γ),  E|y|² = σ²(1 − e^{−γ²}),  distortion σ_d² = E|y|² − α²σ².
 */
function clippingTheory(gamma: number): { alpha: number; outputPower: number; distortion: number } {
  const outputPower = 1 - Math.exp(-gamma * gamma);
  const alpha = outputPower + ((Math.sqrt(Math.PI) * gamma) / 2) * erfcByIntegration(gamma);
  return { alpha, outputPower, distortion: outputPower - alpha * alpha };
}

describe('Gaussian-like OFDM through a soft limiter vs Bussgang / clipping-noise theory', () => {
  // 240 of 240 subcarriers occupied at oversampling 1: all clipping noise of the useful part lands on data
  // subcarriers, so the EVM after a gain fit is √(σ_d²/(α²σ²)) (Ochiai & Imai 2002, SDR = α²/(1 − e^{−γ²} − α²)).
  const config = parseWaveformConfig({
    standard: 'custom',
    link: 'downlink',
    custom: { fftSize: 240, numRb: 20, cpLengthSamples: 16 },
    modulation: '64qam',
    data: { source: 'random', seed: TEST_SEED },
    symbols: 200,
  });
  const wave = generateWaveform(config);
  const x = wave.waveformIq;
  let inputPower = 0;
  for (let i = 0; i < x.length; i++) inputPower += x[i]! ** 2;
  inputPower /= wave.numSamples;

  for (const clippingRatioDb of [0, 3, 6]) {
    it(`matches α, output power and EVM at clipping ratio ${clippingRatioDb} dB (seed ${TEST_SEED})`, () => {
      const gamma = 10 ** (clippingRatioDb / 20);
      // IBO = 10·log10(A²/σ²) = clipping ratio, for the limiter with G = 1 (r_sat = A).
      const { outputIq, drive } = amplifyAtDrive(createSoftLimiterModel(), x, { reference: 'ibo', backoffDb: clippingRatioDb });
      const s = drive.inputScale;
      let cross = 0;
      let outPower = 0;
      for (let i = 0; i < x.length; i++) {
        cross += outputIq[i]! * x[i]! * s;
        outPower += outputIq[i]! ** 2;
      }
      const sigma2 = inputPower * s * s;
      const alphaMeasured = cross / wave.numSamples / sigma2;
      const theory = clippingTheory(gamma);
      expect(Math.abs(alphaMeasured / theory.alpha - 1)).toBeLessThan(relTol);
      expect(Math.abs(outPower / wave.numSamples / sigma2 / theory.outputPower - 1)).toBeLessThan(relTol);
      const evmTheory = 100 * Math.sqrt(theory.distortion / (theory.alpha * theory.alpha));
      const evm = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, outputIq);
      // Distortion power is a small difference of two powers: allow 8 % on the EVM (clipping events are rare at 6 dB).
      expect(Math.abs(evm.evmRmsPercent / evmTheory - 1), `EVM ${evm.evmRmsPercent.toFixed(2)} % vs theory ${evmTheory.toFixed(2)} %`).toBeLessThan(0.08);
      // The fitted gain is the Bussgang α times the drive scale (the grid is at unit scale).
      expect(evm.gainIq[0] / s).toBeCloseTo(alphaMeasured, 2);
    });
  }

  it('the theory itself: α(γ=1) = 0.7715, EVM(γ=2) ≈ 4.1 % (derived from the formulas above)', () => {
    expect(clippingTheory(1).alpha).toBeCloseTo(0.7715, 3);
    const t = clippingTheory(2);
    expect(100 * Math.sqrt(t.distortion) / t.alpha).toBeCloseTo(4.1, 1);
  });
});
