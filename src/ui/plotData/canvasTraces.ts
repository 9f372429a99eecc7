/**
 * Splits a prepared Plotly figure for the canvas drawing layer (src/ui/plots/canvasLayer.ts): Plotly keeps the frame
 * — axes, title, legend, shapes, annotations — and every scatter and bar trace is drawn on a canvas above the plot
 * area instead. Plotly redraws its frame only when the frame changes, so a new configuration whose data changed but
 * whose axes did not costs a canvas redraw (about a millisecond) instead of a full Plotly replot (tens of ms).
 *
 * Shapes (rectangles, lines) and plain text annotations go to the canvas too, and the title becomes a caption the
 * page shows above the plot: values in them change with every configuration, and each such change would otherwise
 * cost a Plotly relayout. What remains with Plotly — axes, legend, margins — changes only when an axis range does.
 *
 * Pure: no DOM. The legend still comes from Plotly: each canvas trace leaves behind a "proxy" trace with the same
 * name and style and no points (its x and y are one shared empty array, so Plotly sees no data change). Axes the
 * canvas draws on need explicit ranges; where the figure leaves one to autorange, it is computed here from the data
 * (Plotly's rule: 5 % padding, "tozero" honoured, shapes on the axis included) and rounded to a nice number so it
 * stays put while values wander.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import { barWidth, textLines } from './canvasGeometry';

export type MarkerSymbol = 'circle' | 'circle-open' | 'square' | 'diamond' | 'cross-thin' | 'x-thin';

export interface CanvasTrace {
  /** Index of the trace (and of its legend proxy) in the figure's data. */
  traceIndex: number;
  name: string;
  kind: 'scatter' | 'bar';
  x: ArrayLike<number | null>;
  y: ArrayLike<number | null>;
  /** Layout keys of its axes: "xaxis", "xaxis2", "yaxis", … */
  xAxis: string;
  yAxis: string;
  line: { color: string; widthPx: number; dash: DashName } | null;
  marker: { color: string; sizePx: number; symbol: MarkerSymbol; opacity: number; lineWidthPx: number } | null;
  /** Closed polygon through the points, filled. */
  fillColor: string | null;
  connectGaps: boolean;
  /** Horizontal error bars: +array / −arrayminus in x units. */
  errorX: { plus: ArrayLike<number>; minus: ArrayLike<number>; color: string; thicknessPx: number; capPx: number } | null;
  /** Plotly hover template; null when the trace takes no hover. */
  hoverTemplate: string | null;
  /** Bar width in x units (80 % of the closest spacing, Plotly's default gap); 0 for scatter traces. */
  barWidth: number;
}

export type DashName = 'solid' | 'dot' | 'dash' | 'longdash' | 'dashdot' | 'longdashdot';

/** Where a shape or annotation coordinate is measured: an axis's data, an axis's domain (0…1), or the plot area. */
export type CanvasRef = { space: 'data' | 'domain'; axis: string } | { space: 'paper' };

export interface CanvasShape {
  kind: 'rect' | 'line';
  xRef: CanvasRef;
  yRef: CanvasRef;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  fillColor: string | null;
  line: { color: string; widthPx: number; dash: DashName } | null;
  /** Drawn under the traces (Plotly's layer "below"). */
  below: boolean;
}

export interface CanvasAnnotation {
  lines: string[];
  xRef: CanvasRef;
  yRef: CanvasRef;
  x: number;
  y: number;
  xAnchor: 'left' | 'center' | 'right';
  yAnchor: 'top' | 'middle' | 'bottom';
  fontPx: number;
  color: string;
}

/** Everything the canvas layer draws for one figure. */
export interface CanvasScene {
  traces: CanvasTrace[];
  shapes: CanvasShape[];
  annotations: CanvasAnnotation[];
}

export interface CanvasSplit extends CanvasScene {
  /** What Plotly draws: traces it must draw itself, and an empty legend proxy for each canvas trace. */
  plotlyData: Data[];
  /** The figure's layout with explicit ranges on every axis the canvas uses, without the title and the moved shapes and annotations. */
  layout: Partial<Layout>;
  /** The title as plain text (shown above the plot by the page), '' when there is none. */
  caption: string;
  /** Font size of the title, px. */
  captionPx: number;
  /** The legend shares the title's band on the right (horizontal legend above the plot): the caption keeps clear of it. */
  legendBesideCaption: boolean;
}

/** One shared empty point list: Plotly compares data arrays by reference, so proxies never look like new data. */
const NO_POINTS: readonly null[] = Object.freeze([null]);

const SYMBOLS: readonly MarkerSymbol[] = ['circle', 'circle-open', 'square', 'diamond', 'cross-thin', 'x-thin'];
const DASHES: readonly DashName[] = ['solid', 'dot', 'dash', 'longdash', 'dashdot', 'longdashdot'];

