/**
 * Trace data for the spectrum panel: the engine's Welch PSD shown relative to the assigned-channel power (dBc in one
 * RBW, what an analyser set to that RBW reads), the ACLR measurement channels shaded with their values, and the 99 %
 * occupied bandwidth marked. Unit conversion and thinning only; the PSD, ACLR and OBW come from src/dsp/metrics.
 */
import type { Data, Layout } from 'plotly.js-dist-min';

type Shape = NonNullable<Layout['shapes']>[number];
type Annotation = NonNullable<Layout['annotations']>[number];
import type { SpectrumData } from '../../worker/client';
import { baseLayout, type PlotTheme } from './plotTheme';

/** Most points per trace; longer spectra keep each group's maximum (peak hold), so spurs and edges stay visible. */
export const MAX_SPECTRUM_POINTS = 1200;

export interface SpectrumLine {
  frequencyMHz: Float64Array;
  /** 10·log10(PSD·RBW / assigned-channel power), dB. */
  levelDbc: Float64Array;
}

/** The PSD in dBc per RBW against frequency in MHz, peak-held down to at most `maxPoints`. */
export function spectrumLine(spectrum: SpectrumData, maxPoints = MAX_SPECTRUM_POINTS): SpectrumLine {
  const n = spectrum.psdPerHz.length;
  const group = Math.max(1, Math.ceil(n / maxPoints));
  const m = Math.ceil(n / group);
  const frequencyMHz = new Float64Array(m);
  const levelDbc = new Float64Array(m);
  const reference = spectrum.aclr.assignedPower;
  for (let j = 0; j < m; j++) {
    let peak = 0;
    let at = j * group;
    for (let i = j * group; i < Math.min(n, (j + 1) * group); i++) {
      const p = spectrum.psdPerHz[i] ?? 0;
      if (p > peak) {
        peak = p;
        at = i;
      }
    }
    frequencyMHz[j] = (spectrum.frequenciesHz[at] ?? 0) / 1e6;
    levelDbc[j] = peak > 0 && reference > 0 ? 10 * Math.log10((peak * spectrum.rbwHz) / reference) : Number.NaN;
  }
  return { frequencyMHz, levelDbc };
}

export interface SpectrumOverlay {
  name: string;
  colour: string;
  spectrum: SpectrumData;
}

export interface SpectrumFigureInput {
  /** What the configuration transmits (the chain's output when there is one). */
  primary: SpectrumData;
  /** The generated waveform, shown thin beside the transmitted one when they differ. */
  generated: SpectrumData | null;
  overlays: readonly SpectrumOverlay[];
  label: string;
  /** Colour of the configuration being edited (default the text colour). */
  colour?: string;
}

const fmtDb = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : '∞');

export function buildSpectrumFigure(input: SpectrumFigureInput, theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const { primary } = input;
  const line = (name: string, s: SpectrumData, colour: string, width: number, dash: 'solid' | 'dot' = 'solid'): Data => {
    const { frequencyMHz, levelDbc } = spectrumLine(s);
    return {
      type: 'scatter',
      mode: 'lines',
      name,
      x: frequencyMHz,
      y: levelDbc,
      line: { color: colour, width, dash },
      hovertemplate: `${name}<br>%{x:.3f} MHz: %{y:.1f} dBc<extra></extra>`,
    };
  };
  const data: Data[] = [];
  for (const overlay of input.overlays) data.push(line(overlay.name, overlay.spectrum, overlay.colour, 1.1, 'dot'));
  if (input.generated !== null) data.push(line('as generated', input.generated, theme.boundary, 1));
  data.push(line(input.label, primary, input.colour ?? theme.text, 1.6));

  const shapes: Shape[] = [];
  const annotations: Annotation[] = [];
  const aclrByKey = new Map(primary.aclr.values.map((v) => [v.key, v]));
  for (const band of primary.bands) {
    const assigned = band.key === 'assigned';
    const x0 = (band.centreHz - band.widthHz / 2) / 1e6;
    const x1 = (band.centreHz + band.widthHz / 2) / 1e6;
    shapes.push({
      type: 'rect',
      xref: 'x',
      yref: 'paper',
      x0,
      x1,
      y0: 0,
      y1: 1,
      fillcolor: assigned ? theme.cyclicPrefixFill : band.key.startsWith('utra') ? theme.bandAlt : theme.band,
      line: { width: 0 },
      layer: 'below',
    });
    const value = aclrByKey.get(band.key);
    annotations.push({
      xref: 'x',
      yref: 'paper',
      x: band.centreHz / 1e6,
      y: assigned ? 1 : band.key.startsWith('utra1') ? 0.86 : band.key.startsWith('utra2') ? 0.74 : 0.98,
      yanchor: 'top',
      showarrow: false,
      text: assigned ? 'assigned' : `${band.label.replace(/ [−+]$/, '')}<br>${fmtDb(value?.aclrDb ?? Number.NaN)} dB`,
      font: { size: 10, color: theme.text },
    });
  }
  const obw = primary.occupiedBandwidth;
  for (const edge of [obw.lowerHz, obw.upperHz]) {
    shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: edge / 1e6, x1: edge / 1e6, y0: 0, y1: 0.8, line: { color: theme.peak, width: 1, dash: 'dot' } });
  }
  annotations.push({
    xref: 'x',
    yref: 'paper',
    x: obw.upperHz / 1e6,
    y: 0.5,
    xanchor: 'left',
    showarrow: false,
    text: ` 99 % OBW ${(obw.occupiedBandwidthHz / 1e6).toFixed(2)} MHz`,
    font: { size: 10, color: theme.peak },
  });
  let lowest = 0;
  for (const v of spectrumLine(primary).levelDbc) if (Number.isFinite(v) && v < lowest) lowest = v;
  const floorDb = Math.max(-150, Math.floor((lowest - 5) / 10) * 10);
  const spanMHz = Math.max(...primary.bands.map((b) => Math.abs(b.centreHz) + b.widthHz / 2)) / 1e6;
  return {
    data,
    layout: {
      ...base,
      title: {
        text: `${(primary.rbwHz / 1e3).toFixed(1)} kHz RBW, ${primary.window}, ${primary.numSegments} segments, ${primary.symbols} symbols at ${primary.oversampling}×`,
        font: { size: 12 },
        x: 0,
        xanchor: 'left',
      },
      legend: { orientation: 'h', x: 0, xanchor: 'left', y: -0.2, yanchor: 'top' },
      margin: { ...base.margin, b: 80 },
      xaxis: { ...base.xaxis, title: { text: 'frequency offset (MHz)' }, range: [-spanMHz * 1.05, spanMHz * 1.05] },
      yaxis: { ...base.yaxis, title: { text: `dBc in ${(primary.rbwHz / 1e3).toFixed(1)} kHz` }, range: [floorDb, 5] },
      shapes,
      annotations,
    },
  };
}
