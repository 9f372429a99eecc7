import { describe, expect, it } from 'vitest';
import { barWidth, dashPattern, formatNumber, hoverLines, nearestPoint, refToPixel, toPixel, type AxisGeometry } from '../../../src/ui/plotData/canvasGeometry';
import { splitForCanvas } from '../../../src/ui/plotData/canvasTraces';

const xAxis: AxisGeometry = { range: [0, 10], log: false, offsetPx: 50, lengthPx: 500 };
const yAxis: AxisGeometry = { range: [-1, 1], log: false, offsetPx: 20, lengthPx: 200 };

describe('toPixel', () => {
  it('maps linearly, with y growing upwards', () => {
    expect(toPixel(xAxis, 0, false)).toBe(50);
    expect(toPixel(xAxis, 5, false)).toBe(300);
    expect(toPixel(yAxis, 1, true)).toBe(20);
    expect(toPixel(yAxis, -1, true)).toBe(220);
    expect(toPixel(yAxis, 0, true)).toBe(120);
  });

  it('maps log axes by decade (range in log10 units, as Plotly keeps it) and has no pixel for ≤ 0 or gaps', () => {
    const log: AxisGeometry = { range: [-6, 0], log: true, offsetPx: 0, lengthPx: 600 };
    expect(toPixel(log, 1e-3, true)).toBeCloseTo(300, 9);
    expect(toPixel(log, 1, true)).toBeCloseTo(0, 9);
    expect([toPixel(log, 0, true), toPixel(xAxis, null, false), toPixel(xAxis, Number.NaN, false)].every(Number.isNaN)).toBe(true);
  });
});

describe('dashPattern', () => {
  it('follows Plotly’s dash styles in units of max(width, 3) px (library behaviour, from memory)', () => {
    expect(dashPattern('solid', 1)).toEqual([]);
    expect(dashPattern('dot', 1)).toEqual([3, 3]);
    expect(dashPattern('dash', 1.2)).toEqual([9, 9]);
    expect(dashPattern('dash', 4)).toEqual([12, 12]);
    expect(dashPattern('dashdot', 3)).toEqual([9, 3, 3, 3]);
  });
});

describe('barWidth', () => {
  it('is 80 % of the closest spacing (Plotly’s default bar gap 0.2, from memory)', () => {
    expect(barWidth([0, 1, 2, 3])).toBeCloseTo(0.8, 12);
    expect(barWidth([0, 2, 3, null])).toBeCloseTo(0.8, 12);
    expect(barWidth([5])).toBeCloseTo(0.8, 12);
  });
});

describe('nearestPoint', () => {
  const { traces: canvasTraces } = splitForCanvas({
    data: [
      { type: 'scatter', mode: 'markers', name: 'a', x: [1, 2, 3], y: [0, 0.5, -0.5], hovertemplate: 'a %{x}' },
      { type: 'scatter', mode: 'lines', name: 'quiet', x: [2], y: [0.5], hoverinfo: 'skip' },
      { type: 'bar', name: 'bars', x: [8, 9], y: [0.8, 0.4], hovertemplate: 'bar %{x}' },
    ],
    layout: { xaxis: { range: [0, 10] }, yaxis: { range: [-1, 1] } },
  });
  const axes = () => ({ x: xAxis, y: yAxis });

  it('finds the closest point within reach, skipping traces that take no hover', () => {
    // Point (2, 0.5) sits at (150, 70) px.
    const hit = nearestPoint(canvasTraces, axes, 152, 73);
    expect(hit).toMatchObject({ pointIndex: 1, xPx: 150, yPx: 70 });
    expect(hit!.trace.name).toBe('a');
    expect(nearestPoint(canvasTraces, axes, 152, 140)).toBeNull(); // 70 px away: out of reach
  });

  it('prefers a marker over a line vertex at the same spot', () => {
    const { traces } = splitForCanvas({
      data: [
        { type: 'scatter', mode: 'lines', name: 'line', x: [5.02], y: [0], hovertemplate: 'line' },
        { type: 'scatter', mode: 'markers', name: 'peak', x: [5], y: [0.04], marker: { size: 9 }, hovertemplate: 'peak' },
      ],
      layout: { xaxis: { range: [0, 10] }, yaxis: { range: [-1, 1] } },
    });
    // Pointer on the line vertex (301, 120); the marker's centre is 4.4 px away but its edge is under the pointer.
    expect(nearestPoint(traces, axes, 301, 120)?.trace.name).toBe('peak');
  });

  it('hits a bar anywhere over its column', () => {
    // Bar at x = 9 spans 8.6…9.4 → 480…520 px; hovering low in the column still picks it.
    const hit = nearestPoint(canvasTraces, axes, 515, 215);
    expect(hit?.trace.name).toBe('bars');
    expect(hit?.pointIndex).toBe(1);
  });
});

describe('hover text', () => {
  it('formats like the d3 formats the figures use', () => {
    expect(formatNumber(3.14159, '.3f')).toBe('3.142');
    expect(formatNumber(0.000123, '.2e')).toBe('1.23e-4');
    expect(formatNumber(0.5, '.4g')).toBe('0.5000');
    expect(formatNumber(1 / 3, undefined)).toBe('0.333333333');
  });

  it('fills a Plotly hover template into lines of plain text', () => {
    expect(hoverLines('I %{y:.4g}<br>%{x:.3f} µs<extra></extra>', 12.3456, -0.25)).toEqual(['I -0.2500', '12.346 µs']);
    expect(hoverLines('input %{x:.2f} dB<br>output %{y:.2f} dB<extra>AM/AM</extra>', -3, -4.5)).toEqual(['input -3.00 dB', 'output -4.50 dB', 'AM/AM']);
    expect(hoverLines('<b>bold</b> %{x}', 2, 0)).toEqual(['bold 2']);
  });
});

describe('refToPixel', () => {
  const paper = { l: 50, t: 20, w: 500, h: 200 };
  const axisOf = (key: string) => (key === 'xaxis' ? xAxis : key === 'yaxis' ? yAxis : key === 'xaxis2' ? { ...xAxis, offsetPx: 400, lengthPx: 100 } : null);

  it('places data, axis-domain and plot-area coordinates as Plotly’s xref/yref define them', () => {
    expect(refToPixel({ space: 'data', axis: 'xaxis' }, 5, false, paper, axisOf)).toBe(300);
    expect(refToPixel({ space: 'paper' }, 0, true, paper, axisOf)).toBe(220); // paper y = 0 is the bottom
    expect(refToPixel({ space: 'paper' }, 1, false, paper, axisOf)).toBe(550);
    expect(refToPixel({ space: 'domain', axis: 'xaxis2' }, 0.5, false, paper, axisOf)).toBe(450);
    expect(refToPixel({ space: 'data', axis: 'yaxis9' }, 0.5, true, paper, axisOf)).toBeNaN();
  });
});
