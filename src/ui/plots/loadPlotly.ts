/**
 * Loads Plotly on first use with a dynamic import(), so its ~4.8 MB bundle is a separate chunk
 * and the first page chunk stays small. One shared promise for every plot.
 */
type PlotlyModule = typeof import('plotly.js-dist-min');

let plotlyPromise: Promise<PlotlyModule> | null = null;

export function loadPlotly(): Promise<PlotlyModule> {
  plotlyPromise ??= import('plotly.js-dist-min').then((module) => {
    // The dist bundle is CommonJS: its API arrives as the default export.
    const withDefault = module as PlotlyModule & { default?: PlotlyModule };
    return withDefault.default ?? withDefault;
  });
  // A failed load (e.g. chunk blocked) should be retried by the next plot, not cached forever.
  plotlyPromise.catch(() => {
    plotlyPromise = null;
  });
  return plotlyPromise;
}
