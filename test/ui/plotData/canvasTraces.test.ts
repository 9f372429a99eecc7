import type { Data } from 'plotly.js-dist-min';
import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { autoRange, axisKey, canvasDrawable, niceCeil, splitForCanvas } from '../../../src/ui/plotData/canvasTraces';
import { figureCsv } from '../../../src/ui/plotData/figureCsv';
import { plotThemes } from '../../../src/ui/plotData/plotTheme';
import { buildReceiverFigure } from '../../../src/ui/plotData/receiverEvm';
import { buildTimeSamplesFigure, prepareTimeSamples, symmetricRange } from '../../../src/ui/plotData/timeSamples';
import type { EvmData } from '../../../src/worker/client';

const timeFigure = () => {
  const waveform = generateWaveform(parseWaveformConfig({ standard: 'lte', bandwidthMHz: 1.4, symbols: 2 }));
  return buildTimeSamplesFigure(prepareTimeSamples(waveform, 0), plotThemes.light);
};

describe('niceCeil', () => {
  it('rounds up to 1, 2, 2.5 or 5 × 10^k', () => {
    // Common practice for axis limits (the 1-2-2.5-5 series of chart scales).
    expect([0.0326, 0.9, 1, 1.01, 2.1, 2.6, 18.4, 51].map(niceCeil)).toEqual([0.05, 1, 1, 2, 2.5, 5, 20, 100]);
  });
});

describe('autoRange', () => {
  const linear = { toZero: false, log: false, pad: true, round: false };

  it('pads 5 % each side, as Plotly does for values (library behaviour, from memory)', () => {
    const [lo, hi] = autoRange([0, 10], linear);
    expect(lo).toBeCloseTo(-0.5, 12);
    expect(hi).toBeCloseTo(10.5, 12);
  });

  it('keeps zero in without padding it ("tozero"), then rounds the top to a nice number', () => {
    expect(autoRange([2.9, 3.4, 12.5], { ...linear, toZero: true, round: true })).toEqual([0, 20]);
    expect(autoRange([-3, -1], { ...linear, toZero: true, round: true })).toEqual([-5, 0]);
  });

  it('runs edge to edge without padding, and spans whole decades on a log axis', () => {
    expect(autoRange([4, 599], { ...linear, pad: false })).toEqual([4, 599]);
    expect(autoRange([3e-5, 0.2, 1, 0, -1], { ...linear, log: true })).toEqual([-5, 0]);
  });

  it('skips non-finite values and falls back to [0, 1] when nothing is left', () => {
    expect(autoRange([Number.NaN, Number.POSITIVE_INFINITY], linear)).toEqual([0, 1]);
    expect(autoRange([Number.NaN, 2, 4], { ...linear, pad: false })).toEqual([2, 4]);
  });
});

