import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { addAwgn } from '../../../src/dsp/channel/awgn';
import { resolveNoiseLevel } from '../../../src/dsp/channel/noiseLevels';
import { createRng } from '../../../src/dsp/data/rng';
import { runLinkSimulation, noiseReferenceOf } from '../../../src/dsp/link/linkSimulation';
import { berBpskQpsk, berSquareQam, ebN0DbForBer } from '../../../src/dsp/receiver/errorRateTheory';
import { measureEvm } from '../../../src/dsp/receiver/evmMeasurement';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { TEST_SEED } from '../../helpers/seed';

function gen(input: WaveformConfigInput) {
  return generateWaveform(parseWaveformConfig(input));
}

describe(`AWGN: measured EVM ≈ 1/√(Es/N0) (common practice; Es/N0 = post-FFT SNR per data element), seed ${TEST_SEED}`, () => {
  // 140 symbols so the averaged channel estimate adds well under 1 % to the error power.
  const relTol = 0.03;
  const cases: [string, WaveformConfigInput, number][] = [
    ['LTE UL DFT-s-OFDM QPSK, DMRS', { bandwidthMHz: 3, modulation: 'qpsk', symbols: 140, referenceSignals: { enabled: true } }, 20],
    ['LTE DL OFDM 64QAM, CRS', { bandwidthMHz: 3, link: 'downlink', modulation: '64qam', symbols: 140, referenceSignals: { enabled: true } }, 30],
    ['NR CP-OFDM 16QAM, data-only (known grid)', { standard: 'nr', bandwidthMHz: 10, subcarrierSpacingKHz: 30, waveform: 'ofdm', modulation: '16qam', symbols: 140 }, 25],
  ];
  for (const [name, input, esN0Db] of cases) {
    it(`${name} at Es/N0 = ${esN0Db} dB`, () => {
      const wave = gen(input);
      const { noiseVariance } = resolveNoiseLevel({ esN0Db }, noiseReferenceOf(wave));
      const rx = addAwgn(wave.waveformIq, noiseVariance, createRng(TEST_SEED), new Float64Array(wave.waveformIq.length));
      const rsOn = wave.plan.referenceSignals.kind !== 'none';
      const { report } = measureEvm(wave.plan, rx, rsOn ? { timing: 'known' } : { timing: 'known', channelEstimation: 'known-grid', transmittedGridIq: wave.gridIq });
      const expected = 100 / Math.sqrt(10 ** (esN0Db / 10));
      expect(Math.abs(report.evmRmsPercent / expected - 1), `EVM ${report.evmRmsPercent} % vs ${expected} %`).toBeLessThan(relTol);
    });
  }
});

describe(`AWGN BER vs theory within 0.3 dB at 1e-3 (Proakis ch. 4; REFERENCE.md §6), seed ${TEST_SEED}`, () => {
  // The receiver is given H = 1 and the true noise variance (reference signals off); the measured BER is converted back
  // to the Eb/N0 the formula needs for it, which must lie within 0.3 dB of the Eb/N0 simulated.
  const toleranceDb = 0.3;
  const cases: [string, WaveformConfigInput, (ebN0Db: number) => number][] = [
    ['BPSK, OFDM', { bandwidthMHz: 5, link: 'downlink', modulation: 'bpsk', symbols: 700 }, berBpskQpsk],
    ['QPSK, DFT-s-OFDM', { bandwidthMHz: 5, modulation: 'qpsk', symbols: 350 }, berBpskQpsk],
    ['16QAM, DFT-s-OFDM', { bandwidthMHz: 5, modulation: '16qam', symbols: 175 }, (x) => berSquareQam(16, x)],
    ['64QAM, OFDM', { bandwidthMHz: 5, link: 'downlink', modulation: '64qam', symbols: 120 }, (x) => berSquareQam(64, x)],
  ];
  for (const [name, input, theory] of cases) {
    it(name, () => {
      const wave = gen(input);
      const ebN0Db = ebN0DbForBer(theory, 1e-3);
      const [point] = runLinkSimulation(wave, { channel: 'awgn', ebN0Db: [ebN0Db], seed: TEST_SEED, repeats: 1 }).points;
      expect(point!.bitErrors, 'enough errors for a stable estimate').toBeGreaterThan(150);
      const equivalentDb = ebN0DbForBer(theory, point!.ber);
      expect(Math.abs(equivalentDb - ebN0Db), `BER ${point!.ber} at ${ebN0Db.toFixed(2)} dB ≙ ${equivalentDb.toFixed(2)} dB`).toBeLessThan(toleranceDb);
    });
  }
});
