import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { generateWaveform, createWaveformGenerator, RE_DATA } from '../../../src/dsp/waveform/waveformGenerator';
import { createWaveformPlan } from '../../../src/dsp/waveform/waveformPlan';
import { fillPnBits, createPnState } from '../../../src/dsp/data/pnSequence';
import { expectCloseArray, maxAbs } from '../../helpers/expectClose';
import { naiveDft } from '../../helpers/naiveDft';
import { integerSubcarrierSymbol, lteUplinkSymbol, nrCpTc } from './formulaReference';

// The generated samples must equal the standards' formulas evaluated at t = n·Ts/os over the whole extended
// symbol, CP included, to 1e-9 relative to the signal's peak (issue #2 acceptance).
const relTol = 1e-9;

function gen(input: WaveformConfigInput) {
  return generateWaveform(parseWaveformConfig(input));
}

function symbolSamples(w: ReturnType<typeof gen>, l: number): Float64Array {
  const lay = w.symbolLayout[l]!;
  return w.waveformIq.subarray(2 * lay.startSample, 2 * (lay.startSample + lay.cpLengthSamples + lay.fftSize));
}

function gridRow(w: ReturnType<typeof gen>, l: number): Float64Array {
  const k = w.numGridSubcarriers;
  return w.gridIq.subarray(2 * k * l, 2 * k * (l + 1));
}

describe('LTE uplink SC-FDMA equals TS 36.211 §5.6 evaluated directly', () => {
  for (const os of [1, 4]) {
    it(`1.4 MHz, DFT-s-OFDM 16QAM, oversampling ${os}, all 14 symbols of a subframe`, () => {
      const w = gen({ standard: 'lte', bandwidthMHz: 1.4, modulation: '16qam', oversampling: os });
      for (let l = 0; l < 14; l++) {
        const cpBase = l % 7 === 0 ? 10 : 9; // TS 36.101 Table F.5.3-1 at FFT 128
        const ref = lteUplinkSymbol(gridRow(w, l), 128, cpBase, os);
        expectCloseArray(symbolSamples(w, l), ref, relTol * maxAbs(ref), `symbol ${l}`);
      }
    });
  }
  it('3 MHz, two blocks with their own modulation and power offset, extended CP, oversampling 2', () => {
    const w = gen({
      standard: 'lte',
      bandwidthMHz: 3,
      cyclicPrefix: 'extended',
      oversampling: 2,
      symbols: 6,
      allocation: [
        { startRb: 10, numRb: 5, modulation: '64qam', powerOffsetDb: -3 },
        { startRb: 1, numRb: 3, modulation: 'qpsk' },
      ],
    });
    for (let l = 0; l < 6; l++) {
      const ref = lteUplinkSymbol(gridRow(w, l), 256, 64, 2);
      expectCloseArray(symbolSamples(w, l), ref, relTol * maxAbs(ref), `symbol ${l}`);
    }
  });
});

describe('LTE downlink OFDM equals TS 36.211 §6.12 evaluated directly', () => {
  for (const os of [1, 3]) {
    it(`1.4 MHz 64QAM, DC unused, oversampling ${os}`, () => {
      const w = gen({ standard: 'lte', link: 'downlink', bandwidthMHz: 1.4, modulation: '64qam', oversampling: os, symbols: 8 });
      for (let l = 0; l < 8; l++) {
        const cpBase = l % 7 === 0 ? 10 : 9;
        const ref = integerSubcarrierSymbol(gridRow(w, l), 128, cpBase, os, true);
        expectCloseArray(symbolSamples(w, l), ref, relTol * maxAbs(ref), `symbol ${l}`);
      }
    });
  }
});