describe('splitForCanvas', () => {
  it('moves every scatter trace to the canvas and leaves Plotly a point-less legend proxy with the same style', () => {
    const figure = timeFigure();
    const split = splitForCanvas(figure);
    expect(split.traces.map((t) => t.name)).toEqual(['I', 'Q', '|x|', 'peak']);
    expect(split.plotlyData.map((t) => t.name)).toEqual(['I', 'Q', '|x|', 'peak']);
    for (const proxy of split.plotlyData as { x: unknown; y: unknown; hoverinfo: unknown }[]) {
      expect(proxy.x).toEqual([null]);
      expect(proxy.hoverinfo).toBe('skip');
    }
    // One shared empty array: Plotly compares data arrays by reference, so a new figure's proxies are no new data.
    const again = splitForCanvas(timeFigure());
    expect((again.plotlyData[0] as { x: unknown }).x).toBe((split.plotlyData[0] as { x: unknown }).x);
    expect(split.plotlyData[0]).toMatchObject({ type: 'scatter', mode: 'lines', line: { color: plotThemes.light.inPhase, width: 1 } });
    // The drawn traces keep the points and their styles.
    const [i, , magnitude, peak] = split.traces;
    expect(i!.x).toBe((figure.data[0] as { x: unknown }).x);
    expect(i!.line).toEqual({ color: plotThemes.light.inPhase, widthPx: 1, dash: 'solid' });
    expect(i!.marker).toBeNull();
    expect(magnitude!.line?.widthPx).toBe(1.6);
    expect(peak!.marker).toMatchObject({ symbol: 'diamond', sizePx: 9, color: plotThemes.light.peak });
    expect(peak!.line).toBeNull();
    expect(i!.hoverTemplate).toContain('%{x:.3f} µs');
    // The figure itself is untouched: CSV and image exports still see every point.
    // Header, one row per point of I, Q, |x| and the peak, and the final newline.
    expect(figureCsv(figure.data).split('\n').length).toBe(1 + 3 * i!.x.length + 1 + 1);
  });

  it('keeps the figure’s own ranges and computes the missing ones from the data and the shapes on that axis', () => {
    const figure = timeFigure();
    const split = splitForCanvas(figure);
    expect(split.layout.xaxis?.range).toEqual(figure.layout.xaxis?.range);
    expect(split.layout.yaxis?.range).toEqual(figure.layout.yaxis?.range);

    const evm: EvmData = {
      evmRmsPercent: 3,
      evmLimitPercent: 17.5,
      perSubcarrierPercent: [Number.NaN, 2.9, 3.4, 3.1, Number.NaN],
      perSymbolPercent: [3.2, 2.8, 3.0],
    } as unknown as EvmData;
    const receiver = splitForCanvas(buildReceiverFigure(evm, plotThemes.light));
    expect(receiver.traces.map((t) => [t.kind, t.xAxis, t.yAxis])).toEqual([
      ['scatter', 'xaxis', 'yaxis'],
      ['bar', 'xaxis2', 'yaxis2'],
    ]);
    // "tozero" value axes reach the 17.5 % limit line (a shape on y and on y2) and round up: [0, 20].
    expect(receiver.layout.yaxis?.range).toEqual([0, 20]);
    expect(receiver.layout.yaxis2?.range).toEqual([0, 20]);
    // Subcarriers run edge to edge (line trace); bars get half a bar width (0.8 × spacing 1) each side.
    expect(receiver.layout.xaxis?.range).toEqual([0, 4]);
    expect(receiver.layout.xaxis2?.range).toEqual([-0.4, 2.4]);
    expect(receiver.traces[0]!.connectGaps).toBe(false);
  });

  it('leaves what the canvas cannot draw to Plotly', () => {
    const heatmap = { type: 'heatmap', z: [[1, 2]] } as Data;
    const text = { type: 'scatter', mode: 'text+markers', x: [1], y: [1], text: ['a'] } as Data;
    const tonexty = { type: 'scatter', mode: 'lines', x: [1, 2], y: [1, 2], fill: 'tonexty' } as Data;
    const band = { type: 'scatter', mode: 'lines', x: [1, 2, 2, 1], y: [1, 1, 2, 2], fill: 'toself', fillcolor: 'rgba(0,0,0,0.1)', line: { width: 0 } } as Data;
    expect([heatmap, text, tonexty, band].map(canvasDrawable)).toEqual([false, false, false, true]);
    const split = splitForCanvas({ data: [heatmap, band], layout: {} });
    expect(split.plotlyData[0]).toBe(heatmap);
    expect(split.traces).toHaveLength(1);
    expect(split.traces[0]).toMatchObject({ traceIndex: 1, fillColor: 'rgba(0,0,0,0.1)', line: null });
  });

  it('reads asymmetric horizontal error bars and Plotly’s axis keys', () => {
    const levels = {
      type: 'scatter',
      mode: 'markers',
      x: [6.4],
      y: [1e-3],
      marker: { symbol: 'circle-open', size: 7, line: { width: 1.6 } },
      error_x: { type: 'data', symmetric: false, array: [0.2], arrayminus: [0.1], thickness: 1.2, width: 4 },
    } as Data;
    const [trace] = splitForCanvas({ data: [levels], layout: { xaxis: { range: [0, 13] }, yaxis: { type: 'log', range: [-6, 0] } } }).traces;
    expect(trace!.errorX).toMatchObject({ plus: [0.2], minus: [0.1], thicknessPx: 1.2, capPx: 4 });
    expect(trace!.marker).toMatchObject({ symbol: 'circle-open', lineWidthPx: 1.6 });
    expect([axisKey(undefined, 'x'), axisKey('x', 'x'), axisKey('x2', 'x'), axisKey('y3', 'y')]).toEqual(['xaxis', 'xaxis', 'xaxis2', 'yaxis3']);
  });
});

