import { describe, expect, it } from 'vitest';
import type { LevelKey } from '../../../src/dsp/metrics/ccdfLevels';
import { gaussianPowerAtProbabilityDb, ofdmPaprAtProbabilityDb, VAN_NEE_ALPHA_OVERSAMPLED } from '../../../src/dsp/metrics/paprTheory';
import { TEST_SEED } from '../../helpers/seed';
import { runStatistics } from './runStatistics';

/** Half-width of a reported 95 % interval, plus one 0.01 dB bin for the grid rounding. */
function allowance(ci: readonly [number | null, number | null] | null, level: number): number {
  const [lo, hi] = ci!;
  return Math.max(level - lo!, hi! - level) + 0.01;
}

describe('OFDM, full LTE 20 MHz downlink grid (1200 subcarriers, QPSK): per-symbol PAPR CCDF against theory', () => {
  // 4000 symbols resolve 1e-1 and 1e-2 (≥ 10 exceedances each); seeded through the run seed.
  const symbols = 4000;
  const config = { standard: 'lte', link: 'downlink', bandwidthMHz: 20 } as const;

  it('oversampling 4: the van Nee & Prasad continuous-time curve 1 − (1 − e^−γ)^(2.8·N), N = 1200, within the Monte-Carlo interval plus 0.1 dB for the α ≈ 2.8 fit', async () => {
    const { report } = await runStatistics(config, { symbols, oversampling: 4, seed: TEST_SEED });
    for (const key of ['1e-1', '1e-2'] as LevelKey[]) {
      const level = report.paprDb[key]!;
      const theory = ofdmPaprAtProbabilityDb(Number(key), 1200, VAN_NEE_ALPHA_OVERSAMPLED);
      // α ≈ 2.8 is an empirical fit (van Nee & Prasad 2000, from memory — verify): 0.1 dB allowed for it.
      const modelToleranceDb = 0.1;
      expect(Math.abs(level - theory), `${key}: measured ${level}, theory ${theory}, seed ${TEST_SEED}`).toBeLessThanOrEqual(
        allowance(report.paprCi95Db[key]!, level) + modelToleranceDb,
      );
    }
    // QPSK has |a_k| = 1, so each symbol's mean is exactly the expected mean: both definitions agree.
    expect(report.paprSymbolMeanDb).toEqual(report.paprRunMeanDb);
    // The instantaneous power of large-N OFDM is close to complex Gaussian: P(|x|²/σ² > γ) = e^−γ (common practice).
    for (const key of ['1e-1', '1e-2', '1e-3'] as LevelKey[]) {
      const level = report.ccdfDb[key]!;
      expect(Math.abs(level - gaussianPowerAtProbabilityDb(Number(key)))).toBeLessThanOrEqual(allowance(report.ccdfCi95Db[key]!, level) + 0.02);
    }
    // Cubic metric of near-Gaussian OFDM: raw 10·log10 6 = 7.78 dB, CM (7.78 − 1.52)/1.56 = 4.01 dB (REFERENCE.md §5.3, derived).
    expect(Math.abs(report.cubicMetricRawDb - 7.78)).toBeLessThan(0.1);
  });

  it('oversampling 1: the independent-sample formula 1 − (1 − e^−γ)^M over the M = 2048 samples of a symbol, within the Monte-Carlo interval; and lower than at 4× (peaks missed)', async () => {
    const at1 = await runStatistics(config, { symbols, oversampling: 1, seed: TEST_SEED });
    const at4 = await runStatistics(config, { symbols, oversampling: 4, seed: TEST_SEED });
    for (const key of ['1e-1', '1e-2'] as LevelKey[]) {
      const level = at1.report.paprDb[key]!;
      // van Nee & Prasad's Nyquist-rate model: one independent Gaussian sample per sample of the symbol (from memory — verify).
      const theory = ofdmPaprAtProbabilityDb(Number(key), 2048, 1);
      expect(Math.abs(level - theory), `${key}: measured ${level}, theory ${theory}, seed ${TEST_SEED}`).toBeLessThanOrEqual(allowance(at1.report.paprCi95Db[key]!, level));
      // At 1× the peaks between samples are missed (Tellambura 2001; common practice: a few tenths of a dB).
      expect(at4.report.paprDb[key]! - level).toBeGreaterThan(0.1);
    }
    expect(at1.report.warnings.join(' ')).toMatch(/Oversampling 1: peaks between samples are missed/);
  });
});

