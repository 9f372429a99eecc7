/**
 * The canvas drawing layer of a Plotly graph div: draws the traces src/ui/plotData/canvasTraces.ts took out of the
 * figure onto one canvas between Plotly's plot layer (grid, axes) and its info layer (legend, hover), with the axis
 * geometry read off Plotly's laid-out axes, so zoom, pan, legend clicks and resizes redraw it. Shows a hover readout
 * for the point nearest the pointer. DOM only; the geometry is pure (canvasGeometry.ts).
 */
import { dashPattern, hoverLines, nearestPoint, toPixel, type AxisGeometry } from '../plotData/canvasGeometry';
import type { CanvasTrace } from '../plotData/canvasTraces';

interface PlotlyAxis {
  range?: [number, number];
  type?: string;
  _offset?: number;
  _length?: number;
}

/** The parts of Plotly's graph div the layer reads (Plotly 4 internals, pinned in package.json). */
interface GraphDiv extends HTMLDivElement {
  _fullLayout?: Record<string, unknown> & { width?: number; height?: number };
  _fullData?: { visible?: boolean | 'legendonly' }[];
  on?(event: string, handler: () => void): void;
}

export interface CanvasLayer {
  /** Draws `traces` now (after Plotly has laid out the frame they belong to). */
  draw(traces: readonly CanvasTrace[]): void;
  dispose(): void;
}

function axisGeometry(layout: GraphDiv['_fullLayout'], key: string): AxisGeometry | null {
  const axis = layout?.[key] as PlotlyAxis | undefined;
  if (axis?.range === undefined || axis._offset === undefined || axis._length === undefined) return null;
  return { range: [Number(axis.range[0]), Number(axis.range[1])], log: axis.type === 'log', offsetPx: axis._offset, lengthPx: axis._length };
}

function markerPath(ctx: CanvasRenderingContext2D, symbol: string, x: number, y: number, r: number): void {
  switch (symbol) {
    case 'square':
      ctx.rect(x - r, y - r, 2 * r, 2 * r);
      return;
    case 'diamond':
      ctx.moveTo(x, y - 1.3 * r);
      ctx.lineTo(x + 1.3 * r, y);
      ctx.lineTo(x, y + 1.3 * r);
      ctx.lineTo(x - 1.3 * r, y);
      ctx.closePath();
      return;
    case 'cross-thin':
      ctx.moveTo(x - r, y);
      ctx.lineTo(x + r, y);
      ctx.moveTo(x, y - r);
      ctx.lineTo(x, y + r);
      return;
    case 'x-thin':
      ctx.moveTo(x - r, y - r);
      ctx.lineTo(x + r, y + r);
      ctx.moveTo(x - r, y + r);
      ctx.lineTo(x + r, y - r);
      return;
    default:
      ctx.moveTo(x + r, y);
      ctx.arc(x, y, r, 0, 2 * Math.PI);
  }
}

function drawTrace(ctx: CanvasRenderingContext2D, trace: CanvasTrace, xa: AxisGeometry, ya: AxisGeometry): void {
  const n = Math.min(trace.x.length, trace.y.length);
  const px = new Float64Array(n);
  const py = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    px[i] = toPixel(xa, trace.x[i], false);
    py[i] = toPixel(ya, trace.y[i], true);
  }
  const valid = (i: number) => !Number.isNaN(px[i]!) && !Number.isNaN(py[i]!);
  ctx.save();
  ctx.beginPath();
  ctx.rect(xa.offsetPx, ya.offsetPx, xa.lengthPx, ya.lengthPx);
  ctx.clip();
  if (trace.fillColor !== null) {
    ctx.beginPath();
    let started = false;
    for (let i = 0; i < n; i++) {
      if (!valid(i)) continue;
      if (started) ctx.lineTo(px[i]!, py[i]!);
      else ctx.moveTo(px[i]!, py[i]!);
      started = true;
    }
    ctx.closePath();
    ctx.fillStyle = trace.fillColor;
    ctx.fill();
  }
  if (trace.kind === 'bar' && trace.marker !== null) {
    const halfPx = ((trace.barWidth / Math.abs(xa.range[1] - xa.range[0])) * xa.lengthPx) / 2;
    const basePx = ya.log ? ya.offsetPx + ya.lengthPx : toPixel(ya, 0, true);
    ctx.fillStyle = trace.marker.color;
    ctx.globalAlpha = trace.marker.opacity;
    for (let i = 0; i < n; i++) if (valid(i)) ctx.fillRect(px[i]! - halfPx, Math.min(basePx, py[i]!), 2 * halfPx, Math.abs(basePx - py[i]!));
    ctx.restore();
    return;
  }
  if (trace.line !== null) {
    ctx.beginPath();
    let pen = false;
    for (let i = 0; i < n; i++) {
      if (!valid(i)) {
        if (!trace.connectGaps) pen = false;
        continue;
      }
      if (pen) ctx.lineTo(px[i]!, py[i]!);
      else ctx.moveTo(px[i]!, py[i]!);
      pen = true;
    }
    ctx.strokeStyle = trace.line.color;
    ctx.lineWidth = trace.line.widthPx;
    ctx.lineJoin = 'round';
    ctx.setLineDash(dashPattern(trace.line.dash, trace.line.widthPx));
    ctx.stroke();
    ctx.setLineDash([]);
  }
  if (trace.errorX !== null) {
    const e = trace.errorX;
    ctx.beginPath();
    for (let i = 0; i < n; i++) {
      if (!valid(i)) continue;
      const x = trace.x[i] as number;
      const left = toPixel(xa, x - (e.minus[i] ?? 0), false);
      const right = toPixel(xa, x + (e.plus[i] ?? 0), false);
      ctx.moveTo(left, py[i]!);
      ctx.lineTo(right, py[i]!);
      for (const end of [left, right]) {
        ctx.moveTo(end, py[i]! - e.capPx);
        ctx.lineTo(end, py[i]! + e.capPx);
      }
    }
    ctx.strokeStyle = e.color;
    ctx.lineWidth = e.thicknessPx;
    ctx.stroke();
  }
  if (trace.marker !== null) {
    const m = trace.marker;
    const r = m.sizePx / 2;
    ctx.globalAlpha = m.opacity;
    ctx.beginPath();
    for (let i = 0; i < n; i++) if (valid(i)) markerPath(ctx, m.symbol, px[i]!, py[i]!, r);
    if (m.symbol === 'circle-open' || m.symbol === 'cross-thin' || m.symbol === 'x-thin') {
      ctx.strokeStyle = m.color;
      ctx.lineWidth = m.lineWidthPx;
      ctx.stroke();
    } else {
      ctx.fillStyle = m.color;
      ctx.fill();
    }
  }
  ctx.restore();
}

