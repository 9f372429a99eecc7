import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { deriveBlockSeed } from '../../../src/dsp/data/rng';
import { binCentreDb } from '../../../src/dsp/metrics/dbHistogram';
import { createSetupMeasurer, resolveMeasurementSetup } from '../../../src/dsp/montecarlo/measurementSetup';
import { TEST_SEED } from '../../helpers/seed';

describe('block measurer', () => {
  it('equals a direct computation from the power source: sums, peak, and each symbol PAPR rounded to 0.01 dB', () => {
    const setup = resolveMeasurementSetup(parseWaveformConfig({ standard: 'lte', bandwidthMHz: 1.4, link: 'downlink', modulation: '16qam' }), {
      symbols: 100,
      blockSymbols: 100,
      seed: TEST_SEED,
    });
    const { measurer, source } = createSetupMeasurer(setup);
    const record = measurer.measureBlock(0);
    const n = source.samplesPerSymbol;
    const powers = new Float64Array(100 * n);
    source.fillSymbolPowers(deriveBlockSeed(TEST_SEED, 0), 0, 100, powers);
    let sumPower = 0;
    let peakPower = 0;
    const runCentres = new Map<number, number>();
    const symbolCentres = new Map<number, number>();
    for (let s = 0; s < 100; s++) {
      let sum = 0;
      let peak = 0;
      for (let i = s * n; i < (s + 1) * n; i++) {
        sum += powers[i]!;
        peak = Math.max(peak, powers[i]!);
      }
      sumPower += sum;
      peakPower = Math.max(peakPower, peak);
      const run = Math.round(100 * 10 * Math.log10(peak / source.expectedMeanPower)) / 100;
      const own = Math.round(100 * 10 * Math.log10((peak * n) / sum)) / 100;
      runCentres.set(run, (runCentres.get(run) ?? 0) + 1);
      symbolCentres.set(own, (symbolCentres.get(own) ?? 0) + 1);
    }
    expect(record.numSymbols).toBe(100);
    // The kernel adds samples in pairs: the same sum to rounding (relTol 1e-12), and the same in every lane.
    expect(Math.abs(record.sumPower - sumPower)).toBeLessThanOrEqual(1e-12 * sumPower);
    expect(record.peakPower).toBe(peakPower);
    const read = (h: typeof measurer.histograms.paprRunMean) => {
      const m = new Map<number, number>();
      h.counts.forEach((c, j) => {
        if (c > 0) m.set(binCentreDb(h, j), c);
      });
      return m;
    };
    expect(read(measurer.histograms.paprRunMean)).toEqual(runCentres);
    expect(read(measurer.histograms.paprSymbolMean)).toEqual(symbolCentres);
    let total = 0;
    measurer.histograms.power.counts.forEach((c) => (total += c));
    expect(total).toBe(100 * n);
  });
});
