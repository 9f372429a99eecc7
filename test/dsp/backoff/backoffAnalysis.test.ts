import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { createRappModel } from '../../../src/dsp/amplifier/rapp';
import { createSalehModel } from '../../../src/dsp/amplifier/saleh';
import { amplifyAtDrive } from '../../../src/dsp/amplifier/drive';
import { analyzeBackoff, type BackoffAnalysis } from '../../../src/dsp/backoff/backoffAnalysis';
import { createWaveformMetrics } from '../../../src/dsp/backoff/backoffMetrics';
import { measureEvm } from '../../../src/dsp/receiver/evmMeasurement';
import { measureGridEvm } from '../../../src/dsp/txcheck/gridEvm';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { TEST_SEED } from '../../helpers/seed';

const toleranceDb = 0.05;

// LTE 1.4 MHz uplink, QPSK, 28 symbols, with a 2-sample raised-cosine ramp (longer ramps reach into the Annex F EVM window, see timeWindowing.test.ts) (the unwindowed waveform's own ACLR floor
// sits below the 33 dB UTRA limit at this bandwidth, see the last test).
function config(waveform: 'ofdm' | 'dft-s-ofdm', windowed = true) {
  return parseWaveformConfig({
    bandwidthMHz: 1.4,
    waveform,
    modulation: 'qpsk',
    symbols: 28,
    data: { source: 'random', seed: TEST_SEED },
    ...(windowed ? { windowing: { rampLengthSamples: 2 } } : {}),
  });
}

function expectOnCurve(a: BackoffAnalysis): void {
  const s = a.solution;
  expect(s.status, s.message).toBe('solved');
  const [lo, hi] = s.bracketDb!;
  expect(hi - lo).toBeLessThanOrEqual(toleranceDb);
  expect(s.requiredBackoffDb).toBe(hi);
  const at = (b: number) => a.curve.find((p) => p.backoffDb === b)!;
  // The passing end meets every limit; the failing end misses at least one.
  const ok = (b: number) =>
    at(b).evmRmsPercent <= a.limits.evm!.value && Object.entries(a.limits.aclr).every(([k, l]) => at(b).aclrDb[k]! >= l.value);
  expect(ok(hi)).toBe(true);
  expect(ok(lo)).toBe(false);
  expect(a.requiredOboDb).toBeCloseTo(hi, 3); // the OBO axis: the measured OBO equals the asked one
}

describe('back-off analysis on measured EVM and ACLR', () => {
  const rapp2 = createRappModel({ smoothness: 2 });
  const dfts = analyzeBackoff(config('dft-s-ofdm'), { model: rapp2, fromDb: 1, toDb: 9, toleranceDb, psatDbm: 26 });
  const ofdm = analyzeBackoff(config('ofdm'), { model: rapp2, fromDb: 1, toDb: 9, toleranceDb, psatDbm: 26 });

  it(`answers on the measured curve within tolerance, with usable power P_sat − OBO (seed ${TEST_SEED})`, () => {
    expectOnCurve(dfts);
    expectOnCurve(ofdm);
    expect(dfts.usableOutputDbm).toBeCloseTo(26 - dfts.requiredOboDb!, 9);
    expect(dfts.limits.evm!.value).toBe(17.5);
    expect(Object.keys(dfts.limits.aclr).sort()).toEqual(['eutraLower', 'eutraUpper', 'utra1Lower', 'utra1Upper']);
    expect(dfts.mpr!.maxMprDb).toBe(1); // 6 RB > 5 RB at 1.4 MHz, QPSK (TS 36.101 Table 6.2.3-1, from memory)
  });

  it('DFT-s-OFDM QPSK needs less back-off than OFDM QPSK for the same limits (common practice: lower PAPR and CM)', () => {
    expect(dfts.requiredOboDb!, `${dfts.requiredOboDb} vs ${ofdm.requiredOboDb} dB`).toBeLessThan(ofdm.requiredOboDb! - 1);
  });

  it('needs less back-off with a more linear PA, more with a TWT or a tighter EVM budget', { timeout: 60000 }, () => {
    const rapp3 = analyzeBackoff(config('dft-s-ofdm'), { model: createRappModel({ smoothness: 3 }), fromDb: 1, toDb: 7, toleranceDb: 0.1 });
    expect(rapp3.requiredOboDb!).toBeLessThan(dfts.requiredOboDb!);
    const saleh = analyzeBackoff(config('dft-s-ofdm'), { model: createSalehModel(), fromDb: 2, toDb: 12, stepDb: 2, toleranceDb: 0.1 });
    expect(saleh.requiredOboDb!).toBeGreaterThan(dfts.requiredOboDb!);
    const tight = analyzeBackoff(config('dft-s-ofdm'), { model: rapp2, fromDb: 2, toDb: 12, stepDb: 2, toleranceDb: 0.1, evmLimitPercent: 1.5 });
    expect(tight.solution.limitingMetric).toBe('evm');
    expect(tight.requiredOboDb!).toBeGreaterThan(dfts.requiredOboDb!);
  });

  it('reports that an unwindowed 1.4 MHz waveform cannot meet UTRA ACLR1 at any back-off (its own spectral floor)', () => {
    const a = analyzeBackoff(config('dft-s-ofdm', false), { model: rapp2, fromDb: 6, toDb: 12, stepDb: 3 });
    expect(a.solution.status).toBe('not-reached');
    expect(a.solution.limitingChannel).toMatch(/^utra1/);
    expect(a.usableOutputDbm).toBeNull();
  });

  it('takes EVM from the reference receiver (Annex F positions), which agrees with the known-timing grid EVM without references', () => {
    const cfg = { ...config('ofdm', false), oversampling: 6 };
    const wave = generateWaveform(cfg);
    const metrics = createWaveformMetrics(wave);
    expect(metrics.methods.evm).toMatch(/reference receiver/);
    const { outputIq } = amplifyAtDrive(rapp2, wave.waveformIq, { reference: 'obo', backoffDb: 5 });
    const evm = metrics.evm(outputIq);
    const rx = measureEvm(wave.plan, outputIq, { timing: 'known', channelEstimation: 'known-grid', transmittedGridIq: wave.gridIq }).report;
    expect(evm.evmRmsPercent).toBe(rx.evmRmsPercent);
    const grid = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, outputIq).evmRmsPercent;
    expect(Math.abs(evm.evmRmsPercent / grid - 1)).toBeLessThan(0.05);
    expect(evm.evmStandardErrorPercent).toBeGreaterThan(0);
    expect(evm.evmStandardErrorPercent).toBeLessThan(0.1 * evm.evmRmsPercent);
  });
});