describe('DFT-s-OFDM against OFDM (LTE 5 MHz uplink, 25 RB, oversampling 4)', () => {
  // 10000 symbols: 1e-3 expects 10 exceedances. LTE 5 MHz keeps the transforms at 2048 points.
  const symbols = 10000;
  it('localized QPSK sits several dB below OFDM at 1e-3; 16QAM about 1 dB above QPSK', async () => {
    const qpsk = await runStatistics({ standard: 'lte', link: 'uplink', bandwidthMHz: 5, modulation: 'qpsk' }, { symbols, seed: TEST_SEED });
    const qam16 = await runStatistics({ standard: 'lte', link: 'uplink', bandwidthMHz: 5, modulation: '16qam' }, { symbols, seed: TEST_SEED });
    const ofdm = await runStatistics({ standard: 'lte', link: 'uplink', bandwidthMHz: 5, waveform: 'ofdm' }, { symbols, seed: TEST_SEED });
    const lfdma = qpsk.report.paprDb['1e-3']!;
    const ofdma = ofdm.report.paprDb['1e-3']!;
    // Myung, Lim, Goodman 2006 (from memory — verify): LFDMA QPSK ≈ 8 dB, OFDMA ≈ 11 dB at 1e-4; our figures here
    // (REFERENCE.md §5.2 cross-check style): about 7.8 and 11.4 dB at 1e-3.
    expect(ofdma - lfdma, `seed ${TEST_SEED}`).toBeGreaterThan(3);
    expect(lfdma).toBeGreaterThan(6.5);
    expect(lfdma).toBeLessThan(9);
    // LFDMA(16QAM) − LFDMA(QPSK) ≈ 1 dB (REFERENCE.md §5.2).
    const step = qam16.report.paprDb['1e-3']! - lfdma;
    expect(step).toBeGreaterThan(0.5);
    expect(step).toBeLessThan(1.5);
    // Cubic metric of LTE uplink SC-FDMA, k = 1.56 unrounded: QPSK ≈ 1.2 dB, 16QAM ≈ 2.1 dB (RAN4/TR 25.814-era studies,
    // from memory — verify); OFDM near the Gaussian 4.01 dB (derived).
    expect(Math.abs(qpsk.report.cubicMetricDb - 1.2)).toBeLessThan(0.3);
    expect(Math.abs(qam16.report.cubicMetricDb - 2.1)).toBeLessThan(0.3);
    expect(Math.abs(ofdm.report.cubicMetricDb - 4.01)).toBeLessThan(0.1);
  });

  it('interleaved QPSK at oversampling 1 has PAPR exactly 0 dB: each sample is a phase-rotated copy of a QPSK symbol', async () => {
    // Custom grid with interleaveFactor·M = fftSize (4·192 = 768): the IFFT of a comb of period 4 repeats the
    // 192-point IDFT of the DFT-spread block, i.e. the QPSK symbols times a unit phase ramp (derivable).
    const { report } = await runStatistics(
      {
        standard: 'custom',
        custom: { fftSize: 768, numRb: 64, cpLengthSamples: 54 },
        waveform: 'dft-s-ofdm',
        mapping: 'interleaved',
        interleaveFactor: 4,
      },
      { symbols: 1000, oversampling: 1, seed: TEST_SEED },
    );
    const absTolDb = 1e-9;
    expect(Math.abs(report.maxPaprDb.runMean)).toBeLessThan(absTolDb);
    expect(Math.abs(report.maxPaprDb.symbolMean)).toBeLessThan(absTolDb);
    expect(report.paprDb['1e-1']).toBe(0);
    expect(report.ccdfDb['1e-3']).toBe(0);
    expect(Math.abs(report.cubicMetricRawDb)).toBeLessThan(1e-9);
    expect(Math.abs(report.crestFactorDb)).toBeLessThan(absTolDb);
  });
});
