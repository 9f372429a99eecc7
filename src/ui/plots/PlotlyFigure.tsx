import type { Config, Data, Layout } from 'plotly.js-dist-min';
import { useEffect, useRef, useState } from 'react';
import { useUpdateTimer } from '../perf/UpdateTimerContext';
import { splitForCanvas } from '../plotData/canvasTraces';
import { createCanvasLayer, type CanvasLayer } from './canvasLayer';
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
  /**
   * "canvas": scatter and bar traces are drawn on a canvas layer and Plotly redraws only the frame (axes, title,
   * legend, shapes) when that changes — for the plots that follow every edit. "svg" (default): Plotly draws it all.
   */
  drawing?: 'svg' | 'canvas';
}

/** A graph div with the complete figure on it: every trace, Plotly-drawn or canvas-drawn (exports and browser tests read it). */
export type PlotBox = HTMLDivElement & { figureData?: Data[] };

const plotConfig: Partial<Config> = {
  responsive: true,
  displaylogo: false,
  modeBarButtonsToRemove: ['lasso2d', 'select2d'],
  doubleClick: 'reset',
};

/**
 * Renders one Plotly figure into a fixed-height box (no layout jump while Plotly loads or updates).
 * After each render the box carries `data-render-count`, which the browser tests wait on.
 */
export function PlotlyFigure({ figure, label, testId, epoch, drawing = 'svg' }: PlotlyFigureProps) {
  const boxRef = useRef<HTMLDivElement>(null);
  const readoutRef = useRef<HTMLDivElement>(null);
  const layerRef = useRef<CanvasLayer | null>(null);
  const frameKey = useRef<string | null>(null);
  const renderCount = useRef(0);
  const drawnFigure = useRef<Figure | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  // Canvas drawing: the figure's title, shown as page text where Plotly would draw it.
  const [caption, setCaption] = useState<{ text: string; sizePx: number; clearRight: boolean } | null>(null);
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
      .then((Plotly): Promise<unknown> | undefined => {
        if (!current) return undefined;
        const t = performance.now();
        if (drawing === 'svg') {
          const done = Plotly.react(box, figure.data, figure.layout, plotConfig);
          performance.measure(`crestline:react:${testId}`, { start: t, end: performance.now() });
          return done;
        }
        // Canvas drawing: Plotly lays out the frame only when it changed, then the canvas draws the traces on it.
        const split = splitForCanvas(figure);
        const key = JSON.stringify([split.plotlyData, split.layout]);
        const draw = () => {
          if (!current) return;
          const readout = readoutRef.current;
          if (layerRef.current === null && readout !== null) layerRef.current = createCanvasLayer(box, readout);
          layerRef.current?.draw(split);
          const next = { text: split.caption, sizePx: split.captionPx, clearRight: split.legendBesideCaption };
          setCaption((shown) => (shown !== null && shown.text === next.text && shown.sizePx === next.sizePx && shown.clearRight === next.clearRight ? shown : next));
          performance.measure(`crestline:react:${testId}`, { start: t, end: performance.now() });
        };
        if (key === frameKey.current) {
          draw();
          return undefined;
        }
        // Unknown until this relayout is done: a newer figure arriving meanwhile lays out its own frame.
        frameKey.current = null;
        // uirevision: a zoom or legend choice the user made survives a new configuration.
        return Plotly.react(box, split.plotlyData, { ...split.layout, uirevision: 'kept' }, plotConfig).then(() => {
          frameKey.current = key;
          draw();
        });
      })
      .then(() => {
        if (!current) return;
        drawnFigure.current = figure;
        (box as PlotBox).figureData = figure.data;
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
  }, [figure, epoch, timer, testId, drawing]);

  // Purge Plotly's listeners on a real unmount only: React's development re-mount (StrictMode) keeps the box.
  const mounted = useRef(false);
  useEffect(() => {
    mounted.current = true;
    const box = boxRef.current;
    return () => {
      mounted.current = false;
      unregisterFigure(testId);
      layerRef.current?.dispose();
      layerRef.current = null;
      frameKey.current = null;
      if (box !== null) void loadPlotly().then((Plotly) => (mounted.current ? undefined : Plotly.purge(box)));
    };
  }, []);

  return (
    <figure className="plot" aria-label={label}>
      <div ref={boxRef} className="plot-box" data-testid={testId} data-drawing={drawing} role="img" aria-label={label} />
      {drawing === 'canvas' && caption !== null && caption.text !== '' && (
        <p className="plot-caption" data-caption-for={testId} style={{ fontSize: `${caption.sizePx}px`, right: caption.clearRight ? '45%' : '8px' }}>
          {caption.text}
        </p>
      )}
      {drawing === 'canvas' && <div ref={readoutRef} className="plot-readout" aria-hidden="true" hidden />}
      {figure === null && <p className="plot-placeholder">Waiting for the engine…</p>}
      {loadError !== null && (
        <p className="plot-error" role="alert">
          The plot could not be drawn: {loadError}
        </p>
      )}
    </figure>
  );
}
