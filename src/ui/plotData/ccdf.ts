/**
 * Trace data for the CCDF panel: the measurement engine's empirical CCDF (instantaneous power over the mean, or
 * per-symbol PAPR over the run's mean power) on a log-probability axis, its 95 % intervals at the reported
 * probabilities as a shaded band with error bars, the OFDM theory, and the pinned scenarios overlaid. Curves are
 * thinned for drawing; every number is the engine's.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { CcdfResult } from '../../worker/client';
import { baseLayout, type PlotTheme } from './plotTheme';

export type CcdfStatistic = 'power' | 'papr';

/** Most points drawn per curve. */
export const MAX_CCDF_POINTS = 600;
/** Lowest probability on the axis. */
export const MIN_PROBABILITY = 1e-6;

const LEVEL_KEYS = ['1e-1', '1e-2', '1e-3', '1e-4', '1e-5'] as const;

/** Every k-th point of a curve (k chosen so at most `max` remain), keeping the last; zero probabilities dropped (log axis). */
export function thinCurve(thresholdDb: Float64Array, probability: Float64Array, max = MAX_CCDF_POINTS): { x: number[]; y: number[] } {
  const keep: number[] = [];
  for (let i = 0; i < probability.length; i++) if ((probability[i] ?? 0) > 0) keep.push(i);
  const k = Math.max(1, Math.ceil(keep.length / max));
  const x: number[] = [];
  const y: number[] = [];
  keep.forEach((index, j) => {
    if (j % k === 0 || j === keep.length - 1) {
      x.push(thresholdDb[index] ?? Number.NaN);
      y.push(probability[index] ?? Number.NaN);
    }
  });
  return { x, y };
}

/** The engine's levels and 95 % intervals of one statistic, where the run could report them. */
export function levelPoints(result: CcdfResult, statistic: CcdfStatistic): { probability: number; levelDb: number; lowDb: number | null; highDb: number | null }[] {
  const levels = statistic === 'power' ? result.report.ccdfDb : result.report.paprRunMeanDb;
  const intervals = statistic === 'power' ? result.report.ccdfCi95Db : result.report.paprRunMeanCi95Db;
  return LEVEL_KEYS.flatMap((key) => {
    const levelDb = levels[key];
    if (levelDb === null || levelDb === undefined) return [];
    const ci = intervals[key];
    return [{ probability: Number(key), levelDb, lowDb: ci?.[0] ?? null, highDb: ci?.[1] ?? null }];
  });
}

export interface CcdfSeries {
  name: string;
  colour: string;
  result: CcdfResult;
}

export interface CcdfFigureInput {
  statistic: CcdfStatistic;
  current: CcdfSeries;
  /** What the current curve is: "quick" (one block) or the long run's progress. */
  note: string;
  overlays: readonly CcdfSeries[];
}

export function buildCcdfFigure(input: CcdfFigureInput, theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const { statistic, current } = input;
  const curveOf = (r: CcdfResult) => (statistic === 'power' ? r.curves.power : r.curves.paprRunMean);
  const data: Data[] = [];

  if (statistic === 'power') {
    const t = thinCurve(current.result.theory.power.thresholdDb, current.result.theory.power.probability);
    data.push({ type: 'scatter', mode: 'lines', name: 'theory: complex Gaussian, e^−γ', x: t.x, y: t.y, line: { color: theme.boundary, width: 1.2, dash: 'dash' }, hoverinfo: 'skip' });
  } else {
    const n = current.result.report.theory.numSubcarriers;
    for (const [curve, label, dash] of [
      [current.result.theory.paprNyquist, `OFDM theory, N = ${n}, α = 1`, 'dash'],
      [current.result.theory.paprOversampled, `OFDM theory, N = ${n}, α = 2.8`, 'dot'],
    ] as const) {
      const t = thinCurve(curve.thresholdDb, curve.probability);
      data.push({ type: 'scatter', mode: 'lines', name: label, x: t.x, y: t.y, line: { color: theme.boundary, width: 1.2, dash }, hoverinfo: 'skip' });
    }
  }

  for (const overlay of input.overlays) {
    const c = thinCurve(curveOf(overlay.result).thresholdDb, curveOf(overlay.result).probability);
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: overlay.name,
      x: c.x,
      y: c.y,
      line: { color: overlay.colour, width: 1.4, dash: 'dot' },
      hovertemplate: `${overlay.name}<br>%{x:.2f} dB: %{y:.2e}<extra></extra>`,
    });
  }

  const points = levelPoints(current.result, statistic).filter((p) => p.lowDb !== null && p.highDb !== null);
  if (points.length >= 2) {
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: '95 % interval',
      x: [...points.map((p) => p.lowDb as number), ...[...points].reverse().map((p) => p.highDb as number)],
      y: [...points.map((p) => p.probability), ...[...points].reverse().map((p) => p.probability)],
      fill: 'toself',
      fillcolor: theme.band,
      line: { width: 0 },
      hoverinfo: 'skip',
    });
  }
  const c = thinCurve(curveOf(current.result).thresholdDb, curveOf(current.result).probability);
  data.push({
    type: 'scatter',
    mode: 'lines',
    name: current.name,
    x: c.x,
    y: c.y,
    line: { color: current.colour, width: 2 },
    hovertemplate: `${current.name}<br>%{x:.2f} dB: %{y:.2e}<extra></extra>`,
  });
  const all = levelPoints(current.result, statistic);
  if (all.length > 0) {
    data.push({
      type: 'scatter',
      mode: 'markers',
      name: 'levels (95 % interval)',
      x: all.map((p) => p.levelDb),
      y: all.map((p) => p.probability),
      marker: { color: current.colour, size: 7, symbol: 'circle-open', line: { width: 1.6 } },
      error_x: {
        type: 'data',
        symmetric: false,
        array: all.map((p) => (p.highDb === null ? 0 : p.highDb - p.levelDb)),
        arrayminus: all.map((p) => (p.lowDb === null ? 0 : p.levelDb - p.lowDb)),
        color: current.colour,
        thickness: 1.2,
        width: 4,
      },
      hovertemplate: 'P = %{y:.0e}: %{x:.2f} dB<extra></extra>',
    } as Data);
  }
  const r = current.result.report;
  return {
    data,
    layout: {
      ...base,
      title: {
        text: `${input.note}; ${r.symbols.toLocaleString('en')} symbols at ${r.oversampling}×, ${r.precision}, seed ${r.runSeed}; CM ${r.cubicMetricDb.toFixed(2)} dB`,
        font: { size: 12 },
        x: 0,
        xanchor: 'left',
      },
      legend: { orientation: 'h', x: 0, xanchor: 'left', y: -0.2, yanchor: 'top' },
      margin: { ...base.margin, b: 86 },
      xaxis: {
        ...base.xaxis,
        title: { text: statistic === 'power' ? 'instantaneous power over the mean (dB)' : 'symbol PAPR: peak over the run’s mean power (dB)' },
        range: statistic === 'power' ? [0, 13] : [2, 14],
      },
      yaxis: {
        ...base.yaxis,
        type: 'log',
        title: { text: statistic === 'power' ? 'P(|x|²/P̄ > x)' : 'P(PAPR > x)' },
        range: [Math.log10(MIN_PROBABILITY), 0],
        exponentformat: 'power',
        dtick: 1,
      },
    },
  };
}