/** Attaches a canvas layer to `gd` (a graph div Plotly has drawn into) and a hover readout element. */
export function createCanvasLayer(gd: HTMLDivElement, readout: HTMLElement): CanvasLayer {
  const div = gd as GraphDiv;
  const canvas = document.createElement('canvas');
  canvas.className = 'plot-canvas-layer';
  canvas.setAttribute('aria-hidden', 'true');
  let traces: readonly CanvasTrace[] = [];
  let listening = false;
  let frame = 0;

  const visible = (trace: CanvasTrace) => (div._fullData?.[trace.traceIndex]?.visible ?? true) === true;
  const geometryOf = (trace: CanvasTrace) => {
    const x = axisGeometry(div._fullLayout, trace.xAxis);
    const y = axisGeometry(div._fullLayout, trace.yAxis);
    return x === null || y === null ? null : { x, y };
  };

  const render = () => {
    const container = div.querySelector('.svg-container');
    const plotLayer = container?.querySelector('svg.main-svg');
    if (container == null || plotLayer == null) return;
    if (canvas.previousElementSibling !== plotLayer) plotLayer.after(canvas);
    const widthPx = Number(div._fullLayout?.width ?? gd.clientWidth);
    const heightPx = Number(div._fullLayout?.height ?? gd.clientHeight);
    const ratio = window.devicePixelRatio || 1;
    const w = Math.round(widthPx * ratio);
    const h = Math.round(heightPx * ratio);
    if (canvas.width !== w || canvas.height !== h) {
      canvas.width = w;
      canvas.height = h;
      canvas.style.width = `${widthPx}px`;
      canvas.style.height = `${heightPx}px`;
    }
    const ctx = canvas.getContext('2d');
    if (ctx === null) return;
    ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
    ctx.clearRect(0, 0, widthPx, heightPx);
    for (const trace of traces) {
      const geometry = geometryOf(trace);
      if (geometry !== null && visible(trace)) drawTrace(ctx, trace, geometry.x, geometry.y);
    }
  };

  // Zoom, pan, legend clicks and resizes: redraw once per animation frame.
  const schedule = () => {
    if (frame !== 0) return;
    frame = requestAnimationFrame(() => {
      frame = 0;
      render();
    });
  };

  const hide = () => {
    readout.hidden = true;
  };
  const onPointerMove = (event: PointerEvent) => {
    if (event.buttons !== 0) return hide();
    const box = gd.getBoundingClientRect();
    const hit = nearestPoint(traces.filter(visible), geometryOf, event.clientX - box.left, event.clientY - box.top);
    if (hit === null || hit.trace.hoverTemplate === null) return hide();
    const x = Number(hit.trace.x[hit.pointIndex]);
    const y = Number(hit.trace.y[hit.pointIndex]);
    readout.replaceChildren(...hoverLines(hit.trace.hoverTemplate, x, y).map((line) => Object.assign(document.createElement('span'), { textContent: line })));
    readout.style.borderColor = hit.trace.line?.color ?? hit.trace.marker?.color ?? '';
    // Beside the point, on the side with more room.
    const left = hit.xPx > gd.clientWidth / 2;
    const above = hit.yPx > gd.clientHeight / 2;
    readout.style.left = `${gd.offsetLeft + hit.xPx + (left ? -10 : 10)}px`;
    readout.style.top = `${gd.offsetTop + hit.yPx + (above ? -10 : 10)}px`;
    readout.style.transform = `translate(${left ? '-100%' : '0'}, ${above ? '-100%' : '0'})`;
    readout.hidden = false;
  };
  gd.addEventListener('pointermove', onPointerMove);
  gd.addEventListener('pointerleave', hide);

  return {
    draw: (next) => {
      traces = next;
      if (!listening && typeof div.on === 'function') {
        listening = true;
        for (const event of ['plotly_afterplot', 'plotly_relayout', 'plotly_relayouting', 'plotly_restyle']) div.on(event, schedule);
      }
      hide();
      render();
    },
    dispose: () => {
      if (frame !== 0) cancelAnimationFrame(frame);
      gd.removeEventListener('pointermove', onPointerMove);
      gd.removeEventListener('pointerleave', hide);
      canvas.remove();
    },
  };
}
