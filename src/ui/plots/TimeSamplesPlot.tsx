import { useMemo } from 'react';
import { plotThemes } from '../plotData/plotTheme';
import { buildTimeSamplesFigure, prepareTimeSamples } from '../plotData/timeSamples';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** I, Q and |x| of the chosen OFDM symbol, cyclic prefix shaded, peak marked. */
export function TimeSamplesPlot() {
  const waveform = useAppStore((state) => state.result?.waveform ?? null);
  const symbolIndex = useAppStore((state) => state.symbolIndex);
  const scheme = useAppStore((state) => state.colorScheme);
  const epoch = useAppStore((state) => state.resultSeq);
  const figure = useMemo(() => {
    if (waveform === null || symbolIndex >= waveform.symbolLayout.length) return null;
    return buildTimeSamplesFigure(prepareTimeSamples(waveform, symbolIndex), plotThemes[scheme]);
  }, [waveform, symbolIndex, scheme]);
  return <PlotlyFigure drawing="canvas" figure={figure} label={`Time samples of OFDM symbol ${symbolIndex}`} epoch={epoch} testId="time-samples-plot" />;
}
