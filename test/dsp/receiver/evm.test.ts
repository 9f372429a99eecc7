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

  it('scales with oversampling and covers extended CP (Table F.5.4-1, from memory) and NR (50 % of the CP, from memory)', () => {
    expect(evmWindowFor(plan({ bandwidthMHz: 5, oversampling: 2 })).windowLengthSamples).toBe(64);
    expect(evmWindowFor(plan({ bandwidthMHz: 5, cyclicPrefix: 'extended' })).windowLengthSamples).toBe(124);
    const nr = evmWindowFor(plan({ standard: 'nr', bandwidthMHz: 100, subcarrierSpacingKHz: 30, waveform: 'ofdm' }));
    expect(nr.cpLengthSamples).toBe(288);
    expect(nr.windowLengthSamples).toBe(144);
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
