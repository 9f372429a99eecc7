/**
 * A figure's traces as CSV in long form — one row per point: trace, x, y (and z for heatmaps) — so every curve on
 * screen can be taken into a spreadsheet or a script. Pure; reads the prepared Plotly data.
 */
import type { Data } from 'plotly.js-dist-min';

const cell = (v: unknown): string => {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  const text = String(v);
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
};

const toArray = (v: unknown): unknown[] => (v === undefined || v === null ? [] : Array.isArray(v) ? v : ArrayBuffer.isView(v) ? Array.from(v as unknown as ArrayLike<number>) : []);

export function figureCsv(data: readonly Data[]): string {
  const lines = ['trace,x,y,z'];
  for (const trace of data) {
    const t = trace as { name?: string; type?: string; x?: unknown; y?: unknown; z?: unknown };
    const name = t.name ?? t.type ?? 'trace';
    if (t.type === 'heatmap') {
      toArray(t.z).forEach((row, r) => toArray(row).forEach((value, c) => lines.push([cell(name), c, r, cell(value)].join(','))));
      continue;
    }
    const xs = toArray(t.x);
    const ys = toArray(t.y);
    for (let i = 0; i < Math.max(xs.length, ys.length); i++) lines.push([cell(name), cell(xs[i]), cell(ys[i]), ''].join(','));
  }
  return `${lines.join('\n')}\n`;
}
