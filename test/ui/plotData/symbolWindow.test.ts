import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { locateDataSymbols, locateSymbolSamples } from '../../../src/ui/plotData/symbolWindow';

const generate = (input: Record<string, unknown>) => generateWaveform(parseWaveformConfig(input));

describe('locateSymbolSamples', () => {
  // TS 36.211 Table 5.6-1: normal CP is 160 Ts for l = 0 and 144 Ts for l = 1…6, N = 2048 Ts;
  // at 30.72 Msps one Ts is one sample, and a slot is 15360 samples (TS 36.211 §4).
  it('places LTE 20 MHz normal-CP symbols at the 36.211 sample offsets', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 20, symbols: 8 });
    expect(locateSymbolSamples(waveform, 0)).toEqual({
      symbolIndex: 0,
      startSample: 0,
      cpLengthSamples: 160,
      usefulStartSample: 160,
      endSample: 2208,
    });
    expect(locateSymbolSamples(waveform, 1)).toMatchObject({ startSample: 2208, cpLengthSamples: 144, endSample: 4400 });
    expect(locateSymbolSamples(waveform, 7)).toMatchObject({ startSample: 15360, cpLengthSamples: 160 });
  });

  it('scales every length by the oversampling factor', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 20, symbols: 2, oversampling: 4 });
    expect(locateSymbolSamples(waveform, 1)).toMatchObject({
      startSample: 4 * 2208,
      cpLengthSamples: 4 * 144,
      endSample: 4 * 4400,
    });
  });

  it('rejects a symbol index outside the waveform', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, symbols: 2 });
    expect(() => locateSymbolSamples(waveform, 2)).toThrow(/Symbol 2 is not in the waveform \(it has 2 symbols\)/);
  });
});

describe('locateDataSymbols', () => {
  it('counts the data resource elements of each symbol in fill order', () => {
    // 40 RB localized: M_sc = 480 data symbols per OFDM symbol (12 subcarriers per RB, TS 36.211 §5.2.3).
    const waveform = generate({ standard: 'lte', bandwidthMHz: 10, allocation: { startRb: 5, numRb: 40 }, symbols: 3 });
    expect(locateDataSymbols(waveform, 0)).toEqual({ first: 0, count: 480 });
    expect(locateDataSymbols(waveform, 2)).toEqual({ first: 960, count: 480 });
    expect(waveform.dataSymbolsIq.length).toBe(2 * 3 * 480);
  });

  it('follows several blocks of different sizes', () => {
    const waveform = generate({
      standard: 'lte',
      link: 'downlink',
      bandwidthMHz: 5,
      allocation: [
        { startRb: 0, numRb: 2 },
        { startRb: 10, numRb: 3 },
      ],
      symbols: 2,
    });
    expect(locateDataSymbols(waveform, 1)).toEqual({ first: 60, count: 60 });
  });

  it('rejects a symbol index outside the grid', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, symbols: 1 });
    expect(() => locateDataSymbols(waveform, 1)).toThrow(RangeError);
    expect(() => locateDataSymbols(waveform, -1)).toThrow(RangeError);
  });
});
