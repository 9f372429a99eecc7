import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { createRng } from '../../../src/dsp/data/rng';
import {
  applyPhaseNoise,
  generateMaskPhaseNoise,
  generateWienerPhaseNoise,
  integratePhaseNoiseRad2,
  maskLevelDbcPerHz,
} from '../../../src/dsp/impairments/phaseNoise';
import { measureGridEvm } from '../../../src/dsp/txcheck/gridEvm';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { DspError } from '../../../src/dsp/errors';
import { TEST_SEED } from '../../helpers/seed';

const relTol = 0.05;

// 240 of 240 subcarriers at 15 kHz, oversampling 1: f_s = 3.6 MHz; all phase-noise ICI lands on data subcarriers.
function fullBandWave(symbols: number) {
  return generateWaveform(
    parseWaveformConfig({
      standard: 'custom',
      link: 'downlink',
      custom: { fftSize: 240, numRb: 20, cpLengthSamples: 16 },
      modulation: '16qam',
      data: { source: 'random', seed: TEST_SEED },
      symbols,
    }),
  );
}

describe('phase noise', () => {
  it('interpolates a mask in dB against log f and integrates it (2∫L df)', () => {
    const mask = [
      { offsetHz: 1e3, levelDbcPerHz: -80 },
      { offsetHz: 1e5, levelDbcPerHz: -100 },
    ];
    expect(maskLevelDbcPerHz(mask, 1e4)).toBeCloseTo(-90, 12);
    // L = 1e-8·(f/1e3)^(−1): 2∫_{1e3}^{1e5} L df = 2e-5·ln(100) (derived).
    expect(integratePhaseNoiseRad2(mask, 1e3, 1e5) / (2e-5 * Math.log(100)) - 1).toBeLessThan(1e-4);
    expect(() => generateMaskPhaseNoise([mask[0]!], 1e6, createRng(1), new Float64Array(8))).toThrow(DspError);
  });

  it('synthesises a mask with the integrated variance, and EVM ≈ σ_φ (common practice)', () => {
    const wave = fullBandWave(200);
    const fs = wave.sampleRateHz;
    // Flat (white) L(f) = −96 dBc/Hz over ±f_s/2: σ² = L·f_s ≈ 9.0e-4 rad² (σ ≈ 1.7°).
    const mask = [
      { offsetHz: 1e3, levelDbcPerHz: -96 },
      { offsetHz: 1e7, levelDbcPerHz: -96 },
    ];
    const phase = generateMaskPhaseNoise(mask, fs, createRng(TEST_SEED), new Float64Array(wave.numSamples));
    let variance = 0;
    for (const p of phase) variance += p * p;
    variance /= phase.length;
    const integrated = integratePhaseNoiseRad2(mask, fs / wave.numSamples, fs / 2);
    expect(Math.abs(variance / integrated - 1), `seed ${TEST_SEED}`).toBeLessThan(relTol);
    const y = applyPhaseNoise(wave.waveformIq, phase, new Float64Array(wave.waveformIq.length));
    const evm = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, y);
    // White phase noise: error power 1 − e^{−σ²} over signal e^{−σ²} → EVM = √(e^{σ²} − 1) ≈ σ.
    const expectedPercent = 100 * Math.sqrt(Math.exp(integrated) - 1);
    expect(Math.abs(evm.evmRmsPercent / expectedPercent - 1), `EVM ${evm.evmRmsPercent} % vs ${expectedPercent} %`).toBeLessThan(relTol);
  });

  it('builds a Wiener process with increment variance 2π·Δν/f_s and EVM² ≈ 2πΔν/(6Δf) after per-symbol phase removal', () => {
    const wave = fullBandWave(400);
    const fs = wave.sampleRateHz;
    const linewidthHz = 30;
    const phase = generateWienerPhaseNoise(linewidthHz, fs, createRng(TEST_SEED), new Float64Array(wave.numSamples));
    let inc = 0;
    for (let i = 1; i < phase.length; i++) inc += (phase[i]! - phase[i - 1]!) ** 2;
    expect(Math.abs(inc / (phase.length - 1) / ((2 * Math.PI * linewidthHz) / fs) - 1)).toBeLessThan(0.03);
    const y = applyPhaseNoise(wave.waveformIq, phase, new Float64Array(wave.waveformIq.length));
    const evm = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, y, { gainPerSymbol: true });
    // Derived: over a useful part of T = 1/Δf, a random walk of rate D = 2πΔν deviates from its mean by E[(φ − φ̄)²] = D·T/6;
    // small-angle, that is the error power of the common-phase-corrected symbol.
    const expectedPercent = 100 * Math.sqrt((2 * Math.PI * linewidthHz) / wave.plan.numerology.subcarrierSpacingHz / 6);
    expect(Math.abs(evm.evmRmsPercent / expectedPercent - 1), `EVM ${evm.evmRmsPercent} % vs ${expectedPercent} % (seed ${TEST_SEED})`).toBeLessThan(0.15);
    // Without per-symbol correction the wander over the record dominates.
    expect(measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, y).evmRmsPercent).toBeGreaterThan(evm.evmRmsPercent);
  });
});
