import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { addAwgn } from '../../../src/dsp/channel/awgn';
import { applyFractionalDelay, designFractionalDelay } from '../../../src/dsp/channel/fractionalDelay';
import { resolveNoiseLevel } from '../../../src/dsp/channel/noiseLevels';
import { createRng } from '../../../src/dsp/data/rng';
import { noiseReferenceOf } from '../../../src/dsp/link/linkSimulation';
import { evmLimitFor } from '../../../src/dsp/receiver/evmLimits';
import { measureEvm } from '../../../src/dsp/receiver/evmMeasurement';
import { evmWindowFor } from '../../../src/dsp/receiver/evmWindow';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { createWaveformPlan } from '../../../src/dsp/waveform/waveformPlan';
import { TEST_SEED } from '../../helpers/seed';

function plan(input: WaveformConfigInput) {
  return createWaveformPlan(parseWaveformConfig(input));
}

describe('EVM window W and positions (TS 36.101 Annex F.5)', () => {
  it('takes W from Table F.5.3-1 for LTE normal CP [S]', () => {
    const expected: Record<number, number> = { 1.4: 5, 3: 12, 5: 32, 10: 66, 15: 102, 20: 136 };
    for (const [bw, w] of Object.entries(expected)) expect(evmWindowFor(plan({ bandwidthMHz: Number(bw) })).windowLengthSamples).toBe(w);
  });

  it('places W positions centred on the CP: 20 MHz (CP 144, W 136) starts the FFT 4 and 139 samples into the CP', () => {
    const w = evmWindowFor(plan({ bandwidthMHz: 20 }));
    expect(w.cpLengthSamples).toBe(144);
    expect(w.lowAdvanceSamples).toBe(144 - 4);
    expect(w.highAdvanceSamples).toBe(144 - 139);
    expect(w.lowAdvanceSamples - w.highAdvanceSamples).toBe(136 - 1);
  });

  it('scales with oversampling (W at the nominal FFT size × oversampling)', () => {
    expect(evmWindowFor(plan({ bandwidthMHz: 5, oversampling: 2 })).windowLengthSamples).toBe(64);
  });

  it('LTE extended CP: Table F.5.4-1 W = 28 / 58 / 124 / 250 / 504 at FFT 128…2048 [S2, public code giving CP − W]; 15 MHz 374 (from memory — verify)', () => {
    const expected: Record<number, number> = { 1.4: 28, 3: 58, 5: 124, 10: 250, 20: 504 };
    for (const [bw, w] of Object.entries(expected)) {
      const window = evmWindowFor(plan({ bandwidthMHz: Number(bw), cyclicPrefix: 'extended' }));
      expect(window.windowLengthSamples).toBe(w);
      expect(window.source).toBe('TS 36.101 Table F.5.4-1');
    }
    const w15 = evmWindowFor(plan({ bandwidthMHz: 15, cyclicPrefix: 'extended' }));
    expect(w15.windowLengthSamples).toBe(374);
    expect(w15.source).toMatch(/from memory — verify/);
  });

  it('NR normal CP: W = 50 % of the CP, TS 38.101-1 Tables F.5.3-1/-2/-3 (V17.0.0) [S2, public transcriptions]', () => {
    const nrPlan = (bw: number, scs: number, oversampling = 1) =>
      evmWindowFor(plan({ standard: 'nr', bandwidthMHz: bw, subcarrierSpacingKHz: scs, waveform: 'ofdm', oversampling }));
    // Table F.5.3-1, 15 kHz 5 MHz: FFT 512, CP 36, W 18.
    expect([nrPlan(5, 15).cpLengthSamples, nrPlan(5, 15).windowLengthSamples]).toEqual([36, 18]);
    // Table F.5.3-2, 30 kHz 5 MHz: FFT 256, CP 18, W 9; 100 MHz: FFT 4096, CP 288, W 144.
    expect([nrPlan(5, 30).cpLengthSamples, nrPlan(5, 30).windowLengthSamples]).toEqual([18, 9]);
    expect([nrPlan(100, 30).cpLengthSamples, nrPlan(100, 30).windowLengthSamples]).toEqual([288, 144]);
    // Rounded at the nominal rate, then scaled: 30 kHz 5 MHz at 2× oversampling is 2 × 9, not a fresh 50 % of 36.
    expect(nrPlan(5, 30, 2).windowLengthSamples).toBe(18);
    expect(nrPlan(100, 30).source).toBe('TS 38.101-1 Tables F.5.3-1/-2/-3, 50 % of the CP');
  });

  it('NR extended CP (60 kHz): TS 38.101-1 Table F.5.4-1 (V17.0.0) [S2, public transcriptions], not 50 % of the CP', () => {
    const ecp = (bw: number, oversampling = 1) =>
      evmWindowFor(plan({ standard: 'nr', bandwidthMHz: bw, subcarrierSpacingKHz: 60, cyclicPrefix: 'extended', waveform: 'ofdm', oversampling }));
    // At the table's FFT size the listed W comes back: 10 MHz CP 64 → 54, 20 MHz CP 128 → 106, 25 MHz CP 128 → 110, 100 MHz CP 512 → 440.
    expect([ecp(10).cpLengthSamples, ecp(10).windowLengthSamples]).toEqual([64, 54]);
    expect([ecp(20).cpLengthSamples, ecp(20).windowLengthSamples]).toEqual([128, 106]);
    expect([ecp(25).cpLengthSamples, ecp(25).windowLengthSamples]).toEqual([128, 110]);
    expect([ecp(100).cpLengthSamples, ecp(100).windowLengthSamples]).toEqual([512, 440]);
    // 40 MHz: table FFT 1024, CP 256, W 220; at 2× oversampling the record holds CP 512 and W 2 × 220.
    expect([ecp(40, 2).cpLengthSamples, ecp(40, 2).windowLengthSamples]).toEqual([512, 2 * 220]);
    expect(ecp(20).source).toBe('TS 38.101-1 Table F.5.4-1 (extended CP)');
  });
});