describe('NR CP-OFDM and DFT-s-OFDM equal TS 38.211 §5.3.1 (and the §5.4 phase term) evaluated directly', () => {
  it('10 MHz at 30 kHz CP-OFDM, two slots (long CP at each slot start), oversampling 2', () => {
    const w = gen({ standard: 'nr', bandwidthMHz: 10, subcarrierSpacingKHz: 30, waveform: 'ofdm', symbols: 28, oversampling: 2 });
    const fftSize = w.plan.numerology.fftSize;
    const samplesPerTc = (fftSize * 30e3) / (480e3 * 4096);
    for (let l = 0; l < 28; l++) {
      const cpBase = nrCpTc(1, l % 28, false) * samplesPerTc;
      const ref = integerSubcarrierSymbol(gridRow(w, l), fftSize, cpBase, 2, false);
      expectCloseArray(symbolSamples(w, l), ref, relTol * maxAbs(ref), `symbol ${l}`);
    }
  });

  it('20 MHz at 60 kHz extended CP, DFT-s-OFDM π/2-BPSK with a carrier: each symbol rotated by e^{−j2πf0(t_start,l + N_CP,l·Tc)}', () => {
    const f0 = 3.5e9;
    const w = gen({
      standard: 'nr',
      bandwidthMHz: 20,
      subcarrierSpacingKHz: 60,
      cyclicPrefix: 'extended',
      modulation: 'pi/2-bpsk',
      allocation: { startRb: 2, numRb: 16 },
      symbols: 12,
      carrierFrequencyHz: f0,
    });
    const fftSize = w.plan.numerology.fftSize;
    let tStartTc = 0;
    for (let l = 0; l < 12; l++) {
      const cpTc = nrCpTc(2, l, true);
      const cpBase = (cpTc * fftSize * 60e3) / (480e3 * 4096);
      const base = integerSubcarrierSymbol(gridRow(w, l), fftSize, cpBase, 1, false);
      const phase = -2 * Math.PI * f0 * ((tStartTc + cpTc) / (480e3 * 4096));
      const c = Math.cos(phase);
      const s = Math.sin(phase);
      const ref = new Float64Array(base.length);
      for (let i = 0; i < base.length; i += 2) {
        ref[i] = base[i]! * c - base[i + 1]! * s;
        ref[i + 1] = base[i]! * s + base[i + 1]! * c;
      }
      // f0·t reaches ~10^6 cycles, so the phase itself carries ~1e-10 rad of rounding: same tolerance applies.
      expectCloseArray(symbolSamples(w, l), ref, relTol * maxAbs(ref), `symbol ${l}`);
      tStartTc += 2048 * 64 * 2 ** -2 + cpTc;
    }
  });
});

describe('resource grid contents', () => {
  it('DFT-s-OFDM: each symbol\'s grid is the unitary DFT of its PN9 QPSK symbols (TS 36.211 §5.3.3), bits filled in order', () => {
    const w = gen({ standard: 'lte', bandwidthMHz: 5, allocation: { startRb: 4, numRb: 15 }, symbols: 3 });
    const m = 180;
    // Bits: PN9 from the all-ones state, in fill order (ITU-T O.150).
    expect(Array.from(w.bits)).toEqual(Array.from(fillPnBits(createPnState(9), new Uint8Array(3 * 2 * m))));
    for (let l = 0; l < 3; l++) {
      const d = w.dataSymbolsIq.subarray(2 * m * l, 2 * m * (l + 1));
      const spread = naiveDft(d).map((v) => v / Math.sqrt(m));
      const row = gridRow(w, l);
      expectCloseArray(row.subarray(2 * 48, 2 * (48 + m)), spread, 1e-12, `grid row ${l}`);
      // Everything outside the allocation is zero, and the kinds say so.
      expect(maxAbs(row.subarray(0, 2 * 48))).toBe(0);
      expect(maxAbs(row.subarray(2 * (48 + m)))).toBe(0);
      const kinds = w.gridKinds.subarray(300 * l, 300 * (l + 1));
      expect(kinds.filter((x) => x === RE_DATA).length).toBe(m);
    }
  });

  it('interleaved mapping puts data on every Q-th subcarrier from the comb offset', () => {
    const w = gen({ standard: 'lte', bandwidthMHz: 5, mapping: 'interleaved', interleaveFactor: 4, combOffset: 1, allocation: { startRb: 0, numRb: 25 }, symbols: 1 });
    const kinds = Array.from(w.gridKinds);
    for (let g = 0; g < 300; g++) expect(kinds[g]).toBe(g % 4 === 1 ? RE_DATA : 0);
    expect(w.warnings.join(' ')).toMatch(/research option/);
  });

  it('mean power of the waveform equals the number of active subcarriers (Parseval over the unscaled IFFT)', () => {
    const w = gen({ standard: 'lte', link: 'downlink', bandwidthMHz: 20, symbols: 14, data: { source: 'random', seed: 5 } });
    let energy = 0;
    for (let i = 0; i < w.waveformIq.length; i++) energy += w.waveformIq[i]! ** 2;
    // Per symbol Σ_n |x[n]|² over the useful part = N·Σ_k|a_k|²; the CP adds a random ±, so compare loosely.
    const perSample = energy / w.numSamples;
    expect(perSample / 1200).toBeGreaterThan(0.97);
    expect(perSample / 1200).toBeLessThan(1.03);
  });

  it('generating in chunks continues the data stream: identical samples to one call', () => {
    const config = parseWaveformConfig({ standard: 'lte', bandwidthMHz: 1.4, symbols: 10, modulation: '256qam' });
    const whole = generateWaveform(config);
    const g = createWaveformGenerator(createWaveformPlan(config));
    const a = g.generate(3);
    const b = g.generate(7);
    expect(Array.from([...a.waveformIq, ...b.waveformIq])).toEqual(Array.from(whole.waveformIq));
  });

  it('LTE 20 MHz uplink subframe is 30720 samples at 30.72 Msps (TS 36.211 §4, common-practice rate)', () => {
    const w = gen({});
    expect(w.numSamples).toBe(30720);
    expect(w.sampleRateHz).toBe(30.72e6);
    expect(w.symbolLayout[7]!.startSample).toBe(15360);
  });
});
