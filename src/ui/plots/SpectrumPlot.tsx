import { useMemo } from 'react';
import { plotThemes } from '../plotData/plotTheme';
import { buildSpectrumFigure } from '../plotData/spectrum';
import { useAppStore } from '../state/AppStoreContext';
import { usePinnedOverlays } from '../state/useOverlays';
import { PlotlyFigure } from './PlotlyFigure';

/** Welch PSD with the ACLR channels shaded and their values; the transmitted spectrum when a chain is configured. */
export function SpectrumPlot() {
  const spectrum = useAppStore((state) => state.spectrum);
  const scheme = useAppStore((state) => state.colorScheme);
  const pinned = usePinnedOverlays();
  const overlays = useMemo(
    () =>
      pinned.flatMap((p) => {
        const s = p.measurement?.spectrum;
        return s === undefined || p.sameAsCurrent ? [] : [{ name: p.name, colour: p.colour, spectrum: s.transmitted ?? s.waveform }];
      }),
    [pinned],
  );
  const figure = useMemo(() => {
    const data = spectrum.data;
    if (data === null) return null;
    const theme = plotThemes[scheme];
    const same = pinned.find((p) => p.sameAsCurrent);
    return buildSpectrumFigure(
      {
        primary: data.transmitted ?? data.waveform,
        generated: data.transmitted === null ? null : data.waveform,
        overlays,
        label: `${same === undefined ? 'current' : `${same.name} (current)`}${data.transmitted === null ? '' : ', transmitted'}`,
        colour: same?.colour ?? theme.text,
      },
      theme,
    );
  }, [spectrum.data, scheme, overlays]);
  return <PlotlyFigure drawing="canvas" figure={figure} label="Power spectral density with ACLR channels" testId="spectrum-plot" epoch={spectrum.seq} />;
}
