/**
 * Colours and axis styling for Plotly figures, one set per colour scheme. Pure data, so figure
 * builders stay testable; the palette is our own (checked for contrast on both backgrounds).
 */
import type { Layout } from 'plotly.js-dist-min';

export type ColorScheme = 'light' | 'dark';

export interface PlotTheme {
  scheme: ColorScheme;
  background: string;
  text: string;
  grid: string;
  zeroLine: string;
  inPhase: string;
  quadrature: string;
  magnitude: string;
  marker: string;
  cyclicPrefixFill: string;
  boundary: string;
  peak: string;
  /** Resource-grid kinds: empty, data, reference (our own scheme, distinct for common colour-vision deficiencies). */
  gridEmpty: string;
  gridData: string;
  gridReference: string;
  /** Colours for overlaid scenarios and curves, in order. */
  series: readonly string[];
  /** Fill of a confidence band, shaded measurement band, limit line. */
  band: string;
  /** A second band fill (UTRA channels beside the same-standard ones). */
  bandAlt: string;
  limit: string;
}

export const plotThemes: Record<ColorScheme, PlotTheme> = {
  light: {
    scheme: 'light',
    background: '#ffffff',
    text: '#1c2430',
    grid: '#e3e7ee',
    zeroLine: '#b7c0cc',
    inPhase: '#1f5fbf',
    quadrature: '#c2571a',
    magnitude: '#2c7a3f',
    marker: '#5a2ca0',
    cyclicPrefixFill: 'rgba(120, 130, 150, 0.16)',
    boundary: '#6b7280',
    peak: '#b4162c',
    gridEmpty: '#eef1f5',
    gridData: '#2f6fd0',
    gridReference: '#e0a21b',
    series: ['#1f5fbf', '#c2571a', '#2c7a3f', '#8a3ab9', '#b4162c', '#0f8a8f'],
    band: 'rgba(31, 95, 191, 0.14)',
    bandAlt: 'rgba(194, 87, 26, 0.12)',
    limit: '#b4162c',
  },
  dark: {
    scheme: 'dark',
    background: '#161b22',
    text: '#dde3ea',
    grid: '#2d3540',
    zeroLine: '#4a5563',
    inPhase: '#6ea8ff',
    quadrature: '#ffa25c',
    magnitude: '#67d37f',
    marker: '#c8a6ff',
    cyclicPrefixFill: 'rgba(160, 170, 190, 0.16)',
    boundary: '#9aa4b2',
    peak: '#ff6b7d',
    gridEmpty: '#202833',
    gridData: '#5d95ea',
    gridReference: '#f2c14e',
    series: ['#6ea8ff', '#ffa25c', '#67d37f', '#c8a6ff', '#ff6b7d', '#4fd1d6'],
    band: 'rgba(110, 168, 255, 0.18)',
    bandAlt: 'rgba(255, 162, 92, 0.14)',
    limit: '#ff6b7d',
  },
};

/** Layout pieces every Crestline figure shares (fonts, colours, margins, legend on top). */
export function baseLayout(theme: PlotTheme): Partial<Layout> {
  const axis = { gridcolor: theme.grid, zerolinecolor: theme.zeroLine, linecolor: theme.grid, automargin: true };
  return {
    paper_bgcolor: theme.background,
    plot_bgcolor: theme.background,
    font: { color: theme.text, size: 12, family: 'system-ui, sans-serif' },
    margin: { l: 56, r: 16, t: 40, b: 48 },
    // Title on the left, legend on the right of the same band above the plot, so they never overlap.
    legend: { orientation: 'h', x: 1, xanchor: 'right', y: 1.02, yanchor: 'bottom' },
    xaxis: { ...axis },
    yaxis: { ...axis },
    hovermode: 'closest',
  };
}
