import { useMemo } from 'react';
import { buildBackoffFigure, type BackoffSeries } from '../plotData/backoff';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from '../state/AppStoreContext';
import { usePinnedOverlays } from '../state/useOverlays';
import { PlotlyFigure } from './PlotlyFigure';

/** EVM and ACLR against output back-off for the configuration and the pinned scenarios, with each one's answer. */
export function BackoffPlot() {
  const backoff = useAppStore((state) => state.backoff);
  const hasAmplifier = useAppStore((state) => state.submittedDraft?.amplifier !== undefined);
  const scheme = useAppStore((state) => state.colorScheme);
  const pinned = usePinnedOverlays();
  const figure = useMemo(() => {
    const theme = plotThemes[scheme];
    const series: BackoffSeries[] = pinned.flatMap((p) =>
      p.measurement?.backoff === undefined || p.sameAsCurrent ? [] : [{ name: p.name, colour: p.colour, analysis: p.measurement.backoff.analysis, current: false }],
    );
    const same = pinned.find((p) => p.sameAsCurrent);
    if (backoff.data !== null) {
      series.push({ name: same === undefined ? 'current' : `${same.name} (current)`, colour: same?.colour ?? theme.text, analysis: backoff.data.analysis, current: true });
    }
    return series.length === 0 ? null : buildBackoffFigure(series, theme);
  }, [backoff.data, pinned, scheme]);
  return (
    <>
      <p className="plot-status" role="status">
        {backoff.status === 'running'
          ? 'Sweeping the back-off (1–15 dB, then bisection to 0.05 dB)…'
          : backoff.status === 'failed'
            ? `Back-off: ${backoff.error ?? 'failed'}`
            : !hasAmplifier
              ? 'The configuration has no amplifier: switch one on under Amplifier to sweep its back-off. Pinned scenarios with one are shown.'
              : backoff.data !== null
                ? `Swept in ${(backoff.data.elapsedMs / 1000).toFixed(1)} s; ${backoff.data.analysis.curve.length} points.`
                : ''}
      </p>
      <PlotlyFigure figure={figure} label="EVM and ACLR against output back-off" testId="backoff-plot" epoch={backoff.seq} />
    </>
  );
}
