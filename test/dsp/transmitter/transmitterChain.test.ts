import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { applyTransmitterChain } from '../../../src/dsp/transmitter/transmitterChain';
import { measureGridEvm } from '../../../src/dsp/txcheck/gridEvm';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { DspError } from '../../../src/dsp/errors';
import { TEST_SEED } from '../../helpers/seed';

const base = { bandwidthMHz: 5, modulation: '16qam', oversampling: 2, symbols: 14, data: { source: 'random', seed: TEST_SEED } } as const;

describe('transmitter chain driven by the configuration', () => {
  it('changes nothing when no transmitter sub-object is given', () => {
    const config = parseWaveformConfig(base);
    const wave = generateWaveform(config);
    const { outputIq, report } = applyTransmitterChain(wave, config);
    expect(report.steps).toEqual([]);
    expect(outputIq).not.toBe(wave.waveformIq);
    expect(Array.from(outputIq)).toEqual(Array.from(wave.waveformIq));
  });

  it('applies clip-filter, windowing, impairments and the PA in order, and reports each', () => {
    const config = parseWaveformConfig({
      ...base,
      paprReduction: { clippingRatioDb: 6, iterations: 2 },
      windowing: { rampLengthSamples: 8 },
      impairments: { iqImbalance: { gainDb: 0.2, phaseDeg: 1 }, dcOffset: { levelDbc: -35 }, phaseNoise: { linewidthHz: 10 }, dac: { bits: 12 }, sampleClockPpm: 2 },
      amplifier: { model: 'rapp', smoothness: 3, backoffDb: 8 },
    });
    const wave = generateWaveform(config);
    const { outputIq, report } = applyTransmitterChain(wave, config);
    expect(report.steps.length).toBe(8);
    expect(report.steps[0]).toMatch(/clip and filter/);
    expect(report.steps[7]).toMatch(/amplifier Rapp/);
    expect(report.amplifier!.drive.oboDb).toBeCloseTo(8, 3);
    expect(report.impairments!.imageRejectionRatioDb).toBeGreaterThan(30);
    const evm = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, outputIq, { timingOffsetSamples: -8 });
    expect(evm.evmRmsPercent).toBeGreaterThan(0.5);
    expect(evm.evmRmsPercent).toBeLessThan(10);
  });

  it('validates the new sub-objects with field names', () => {
    const issues = (input: object): string => {
      try {
        parseWaveformConfig({ ...base, ...input });
      } catch (err) {
        return (err as DspError).message;
      }
      return '';
    };
    expect(issues({ amplifier: { model: 'tube' } })).toMatch(/amplifier.*model must be one of rapp, saleh, limiter, polynomial, table/);
    expect(issues({ amplifier: { model: 'rapp', smoothnes: 2 } })).toMatch(/unknown field "smoothnes"/);
    expect(issues({ impairments: { phaseNoise: {} } })).toMatch(/give linewidthHz, mask, or both/);
    expect(issues({ impairments: { dac: { bits: 1 } } })).toMatch(/impairments\.dac\.bits/);
    expect(issues({ paprReduction: { iterations: 0 } })).toMatch(/paprReduction\.iterations/);
    expect(issues({ amplifier: { model: 'table', inputUnit: 'dBm', rows: [{ inputDb: 0, gainDb: 10, phaseDeg: 0 }] } })).toMatch(/at least 2 rows/);
  });
});
