/**
 * Trace data for the amplifier panel: the model's static AM/AM (output vs input level, both relative to saturation)
 * and AM/PM, with the operating point the configured drive puts the waveform's mean power at. From the engine's
 * computeAmplifierCurves and solveDrive results; no computation of its own beyond sign changes.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { AmplifierData } from '../../worker/client';
import { baseLayout, type PlotTheme } from './plotTheme';

export function buildAmplifierFigure(amplifier: AmplifierData, theme: PlotTheme): { data: Data[]; layout: Partial<Layout> } {
  const base = baseLayout(theme);
  const data: Data[] = [
    {
      type: 'scatter',
      mode: 'lines',
      name: 'AM/AM',
      x: amplifier.inputDbRelSat,
      y: amplifier.outputDbRelSat,
      line: { color: theme.series[0] ?? theme.inPhase, width: 2 },
      hovertemplate: 'input %{x:.2f} dB re sat<br>output %{y:.2f} dB re sat<extra>AM/AM</extra>',
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'linear gain',
      x: [amplifier.inputDbRelSat[0] ?? -30, 10],
      // Small-signal gain line through the first point (0 dB compression there by construction of the curves).
      y: [(amplifier.outputDbRelSat[0] ?? -30) , (amplifier.outputDbRelSat[0] ?? -30) + 10 - (amplifier.inputDbRelSat[0] ?? -30)],
      line: { color: theme.boundary, width: 1, dash: 'dot' },
      hoverinfo: 'skip',
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'AM/PM',
      x: amplifier.inputDbRelSat,
      y: amplifier.phaseDeg,
      yaxis: 'y2',
      line: { color: theme.series[1] ?? theme.quadrature, width: 1.6, dash: 'dash' },
      hovertemplate: 'input %{x:.2f} dB re sat<br>phase %{y:.2f}°<extra>AM/PM</extra>',
    },
  ];
  const drive = amplifier.drive;
  if (drive !== null) {
    data.push({
      type: 'scatter',
      mode: 'text+markers',
      name: 'mean operating point',
      x: [-drive.iboDb],
      y: [-drive.oboDb],
      text: [`IBO ${drive.iboDb.toFixed(1)} dB / OBO ${drive.oboDb.toFixed(1)} dB`],
      textposition: 'top left',
      textfont: { size: 11, color: theme.text },
      marker: { color: theme.peak, size: 11, symbol: 'diamond' },
      hovertemplate: 'mean input −IBO %{x:.2f} dB<br>mean output −OBO %{y:.2f} dB<extra></extra>',
    });
  }
  const p1 = amplifier.inputP1dbRelSatDb;
  let phaseSpan = 0;
  for (const v of amplifier.phaseDeg) phaseSpan = Math.max(phaseSpan, Math.abs(v));
  return {
    data,
    layout: {
      ...base,
      title: { text: `${amplifier.description}${Number.isFinite(p1) ? `; P1dB at ${p1.toFixed(1)} dB re input sat` : ''}`, font: { size: 12 }, x: 0, xanchor: 'left' },
      xaxis: { ...base.xaxis, title: { text: 'input level (dB re input saturation)' } },
      yaxis: { ...base.yaxis, title: { text: 'output level (dB re output saturation)' }, range: [-32, 3] },
      yaxis2: {
        ...base.yaxis,
        title: { text: 'AM/PM (°)' },
        overlaying: 'y',
        side: 'right',
        showgrid: false,
        zeroline: false,
        // A model without AM/PM gets a ±10° axis rather than a magnified rounding noise.
        range: phaseSpan < 1 ? [-10, 10] : [-phaseSpan * 1.1, phaseSpan * 1.1],
        tickmode: 'auto',
      },
      legend: { x: 0.98, xanchor: 'right', y: 0.04, yanchor: 'bottom', bgcolor: theme.background, bordercolor: theme.grid, borderwidth: 1 },
      margin: { ...base.margin, r: 56 },
    },
  };
}
