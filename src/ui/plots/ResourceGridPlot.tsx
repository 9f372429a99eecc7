import { useMemo } from 'react';
import { plotThemes } from '../plotData/plotTheme';
import { buildResourceGridFigure, prepareResourceGrid } from '../plotData/resourceGrid';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** Symbols × subcarriers, coloured by what each resource element carries. */
export function ResourceGridPlot() {
  const waveform = useAppStore((state) => state.result?.waveform ?? null);
  const scheme = useAppStore((state) => state.colorScheme);
  const epoch = useAppStore((state) => state.resultSeq);
  const figure = useMemo(
    () => (waveform === null ? null : buildResourceGridFigure(prepareResourceGrid(waveform), plotThemes[scheme])),
    [waveform, scheme],
  );
  return <PlotlyFigure figure={figure} label="Resource grid: OFDM symbols by subcarriers" epoch={epoch} testId="resource-grid-plot" />;
}
