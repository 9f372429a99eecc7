import { useMemo } from 'react';
import { buildCcdfFigure } from '../plotData/ccdf';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from '../state/AppStoreContext';
import { useCcdfResult } from '../state/useCcdfResult';
import { usePinnedOverlays } from '../state/useOverlays';
import { PlotlyFigure } from './PlotlyFigure';

/** Power CCDF or per-symbol PAPR CCDF of the configuration, with its intervals, the theory and the pinned scenarios. */
export function CcdfPlot() {
  const { result, note, seq } = useCcdfResult();
  const statistic = useAppStore((state) => state.ccdfStatistic);
  const scheme = useAppStore((state) => state.colorScheme);
  const pinned = usePinnedOverlays();
  const figure = useMemo(() => {
    if (result === null) return null;
    const theme = plotThemes[scheme];
    const overlays = pinned.flatMap((p) => (p.measurement?.ccdf === undefined || p.sameAsCurrent ? [] : [{ name: p.name, colour: p.colour, result: p.measurement.ccdf }]));
    const same = pinned.find((p) => p.sameAsCurrent);
    return buildCcdfFigure(
      { statistic, note, overlays, current: { name: same === undefined ? 'current' : `${same.name} (current)`, colour: same?.colour ?? theme.text, result } },
      theme,
    );
  }, [result, note, statistic, scheme, pinned]);
  return <PlotlyFigure drawing="canvas" figure={figure} label="CCDF on a log-probability axis" testId="ccdf-plot" epoch={seq} />;
}
