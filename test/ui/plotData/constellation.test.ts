import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { buildConstellationFigure, countDistinctPoints, prepareConstellation, prepareReceivedConstellation } from '../../../src/ui/plotData/constellation';
import { plotThemes } from '../../../src/ui/plotData/plotTheme';
import { expectCloseArray } from '../../helpers/expectClose';

const generate = (input: Record<string, unknown>) => generateWaveform(parseWaveformConfig(input));
const absTol = 1e-12;

describe('prepareConstellation', () => {
  it('shows the four QPSK points ±1/√2 ± j/√2 of a DFT-s-OFDM symbol (before spreading)', () => {
    // TS 36.211 §7.1.2 Table 7.1.2-1: QPSK symbols (±1 ± j)/√2.
    const waveform = generate({ standard: 'lte', bandwidthMHz: 5, modulation: 'qpsk', symbols: 2 });
    const series = prepareConstellation(waveform, 1);
    expect(series.inPhase.length).toBe(300); // 25 RB × 12 (TS 36.101 Table 5.6-1)
    expect(countDistinctPoints(series)).toBe(4);
    for (const v of [...series.inPhase, ...series.quadrature]) expect(Math.abs(Math.abs(v) - Math.SQRT1_2)).toBeLessThan(absTol);
    expect(series.maxAbsComponent).toBeCloseTo(Math.SQRT1_2, 12);
  });

  it('shows 16QAM levels ±1/√10 and ±3/√10 and more distinct points than QPSK', () => {
    // TS 36.211 §7.1.3 Table 7.1.3-1: 16QAM components in {±1, ±3}/√10.
    const waveform = generate({ standard: 'lte', link: 'downlink', bandwidthMHz: 5, modulation: '16qam', symbols: 1 });
    const series = prepareConstellation(waveform, 0);
    expect(countDistinctPoints(series)).toBe(16);
    const levels = new Set([...series.inPhase].map((v) => Math.round(Math.abs(v) * Math.sqrt(10))));
    expect(levels).toEqual(new Set([1, 3]));
  });

  it('takes the data symbols of the chosen OFDM symbol only', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, modulation: '64qam', symbols: 3 });
    const series = prepareConstellation(waveform, 2);
    const expectedFirst = 2 * 72; // 6 RB × 12 data symbols in each earlier symbol
    expect(series.inPhase[0]).toBe(waveform.dataSymbolsIq[2 * expectedFirst]);
    expect(series.quadrature[71]).toBe(waveform.dataSymbolsIq[2 * (expectedFirst + 71) + 1]);
  });
});

describe('countDistinctPoints', () => {
  it('rounds before counting', () => {
    const series = { inPhase: new Float64Array([0.1, 0.1 + 1e-9, -0.1]), quadrature: new Float64Array([0, 0, 0]) };
    expect(countDistinctPoints(series)).toBe(2);
    expect(countDistinctPoints(series, 12)).toBe(3);
  });
});

describe('buildConstellationFigure', () => {
  it('uses a square, symmetric view with equal axis scales', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, symbols: 1 });
    const figure = buildConstellationFigure(prepareConstellation(waveform, 0), plotThemes.light, 'QPSK');
    // QPSK's outermost component is 1/√2 (TS 36.211 Table 7.1.2-1); 15 % beyond it is 1.15/√2, rounded up to tenths
    // of 1/√2: 1.2/√2.
    const limit = Math.SQRT1_2 * 1.2;
    expectCloseArray((figure.layout.xaxis?.range ?? []).map(Number), [-limit, limit], absTol, 'x range');
    expectCloseArray((figure.layout.yaxis?.range ?? []).map(Number), [-limit, limit], absTol, 'y range');
    expect(figure.layout.yaxis).toMatchObject({ scaleanchor: 'x', scaleratio: 1 });
    expect(figure.layout.title).toMatchObject({ text: 'Symbol 0: 72 QPSK data symbols' });
  });

  it('overlays the received points, aligned with the ideal ones, and widens the view for them', () => {
    const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, symbols: 2 });
    // A received constellation: the ideal symbols of both OFDM symbols scaled by 1.3 (fill order, as the receiver gives them).
    const receivedIq = waveform.dataSymbolsIq.map((v) => 1.3 * v);
    const points = prepareReceivedConstellation(receivedIq, waveform, 1);
    const ideal = prepareConstellation(waveform, 1);
    expect(points).not.toBeNull();
    expectCloseArray(points!.inPhase, ideal.inPhase.map((v) => 1.3 * v), absTol, 'received I of symbol 1');
    const figure = buildConstellationFigure(ideal, plotThemes.light, 'QPSK', { ...points!, evmPercent: 30 });
    expect(figure.data.map((t) => t.name)).toEqual(['ideal', 'received']);
    expect(figure.layout.title).toMatchObject({ text: 'Symbol 1: 72 QPSK data symbols; received EVM 30.00\u00a0%' });
    // 1.3 × 1.15 = 1.495 tenths-of-1/√2 steps → 1.5/√2.
    expectCloseArray((figure.layout.xaxis?.range ?? []).map(Number), [-1.5 * Math.SQRT1_2, 1.5 * Math.SQRT1_2], absTol, 'x range');
    // A receiver constellation shorter than the grid expects (e.g. another configuration) is not drawn.
    expect(prepareReceivedConstellation(receivedIq.subarray(0, 10), waveform, 1)).toBeNull();
  });
});