describe('EVM limits per modulation (REFERENCE.md §5.4)', () => {
  it('LTE UE (36.101 Table 6.5.2.1.1-1), LTE BS (36.104), NR UE (38.101-1 Table 6.4.2.1-1)', () => {
    expect(evmLimitFor('lte', 'uplink', 'qpsk').limitPercent).toBe(17.5);
    expect(evmLimitFor('lte', 'uplink', '16qam').limitPercent).toBe(12.5);
    expect(evmLimitFor('lte', 'uplink', '64qam').limitPercent).toBe(8);
    expect(evmLimitFor('lte', 'uplink', '256qam').limitPercent).toBe(3.5);
    expect(evmLimitFor('lte', 'uplink', '1024qam').limitPercent).toBeUndefined();
    expect(evmLimitFor('lte', 'downlink', '1024qam').limitPercent).toBe(2.5);
    expect(evmLimitFor('nr', 'uplink', 'pi/2-bpsk').limitPercent).toBe(30);
    expect(evmLimitFor('nr', 'uplink', '256qam').limitPercent).toBe(3.5);
    expect(evmLimitFor('custom', 'uplink', 'qpsk').limitPercent).toBeUndefined();
  });
});

describe(`EVM measurement, seed ${TEST_SEED}`, () => {
  function noisy(input: WaveformConfigInput, esN0Db: number) {
    const wave = generateWaveform(parseWaveformConfig(input));
    const { noiseVariance } = resolveNoiseLevel({ esN0Db }, noiseReferenceOf(wave));
    return { wave, rx: addAwgn(wave.waveformIq, noiseVariance, createRng(TEST_SEED), new Float64Array(wave.waveformIq.length)) };
  }

  it('passes QPSK at Es/N0 = 20 dB (EVM ≈ 10 %) and fails it at 13 dB (≈ 22 % > 17.5 %)', () => {
    const input: WaveformConfigInput = { bandwidthMHz: 1.4, symbols: 70, referenceSignals: { enabled: true } };
    const at20 = noisy(input, 20);
    const good = measureEvm(at20.wave.plan, at20.rx).report;
    expect(good.pass).toBe(true);
    expect(good.evmLimitPercent).toBe(17.5);
    const at13 = noisy(input, 13);
    const bad = measureEvm(at13.wave.plan, at13.rx).report;
    expect(bad.evmRmsPercent).toBeGreaterThan(17.5);
    expect(bad.pass).toBe(false);
  });

  it('reports the larger of the two positions: a 30-sample echo spoils the early window (CP margin 4) but not the late one', () => {
    // The late window still sees the echo as a smooth frequency ripple that the 7-pilot smoothing follows to ~1 %.
    const wave = generateWaveform(parseWaveformConfig({ bandwidthMHz: 20, symbols: 14, modulation: '64qam', referenceSignals: { enabled: true } }));
    const echo = applyFractionalDelay(designFractionalDelay(30), wave.waveformIq, new Float64Array(wave.waveformIq.length));
    const rx = new Float64Array(wave.waveformIq.length);
    for (let i = 0; i < rx.length; i++) rx[i] = wave.waveformIq[i]! + 0.3 * echo[i]!;
    const { report } = measureEvm(wave.plan, rx, { timing: 'known' });
    expect(report.evmHighPercent).toBeLessThan(1);
    expect(report.evmLowPercent).toBeGreaterThan(2 * report.evmHighPercent);
    expect(report.reportedPosition).toBe('low');
    expect(report.evmRmsPercent).toBe(report.evmLowPercent);
  });

  it('gives per-symbol EVM (NaN on reference symbols), per-subcarrier EVM and the constellation', () => {
    const { wave, rx } = noisy({ bandwidthMHz: 1.4, symbols: 14, modulation: '16qam', referenceSignals: { enabled: true } }, 25);
    const { report } = measureEvm(wave.plan, rx);
    expect(report.perSymbolPercent).toHaveLength(14);
    expect(Number.isNaN(report.perSymbolPercent[3]!)).toBe(true);
    expect(report.perSymbolPercent.filter((p) => Number.isFinite(p))).toHaveLength(12);
    expect(report.perSubcarrierPercent).toHaveLength(72);
    for (const p of report.perSubcarrierPercent) expect(p).toBeGreaterThan(0);
    expect(report.constellationIq.length).toBe(wave.dataSymbolsIq.length);
    expect(report.evmPeakPercent).toBeGreaterThan(report.evmRmsPercent);
  });
});