type Loose = Record<string, unknown>;
const obj = (v: unknown): Loose => (v !== null && typeof v === 'object' ? (v as Loose) : {});
const str = (v: unknown, fallback: string): string => (typeof v === 'string' ? v : fallback);
const num = (v: unknown, fallback: number): number => (typeof v === 'number' && Number.isFinite(v) ? v : fallback);
const isArrayLike = (v: unknown): v is ArrayLike<number | null> => Array.isArray(v) || (ArrayBuffer.isView(v) && !(v instanceof DataView));

/** Plotly's axis key for a trace's "x2" / "y" reference. */
export function axisKey(ref: unknown, letter: 'x' | 'y'): string {
  const id = typeof ref === 'string' && ref.startsWith(letter) ? ref.slice(1) : '';
  return `${letter}axis${id === '1' ? '' : id}`;
}

/**
 * Whether the canvas can draw this trace as Plotly would. Anything else (heatmaps, text, other fills, symbols we do
 * not draw) stays with Plotly.
 */
export function canvasDrawable(trace: Data): boolean {
  const t = trace as Loose;
  const type = t.type ?? 'scatter';
  if (!isArrayLike(t.x) || !isArrayLike(t.y)) return false;
  if (t.visible === false) return false;
  if (type === 'bar') return t.orientation === undefined || t.orientation === 'v';
  if (type !== 'scatter') return false;
  const mode = str(t.mode, 'lines');
  if (!/^(lines|markers|lines\+markers|markers\+lines)$/.test(mode)) return false;
  if (t.fill !== undefined && t.fill !== 'none' && t.fill !== 'toself') return false;
  const symbol = obj(t.marker).symbol;
  if (symbol !== undefined && !SYMBOLS.includes(symbol as MarkerSymbol)) return false;
  const dash = obj(t.line).dash;
  if (dash !== undefined && !DASHES.includes(dash as DashName)) return false;
  const err = obj(t.error_x);
  if (t.error_x !== undefined && (err.type !== 'data' || !isArrayLike(err.array))) return false;
  return t.error_y === undefined;
}

function toCanvasTrace(trace: Data, traceIndex: number, fallbackColour: string): CanvasTrace {
  const t = trace as Loose;
  const kind = t.type === 'bar' ? 'bar' : 'scatter';
  const mode = kind === 'bar' ? 'markers' : str(t.mode, 'lines');
  const line = obj(t.line);
  const marker = obj(t.marker);
  const markerLine = obj(marker.line);
  const lineWidth = num(line.width, 2);
  const err = obj(t.error_x);
  const hoverinfo = t.hoverinfo;
  return {
    traceIndex,
    name: str(t.name, `trace ${traceIndex}`),
    kind,
    x: t.x as ArrayLike<number | null>,
    y: t.y as ArrayLike<number | null>,
    xAxis: axisKey(t.xaxis, 'x'),
    yAxis: axisKey(t.yaxis, 'y'),
    line: mode.includes('lines') && lineWidth > 0 ? { color: str(line.color, fallbackColour), widthPx: lineWidth, dash: (line.dash as DashName | undefined) ?? 'solid' } : null,
    marker:
      kind === 'bar' || mode.includes('markers')
        ? {
            color: str(marker.color, fallbackColour),
            sizePx: num(marker.size, 6),
            symbol: (marker.symbol as MarkerSymbol | undefined) ?? 'circle',
            opacity: num(marker.opacity, 1),
            lineWidthPx: num(markerLine.width, 1),
          }
        : null,
    fillColor: t.fill === 'toself' ? str(t.fillcolor, fallbackColour) : null,
    connectGaps: t.connectgaps === true,
    errorX:
      t.error_x === undefined
        ? null
        : {
            plus: err.array as ArrayLike<number>,
            minus: isArrayLike(err.arrayminus) && err.symmetric === false ? (err.arrayminus as ArrayLike<number>) : (err.array as ArrayLike<number>),
            color: str(err.color, fallbackColour),
            thicknessPx: num(err.thickness, 2),
            capPx: num(err.width, 4),
          },
    hoverTemplate: hoverinfo === 'skip' || hoverinfo === 'none' ? null : str(t.hovertemplate, `${str(t.name, '')}<br>%{x}: %{y}`),
    barWidth: kind === 'bar' ? barWidth(t.x as ArrayLike<number | null>) : 0,
  };
}

/** The legend entry a canvas trace leaves in Plotly: same name and style, no points, no hover. */
function legendProxy(trace: Data): Data {
  const { x: _x, y: _y, error_x: _e, hovertemplate: _h, ...style } = trace as Loose;
  return { ...style, x: NO_POINTS, y: NO_POINTS, hoverinfo: 'skip' } as unknown as Data;
}

