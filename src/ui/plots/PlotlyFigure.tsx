import type { Config, Data, Layout } from 'plotly.js-dist-min';
import { useEffect, useRef, useState } from 'react';
import { loadPlotly } from './loadPlotly';

export interface Figure {
  data: Data[];
  layout: Partial<Layout>;
}

export interface PlotlyFigureProps {
  /** Prepared by a pure helper in src/ui/plotData; null while there is nothing to show. */
  figure: Figure | null;
  /** Accessible name of the plot region. */
  label: string;
  testId: string;
}

const plotConfig: Partial<Config> = {
  responsive: true,
  displaylogo: false,
  modeBarButtonsToRemove: ['lasso2d', 'select2d'],
};

/**
 * Renders one Plotly figure into a fixed-height box (no layout jump while Plotly loads or updates).
 * After each render the box carries `data-render-count`, which the browser tests wait on.
 */
export function PlotlyFigure({ figure, label, testId }: PlotlyFigureProps) {
  const boxRef = useRef<HTMLDivElement>(null);
  const renderCount = useRef(0);
  const [loadError, setLoadError] = useState<string | null>(null);

  useEffect(() => {
    const box = boxRef.current;
    if (box === null || figure === null) return;
    let current = true;
    loadPlotly()
      .then((Plotly) => (current ? Plotly.react(box, figure.data, figure.layout, plotConfig) : undefined))
      .then(() => {
        if (!current) return;
        renderCount.current += 1;
        box.dataset.renderCount = String(renderCount.current);
        setLoadError(null);
      })
      .catch((error: unknown) => {
        if (current) setLoadError(error instanceof Error ? error.message : String(error));
      });
    return () => {
      current = false;
    };
  }, [figure]);

  // Purge Plotly's listeners on a real unmount only: React's development re-mount (StrictMode) keeps the box.
  const mounted = useRef(false);
  useEffect(() => {
    mounted.current = true;
    const box = boxRef.current;
    return () => {
      mounted.current = false;
      if (box !== null) void loadPlotly().then((Plotly) => (mounted.current ? undefined : Plotly.purge(box)));
    };
  }, []);

  return (
    <figure className="plot" aria-label={label}>
      <div ref={boxRef} className="plot-box" data-testid={testId} role="img" aria-label={label} />
      {figure === null && <p className="plot-placeholder">Waiting for the engine…</p>}
      {loadError !== null && (
        <p className="plot-error" role="alert">
          The plot could not be drawn: {loadError}
        </p>
      )}
    </figure>
  );
}
