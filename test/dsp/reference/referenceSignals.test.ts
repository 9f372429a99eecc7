import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { crsInitialisation } from '../../../src/dsp/reference/lteCrs';
import { nrDmrsInitialisation } from '../../../src/dsp/reference/nrDmrs';
import { fillGoldQpsk } from '../../../src/dsp/reference/goldSequence';
import { fillShiftedBaseSequence } from '../../../src/dsp/reference/zadoffChu';
import { generateWaveform, RE_DATA, RE_EMPTY, RE_REFERENCE } from '../../../src/dsp/waveform/waveformGenerator';
import { createWaveformPlan } from '../../../src/dsp/waveform/waveformPlan';

const absTol = 1e-12;

function gen(input: WaveformConfigInput) {
  return generateWaveform(parseWaveformConfig(input));
}

function kindsOfSymbol(w: ReturnType<typeof gen>, l: number): Uint8Array {
  const k = w.numGridSubcarriers;
  return w.gridKinds.subarray(k * l, k * (l + 1));
}

function countKind(kinds: Uint8Array, kind: number): number {
  return kinds.reduce((n, x) => n + (x === kind ? 1 : 0), 0);
}

describe('reference signals are off by default', () => {
  it('leaves the default waveform data-only, with the counts of a plain symbol in every symbol', () => {
    const w = gen({});
    expect(w.plan.referenceSignals.kind).toBe('none');
    expect(countKind(w.gridKinds, RE_REFERENCE)).toBe(0);
    expect(w.plan.numBits).toBe(w.plan.bitsPerOfdmSymbol * 14);
    expect(w.bits.length).toBe(w.plan.numBits);
    expect(parseWaveformConfig({}).referenceSignals).toBeUndefined();
  });
});

describe('LTE PUSCH DMRS (TS 36.211 §5.5.2.1)', () => {
  it('fills symbol 3 of each normal-CP slot with r^(α)_{u,v}(n) over the allocation; data skips it', () => {
    const rs = { enabled: true, groupNumber: 11, sequenceNumber: 0, cyclicShift: 5 };
    const w = gen({ bandwidthMHz: 3, allocation: { startRb: 2, numRb: 6 }, modulation: '16qam', referenceSignals: rs });
    const expected = fillShiftedBaseSequence('lte', 11, 0, (2 * Math.PI * 5) / 12, 72, new Float64Array(144));
    for (let l = 0; l < 14; l++) {
      const kinds = kindsOfSymbol(w, l);
      if (l % 7 === 3) {
        expect(countKind(kinds, RE_REFERENCE), `symbol ${l}`).toBe(72);
        expect(countKind(kinds, RE_DATA)).toBe(0);
        for (let n = 0; n < 72; n++) {
          const e = 2 * (180 * l + 24 + n);
          expect(Math.abs(w.gridIq[e]! - expected[2 * n]!)).toBeLessThan(absTol);
          expect(Math.abs(w.gridIq[e + 1]! - expected[2 * n + 1]!)).toBeLessThan(absTol);
        }
      } else {
        expect(countKind(kinds, RE_DATA)).toBe(72);
      }
    }
    expect(w.plan.numDataSymbols).toBe(72 * 12);
    expect(w.bits.length).toBe(72 * 12 * 4);
    expect(w.dataSymbolsIq.length).toBe(2 * 72 * 12);
  });

  it('sits on symbol 2 of each extended-CP slot (TS 36.211 §5.5.2.1.2)', () => {
    const w = gen({ bandwidthMHz: 1.4, cyclicPrefix: 'extended', symbols: 12, referenceSignals: { enabled: true } });
    const rsSymbols = Array.from({ length: 12 }, (_, l) => l).filter((l) => countKind(kindsOfSymbol(w, l), RE_REFERENCE) > 0);
    expect(rsSymbols).toEqual([2, 8]);
  });

  it('keeps the block power offset on the DMRS (the DMRS is part of the PUSCH)', () => {
    const w = gen({ bandwidthMHz: 1.4, allocation: { startRb: 0, numRb: 6, powerOffsetDb: 6 }, referenceSignals: { enabled: true } });
    const e = 2 * (72 * 3);
    expect(Math.hypot(w.gridIq[e]!, w.gridIq[e + 1]!)).toBeCloseTo(10 ** (6 / 20), 12);
  });
});

describe('LTE downlink CRS, antenna port 0 (TS 36.211 §6.10.1)', () => {
  it('puts r(m′) on k = 6m + (v + v_shift) mod 6 of symbols 0 and 4 of each slot, over the whole grid', () => {
    const cellId = 7; // v_shift = 1
    const w = gen({ bandwidthMHz: 1.4, link: 'downlink', referenceSignals: { enabled: true, cellId } });
    for (let l = 0; l < 14; l++) {
      const kinds = kindsOfSymbol(w, l);
      const symbolInSlot = l % 7;
      if (symbolInSlot !== 0 && symbolInSlot !== 4) {
        expect(countKind(kinds, RE_REFERENCE)).toBe(0);
        continue;
      }
      const offset = ((symbolInSlot === 0 ? 0 : 3) + (cellId % 6)) % 6;
      const positions = Array.from(kinds.keys()).filter((k) => kinds[k] === RE_REFERENCE);
      expect(positions).toEqual(Array.from({ length: 12 }, (_, m) => 6 * m + offset));
      expect(countKind(kinds, RE_DATA)).toBe(72 - 12);
      const seq = fillGoldQpsk(crsInitialisation(Math.floor(l / 7), symbolInSlot, cellId, false), new Float64Array(440));
      for (let m = 0; m < 12; m++) {
        const mPrime = m + 110 - 6;
        expect(w.gridIq[2 * (72 * l + positions[m]!)]).toBeCloseTo(seq[2 * mPrime]!, 15);
        expect(w.gridIq[2 * (72 * l + positions[m]!) + 1]).toBeCloseTo(seq[2 * mPrime + 1]!, 15);
      }
    }
    expect(w.plan.numDataSymbols).toBe(72 * 14 - 4 * 12);
  });

  it('c_init = 2^10(7(n_s+1) + l + 1)(2N_ID + 1) + 2N_ID + N_CP (worked by hand, derived)', () => {
    expect(crsInitialisation(0, 0, 0, false)).toBe(1024 * 8 + 1);
    expect(crsInitialisation(19, 4, 503, true)).toBe(1024 * (7 * 20 + 5) * 1007 + 1006);
  });
});

