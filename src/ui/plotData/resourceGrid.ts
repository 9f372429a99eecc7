/**
 * Heatmap of the resource grid: OFDM symbols × subcarriers, each resource element coloured by its
 * kind (empty, data, reference) from the engine's gridKinds. Copies and thins values; no DSP.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import { GRID_KIND, type EngineWaveform } from '../../worker/protocol';
import { baseLayout, type PlotTheme } from './plotTheme';

/** Symbols drawn at most (two LTE subframes / NR slots at 15 kHz); the rest repeat the pattern. */
export const MAX_GRID_SYMBOLS = 28;

export interface ResourceGridSeries {
  /** z[l][k] = kind of resource element k of symbol l (GRID_KIND values). */
  kinds: number[][];
  numSymbolsShown: number;
  numSymbolsTotal: number;
  numSubcarriers: number;
  counts: { empty: number; data: number; reference: number };
}

export function prepareResourceGrid(
  waveform: Pick<EngineWaveform, 'gridKinds' | 'numGridSubcarriers' | 'numSymbols'>,
  maxSymbols = MAX_GRID_SYMBOLS,
): ResourceGridSeries {
  const k = waveform.numGridSubcarriers;
  const shown = Math.min(waveform.numSymbols, maxSymbols);
  const kinds: number[][] = [];
  const counts = { empty: 0, data: 0, reference: 0 };
  for (let l = 0; l < shown; l++) {
    const row = Array.from(waveform.gridKinds.subarray(l * k, (l + 1) * k));
    for (const kind of row) {
      if (kind === GRID_KIND.data) counts.data += 1;
      else if (kind === GRID_KIND.reference) counts.reference += 1;
      else counts.empty += 1;
    }
    kinds.push(row);
  }
  return { kinds, numSymbolsShown: shown, numSymbolsTotal: waveform.numSymbols, numSubcarriers: k, counts };
}

export function buildResourceGridFigure(series: ResourceGridSeries, theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  // A stepped colour scale over kinds 0, 1, 2 (zmin −0.5 … zmax 2.5): each kind gets one flat colour.
  const colorscale: [number, string][] = [
    [0, theme.gridEmpty],
    [1 / 3, theme.gridEmpty],
    [1 / 3, theme.gridData],
    [2 / 3, theme.gridData],
    [2 / 3, theme.gridReference],
    [1, theme.gridReference],
  ];
  const kindNames = ['empty', 'data', 'reference'];
  const text = series.kinds.map((row) => row.map((kind) => kindNames[kind] ?? 'unknown'));
  const shownNote =
    series.numSymbolsShown < series.numSymbolsTotal ? ` (first ${series.numSymbolsShown} of ${series.numSymbolsTotal} symbols)` : '';
  return {
    data: [
      {
        type: 'heatmap',
        z: series.kinds,
        text,
        zmin: -0.5,
        zmax: 2.5,
        colorscale,
        xgap: 0,
        ygap: 1,
        colorbar: {
          tickvals: [0, 1, 2],
          ticktext: ['empty', 'data', 'reference'],
          thickness: 12,
          len: 0.9,
          outlinewidth: 0,
          tickfont: { color: theme.text },
        },
        hovertemplate: 'symbol %{y}<br>subcarrier %{x} (RB %{customdata})<br>%{text}<extra></extra>',
        customdata: series.kinds.map((row) => row.map((_, k) => Math.floor(k / 12))),
      } as Data,
    ],
    layout: {
      ...base,
      title: {
        text: `Resource grid: ${series.counts.data.toLocaleString('en')} data, ${series.counts.reference.toLocaleString('en')} reference REs${shownNote}`,
        font: { size: 13 },
        x: 0,
        xanchor: 'left',
      },
      showlegend: false,
      xaxis: { ...base.xaxis, title: { text: 'subcarrier k (12 per RB)' }, range: [-0.5, series.numSubcarriers - 0.5] },
      yaxis: { ...base.yaxis, title: { text: 'OFDM symbol l' }, autorange: 'reversed' },
    },
  };
}
