/**
 * The canvas drawing layer of a Plotly graph div: draws the traces src/ui/plotData/canvasTraces.ts took out of the
 * figure onto one canvas between Plotly's plot layer (grid, axes) and its info layer (legend, hover), with the axis
 * geometry read off Plotly's laid-out axes, so zoom, pan, legend clicks and resizes redraw it. Shows a hover readout
 * for the point nearest the pointer. DOM only; the geometry is pure (canvasGeometry.ts).
 */
import { dashPattern, hoverLines, nearestPoint, refToPixel, toPixel, type AxisGeometry, type PaperGeometry } from '../plotData/canvasGeometry';
import type { CanvasAnnotation, CanvasScene, CanvasShape, CanvasTrace } from '../plotData/canvasTraces';

interface PlotlyAxis {
  range?: [number, number];
  type?: string;
  _offset?: number;
  _length?: number;
}

/** The parts of Plotly's graph div the layer reads (Plotly 4 internals, pinned in package.json). */
interface GraphDiv extends HTMLDivElement {
  _fullLayout?: Record<string, unknown> & { width?: number; height?: number; _size?: PaperGeometry };
  _fullData?: { visible?: boolean | 'legendonly' }[];
  on?(event: string, handler: () => void): void;
}

export interface CanvasLayer {
  /** Draws `scene` now (after Plotly has laid out the frame it belongs to). */
  draw(scene: CanvasScene): void;
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

type AxisOf = (key: string) => AxisGeometry | null;

function drawShape(ctx: CanvasRenderingContext2D, shape: CanvasShape, paper: PaperGeometry, axisOf: AxisOf): void {
  const x0 = refToPixel(shape.xRef, shape.x0, false, paper, axisOf);
  const x1 = refToPixel(shape.xRef, shape.x1, false, paper, axisOf);
  const y0 = refToPixel(shape.yRef, shape.y0, true, paper, axisOf);
  const y1 = refToPixel(shape.yRef, shape.y1, true, paper, axisOf);
  if ([x0, x1, y0, y1].some(Number.isNaN)) return;
  ctx.save();
  ctx.beginPath();
  ctx.rect(paper.l, paper.t, paper.w, paper.h);
  ctx.clip();
  ctx.beginPath();
  if (shape.kind === 'rect') ctx.rect(Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0));
  else {
    ctx.moveTo(x0, y0);
    ctx.lineTo(x1, y1);
  }
  if (shape.fillColor !== null) {
    ctx.fillStyle = shape.fillColor;
    ctx.fill();
  }
  if (shape.line !== null) {
    ctx.strokeStyle = shape.line.color;
    ctx.lineWidth = shape.line.widthPx;
    ctx.setLineDash(dashPattern(shape.line.dash, shape.line.widthPx));
    ctx.stroke();
  }
  ctx.restore();
}

/** Text like Plotly's annotations without arrow: anchored at (x, y), lines 1.3 em apart, 2 px from the anchor. */
function drawAnnotation(ctx: CanvasRenderingContext2D, note: CanvasAnnotation, paper: PaperGeometry, axisOf: AxisOf): void {
  const x = refToPixel(note.xRef, note.x, false, paper, axisOf);
  const y = refToPixel(note.yRef, note.y, true, paper, axisOf);
  if (Number.isNaN(x) || Number.isNaN(y)) return;
  const lineHeight = 1.3 * note.fontPx;
  const height = note.lines.length * lineHeight;
  const top = note.yAnchor === 'top' ? y + 2 : note.yAnchor === 'bottom' ? y - 2 - height : y - height / 2;
  ctx.save();
  ctx.font = `${note.fontPx}px system-ui, sans-serif`;
  ctx.fillStyle = note.color;
  ctx.textAlign = note.xAnchor;
  ctx.textBaseline = 'middle';
  const textX = note.xAnchor === 'left' ? x + 2 : note.xAnchor === 'right' ? x - 2 : x;
  note.lines.forEach((line, i) => ctx.fillText(line, textX, top + (i + 0.5) * lineHeight));
  ctx.restore();
}

/** Attaches a canvas layer to `gd` (a graph div Plotly has drawn into) and a hover readout element. */
export function createCanvasLayer(gd: HTMLDivElement, readout: HTMLElement): CanvasLayer {
  const div = gd as GraphDiv;
  const canvas = document.createElement('canvas');
  canvas.className = 'plot-canvas-layer';
  canvas.setAttribute('aria-hidden', 'true');
  let scene: CanvasScene = { traces: [], shapes: [], annotations: [] };
  let listening = false;
  let disposed = false;
  let frame = 0;

  const visible = (trace: CanvasTrace) => (div._fullData?.[trace.traceIndex]?.visible ?? true) === true;
  const geometryOf = (trace: CanvasTrace) => {
    const x = axisGeometry(div._fullLayout, trace.xAxis);
    const y = axisGeometry(div._fullLayout, trace.yAxis);
    return x === null || y === null ? null : { x, y };
  };

  const render = () => {
    // Plotly keeps its listeners until the div is purged: a disposed layer must not bring its canvas back.
    if (disposed) return;
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
    const paper = div._fullLayout?._size ?? { l: 0, t: 0, w: widthPx, h: heightPx };
    const axisOf = (key: string) => axisGeometry(div._fullLayout, key);
    for (const shape of scene.shapes) if (shape.below) drawShape(ctx, shape, paper, axisOf);
    for (const trace of scene.traces) {
      const geometry = geometryOf(trace);
      if (geometry !== null && visible(trace)) drawTrace(ctx, trace, geometry.x, geometry.y);
    }
    for (const shape of scene.shapes) if (!shape.below) drawShape(ctx, shape, paper, axisOf);
    for (const note of scene.annotations) drawAnnotation(ctx, note, paper, axisOf);
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
    const hit = nearestPoint(scene.traces.filter(visible), geometryOf, event.clientX - box.left, event.clientY - box.top);
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
      scene = next;
      if (!listening && typeof div.on === 'function') {
        listening = true;
        for (const event of ['plotly_afterplot', 'plotly_relayout', 'plotly_relayouting', 'plotly_restyle']) div.on(event, schedule);
      }
      hide();
      render();
    },
    dispose: () => {
      disposed = true;
      if (frame !== 0) cancelAnimationFrame(frame);
      gd.removeEventListener('pointermove', onPointerMove);
      gd.removeEventListener('pointerleave', hide);
      canvas.remove();
    },
  };
}
