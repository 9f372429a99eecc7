import { useState } from 'react';
import { downloadFile } from '../download';
import { figureCsv } from '../plotData/figureCsv';
import { registeredFigure, type RegisteredFigure } from './figureRegistry';
import { loadPlotly } from './loadPlotly';

/**
 * What to hand Plotly's image export: the graph div itself, or — for a canvas-drawn plot, whose traces Plotly does not
 * hold — the complete figure at the axis ranges on screen (so a zoomed view exports as seen, every trace as vectors).
 */
function imageSource(entry: RegisteredFigure): HTMLDivElement | { data: RegisteredFigure['figure']['data']; layout: RegisteredFigure['figure']['layout'] } {
  if (entry.box.dataset.drawing !== 'canvas') return entry.box;
  const shown = (entry.box as HTMLDivElement & { _fullLayout?: Record<string, { range?: unknown } | undefined> })._fullLayout ?? {};
  const layout: Record<string, unknown> = { ...entry.figure.layout };
  for (const key of Object.keys(layout)) {
    const range = /^[xy]axis\d*$/.test(key) ? shown[key]?.range : undefined;
    if (Array.isArray(range)) layout[key] = { ...(layout[key] as object), range: [...range], autorange: false };
  }
  return { data: entry.figure.data, layout: layout as RegisteredFigure['figure']['layout'] };
}

/** PNG, SVG (Plotly's own image export) and CSV (the traces) of one plot. */
export function PlotExportButtons({ plotId, fileStem, title }: { plotId: string; fileStem: string; title: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const image = async (format: 'png' | 'svg') => {
    const entry = registeredFigure(plotId);
    if (entry === undefined) return setMessage('Nothing drawn yet.');
    try {
      const Plotly = await loadPlotly();
      await Plotly.downloadImage(imageSource(entry) as HTMLDivElement, { format, filename: fileStem, width: entry.box.clientWidth, height: entry.box.clientHeight });
      setMessage(null);
    } catch (error) {
      setMessage(`Image export failed: ${error instanceof Error ? error.message : String(error)}`);
    }
  };
  const csv = () => {
    const entry = registeredFigure(plotId);
    if (entry === undefined) return setMessage('Nothing drawn yet.');
    downloadFile(figureCsv(entry.figure.data), `${fileStem}.csv`, 'text/csv');
  };
  return (
    <span className="export-buttons" role="group" aria-label={`Export the ${title} plot`}>
      <button type="button" className="small-button" onClick={() => void image('png')} aria-label={`${title} as PNG`}>
        PNG
      </button>
      <button type="button" className="small-button" onClick={() => void image('svg')} aria-label={`${title} as SVG`}>
        SVG
      </button>
      <button type="button" className="small-button" onClick={csv} aria-label={`${title} curves as CSV`}>
        CSV
      </button>
      {message !== null && (
        <span className="field-error" role="alert">
          {message}
        </span>
      )}
    </span>
  );
}