/** Smallest of 1, 2, 2.5, 5 × 10^k that is ≥ v (v > 0). */
export function niceCeil(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return v;
  const decade = 10 ** Math.floor(Math.log10(v));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * decade >= v * (1 - 1e-12)) return m * decade;
  return 10 * decade;
}

export interface AutoRangeOptions {
  /** Keep zero in the range (Plotly's rangemode "tozero"). */
  toZero: boolean;
  /** A log axis: the range comes back in log10 units, whole decades. */
  log: boolean;
  /** 5 % padding each side (Plotly pads where markers or a value axis are drawn; line traces run edge to edge in x). */
  pad: boolean;
  /** Round outward to nice numbers, so the axis stays put while the values move a little. */
  round: boolean;
}

/** The range Plotly would pick for these values (see AutoRangeOptions). */
export function autoRange(values: Iterable<number>, options: AutoRangeOptions): [number, number] {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const raw of values) {
    if (!Number.isFinite(raw)) continue;
    if (options.log && raw <= 0) continue;
    const v = options.log ? Math.log10(raw) : raw;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo > hi) return [0, 1];
  if (options.log) return [Math.floor(lo), Math.ceil(hi === lo ? hi + 1 : hi)];
  if (options.toZero) {
    lo = Math.min(lo, 0);
    hi = Math.max(hi, 0);
  }
  const span = hi - lo || Math.abs(hi) || 1;
  const padding = options.pad ? 0.05 * span : 0;
  const lower = options.toZero && lo === 0 ? 0 : lo - padding;
  const upper = options.toZero && hi === 0 ? 0 : hi + padding;
  if (!options.round) return lower === upper ? [lower - 1, upper + 1] : [lower, upper];
  if (lower === 0) return [0, niceCeil(upper)];
  if (upper === 0) return [-niceCeil(-lower), 0];
  const step = niceCeil(span) / 20;
  return [Math.floor(lower / step) * step, Math.ceil(upper / step) * step];
}

function* traceValues(trace: CanvasTrace, axis: 'x' | 'y'): Generator<number> {
  const values = axis === 'x' ? trace.x : trace.y;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null || v === undefined) continue;
    if (axis === 'x' && trace.errorX !== null) {
      yield v + (trace.errorX.plus[i] ?? 0);
      yield v - (trace.errorX.minus[i] ?? 0);
    } else if (axis === 'x' && trace.kind === 'bar') {
      yield v - trace.barWidth / 2;
      yield v + trace.barWidth / 2;
    } else yield v;
  }
  if (trace.kind === 'bar' && axis === 'y') yield 0;
}

function* shapeValues(layout: Partial<Layout>, key: string): Generator<number> {
  const letter = key[0] as 'x' | 'y';
  const ref = `${letter}${key.slice(5)}`;
  for (const shape of (layout.shapes ?? []) as Loose[]) {
    if (shape[`${letter}ref`] !== ref) continue;
    for (const end of ['0', '1']) {
      const v = shape[`${letter}${end}`];
      if (typeof v === 'number') yield v;
    }
  }
}

/** Parses Plotly's "x", "x2", "x domain", "paper" references; null for what the canvas does not place. */
export function parseRef(ref: unknown, letter: 'x' | 'y'): CanvasRef | null {
  const text = ref === undefined ? letter : ref;
  if (text === 'paper') return { space: 'paper' };
  if (typeof text !== 'string') return null;
  const match = new RegExp(`^${letter}(\\d*)( domain)?$`).exec(text);
  if (match === null) return null;
  return { space: match[2] === undefined ? 'data' : 'domain', axis: axisKey(`${letter}${match[1] ?? ''}`, letter) };
}

function toCanvasShape(shape: Loose, fallbackColour: string): CanvasShape | null {
  if (shape.type !== 'rect' && shape.type !== 'line') return null;
  const xRef = parseRef(shape.xref, 'x');
  const yRef = parseRef(shape.yref, 'y');
  const [x0, x1, y0, y1] = [shape.x0, shape.x1, shape.y0, shape.y1];
  if (xRef === null || yRef === null || ![x0, x1, y0, y1].every((v) => typeof v === 'number' && Number.isFinite(v))) return null;
  if (shape.visible === false || (shape.opacity !== undefined && shape.opacity !== 1) || shape.path !== undefined) return null;
  const line = obj(shape.line);
  const widthPx = num(line.width, 2);
  const dash = (line.dash as DashName | undefined) ?? 'solid';
  if (!DASHES.includes(dash)) return null;
  return {
    kind: shape.type,
    xRef,
    yRef,
    x0: x0 as number,
    x1: x1 as number,
    y0: y0 as number,
    y1: y1 as number,
    fillColor: shape.type === 'rect' && typeof shape.fillcolor === 'string' ? shape.fillcolor : null,
    line: widthPx > 0 ? { color: str(line.color, fallbackColour), widthPx, dash } : null,
    below: shape.layer === 'below',
  };
}

