/**
 * Trace data for the time-samples plot of one OFDM symbol: I, Q and |x| against time, the cyclic
 * prefix span and the peak. Runs before rendering (no DSP in components); elementwise arithmetic only.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { EngineWaveform } from '../../worker/protocol';
import { niceCeil } from './canvasTraces';
import { baseLayout, type PlotTheme } from './plotTheme';
import { locateSymbolSamples } from './symbolWindow';

export interface TimeSamplesSeries {
  symbolIndex: number;
  /** Time of each sample from the first sample of the waveform, µs. */
  timeUs: Float64Array;
  inPhase: Float64Array;
  quadrature: Float64Array;
  magnitude: Float64Array;
  cpLengthSamples: number;
  /** Start of the cyclic prefix and of the useful part, µs. */
  cpStartUs: number;
  usefulStartUs: number;
  endUs: number;
  peak: { timeUs: number; magnitude: number };
  /** Peak over mean of |x|² within this symbol, CP included, dB. */
  peakToAveragePowerDb: number;
}

export function prepareTimeSamples(
  waveform: Pick<EngineWaveform, 'waveformIq' | 'symbolLayout' | 'sampleRateHz'>,
  symbolIndex: number,
): TimeSamplesSeries {
  const window = locateSymbolSamples(waveform, symbolIndex);
  const numSamples = window.endSample - window.startSample;
  const usPerSample = 1e6 / waveform.sampleRateHz;
  const timeUs = new Float64Array(numSamples);
  const inPhase = new Float64Array(numSamples);
  const quadrature = new Float64Array(numSamples);
  const magnitude = new Float64Array(numSamples);
  let peakIndex = 0;
  let sumPower = 0;
  for (let n = 0; n < numSamples; n++) {
    const sample = window.startSample + n;
    const re = waveform.waveformIq[2 * sample] ?? Number.NaN;
    const im = waveform.waveformIq[2 * sample + 1] ?? Number.NaN;
    timeUs[n] = sample * usPerSample;
    inPhase[n] = re;
    quadrature[n] = im;
    magnitude[n] = Math.hypot(re, im);
    sumPower += re * re + im * im;
    if ((magnitude[n] ?? 0) > (magnitude[peakIndex] ?? 0)) peakIndex = n;
  }
  const peakMagnitude = magnitude[peakIndex] ?? 0;
  const meanPower = sumPower / numSamples;
  return {
    symbolIndex,
    timeUs,
    inPhase,
    quadrature,
    magnitude,
    cpLengthSamples: window.cpLengthSamples,
    cpStartUs: window.startSample * usPerSample,
    usefulStartUs: window.usefulStartSample * usPerSample,
    endUs: window.endSample * usPerSample,
    peak: { timeUs: timeUs[peakIndex] ?? 0, magnitude: peakMagnitude },
    peakToAveragePowerDb: meanPower > 0 ? 10 * Math.log10((peakMagnitude * peakMagnitude) / meanPower) : Number.NaN,
  };
}

/** Most points drawn per trace; longer symbols keep each bucket's minimum and maximum (the envelope and its peaks). */
export const MAX_TIME_POINTS = 1000;

/**
 * Min/max decimation for drawing: splits the samples into buckets and keeps, in time order, each bucket's smallest
 * and largest value, so at most `maxPoints` remain and no extreme disappears. Returns the input when it is short.
 */
export function minMaxDecimate(x: Float64Array, y: Float64Array, maxPoints = MAX_TIME_POINTS): { x: Float64Array; y: Float64Array } {
  const n = y.length;
  const bucket = Math.ceil(n / Math.max(1, Math.floor(maxPoints / 2)));
  if (bucket <= 2) return { x, y };
  const outX: number[] = [];
  const outY: number[] = [];
  for (let start = 0; start < n; start += bucket) {
    let lo = start;
    let hi = start;
    for (let i = start; i < Math.min(n, start + bucket); i++) {
      if ((y[i] ?? 0) < (y[lo] ?? 0)) lo = i;
      if ((y[i] ?? 0) > (y[hi] ?? 0)) hi = i;
    }
    for (const i of lo <= hi ? [lo, hi] : [hi, lo]) {
      outX.push(x[i] ?? Number.NaN);
      outY.push(y[i] ?? Number.NaN);
    }
  }
  return { x: Float64Array.from(outX), y: Float64Array.from(outY) };
}

/** ±(peak + 5 %), rounded up to a nice number; ±1 when there is no signal. */
export function symmetricRange(peak: number): [number, number] {
  const limit = peak > 0 && Number.isFinite(peak) ? niceCeil(peak * 1.05) : 1;
  return [-limit, limit];
}

export function buildTimeSamplesFigure(series: TimeSamplesSeries, theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const line = (name: string, values: Float64Array, color: string, width: number): Data => {
    const { x, y } = minMaxDecimate(series.timeUs, values);
    return {
    type: 'scatter',
    mode: 'lines',
    name,
    x,
    y,
    line: { color, width },
    hovertemplate: `${name} %{y:.4g}<br>%{x:.3f} µs<extra></extra>`,
    };
  };
  return {
    data: [
      line('I', series.inPhase, theme.inPhase, 1),
      line('Q', series.quadrature, theme.quadrature, 1),
      line('|x|', series.magnitude, theme.magnitude, 1.6),
      {
        type: 'scatter',
        mode: 'markers',
        name: 'peak',
        x: [series.peak.timeUs],
        y: [series.peak.magnitude],
        marker: { color: theme.peak, size: 9, symbol: 'diamond' },
        hovertemplate: 'peak |x| %{y:.4g}<br>%{x:.3f} µs<extra></extra>',
      },
    ],
    layout: {
      ...base,
      title: {
        text: `Symbol ${series.symbolIndex}: time samples, ${series.timeUs.length} samples (peak/average ${series.peakToAveragePowerDb.toFixed(2)} dB)`,
        font: { size: 13 },
        x: 0,
        xanchor: 'left',
      },
      // A taller top margin: the legend above the plot sits below the tool bar Plotly shows on hover, not under it.
      margin: { ...base.margin, t: 60 },
      xaxis: { ...base.xaxis, title: { text: 'time from waveform start (µs)' }, range: [series.cpStartUs, series.endUs] },
      // Symmetric about zero and rounded up to 1, 2, 2.5 or 5 × 10^k: the axis stays put while the peak moves a little.
      yaxis: { ...base.yaxis, title: { text: 'amplitude (formula scale)' }, range: symmetricRange(series.peak.magnitude) },
      shapes: [
        {
          type: 'rect',
          xref: 'x',
          yref: 'paper',
          x0: series.cpStartUs,
          x1: series.usefulStartUs,
          y0: 0,
          y1: 1,
          fillcolor: theme.cyclicPrefixFill,
          line: { width: 0 },
          layer: 'below',
        },
        {
          type: 'line',
          xref: 'x',
          yref: 'paper',
          x0: series.usefulStartUs,
          x1: series.usefulStartUs,
          y0: 0,
          y1: 1,
          line: { color: theme.boundary, width: 1.5, dash: 'dash' },
        },
      ],
      annotations: [
        {
          xref: 'x',
          yref: 'paper',
          x: series.usefulStartUs,
          y: 1,
          xanchor: 'right',
          yanchor: 'top',
          text: `CP ${series.cpLengthSamples} samples`,
          showarrow: false,
          font: { size: 11, color: theme.text },
        },
      ],
    },
  };
}
