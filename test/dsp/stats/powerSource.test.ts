import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { DspError } from '../../../src/dsp/errors';
import { createPowerSource } from '../../../src/dsp/stats/powerSource';
import { createWaveformGenerator } from '../../../src/dsp/waveform/waveformGenerator';
import { createWaveformPlan, symbolLayoutOf, type WaveformPlan } from '../../../src/dsp/waveform/waveformPlan';
import { TEST_SEED } from '../../helpers/seed';

const relTol = 1e-9;

function planOf(input: WaveformConfigInput): WaveformPlan {
  return createWaveformPlan(parseWaveformConfig(input));
}

/** |x|² of the useful parts (CP removed) of symbols first…first+count−1, generated with data {random, seed}. */
function generatorPowers(input: WaveformConfigInput, seed: number, first: number, count: number): Float64Array {
  const plan = planOf({ ...input, data: { source: 'random', seed }, symbols: first + count });
  const batch = createWaveformGenerator(plan).generate(first + count);
  const n = plan.ofdm.ifftSize;
  const out = new Float64Array(count * n);
  for (let s = 0; s < count; s++) {
    const layout = symbolLayoutOf(plan, first + s);
    const start = 2 * (layout.startSample + layout.cpLengthSamples);
    for (let i = 0; i < n; i++) {
      const re = batch.waveformIq[start + 2 * i]!;
      const im = batch.waveformIq[start + 2 * i + 1]!;
      out[s * n + i] = re * re + im * im;
    }
  }
  return out;
}

/** Worst |a − b| relative to the largest |b|. */
function worstRelativeError(actual: ArrayLike<number>, expected: ArrayLike<number>): number {
  expect(actual.length).toBe(expected.length);
  let peak = 0;
  let worst = 0;
  for (let i = 0; i < expected.length; i++) {
    peak = Math.max(peak, Math.abs(expected[i]!));
    worst = Math.max(worst, Math.abs(actual[i]! - expected[i]!));
  }
  return worst / peak;
}

const CASES: { name: string; input: WaveformConfigInput }[] = [
  { name: 'LTE 20 MHz uplink DFT-s-OFDM QPSK, os 4', input: { oversampling: 4 } },
  { name: 'LTE 20 MHz downlink OFDM QPSK, os 4', input: { link: 'downlink', oversampling: 4 } },
  { name: 'LTE 5 MHz downlink OFDM 16QAM, os 2', input: { link: 'downlink', bandwidthMHz: 5, modulation: '16qam', oversampling: 2 } },
  {
    name: 'NR 20 MHz uplink DFT-s-OFDM, two blocks 64QAM/QPSK with power offsets, os 2',
    input: {
      standard: 'nr',
      bandwidthMHz: 20,
      waveform: 'dft-s-ofdm',
      oversampling: 2,
      allocation: [
        { startRb: 0, numRb: 12, modulation: '64qam', powerOffsetDb: -3 },
        { startRb: 20, numRb: 25, powerOffsetDb: 2 },
      ],
    },
  },
  { name: 'NR 10 MHz uplink DFT-s-OFDM π/2-BPSK, os 3', input: { standard: 'nr', bandwidthMHz: 10, waveform: 'dft-s-ofdm', modulation: 'pi/2-bpsk', oversampling: 3 } },
  { name: 'LTE 3 MHz downlink OFDM 1024QAM, os 1', input: { link: 'downlink', bandwidthMHz: 3, modulation: '1024qam' } },
  { name: 'LTE 1.4 MHz uplink interleaved DFT-s-OFDM QPSK, os 4', input: { bandwidthMHz: 1.4, mapping: 'interleaved', interleaveFactor: 4, oversampling: 4 } },
];

