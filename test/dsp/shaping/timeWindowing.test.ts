import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { outOfBandPowerRatioDb } from '../../../src/dsp/paprReduction/outOfBandPower';
import { transmissionEdgesHz } from '../../../src/dsp/paprReduction/clipAndFilter';
import { applyTimeWindowing } from '../../../src/dsp/shaping/timeWindowing';
import { measureGridEvm } from '../../../src/dsp/txcheck/gridEvm';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { TEST_SEED } from '../../helpers/seed';

describe('raised-cosine transmit windowing (WOLA at the transmitter)', () => {
  for (const link of ['downlink', 'uplink'] as const) {
    it(`leaves the useful part untouched, lowers out-of-band power, and costs EVM only when the FFT starts in the ramp (LTE ${link})`, () => {
      const wave = generateWaveform(
        parseWaveformConfig({ link, bandwidthMHz: 5, modulation: '16qam', oversampling: 4, symbols: 14, data: { source: 'random', seed: TEST_SEED } }),
      );
      const ramp = 64; // 16 samples at the base rate, CP is 36·4 = 144 / 160·… at this rate
      const windowed = applyTimeWindowing(wave.waveformIq, wave.symbolLayout, ramp, link === 'uplink' ? -1 : 1, new Float64Array(wave.waveformIq.length));
      for (const l of wave.symbolLayout) {
        for (let i = 2 * (l.startSample + ramp); i < 2 * (l.startSample + l.cpLengthSamples + l.fftSize); i++) {
          expect(windowed[i]).toBe(wave.waveformIq[i]);
        }
      }
      const { lowHz, highHz } = transmissionEdgesHz(wave.plan);
      // Windowing acts on the far skirts; near the band edge the spectrum is set by the subcarriers themselves.
      // Compare the power beyond a 300 kHz guard (20 subcarriers) outside the transmission bandwidth.
      const guardHz = 300e3;
      const oobBefore = outOfBandPowerRatioDb(wave.waveformIq, wave.sampleRateHz, lowHz - guardHz, highHz + guardHz);
      const oobAfter = outOfBandPowerRatioDb(windowed, wave.sampleRateHz, lowHz - guardHz, highHz + guardHz);
      expect(oobAfter, `${oobBefore.toFixed(1)} → ${oobAfter.toFixed(1)} dB`).toBeLessThan(oobBefore - 6);
      // FFT window after the ramp: no error (the suffix and ramp sum to the continuation, common practice).
      expect(measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, windowed, { timingOffsetSamples: -(144 - ramp) }).evmRmsPercent).toBeLessThan(1e-9);
      // FFT window starting at the first CP sample: the ramp region is inside it, EVM rises.
      expect(measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, windowed, { timingOffsetSamples: -144 }).evmRmsPercent).toBeGreaterThan(1);
      expect(measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, wave.waveformIq, { timingOffsetSamples: -144 }).evmRmsPercent).toBeLessThan(1e-9);
    });
  }

  it('rejects a ramp longer than the CP', () => {
    const wave = generateWaveform(parseWaveformConfig({ bandwidthMHz: 1.4, symbols: 2 }));
    expect(() => applyTimeWindowing(wave.waveformIq, wave.symbolLayout, 10, 1, new Float64Array(wave.waveformIq.length))).toThrow(/shortest cyclic prefix \(9/);
  });
});

describe('windowing against the standard EVM window (TS 36.101 Annex F, reference receiver)', () => {
  it('costs EVM only once the ramp reaches the early FFT position of the EVM window W (LTE 1.4 MHz: W = 5 of CP 9)', async () => {
    const { measureEvm } = await import('../../../src/dsp/receiver/evmMeasurement');
    const { applyTransmitterChain } = await import('../../../src/dsp/transmitter/transmitterChain');
    const evmFor = (ramp: number): number => {
      const cfg = parseWaveformConfig({ bandwidthMHz: 1.4, modulation: 'qpsk', symbols: 14, oversampling: 2, data: { source: 'random', seed: TEST_SEED }, windowing: { rampLengthSamples: ramp } });
      const wave = generateWaveform(cfg);
      const tx = applyTransmitterChain(wave, cfg).outputIq;
      return measureEvm(wave.plan, tx, { timing: 'known', channelEstimation: 'known-grid', transmittedGridIq: wave.gridIq }).report.evmRmsPercent;
    };
    // The early position starts ⌊(CP − W)/2⌋ = 2 samples into the CP (Annex F, REFERENCE.md §5.4): ramps of 1–2 samples stay
    // before it, longer ones overlap it.
    expect(evmFor(1)).toBeLessThan(1e-6);
    expect(evmFor(2)).toBeLessThan(1e-6);
    expect(evmFor(4)).toBeGreaterThan(1);
    expect(evmFor(6)).toBeGreaterThan(evmFor(4));
  });
});
