import { useEffect, useMemo, useRef, useState } from 'react';
import { displayName } from '../panels/configFields';
import { buildConstellationFigure, prepareConstellation, prepareReceivedConstellation } from '../plotData/constellation';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** How long the ideal points of a new configuration wait for its received points before they are drawn alone. */
export const RECEIVED_WAIT_MS = 400;

/** The data symbols of the chosen OFDM symbol, before DFT spreading, with the receiver's equalised points. */
export function ConstellationPlot() {
  const result = useAppStore((state) => state.result);
  const symbolIndex = useAppStore((state) => state.symbolIndex);
  const scheme = useAppStore((state) => state.colorScheme);
  const epoch = useAppStore((state) => state.resultSeq);
  const evm = useAppStore((state) => (state.evm.seq === state.resultSeq ? state.evm.data : null));
  // Complete once the received points of the same configuration are in (or their measurement failed).
  const complete = useAppStore((state) => state.evm.seq === state.resultSeq || state.evm.status === 'failed');
  // Draw once per configuration: wait briefly for the receiver's points instead of drawing the ideal ones twice.
  const [waitedFor, setWaitedFor] = useState(-1);
  useEffect(() => {
    if (complete) return;
    const timer = setTimeout(() => setWaitedFor(epoch), RECEIVED_WAIT_MS);
    return () => clearTimeout(timer);
  }, [epoch, complete]);
  const shown = useRef<ReturnType<typeof buildConstellationFigure> | null>(null);
  const ready = complete || waitedFor === epoch || shown.current === null;
  const built = useMemo(() => {
    if (!ready) return undefined;
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
  }, [ready, result, symbolIndex, scheme, evm]);
  if (built !== undefined) shown.current = built;
  const figure = shown.current;
  return <PlotlyFigure drawing="canvas" figure={figure} label={`Constellation of OFDM symbol ${symbolIndex}`} epoch={complete ? epoch : epoch - 1} testId="constellation-plot" />;
}