describe(`createPowerSource f64 (seed ${TEST_SEED})`, () => {
  for (const c of CASES) {
    it(`equals |ofdmModulateSymbol|² (CP removed) of the generator with the same random data: ${c.name}`, () => {
      // Reference: the engine's generator (TS 36.211 §5.6/§6.12, TS 38.211 §5.3.1 formulas) fed {source: 'random', seed}.
      const source = createPowerSource(planOf(c.input));
      const count = 3;
      const out = new Float64Array(count * source.samplesPerSymbol);
      source.fillSymbolPowers(TEST_SEED, 0, count, out);
      expect(worstRelativeError(out, generatorPowers(c.input, TEST_SEED, 0, count))).toBeLessThanOrEqual(relTol);
    });
  }

  it('starts a block at any symbol: symbols 5…7 equal the generator’s symbols 5…7 (data skipped, π/2-BPSK phase kept)', () => {
    for (const input of [CASES[3]!.input, CASES[4]!.input, CASES[5]!.input]) {
      const source = createPowerSource(planOf(input));
      const out = new Float64Array(3 * source.samplesPerSymbol);
      source.fillSymbolPowers(TEST_SEED + 1, 5, 3, out);
      expect(worstRelativeError(out, generatorPowers(input, TEST_SEED + 1, 5, 3))).toBeLessThanOrEqual(relTol);
    }
  });

  it('matches a direct O(N·K) evaluation of the TS 36.211 §5.6 uplink sum at t = n·Ts/os', () => {
    // s(t) = Σ_k a_k e^{j2π(k+1/2)Δf t}, k = k' − 6·N_RB, evaluated here independently of the IFFT.
    const input: WaveformConfigInput = { bandwidthMHz: 1.4, oversampling: 2, modulation: '16qam', waveform: 'dft-s-ofdm' };
    const plan = planOf({ ...input, data: { source: 'random', seed: TEST_SEED }, symbols: 1 });
    const grid = createWaveformGenerator(plan).generate(1).gridIq;
    const nOs = plan.ofdm.ifftSize;
    const numK = plan.numerology.numGridSubcarriers;
    const expected = new Float64Array(nOs);
    for (let n = 0; n < nOs; n++) {
      let re = 0;
      let im = 0;
      for (let kp = 0; kp < numK; kp++) {
        const angle = (2 * Math.PI * (kp - numK / 2 + 0.5) * n) / nOs;
        const c = Math.cos(angle);
        const s = Math.sin(angle);
        re += grid[2 * kp]! * c - grid[2 * kp + 1]! * s;
        im += grid[2 * kp]! * s + grid[2 * kp + 1]! * c;
      }
      expected[n] = re * re + im * im;
    }
    const out = new Float64Array(nOs);
    createPowerSource(plan).fillSymbolPowers(TEST_SEED, 0, 1, out);
    expect(worstRelativeError(out, expected)).toBeLessThanOrEqual(relTol);
  });

  it('constant-modulus QPSK: every symbol’s mean power is exactly expectedMeanPower (Parseval)', () => {
    // Parseval for the unnormalised IDFT: (1/N) Σ_n |x[n]|² = Σ_k |X_k|² (Proakis, Digital Signal Processing, §5.2; common practice).
    for (const input of [CASES[0]!.input, CASES[1]!.input]) {
      const source = createPowerSource(planOf(input));
      expect(source.expectedMeanPower).toBe(1200);
      const out = new Float64Array(2 * source.samplesPerSymbol);
      source.fillSymbolPowers(TEST_SEED, 0, 2, out);
      for (let s = 0; s < 2; s++) {
        let sum = 0;
        for (let i = 0; i < source.samplesPerSymbol; i++) sum += out[s * source.samplesPerSymbol + i]!;
        expect(Math.abs(sum / source.samplesPerSymbol - 1200) / 1200).toBeLessThanOrEqual(relTol);
      }
    }
  });

  it('expectedMeanPower matches the empirical mean of 16QAM/64QAM blocks with power offsets within 5 standard errors', () => {
    // E|d|² = 1 for every TS 38.211 §5.1 constellation; per subcarrier the power |d|² has variance E|d|⁴ − 1:
    // 0.32 for 16QAM and 8/21 for 64QAM (derived from the constellation levels, common practice). Unitary spreading keeps
    // Σ|z|² = Σ|d|², so the per-symbol mean power has variance Σ amp⁴·var over data symbols.
    const input: WaveformConfigInput = {
      ...CASES[3]!.input,
      allocation: [
        { startRb: 0, numRb: 12, modulation: '64qam', powerOffsetDb: -3 },
        { startRb: 20, numRb: 25, modulation: '16qam', powerOffsetDb: 2 },
      ],
    };
    const plan = planOf(input);
    const source = createPowerSource(plan);
    const a1 = 10 ** (-3 / 20);
    const a2 = 10 ** (2 / 20);
    expect(source.expectedMeanPower).toBeCloseTo(144 * a1 ** 2 + 300 * a2 ** 2, 9);
    const numSymbols = 400;
    const out = new Float64Array(numSymbols * source.samplesPerSymbol);
    source.fillSymbolPowers(TEST_SEED, 0, numSymbols, out);
    let sum = 0;
    for (let i = 0; i < out.length; i++) sum += out[i]!;
    const mean = sum / out.length;
    const variancePerSymbol = 144 * a1 ** 4 * (8 / 21) + 300 * a2 ** 4 * 0.32;
    const standardError = Math.sqrt(variancePerSymbol / numSymbols);
    expect(Math.abs(mean - source.expectedMeanPower), `seed ${TEST_SEED}`).toBeLessThanOrEqual(5 * standardError);
    // The test can fail: a wrong amplitude (offset applied in power, not amplitude) moves the mean by far more.
    expect(Math.abs(144 * a1 + 300 * a2 - source.expectedMeanPower)).toBeGreaterThan(50 * standardError);
  });

  it('different block seeds give different data; the same seed repeats exactly', () => {
    const source = createPowerSource(planOf(CASES[0]!.input));
    const a = new Float64Array(source.samplesPerSymbol);
    const b = new Float64Array(source.samplesPerSymbol);
    const c = new Float32Array(source.samplesPerSymbol);
    source.fillSymbolPowers(7, 0, 1, a);
    source.fillSymbolPowers(8, 0, 1, b);
    source.fillSymbolPowers(7, 0, 1, c);
    expect(worstRelativeError(a, b)).toBeGreaterThan(0.01);
    expect(worstRelativeError(c, a)).toBeLessThanOrEqual(1e-6);
  });

  it('rejects bad requests with typed errors naming the field', () => {
    const source = createPowerSource(planOf({ bandwidthMHz: 1.4 }));
    const expectCode = (fn: () => void, code: string, text: RegExp) => {
      try {
        fn();
        expect.unreachable('should have thrown');
      } catch (err) {
        expect(err).toBeInstanceOf(DspError);
        expect((err as DspError).code).toBe(code);
        expect((err as DspError).message).toMatch(text);
      }
    };
    expectCode(() => source.fillSymbolPowers(1, 0, 2, new Float64Array(source.samplesPerSymbol)), 'LENGTH_MISMATCH', /Power output/);
    expectCode(() => source.fillSymbolPowers(-1, 0, 1, new Float64Array(source.samplesPerSymbol)), 'INVALID_CONFIG', /blockSeed/);
    expectCode(() => source.fillSymbolPowers(1, 0.5, 1, new Float64Array(source.samplesPerSymbol)), 'INVALID_CONFIG', /firstSymbol/);
    expectCode(
      () => createPowerSource(planOf({ bandwidthMHz: 1.4 }), { precision: 'f16' as unknown as 'f64' }),
      'INVALID_CONFIG',
      /precision "f16".*"f64", "f32"/,
    );
  });
});
