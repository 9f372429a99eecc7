/**
 * Trace data for the receiver panel: RMS EVM per subcarrier and per OFDM symbol from the reference receiver, with the
 * standard's limit. Values come from src/dsp/receiver (measureEvm); NaN entries (no data there) are left as gaps.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { EvmData } from '../../worker/client';
import { baseLayout, type PlotTheme } from './plotTheme';

export function buildReceiverFigure(evm: EvmData, theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const subcarriers = evm.perSubcarrierPercent;
  const symbols = evm.perSymbolPercent;
  const data: Data[] = [];
  if (subcarriers.length > 0) {
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: 'per subcarrier',
      x: subcarriers.map((_, k) => k),
      y: subcarriers.map((v) => (Number.isFinite(v) ? v : null)),
      connectgaps: false,
      line: { color: theme.series[0] ?? theme.inPhase, width: 1.2 },
      hovertemplate: 'subcarrier %{x}: %{y:.3f} %<extra></extra>',
    });
  }
  data.push({
    type: 'bar',
    name: 'per symbol',
    x: symbols.map((_, l) => l),
    y: symbols.map((v) => (Number.isFinite(v) ? v : null)),
    xaxis: 'x2',
    yaxis: 'y2',
    marker: { color: theme.series[2] ?? theme.magnitude },
    hovertemplate: 'symbol %{x}: %{y:.3f} %<extra></extra>',
  } as Data);
  const limit = evm.evmLimitPercent;
  const shapes =
    limit === undefined
      ? []
      : (['y', 'y2'] as const).map((yref, i) => ({
          type: 'line' as const,
          xref: i === 0 ? ('x domain' as const) : ('x2 domain' as const),
          yref,
          x0: 0,
          x1: 1,
          y0: limit,
          y1: limit,
          line: { color: theme.limit, width: 1.2, dash: 'dash' as const },
        }));
  const rms = evm.evmRmsPercent;
  return {
    data,
    layout: {
      ...base,
      title: {
        text: `RMS EVM ${rms.toFixed(rms < 1 ? 3 : 2)} %${limit !== undefined ? ` (limit ${limit} %)` : ''}`,
        font: { size: 12 },
        x: 0,
        xanchor: 'left',
      },
      showlegend: false,
      grid: { rows: 1, columns: 2, pattern: 'independent' },
      xaxis: { ...base.xaxis, title: { text: 'subcarrier k' }, domain: [0, 0.62] },
      yaxis: { ...base.yaxis, title: { text: 'EVM (%)' }, rangemode: 'tozero' },
      xaxis2: { ...base.xaxis, title: { text: 'OFDM symbol l' }, domain: [0.7, 1], anchor: 'y2' },
      yaxis2: { ...base.yaxis, anchor: 'x2', rangemode: 'tozero' },
      shapes,
    },
  };
}
