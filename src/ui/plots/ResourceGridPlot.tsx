import { useMemo, useRef } from 'react';
import { plotThemes } from '../plotData/plotTheme';
import { buildResourceGridFigure, prepareResourceGrid } from '../plotData/resourceGrid';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** Symbols × subcarriers, coloured by what each resource element carries. */
export function ResourceGridPlot() {
  const waveform = useAppStore((state) => state.result?.waveform ?? null);
  const scheme = useAppStore((state) => state.colorScheme);
  const epoch = useAppStore((state) => state.resultSeq);
  // A change that leaves the grid's layout alone (modulation, data, power) keeps the drawn figure.
  const last = useRef<{ kinds: Uint8Array; numSymbols: number; scheme: string; figure: ReturnType<typeof buildResourceGridFigure> } | null>(null);
  const figure = useMemo(() => {
    if (waveform === null) return null;
    const prev = last.current;
    if (prev !== null && prev.scheme === scheme && prev.numSymbols === waveform.numSymbols && sameBytes(prev.kinds, waveform.gridKinds)) return prev.figure;
    const built = buildResourceGridFigure(prepareResourceGrid(waveform), plotThemes[scheme]);
    last.current = { kinds: waveform.gridKinds.slice(), numSymbols: waveform.numSymbols, scheme, figure: built };
    return built;
  }, [waveform, scheme]);
  return <PlotlyFigure figure={figure} label="Resource grid: OFDM symbols by subcarriers" epoch={epoch} testId="resource-grid-plot" />;
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
