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
): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const limit = Math.max(series.maxAbsComponent, 1e-12) * 1.2;
  return {
    data: [
      {
        type: 'scatter',
        mode: 'markers',
        name: 'data symbols',
        x: series.inPhase,
        y: series.quadrature,
        marker: { color: theme.marker, size: 5, opacity: 0.75 },
        hovertemplate: 'I %{x:.4f}<br>Q %{y:.4f}<extra></extra>',
      },
    ],
    layout: {
      ...base,
      title: {
        text: `Symbol ${series.symbolIndex}: ${series.inPhase.length} ${modulationLabel} data symbols`,
        font: { size: 13 },
        x: 0,
        xanchor: 'left',
      },
      showlegend: false,
      xaxis: { ...base.xaxis, title: { text: 'I' }, range: [-limit, limit], zeroline: true },
      yaxis: { ...base.yaxis, title: { text: 'Q' }, range: [-limit, limit], zeroline: true, scaleanchor: 'x', scaleratio: 1 },
    },
  };
}