function toCanvasAnnotation(annotation: Loose, fallbackColour: string, fallbackPx: number): CanvasAnnotation | null {
  if (annotation.showarrow !== false || typeof annotation.text !== 'string' || annotation.visible === false) return null;
  const xRef = parseRef(annotation.xref, 'x');
  const yRef = parseRef(annotation.yref, 'y');
  const { x, y } = annotation;
  if (xRef === null || yRef === null || typeof x !== 'number' || typeof y !== 'number') return null;
  if (annotation.bgcolor !== undefined || annotation.bordercolor !== undefined || annotation.textangle !== undefined) return null;
  const font = obj(annotation.font);
  const xAnchor = annotation.xanchor === 'left' || annotation.xanchor === 'right' ? annotation.xanchor : 'center';
  const yAnchor = annotation.yanchor === 'top' || annotation.yanchor === 'bottom' ? annotation.yanchor : 'middle';
  return { lines: textLines(annotation.text), xRef, yRef, x, y, xAnchor, yAnchor, fontPx: num(font.size, fallbackPx), color: str(font.color, fallbackColour) };
}

/** Splits `figure` for the canvas layer (see the file comment). Traces the canvas cannot draw stay with Plotly. */
export function splitForCanvas(figure: { data: Data[]; layout: Partial<Layout> }, fallbackColour = '#444'): CanvasSplit {
  const font = obj(figure.layout.font);
  const textColour = str(font.color, fallbackColour);
  const canvasTraces: CanvasTrace[] = [];
  const plotlyData = figure.data.map((trace, index) => {
    if (!canvasDrawable(trace)) return trace;
    canvasTraces.push(toCanvasTrace(trace, index, fallbackColour));
    return legendProxy(trace);
  });
  const layout: Loose = { ...figure.layout };

  const shapes: CanvasShape[] = [];
  const plotlyShapes = ((figure.layout.shapes ?? []) as Loose[]).filter((shape) => {
    const drawn = toCanvasShape(shape, textColour);
    if (drawn !== null) shapes.push(drawn);
    return drawn === null;
  });
  const annotations: CanvasAnnotation[] = [];
  const plotlyAnnotations = ((figure.layout.annotations ?? []) as Loose[]).filter((annotation) => {
    const drawn = toCanvasAnnotation(annotation, textColour, num(font.size, 12));
    if (drawn !== null) annotations.push(drawn);
    return drawn === null;
  });
  if (figure.layout.shapes !== undefined) layout.shapes = plotlyShapes;
  if (figure.layout.annotations !== undefined) layout.annotations = plotlyAnnotations;

  // Every axis the canvas places something on in data units needs an explicit range: Plotly no longer sees that data.
  const dataAxis = (ref: CanvasRef) => (ref.space === 'data' ? [ref.axis] : []);
  const axes = new Set([
    ...canvasTraces.flatMap((t) => [t.xAxis, t.yAxis]),
    ...[...shapes, ...annotations].flatMap((item) => [...dataAxis(item.xRef), ...dataAxis(item.yRef)]),
  ]);
  for (const key of axes) {
    const axis = obj(layout[key]);
    if (Array.isArray(axis.range) && axis.range.length === 2) continue;
    const letter = key[0] as 'x' | 'y';
    const on = canvasTraces.filter((t) => (letter === 'x' ? t.xAxis : t.yAxis) === key);
    const values = function* () {
      for (const t of on) yield* traceValues(t, letter);
      yield* shapeValues(figure.layout, key);
    };
    // Values are padded and rounded; positions (x) run edge to edge unless markers sit at the ends.
    const pad = letter === 'y' || on.some((t) => t.kind === 'scatter' && t.marker !== null);
    const range = autoRange(values(), { toZero: axis.rangemode === 'tozero', log: axis.type === 'log', pad, round: letter === 'y' });
    layout[key] = { ...axis, range, autorange: false };
  }

  const title = obj(figure.layout.title);
  const caption = typeof figure.layout.title === 'string' ? figure.layout.title : str(title.text, '');
  if (figure.layout.title !== undefined) layout.title = { text: '' };
  return {
    plotlyData,
    layout: layout as Partial<Layout>,
    traces: canvasTraces,
    shapes,
    annotations,
    caption: textLines(caption).join(' '),
    captionPx: num(obj(title.font).size, num(font.size, 12)),
    legendBesideCaption: figure.layout.showlegend !== false && num(obj(figure.layout.legend).y, 0) >= 1 && obj(figure.layout.legend).xanchor === 'right',
  };
}
