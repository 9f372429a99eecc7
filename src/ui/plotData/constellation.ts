/**
 * Trace data for the constellation of one OFDM symbol's data symbols (before DFT spreading, so
 * DFT-s-OFDM shows its QAM points too). Copies values out of the engine's buffer; no DSP.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { EngineWaveform } from '../../worker/protocol';
import { baseLayout, type PlotTheme } from './plotTheme';
import { locateDataSymbols } from './symbolWindow';

export interface ConstellationSeries {
  symbolIndex: number;
  inPhase: Float64Array;
  quadrature: Float64Array;
  /** Largest |I| or |Q|, for a square, symmetric view. */
  maxAbsComponent: number;
}

export function prepareConstellation(
  waveform: Pick<EngineWaveform, 'dataSymbolsIq' | 'gridKinds' | 'numGridSubcarriers' | 'numSymbols'>,
  symbolIndex: number,
): ConstellationSeries {
  const { first, count } = locateDataSymbols(waveform, symbolIndex);
  const inPhase = new Float64Array(count);
  const quadrature = new Float64Array(count);
  let maxAbsComponent = 0;
  for (let i = 0; i < count; i++) {
    const re = waveform.dataSymbolsIq[2 * (first + i)] ?? Number.NaN;
    const im = waveform.dataSymbolsIq[2 * (first + i) + 1] ?? Number.NaN;
    inPhase[i] = re;
    quadrature[i] = im;
    maxAbsComponent = Math.max(maxAbsComponent, Math.abs(re), Math.abs(im));
  }
  return { symbolIndex, inPhase, quadrature, maxAbsComponent };
}

/** Received (equalised) points of symbol `symbolIndex` from the receiver's fill-order constellation, aligned with the ideal ones. */
export function prepareReceivedConstellation(
  receivedIq: Float64Array,
  waveform: Pick<EngineWaveform, 'gridKinds' | 'numGridSubcarriers' | 'numSymbols'>,
  symbolIndex: number,
): { inPhase: Float64Array; quadrature: Float64Array } | null {
  const { first, count } = locateDataSymbols(waveform, symbolIndex);
  if (2 * (first + count) > receivedIq.length) return null;
  const inPhase = new Float64Array(count);
  const quadrature = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    inPhase[i] = receivedIq[2 * (first + i)] ?? Number.NaN;
    quadrature[i] = receivedIq[2 * (first + i) + 1] ?? Number.NaN;
  }
  return { inPhase, quadrature };
}

/** Most received points drawn per symbol: every SVG marker costs drawing time, and a few hundred show the cloud. */
export const MAX_RECEIVED_POINTS = 480;

/** The distinct ideal points (rounded to 1e-9): at most the constellation's size, whatever the allocation. */
export function distinctIdealPoints(series: Pick<ConstellationSeries, 'inPhase' | 'quadrature'>): { inPhase: number[]; quadrature: number[] } {
  const seen = new Set<string>();
  const inPhase: number[] = [];
  const quadrature: number[] = [];
  for (let i = 0; i < series.inPhase.length; i++) {
    const re = series.inPhase[i] ?? 0;
    const im = series.quadrature[i] ?? 0;
    const key = `${re.toFixed(9)},${im.toFixed(9)}`;
    if (seen.has(key)) continue;
    seen.add(key);
    inPhase.push(re);
    quadrature.push(im);
  }
  return { inPhase, quadrature };
}

/** Every k-th point so that at most `max` remain (k = ⌈n/max⌉), keeping the order. */
export function everyKth(values: Float64Array, max: number): Float64Array {
  const k = Math.max(1, Math.ceil(values.length / max));
  if (k === 1) return values;
  return values.filter((_, i) => i % k === 0);
}

/** Counts distinct points (rounded to `decimals`), e.g. 4 for QPSK over enough symbols. */
export function countDistinctPoints(series: Pick<ConstellationSeries, 'inPhase' | 'quadrature'>, decimals = 6): number {
  const seen = new Set<string>();
  for (let i = 0; i < series.inPhase.length; i++) {
    seen.add(`${(series.inPhase[i] ?? 0).toFixed(decimals)},${(series.quadrature[i] ?? 0).toFixed(decimals)}`);
  }
  return seen.size;
}

export function buildConstellationFigure(
  series: ConstellationSeries,
  theme: PlotTheme,
  modulationLabel: string,
  received: { inPhase: Float64Array; quadrature: Float64Array; evmPercent: number } | null = null,
): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  let maxAbs = series.maxAbsComponent;
  if (received !== null) for (let i = 0; i < received.inPhase.length; i++) maxAbs = Math.max(maxAbs, Math.abs(received.inPhase[i] ?? 0), Math.abs(received.quadrature[i] ?? 0));
  // 15 % beyond the outermost point, rounded up to a tenth of the ideal outermost component so received noise
  // does not move the axes from one configuration to the next.
  const reach = Math.max(Math.min(maxAbs, 2 * series.maxAbsComponent), 1e-12) * 1.15;
  const grain = series.maxAbsComponent > 0 ? series.maxAbsComponent / 10 : reach / 10;
  const limit = Math.ceil(reach / grain - 1e-9) * grain;
  const ideal = distinctIdealPoints(series);
  const data: Data[] = [
    {
      type: 'scatter',
      mode: 'markers',
      name: 'ideal',
      x: ideal.inPhase,
      y: ideal.quadrature,
      marker: { color: theme.marker, size: 7, opacity: 0.9, symbol: 'cross-thin', line: { width: 2, color: theme.marker } },
      hovertemplate: 'ideal I %{x:.4f}<br>Q %{y:.4f}<extra></extra>',
    },
  ];
  // The EVM readout goes in the title, not the legend: the legend then never changes between configurations.
  let readout = '';
  if (received !== null) {
    const shown = everyKth(received.inPhase, MAX_RECEIVED_POINTS).length;
    // A no-break space keeps the value and its unit on one line when the caption wraps.
    readout = `; received EVM ${received.evmPercent.toFixed(received.evmPercent < 1 ? 3 : 2)}\u00a0%${shown < received.inPhase.length ? ` (${shown} of ${received.inPhase.length} shown)` : ''}`;
    data.push({
      type: 'scatter',
      mode: 'markers',
      name: 'received',
      x: everyKth(received.inPhase, MAX_RECEIVED_POINTS),
      y: everyKth(received.quadrature, MAX_RECEIVED_POINTS),
      marker: { color: theme.series[1] ?? theme.quadrature, size: 3.5, opacity: 0.55 },
      hovertemplate: 'received I %{x:.4f}<br>Q %{y:.4f}<extra></extra>',
    });
  }
  return {
    data,
    layout: {
      ...base,
      title: {
        text: `Symbol ${series.symbolIndex}: ${series.inPhase.length} ${modulationLabel} data symbols${readout}`,
        font: { size: 13 },
        x: 0,
        xanchor: 'left',
      },
      showlegend: received !== null,
      legend: { orientation: 'h', x: 0, xanchor: 'left', y: -0.16, yanchor: 'top' },
      margin: { ...base.margin, b: 70 },
      xaxis: { ...base.xaxis, title: { text: 'I' }, range: [-limit, limit], zeroline: true },
      yaxis: { ...base.yaxis, title: { text: 'Q' }, range: [-limit, limit], zeroline: true, scaleanchor: 'x', scaleratio: 1 },
    },
  };
}
