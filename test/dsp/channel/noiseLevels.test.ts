import { describe, expect, it } from 'vitest';
import { addAwgn, meanPowerOf } from '../../../src/dsp/channel/awgn';
import { esN0DbFromEbN0Db, resolveNoiseLevel, snrDbFromEsN0Db } from '../../../src/dsp/channel/noiseLevels';
import { createRng } from '../../../src/dsp/data/rng';
import { TEST_SEED } from '../../helpers/seed';

const ref = { signalPowerLinear: 300, dataReEnergyLinear: 1, ifftSize: 512, bitsPerDataSymbol: 4 };

describe('SNR, Es/N0 and Eb/N0 (noiseLevels.ts definitions)', () => {
  it('Eb/N0 = Es/N0 − 10·log10(bits per symbol)', () => {
    expect(esN0DbFromEbN0Db(10, 4)).toBeCloseTo(10 + 10 * Math.log10(4), 12);
  });
  it('Es/N0 = N·E_RE/σ² and SNR = P_s/σ², so SNR = Es/N0 + 10·log10(P_s/(N·E_RE))', () => {
    const f = resolveNoiseLevel({ esN0Db: 20 }, ref);
    expect(f.noiseVariance).toBeCloseTo((512 * 1) / 100, 12);
    expect(f.snrDb).toBeCloseTo(20 + 10 * Math.log10(300 / 512), 12);
    expect(snrDbFromEsN0Db(20, ref)).toBeCloseTo(f.snrDb, 12);
  });
  it('round-trips between the three forms', () => {
    const a = resolveNoiseLevel({ ebN0Db: 7 }, ref);
    const b = resolveNoiseLevel({ snrDb: a.snrDb }, ref);
    const c = resolveNoiseLevel({ esN0Db: a.esN0Db }, ref);
    for (const x of [b, c]) {
      expect(x.noiseVariance).toBeCloseTo(a.noiseVariance, 12);
      expect(x.ebN0Db).toBeCloseTo(7, 12);
    }
  });
  it('rejects a non-finite level', () => {
    expect(() => resolveNoiseLevel({ snrDb: Number.NaN }, ref)).toThrowError(/not a finite number/);
  });
});

describe(`AWGN, seed ${TEST_SEED}`, () => {
  it('adds complex noise of variance σ² per sample (σ²/2 per component), zero mean (1 % on 2e5 samples)', () => {
    const n = 200000;
    const noise = addAwgn(new Float64Array(2 * n), 0.25, createRng(TEST_SEED), new Float64Array(2 * n));
    expect(Math.abs(meanPowerOf(noise) / 0.25 - 1)).toBeLessThan(0.01);
    let re2 = 0;
    let meanRe = 0;
    for (let i = 0; i < n; i++) {
      re2 += noise[2 * i]! ** 2;
      meanRe += noise[2 * i]!;
    }
    expect(Math.abs(re2 / n / 0.125 - 1)).toBeLessThan(0.01);
    expect(Math.abs(meanRe / n)).toBeLessThan(0.005);
  });
});
