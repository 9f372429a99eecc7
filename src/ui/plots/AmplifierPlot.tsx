import { useMemo } from 'react';
import { buildAmplifierFigure } from '../plotData/amplifier';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** AM/AM and AM/PM of the configured amplifier with the waveform's mean operating point. */
export function AmplifierPlot() {
  const spectrum = useAppStore((state) => state.spectrum);
  const scheme = useAppStore((state) => state.colorScheme);
  const amplifier = spectrum.data?.amplifier ?? null;
  const figure = useMemo(() => (amplifier === null ? null : buildAmplifierFigure(amplifier, plotThemes[scheme])), [amplifier, scheme]);
  if (spectrum.data !== null && amplifier === null) {
    return <p className="plot-empty">No amplifier in this configuration. Add one under Transmitter → Amplifier to see its AM/AM and AM/PM.</p>;
  }
  return <PlotlyFigure figure={figure} label="Amplifier AM/AM and AM/PM" testId="amplifier-plot" epoch={spectrum.seq} />;
}
