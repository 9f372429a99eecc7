import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { countErrors } from '../../../src/dsp/receiver/errorCounting';
import { measureEvm } from '../../../src/dsp/receiver/evmMeasurement';
import { receiveWaveform } from '../../../src/dsp/receiver/referenceReceiver';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { expectCloseArray } from '../../helpers/expectClose';

// Issue 5 acceptance: clean generated waveforms of every modulation and both waveforms demodulate with EVM below
// 0.01 % and no bit errors (the receiver inverts the generator; any sign, phase or index slip shows up here).
const evmLimitPercent = 0.01;

function gen(input: WaveformConfigInput) {
  return generateWaveform(parseWaveformConfig(input));
}

const waveforms: { name: string; base: WaveformConfigInput; modulations: string[] }[] = [
  {
    name: 'LTE uplink DFT-s-OFDM, PUSCH DMRS',
    base: { standard: 'lte', bandwidthMHz: 1.4, link: 'uplink', referenceSignals: { enabled: true, groupNumber: 17, cyclicShift: 3 } },
    modulations: ['bpsk', 'qpsk', '16qam', '64qam', '256qam', '1024qam'],
  },
  {
    name: 'LTE downlink OFDM, CRS port 0',
    base: { standard: 'lte', bandwidthMHz: 1.4, link: 'downlink', referenceSignals: { enabled: true, cellId: 301 } },
    modulations: ['bpsk', 'qpsk', '16qam', '64qam', '256qam', '1024qam'],
  },
  {
    name: 'NR uplink DFT-s-OFDM, low-PAPR DMRS',
    base: { standard: 'nr', bandwidthMHz: 5, subcarrierSpacingKHz: 15, link: 'uplink', referenceSignals: { enabled: true, groupNumber: 4 } },
    modulations: ['pi/2-bpsk', 'bpsk', 'qpsk', '16qam', '64qam', '256qam', '1024qam'],
  },
  {
    name: 'NR uplink CP-OFDM, Gold DMRS, carrier phase term (§5.4)',
    base: { standard: 'nr', bandwidthMHz: 10, subcarrierSpacingKHz: 30, waveform: 'ofdm', carrierFrequencyHz: 3.5e9, referenceSignals: { enabled: true, scramblingId: 77 } },
    modulations: ['bpsk', 'qpsk', '16qam', '64qam', '256qam', '1024qam'],
  },
];

describe('clean waveforms: EVM as measured (both Annex F window positions, CP timing) and BER', () => {
  for (const w of waveforms) {
    for (const modulation of w.modulations) {
      it(`${w.name}, ${modulation}`, () => {
        const wave = gen({ ...w.base, modulation } as WaveformConfigInput);
        const { report, nominal } = measureEvm(wave.plan, wave.waveformIq, { timing: 'cp' });
        expect(report.evmRmsPercent).toBeLessThan(evmLimitPercent);
        expect(report.evmLowPercent).toBeLessThan(evmLimitPercent);
        expect(report.evmHighPercent).toBeLessThan(evmLimitPercent);
        expect(report.timingOffsetSamples).toBe(0);
        expect(countErrors(wave.plan, wave.bits, nominal.bits).bitErrors).toBe(0);
        expectCloseArray(nominal.dataSymbolsIq, wave.dataSymbolsIq, 1e-9, 'equalised symbols vs transmitted');
      });
    }
  }
});

describe('data-only waveforms (reference signals off)', () => {
  for (const input of [
    { standard: 'lte', bandwidthMHz: 3, modulation: '64qam', oversampling: 2 },
    { standard: 'lte', bandwidthMHz: 3, link: 'downlink', cyclicPrefix: 'extended', modulation: '256qam' },
    { standard: 'nr', bandwidthMHz: 10, subcarrierSpacingKHz: 30, modulation: 'pi/2-bpsk' },
    { standard: 'custom', custom: { fftSize: 256, numRb: 10, cpLengthSamples: 18 }, waveform: 'ofdm', modulation: '16qam' },
  ] as WaveformConfigInput[]) {
    it(`demodulate from the known transmitted grid (data-aided) and say so: ${JSON.stringify(input)}`, () => {
      const wave = gen(input);
      const { report, nominal } = measureEvm(wave.plan, wave.waveformIq, { channelEstimation: 'known-grid', transmittedGridIq: wave.gridIq });
      expect(report.evmRmsPercent).toBeLessThan(evmLimitPercent);
      expect(report.channelEstimationNote).toMatch(/known transmitted grid.*reference signals off/);
      expect(countErrors(wave.plan, wave.bits, nominal.bits).bitErrors).toBe(0);
    });
  }

  it('or with an ideal channel (H = 1) and say so', () => {
    const wave = gen({ standard: 'lte', bandwidthMHz: 1.4, modulation: '16qam' });
    const rx = receiveWaveform(wave.plan, wave.waveformIq, { channelEstimation: 'ideal' });
    expect(rx.channelEstimationNote).toMatch(/ideal channel/);
    expect(countErrors(wave.plan, wave.bits, rx.bits).bitErrors).toBe(0);
  });

  it('refuses reference-signal estimation when there are none', () => {
    const wave = gen({ standard: 'lte', bandwidthMHz: 1.4 });
    expect(() => receiveWaveform(wave.plan, wave.waveformIq, { channelEstimation: 'reference' })).toThrowError(/needs reference signals/);
  });
});

describe('receiver options', () => {
  const wave = gen({ standard: 'lte', bandwidthMHz: 1.4, modulation: '64qam', referenceSignals: { enabled: true }, symbols: 28 });

  it('gives the same symbols at every FFT window position inside the CP (the window ramp is undone exactly)', () => {
    for (const advance of [0, 1, 5, 9]) {
      const rx = receiveWaveform(wave.plan, wave.waveformIq, { windowAdvanceSamples: advance });
      expectCloseArray(rx.dataSymbolsIq, wave.dataSymbolsIq, 1e-9, `advance ${advance}`);
    }
    expect(() => receiveWaveform(wave.plan, wave.waveformIq, { windowAdvanceSamples: 10 })).toThrowError(/0 to 9/);
  });

  it('MMSE and LLRs: clean LLR signs equal the transmitted bits (positive favours 0)', () => {
    const rx = receiveWaveform(wave.plan, wave.waveformIq, { equalizer: 'mmse', noiseVariance: 1e-6, computeLlr: true });
    expect(rx.equalizer).toBe('mmse');
    let wrong = 0;
    for (let i = 0; i < wave.bits.length; i++) if ((rx.llr![i]! < 0 ? 1 : 0) !== wave.bits[i]) wrong++;
    expect(wrong).toBe(0);
  });

  it('finds a waveform that starts later in the record (timing) with CP correlation', () => {
    const delay = 37;
    const padded = new Float64Array(wave.waveformIq.length + 2 * 100);
    padded.set(wave.waveformIq, 2 * delay);
    const rx = receiveWaveform(wave.plan, padded, { timing: 'cp' });
    expect(rx.timingOffsetSamples).toBe(delay);
    expect(countErrors(wave.plan, wave.bits, rx.bits).bitErrors).toBe(0);
  });
});
