/**
 * Trace data for the back-off panel: EVM and ACLR of the amplified waveform against output back-off, the limits the
 * solver checks, and each scenario's answer (least OBO meeting every limit) as a vertical marker. Everything comes
 * from src/dsp/backoff's analysis; the helper only groups the two sides of each adjacent channel (worse side shown).
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { BackoffAnalysis } from '../../dsp/backoff/backoffAnalysis';
import { baseLayout, type PlotTheme } from './plotTheme';

type Shape = NonNullable<Layout['shapes']>[number];
type Annotation = NonNullable<Layout['annotations']>[number];

export interface BackoffSeries {
  name: string;
  colour: string;
  analysis: BackoffAnalysis;
  /** The configuration being edited: all channels drawn, solid. Pinned scenarios: EVM and their limiting channel. */
  current: boolean;
}

/** "eutraLower" → "eutra": the channel without its side. */
export const channelGroup = (key: string) => key.replace(/(Lower|Upper)$/, '');

const GROUP_LABELS: Record<string, string> = { eutra: 'E-UTRA ACLR1', eutra2: 'E-UTRA ACLR2', nr: 'NR ACLR1', nr2: 'NR ACLR2', utra1: 'UTRA ACLR1', utra2: 'UTRA ACLR2' };
export const groupLabel = (group: string) => GROUP_LABELS[group] ?? group;

/** Per channel group: the worse side's ACLR at each curve point, and the group's limit (the larger of the two sides'). */
export function aclrByGroup(analysis: BackoffAnalysis): Map<string, { aclrDb: number[]; limitDb: number | null }> {
  const groups = new Map<string, { aclrDb: number[]; limitDb: number | null }>();
  const keys = Object.keys(analysis.curve[0]?.aclrDb ?? {});
  for (const key of keys) {
    const g = channelGroup(key);
    const entry = groups.get(g) ?? { aclrDb: analysis.curve.map(() => Number.POSITIVE_INFINITY), limitDb: null };
    analysis.curve.forEach((point, i) => {
      entry.aclrDb[i] = Math.min(entry.aclrDb[i]!, point.aclrDb[key] ?? Number.POSITIVE_INFINITY);
    });
    const limit = analysis.limits.aclr[key]?.value;
    if (limit !== undefined) entry.limitDb = Math.max(entry.limitDb ?? -Infinity, limit);
    groups.set(g, entry);
  }
  return groups;
}

const DASHES = ['solid', 'dash', 'dot', 'dashdot', 'longdash', 'longdashdot'] as const;

export function buildBackoffFigure(series: readonly BackoffSeries[], theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const data: Data[] = [];
  const shapes: Shape[] = [];
  const annotations: Annotation[] = [];
  const current = series.find((s) => s.current) ?? series[0];
  series.forEach((s, index) => {
    const obo = s.analysis.curve.map((p) => p.oboDb);
    data.push({
      type: 'scatter',
      mode: 'lines+markers',
      name: `${s.name}: EVM`,
      legendgroup: s.name,
      x: obo,
      y: s.analysis.curve.map((p) => p.evmRmsPercent),
      line: { color: s.colour, width: s.current ? 2 : 1.4 },
      marker: { size: s.current ? 5 : 4 },
      hovertemplate: `${s.name}<br>OBO %{x:.2f} dB: EVM %{y:.2f} %<extra></extra>`,
    });
    const groups = aclrByGroup(s.analysis);
    const limiting = s.analysis.solution.limitingChannel === null ? null : channelGroup(s.analysis.solution.limitingChannel);
    [...groups.entries()].forEach(([group, values], g) => {
      if (!s.current && group !== (limiting ?? [...groups.keys()][0])) return;
      data.push({
        type: 'scatter',
        mode: 'lines',
        name: `${s.name}: ${groupLabel(group)}`,
        legendgroup: s.name,
        x: obo,
        y: values.aclrDb,
        yaxis: 'y2',
        line: { color: s.colour, width: s.current ? 1.6 : 1.2, dash: DASHES[g % DASHES.length] },
        hovertemplate: `${s.name}<br>${groupLabel(group)} at OBO %{x:.2f} dB: %{y:.1f} dB<extra></extra>`,
      });
    });
    const answer = s.analysis.requiredOboDb;
    if (answer !== null) {
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: answer, x1: answer, y0: 0, y1: 1, line: { color: s.colour, width: 1.5, dash: s.current ? 'solid' : 'dash' } });
      annotations.push({
        xref: 'x',
        yref: 'paper',
        x: answer,
        y: 1 - 0.07 * index,
        xanchor: 'left',
        yanchor: 'top',
        showarrow: false,
        text: ` ${answer.toFixed(2)} dB`,
        font: { size: 11, color: s.colour },
        bgcolor: theme.background,
      });
    }
  });
  if (current !== undefined) {
    const evmLimit = current.analysis.limits.evm?.value;
    if (evmLimit !== undefined) {
      shapes.push({ type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: evmLimit, y1: evmLimit, line: { color: theme.limit, width: 1.2, dash: 'dot' } });
      annotations.push({ xref: 'paper', yref: 'y', x: 1, y: evmLimit, xanchor: 'right', yanchor: 'bottom', showarrow: false, text: `EVM limit ${evmLimit} %`, font: { size: 10, color: theme.limit } });
    }
    const limits = new Set<number>();
    for (const { limitDb } of aclrByGroup(current.analysis).values()) if (limitDb !== null) limits.add(limitDb);
    for (const limit of limits) {
      shapes.push({ type: 'line', xref: 'paper', yref: 'y2', x0: 0, x1: 1, y0: limit, y1: limit, line: { color: theme.limit, width: 1, dash: 'dot' } });
      annotations.push({ xref: 'paper', yref: 'y2', x: 1, y: limit, xanchor: 'right', yanchor: 'bottom', showarrow: false, text: `ACLR limit ${limit} dB`, font: { size: 10, color: theme.limit } });
    }
  }
  const axisName = current?.analysis.axis === 'ibo' ? 'sweep on IBO; ' : '';
  return {
    data,
    layout: {
      ...base,
      title: {
        text: current === undefined ? '' : `${axisName}${current.analysis.amplifier}: ${current.analysis.solution.message}`,
        font: { size: 12 },
        x: 0,
        xanchor: 'left',
      },
      legend: { orientation: 'h', x: 0, xanchor: 'left', y: -0.18, yanchor: 'top' },
      margin: { ...base.margin, b: 96 },
      grid: { rows: 2, columns: 1, pattern: 'coupled', roworder: 'top to bottom' },
      xaxis: { ...base.xaxis, title: { text: 'output back-off OBO (dB)' } },
      yaxis: { ...base.yaxis, title: { text: 'EVM (%)' }, domain: [0.55, 1], rangemode: 'tozero' },
      yaxis2: { ...base.yaxis, title: { text: 'ACLR (dB)' }, domain: [0, 0.45] },
      shapes,
      annotations,
    },
  };
}
