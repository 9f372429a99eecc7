import { useMemo } from 'react';
import { displayName } from '../panels/configFields';
import { buildConstellationFigure, prepareConstellation } from '../plotData/constellation';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** The data symbols of the chosen OFDM symbol, before DFT spreading. */
export function ConstellationPlot() {
  const result = useAppStore((state) => state.result);
  const symbolIndex = useAppStore((state) => state.symbolIndex);
  const scheme = useAppStore((state) => state.colorScheme);
  const epoch = useAppStore((state) => state.resultSeq);
  const figure = useMemo(() => {
    if (result === null || symbolIndex >= result.waveform.numSymbols) return null;
    const modulations = [...new Set(result.waveform.summary.allocations.map((block) => displayName(block.modulation)))];
    return buildConstellationFigure(
      prepareConstellation(result.waveform, symbolIndex),
      plotThemes[scheme],
      modulations.join(' + '),
    );
  }, [result, symbolIndex, scheme]);
  return <PlotlyFigure figure={figure} label={`Constellation of OFDM symbol ${symbolIndex}`} epoch={epoch} testId="constellation-plot" />;
}