describe('symmetricRange', () => {
  it('is ±(peak + 5 %) rounded up to a nice number', () => {
    expect(symmetricRange(38)).toEqual([-50, 50]);
    expect(symmetricRange(0.9)).toEqual([-1, 1]);
    expect(symmetricRange(0)).toEqual([-1, 1]);
  });
});

describe('splitForCanvas: shapes, annotations and the title', () => {
  const figure = {
    data: [{ type: 'scatter', mode: 'lines', x: [0, 1], y: [0, 1] } as Data],
    layout: {
      font: { color: '#123', size: 12 },
      title: { text: 'Symbol 0: <b>72</b> points<br>second line', font: { size: 13 } },
      xaxis: { range: [0, 1] as [number, number] },
      yaxis: { range: [0, 1] as [number, number] },
      legend: { orientation: 'h' as const, x: 1, xanchor: 'right' as const, y: 1.02 },
      shapes: [
        { type: 'rect' as const, xref: 'x' as const, yref: 'paper' as const, x0: 0, x1: 0.2, y0: 0, y1: 1, fillcolor: 'rgba(0,0,0,0.1)', line: { width: 0 }, layer: 'below' as const },
        { type: 'line' as const, xref: 'x2 domain' as never, yref: 'y2' as const, x0: 0, x1: 1, y0: 12.5, y1: 12.5, line: { color: 'red', width: 1.2, dash: 'dash' as const } },
        { type: 'circle' as const, xref: 'x' as const, yref: 'y' as const, x0: 0, x1: 1, y0: 0, y1: 1 },
      ],
      annotations: [
        { xref: 'x' as const, yref: 'paper' as const, x: 0.2, y: 1, xanchor: 'right' as const, yanchor: 'top' as const, text: 'CP 9 samples', showarrow: false },
        { x: 0.5, y: 0.5, text: 'with an arrow', showarrow: true },
      ],
    },
  };

  it('moves rectangles, lines and arrow-less text to the canvas and leaves the rest to Plotly', () => {
    const split = splitForCanvas(figure);
    expect(split.shapes).toEqual([
      { kind: 'rect', xRef: { space: 'data', axis: 'xaxis' }, yRef: { space: 'paper' }, x0: 0, x1: 0.2, y0: 0, y1: 1, fillColor: 'rgba(0,0,0,0.1)', line: null, below: true },
      { kind: 'line', xRef: { space: 'domain', axis: 'xaxis2' }, yRef: { space: 'data', axis: 'yaxis2' }, x0: 0, x1: 1, y0: 12.5, y1: 12.5, fillColor: null, line: { color: 'red', widthPx: 1.2, dash: 'dash' }, below: false },
    ]);
    expect(split.layout.shapes).toEqual([figure.layout.shapes[2]]);
    expect(split.annotations).toEqual([
      { lines: ['CP 9 samples'], xRef: { space: 'data', axis: 'xaxis' }, yRef: { space: 'paper' }, x: 0.2, y: 1, xAnchor: 'right', yAnchor: 'top', fontPx: 12, color: '#123' },
    ]);
    expect(split.layout.annotations).toEqual([figure.layout.annotations[1]]);
    // The limit line is the only thing on y2: that axis still gets a range (12.5 ± 5 %, rounded to steps of 1).
    expect(split.layout.yaxis2?.range).toEqual([11, 14]);
  });

  it('turns the title into a plain-text caption and keeps it out of Plotly', () => {
    const split = splitForCanvas(figure);
    expect(split.caption).toBe('Symbol 0: 72 points second line');
    expect(split.captionPx).toBe(13);
    expect(split.legendBesideCaption).toBe(true);
    expect(split.layout.title).toEqual({ text: '' });
    // Unchanged input: exports still carry the title, shapes and annotations.
    expect(figure.layout.title.text).toContain('Symbol 0');
    expect(figure.layout.shapes).toHaveLength(3);
  });
});
