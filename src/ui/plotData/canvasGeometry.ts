/**
 * Geometry of the canvas drawing layer, pure: data value → pixel for Plotly's linear and log axes, the dash
 * patterns Plotly uses, the nearest point under the pointer and the hover text from a Plotly hover template.
 */
import type { CanvasRef, CanvasTrace, DashName } from './canvasTraces';

/** What the layer reads off one Plotly axis: its range (log10 units on a log axis), type, offset and length in px. */
export interface AxisGeometry {
  range: [number, number];
  log: boolean;
  offsetPx: number;
  lengthPx: number;
}

/** Pixel position of `value` on `axis` (x grows rightwards, y upwards); NaN where there is nothing to draw. */
export function toPixel(axis: AxisGeometry, value: number | null | undefined, vertical: boolean): number {
  if (value === null || value === undefined || !Number.isFinite(value)) return Number.NaN;
  if (axis.log && value <= 0) return Number.NaN;
  const v = axis.log ? Math.log10(value) : value;
  const [r0, r1] = axis.range;
  const fraction = (v - r0) / (r1 - r0);
  return vertical ? axis.offsetPx + (1 - fraction) * axis.lengthPx : axis.offsetPx + fraction * axis.lengthPx;
}

/** The plot area in px (Plotly's margins inside the graph div): left, top, width, height. */
export interface PaperGeometry {
  l: number;
  t: number;
  w: number;
  h: number;
}

/** Pixel position of a shape or annotation coordinate measured in `ref` (data, axis domain or plot area). */
export function refToPixel(
  ref: CanvasRef,
  value: number,
  vertical: boolean,
  paper: PaperGeometry,
  axisOf: (key: string) => AxisGeometry | null,
): number {
  if (ref.space === 'paper') return vertical ? paper.t + (1 - value) * paper.h : paper.l + value * paper.w;
  const axis = axisOf(ref.axis);
  if (axis === null) return Number.NaN;
  if (ref.space === 'domain') return vertical ? axis.offsetPx + (1 - value) * axis.lengthPx : axis.offsetPx + value * axis.lengthPx;
  return toPixel(axis, value, vertical);
}

/** Plotly's dash patterns (drawing.dashStyle): units of max(line width, 3) px. */
export function dashPattern(dash: DashName, widthPx: number): number[] {
  const u = Math.max(widthPx, 3);
  switch (dash) {
    case 'dot':
      return [u, u];
    case 'dash':
      return [3 * u, 3 * u];
    case 'longdash':
      return [5 * u, 5 * u];
    case 'dashdot':
      return [3 * u, u, u, u];
    case 'longdashdot':
      return [5 * u, 2 * u, u, 2 * u];
    default:
      return [];
  }
}

/** Width of each bar in x units: 80 % of the closest spacing between bar positions (Plotly's default bargap 0.2). */
export function barWidth(x: ArrayLike<number | null>): number {
  let spacing = Number.POSITIVE_INFINITY;
  const sorted = Array.from(x).filter((v): v is number => v !== null && Number.isFinite(v)).sort((a, b) => a - b);
  for (let i = 1; i < sorted.length; i++) {
    const d = sorted[i]! - sorted[i - 1]!;
    if (d > 0 && d < spacing) spacing = d;
  }
  return 0.8 * (Number.isFinite(spacing) ? spacing : 1);
}

export interface HoverHit {
  trace: CanvasTrace;
  pointIndex: number;
  xPx: number;
  yPx: number;
}

/**
 * The point closest to (xPx, yPx) within `maxDistancePx`, over the traces that take hover; distances run to a
 * marker's edge, so a marked point wins over a line vertex under it, and a bar is hit anywhere over its column.
 * `axes` gives each trace's geometry.
 */
export function nearestPoint(
  traces: readonly CanvasTrace[],
  axes: (trace: CanvasTrace) => { x: AxisGeometry; y: AxisGeometry } | null,
  xPx: number,
  yPx: number,
  maxDistancePx = 20,
): HoverHit | null {
  let best: HoverHit | null = null;
  let bestDistance = maxDistancePx * maxDistancePx;
  for (const trace of traces) {
    if (trace.hoverTemplate === null) continue;
    const geometry = axes(trace);
    if (geometry === null) continue;
    const markerRadiusPx = trace.kind === 'scatter' && trace.marker !== null ? trace.marker.sizePx / 2 : 0;
    const halfBarPx = trace.kind === 'bar' ? (trace.barWidth / Math.abs(geometry.x.range[1] - geometry.x.range[0])) * geometry.x.lengthPx * 0.5 : 0;
    for (let i = 0; i < trace.x.length; i++) {
      const px = toPixel(geometry.x, trace.x[i], false);
      const py = toPixel(geometry.y, trace.y[i], true);
      if (Number.isNaN(px) || Number.isNaN(py)) continue;
      const dx = trace.kind === 'bar' ? Math.max(0, Math.abs(xPx - px) - halfBarPx) : xPx - px;
      const dy = trace.kind === 'bar' ? 0 : yPx - py;
      // Distance to a marker's edge: a marked point (a peak, a level) wins over a line vertex under it.
      const d = Math.max(0, Math.hypot(dx, dy) - markerRadiusPx) ** 2;
      if (d <= bestDistance) {
        bestDistance = d;
        best = { trace, pointIndex: i, xPx: px, yPx: py };
      }
    }
  }
  return best;
}

/** A number in a d3-style format: ".3f", ".2e", ".4g", or as given. */
export function formatNumber(value: number, format: string | undefined): string {
  if (!Number.isFinite(value)) return String(value);
  const match = /^\.(\d+)([efg])$/.exec(format ?? '');
  if (match === null) return String(Math.round(value * 1e9) / 1e9);
  const digits = Number(match[1]);
  if (match[2] === 'f') return value.toFixed(digits);
  if (match[2] === 'e') return value.toExponential(digits);
  return value.toPrecision(Math.max(1, digits));
}

/**
 * The hover text of one point from a Plotly hover template: %{x}, %{y} (optionally %{x:.3f} etc.), <br> line breaks;
 * the <extra> box becomes a last line when it holds text. Lines come back as an array (drawn as text, never HTML).
 */
export function hoverLines(template: string, x: number, y: number): string[] {
  const extra = /<extra>(.*?)<\/extra>/.exec(template)?.[1] ?? '';
  const body = template.replace(/<extra>.*?<\/extra>/g, '');
  const text = body.replace(/%\{([xy])(?::([^}]*))?\}/g, (_, axis: string, format: string | undefined) => formatNumber(axis === 'x' ? x : y, format));
  const lines = textLines(text);
  return extra.trim() === '' ? lines : [...lines, extra];
}

/** Plain-text lines of a Plotly label: <br> breaks lines, other tags are dropped. */
export function textLines(text: string): string[] {
  return text.split(/<br\s*\/?>/i).map((line) => line.replace(/<[^>]*>/g, ''));
}
