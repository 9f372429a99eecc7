import { useState } from 'react';
import { downloadFile } from '../download';
import { figureCsv } from '../plotData/figureCsv';
import { registeredFigure } from './figureRegistry';
import { loadPlotly } from './loadPlotly';

/** PNG, SVG (Plotly's own image export) and CSV (the traces) of one plot. */
export function PlotExportButtons({ plotId, fileStem, title }: { plotId: string; fileStem: string; title: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const image = async (format: 'png' | 'svg') => {
    const entry = registeredFigure(plotId);
    if (entry === undefined) return setMessage('Nothing drawn yet.');
    try {
      const Plotly = await loadPlotly();
      await Plotly.downloadImage(entry.box, { format, filename: fileStem, width: entry.box.clientWidth, height: entry.box.clientHeight });
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
