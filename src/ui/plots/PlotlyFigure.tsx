import type { Config, Data, Layout } from 'plotly.js-dist-min';
import { useEffect, useRef, useState } from 'react';
import { useUpdateTimer } from '../perf/UpdateTimerContext';
import { registerFigure, unregisterFigure } from './figureRegistry';
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
  /** Sequence number of the configuration the figure shows (reported to the update timer after drawing). */
  epoch?: number;
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
export function PlotlyFigure({ figure, label, testId, epoch }: PlotlyFigureProps) {
  const boxRef = useRef<HTMLDivElement>(null);
  const renderCount = useRef(0);
  const drawnFigure = useRef<Figure | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const timer = useUpdateTimer();

  useEffect(() => {
    if (timer === null || figure === null) return;
    timer.register(testId);
    return () => timer.unregister(testId);
  }, [timer, testId, figure === null]);

  useEffect(() => {
    const box = boxRef.current;
    if (box === null || figure === null) return;
    // Same figure for a newer configuration (nothing this plot shows changed): already up to date.
    if (drawnFigure.current === figure) {
      if (epoch !== undefined) timer?.rendered(testId, epoch);
      return;
    }
    let current = true;
    if (epoch !== undefined) performance.mark(`crestline:draw-start:${testId}:${epoch}`);
    loadPlotly()
      .then((Plotly) => {
        if (!current) return undefined;
        const t = performance.now();
        const done = Plotly.react(box, figure.data, figure.layout, plotConfig);
        performance.measure(`crestline:react:${testId}`, { start: t, end: performance.now() });
        return done;
      })
      .then(() => {
        if (!current) return;
        drawnFigure.current = figure;
        registerFigure(testId, { box, figure });
        renderCount.current += 1;
        box.dataset.renderCount = String(renderCount.current);
        if (epoch !== undefined) {
          box.dataset.epoch = String(epoch);
          performance.mark(`crestline:drawn:${testId}:${epoch}`);
          timer?.rendered(testId, epoch);
        }
        setLoadError(null);
      })
      .catch((error: unknown) => {
        if (current) setLoadError(error instanceof Error ? error.message : String(error));
      });
    return () => {
      current = false;
    };
  }, [figure, epoch, timer, testId]);

  // Purge Plotly's listeners on a real unmount only: React's development re-mount (StrictMode) keeps the box.
  const mounted = useRef(false);
  useEffect(() => {
    mounted.current = true;
    const box = boxRef.current;
    return () => {
      mounted.current = false;
      unregisterFigure(testId);
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