describe('NR PUSCH DMRS, type 1, single symbol (TS 38.211 §6.4.1.1)', () => {
  it('CP-OFDM: Gold-sequence QPSK r(k/2)·√2 on the even subcarriers of the configured symbols; the odd ones stay empty', () => {
    const rs = { enabled: true, scramblingId: 41, nScid: 1, dmrsSymbols: [2, 11] };
    const w = gen({ standard: 'nr', bandwidthMHz: 5, subcarrierSpacingKHz: 15, waveform: 'ofdm', allocation: { startRb: 3, numRb: 4 }, referenceSignals: rs });
    const k = w.numGridSubcarriers;
    for (let l = 0; l < 14; l++) {
      const kinds = kindsOfSymbol(w, l);
      if (l !== 2 && l !== 11) {
        expect(countKind(kinds, RE_REFERENCE)).toBe(0);
        continue;
      }
      expect(countKind(kinds, RE_REFERENCE)).toBe(24);
      expect(countKind(kinds, RE_DATA)).toBe(0);
      const seq = fillGoldQpsk(nrDmrsInitialisation(14, 0, l, 41, 1), new Float64Array(2 * 42));
      for (let sc = 36; sc < 84; sc++) {
        expect(kinds[sc]).toBe(sc % 2 === 0 ? RE_REFERENCE : RE_EMPTY);
        if (sc % 2 === 0) expect(w.gridIq[2 * (k * l + sc)]).toBeCloseTo(Math.SQRT2 * seq[sc]!, 14);
      }
    }
  });

  it('c_init = (2^17(14·n_s + l + 1)(2N_ID + 1) + 2N_ID + n_SCID) mod 2^31 (worked by hand, derived)', () => {
    expect(nrDmrsInitialisation(14, 0, 2, 0, 0)).toBe(131072 * 3);
    expect(nrDmrsInitialisation(14, 3, 11, 1000, 1)).toBe((131072 * (14 * 3 + 12) * 2001 + 2001) % 2 ** 31);
  });

  it('DFT-s-OFDM: the length-6·M_RB low-PAPR sequence (δ = 1, α = 0) on every other subcarrier; no data in DMRS symbols', () => {
    const w = gen({ standard: 'nr', bandwidthMHz: 5, subcarrierSpacingKHz: 15, allocation: { startRb: 0, numRb: 5 }, referenceSignals: { enabled: true, groupNumber: 9 } });
    const seq = fillShiftedBaseSequence('nr', 9, 0, 0, 30, new Float64Array(60));
    const k = w.numGridSubcarriers;
    for (const l of [2, 7, 11]) {
      for (let n = 0; n < 30; n++) {
        expect(w.gridIq[2 * (k * l + 2 * n)]).toBeCloseTo(Math.SQRT2 * seq[2 * n]!, 14);
        expect(w.gridIq[2 * (k * l + 2 * n) + 1]).toBeCloseTo(Math.SQRT2 * seq[2 * n + 1]!, 14);
      }
    }
    expect(w.plan.numDataSymbols).toBe(60 * 11);
  });
});

describe('reference-signal configuration errors', () => {
  const cases: [string, WaveformConfigInput, RegExp][] = [
    ['custom numerology', { standard: 'custom', custom: { fftSize: 256, numRb: 10, cpLengthSamples: 18 }, referenceSignals: { enabled: true } }, /referenceSignals\.enabled: standard "custom"/],
    ['interleaved mapping', { bandwidthMHz: 5, mapping: 'interleaved', interleaveFactor: 2, referenceSignals: { enabled: true } }, /localized mapping only/],
    ['dmrsSymbols on LTE', { referenceSignals: { enabled: true, dmrsSymbols: [3] } }, /applies to NR only/],
    ['dmrsSymbols not ascending', { standard: 'nr', bandwidthMHz: 10, referenceSignals: { enabled: true, dmrsSymbols: [7, 2] } }, /distinct, ascending/],
    ['group number out of range', { referenceSignals: { enabled: true, groupNumber: 30 } }, /referenceSignals\.groupNumber/],
    ['unknown field', { referenceSignals: { enabled: true, hopping: true } } as WaveformConfigInput, /unknown field "hopping"/],
  ];
  for (const [what, input, message] of cases) {
    it(`rejects ${what} with INVALID_CONFIG naming the field`, () => {
      expect(() => parseWaveformConfig(input)).toThrowError(message);
      try {
        parseWaveformConfig(input);
      } catch (err) {
        expect((err as { code: string }).code).toBe('INVALID_CONFIG');
      }
    });
  }

  it('a disabled block is ignored even with NR-only fields on LTE', () => {
    expect(createWaveformPlan(parseWaveformConfig({ referenceSignals: { enabled: false, dmrsSymbols: [3] } })).referenceSignals.kind).toBe('none');
  });
});
