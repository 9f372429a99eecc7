import { useMemo } from 'react';
import { displayName } from '../panels/configFields';
import { buildConstellationFigure, prepareConstellation, prepareReceivedConstellation } from '../plotData/constellation';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** The data symbols of the chosen OFDM symbol, before DFT spreading. */
export function ConstellationPlot() {
  const result = useAppStore((state) => state.result);
  const symbolIndex = useAppStore((state) => state.symbolIndex);
  const scheme = useAppStore((state) => state.colorScheme);
  const epoch = useAppStore((state) => state.resultSeq);
  const evm = useAppStore((state) => (state.evm.seq === state.resultSeq ? state.evm.data : null));
  // Complete once the received points of the same configuration are in (or their measurement failed).
  const complete = useAppStore((state) => state.evm.seq === state.resultSeq || state.evm.status === 'failed');
  const figure = useMemo(() => {
    if (result === null || symbolIndex >= result.waveform.numSymbols) return null;
    const modulations = [...new Set(result.waveform.summary.allocations.map((block) => displayName(block.modulation)))];
    const receivedIq = evm?.evm.constellationIq ?? null;
    const points = receivedIq === null ? null : prepareReceivedConstellation(receivedIq, result.waveform, symbolIndex);
    return buildConstellationFigure(
      prepareConstellation(result.waveform, symbolIndex),
      plotThemes[scheme],
      modulations.join(' + '),
      points === null || evm === null ? null : { ...points, evmPercent: evm.evm.evmRmsPercent },
    );
  }, [result, symbolIndex, scheme, evm]);
  return <PlotlyFigure figure={figure} label={`Constellation of OFDM symbol ${symbolIndex}`} epoch={complete ? epoch : epoch - 1} testId="constellation-plot" />;
}
