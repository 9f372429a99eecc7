import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { clipAndFilter } from '../../../src/dsp/paprReduction/clipAndFilter';
import { recordPaprDb } from '../../../src/dsp/paprReduction/outOfBandPower';
import { measureGridEvm } from '../../../src/dsp/txcheck/gridEvm';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { DspError } from '../../../src/dsp/errors';
import { powerPercentileDb } from '../../helpers/powerPercentile';
import { TEST_SEED } from '../../helpers/seed';

describe('iterative clipping and filtering (Armstrong 2002)', () => {
  const wave = generateWaveform(
    parseWaveformConfig({ link: 'downlink', bandwidthMHz: 5, modulation: '64qam', oversampling: 4, symbols: 28, data: { source: 'random', seed: TEST_SEED } }),
  );

  it('lowers the PAPR more with more iterations, keeps the spectrum in band, and costs the EVM it reports', () => {
    const once = clipAndFilter(wave.plan, wave.symbolLayout, wave.waveformIq, { clippingRatioDb: 4, iterations: 1, filter: 'allocated' });
    const four = clipAndFilter(wave.plan, wave.symbolLayout, wave.waveformIq, { clippingRatioDb: 4, iterations: 4, filter: 'allocated' });
    const r1 = once.report;
    const r4 = four.report;
    // Armstrong 2002: filtering regrows peaks; repeating clip+filter brings the PAPR down towards the clipping level.
    expect(r1.paprGainDb).toBeGreaterThan(1);
    expect(r4.paprAfterDb).toBeLessThan(r1.paprAfterDb);
    expect(powerPercentileDb(four.outputIq, 0.999)).toBeLessThan(powerPercentileDb(wave.waveformIq, 0.999) - 1.5);
    expect(r4.paprBeforeDb).toBeCloseTo(recordPaprDb(wave.waveformIq), 12);
    // Clipping alone spreads power out of band; the filter takes it back to the unclipped level (what remains is the
    // rectangular symbol edges' own skirt, ≈ −26 dB here).
    expect(r4.outOfBandClipOnlyDb).toBeGreaterThan(r4.outOfBandBeforeDb + 2);
    expect(Math.abs(r4.outOfBandAfterDb - r4.outOfBandBeforeDb)).toBeLessThan(0.5);
    // The in-band error it reports is the error a known-timing receiver measures.
    const evm = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, four.outputIq);
    expect(Math.abs(evm.evmRmsPercent - r4.evmCostPercent)).toBeLessThan(0.01 * r4.evmCostPercent);
    expect(r4.evmCostPercent).toBeGreaterThan(r1.evmCostPercent);
  });

  it('costs more EVM and gains more PAPR at a lower clipping ratio', () => {
    const reports = [7, 5, 3].map((cr) => clipAndFilter(wave.plan, wave.symbolLayout, wave.waveformIq, { clippingRatioDb: cr, iterations: 2, filter: 'grid' }).report);
    for (let i = 1; i < reports.length; i++) {
      expect(reports[i]!.evmCostPercent).toBeGreaterThan(reports[i - 1]!.evmCostPercent);
      expect(reports[i]!.paprAfterDb).toBeLessThan(reports[i - 1]!.paprAfterDb);
    }
  });

  it('rejects bad options', () => {
    expect(() => clipAndFilter(wave.plan, wave.symbolLayout, wave.waveformIq, { clippingRatioDb: 4, iterations: 0, filter: 'grid' })).toThrow(DspError);
    expect(() => clipAndFilter(wave.plan, wave.symbolLayout, wave.waveformIq, { clippingRatioDb: -1, iterations: 1, filter: 'grid' })).toThrow(/clippingRatioDb/);
  });
});
