import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { plotThemes } from '../../../src/ui/plotData/plotTheme';
import { buildTimeSamplesFigure, MAX_TIME_POINTS, prepareTimeSamples } from '../../../src/ui/plotData/timeSamples';
import { expectCloseArray } from '../../helpers/expectClose';

const absTol = 1e-9;
const generate = (input: Record<string, unknown>) => generateWaveform(parseWaveformConfig(input));

describe('prepareTimeSamples', () => {
  it('takes the symbol’s own samples: the cyclic prefix repeats the end of the useful part (downlink)', () => {
    // TS 36.211 §6.12: s(t) = Σ a_k e^{j2πkΔf(t − N_CP·Ts)} is periodic in N·Ts, so the CP equals the symbol's tail.
    const waveform = generate({ standard: 'lte', link: 'downlink', bandwidthMHz: 1.4, symbols: 3, oversampling: 2 });
    const series = prepareTimeSamples(waveform, 1);
    const cp = series.cpLengthSamples;
    const n = series.inPhase.length - cp;
    expect(cp).toBe(2 * 9); // 144 Ts × 128/2048, ×2 oversampling (TS 36.101 Table F.5.3-1 lists 9 at 1.4 MHz)
    expectCloseArray(series.inPhase.subarray(0, cp), series.inPhase.subarray(n, n + cp), absTol, 'I: CP vs tail');
    expectCloseArray(series.quadrature.subarray(0, cp), series.quadrature.subarray(n, n + cp), absTol, 'Q: CP vs tail');
  });

  it('shows the uplink half-subcarrier shift: the CP is the negated tail', () => {
    // TS 36.211 §5.6: subcarriers at (k + 1/2)Δf, so s(t − N·Ts) = e^{−jπ(2k+1)} s(t) = −s(t) (derived).
    const waveform = generate({ standard: 'lte', link: 'uplink', bandwidthMHz: 1.4, symbols: 2 });
    const series = prepareTimeSamples(waveform, 0);
    const cp = series.cpLengthSamples;
    const n = series.inPhase.length - cp;
    const negatedTail = series.inPhase.subarray(n).map((v) => -v);
    expectCloseArray(series.inPhase.subarray(0, cp), negatedTail, absTol, 'I: CP vs −tail');
  });

  it('gives time in µs from the waveform start and the CP span', () => {
    // LTE 1.4 MHz: 1.92 Msps (128 × 15 kHz, common practice); symbol 1 starts after 128 + 10 samples.
    const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, symbols: 2 });
    const series = prepareTimeSamples(waveform, 1);
    const usPerSample = 1e6 / 1.92e6;
    expect(series.timeUs[0]).toBeCloseTo(138 * usPerSample, 9);
    expect((series.timeUs[1] ?? 0) - (series.timeUs[0] ?? 0)).toBeCloseTo(usPerSample, 9);
    expect(series.cpStartUs).toBeCloseTo(138 * usPerSample, 9);
    expect(series.usefulStartUs).toBeCloseTo((138 + 9) * usPerSample, 9);
    expect(series.endUs).toBeCloseTo((138 + 9 + 128) * usPerSample, 9);
  });

  it('finds the peak and the peak-to-average power of the symbol', () => {
    const waveform = generate({ standard: 'lte', link: 'downlink', bandwidthMHz: 3, symbols: 1, modulation: '64qam' });
    const series = prepareTimeSamples(waveform, 0);
    let peakPower = 0;
    let sumPower = 0;
    const numSamples = waveform.numSamples;
    for (let i = 0; i < numSamples; i++) {
      const p = (waveform.waveformIq[2 * i] ?? 0) ** 2 + (waveform.waveformIq[2 * i + 1] ?? 0) ** 2;
      peakPower = Math.max(peakPower, p);
      sumPower += p;
    }
    expect(series.peak.magnitude).toBeCloseTo(Math.sqrt(peakPower), 12);
    expect(series.peakToAveragePowerDb).toBeCloseTo(10 * Math.log10(peakPower / (sumPower / numSamples)), 9);
    // OFDM with 180 subcarriers: PAPR of one symbol lies well above 3 dB and below 10·log10(180) (van Nee & Prasad, ch. 6).
    expect(series.peakToAveragePowerDb).toBeGreaterThan(3);
    expect(series.peakToAveragePowerDb).toBeLessThan(10 * Math.log10(180));
  });
});

describe('buildTimeSamplesFigure', () => {
  const waveform = generate({ standard: 'lte', bandwidthMHz: 1.4, symbols: 1 });
  const series = prepareTimeSamples(waveform, 0);

  it('draws I, Q, |x| and the peak, with the CP shaded up to the useful part', () => {
    const figure = buildTimeSamplesFigure(series, plotThemes.light);
    expect(figure.data.map((trace) => trace.name)).toEqual(['I', 'Q', '|x|', 'peak']);
    const [cpShade, boundary] = figure.layout.shapes ?? [];
    expect(cpShade).toMatchObject({ type: 'rect', x0: series.cpStartUs, x1: series.usefulStartUs });
    expect(boundary).toMatchObject({ type: 'line', x0: series.usefulStartUs, x1: series.usefulStartUs });
    expect(figure.layout.xaxis?.range).toEqual([series.cpStartUs, series.endUs]);
  });

  it('thins long symbols by min/max buckets without losing an extreme', () => {
    const long = prepareTimeSamples(generate({ standard: 'lte', bandwidthMHz: 20, symbols: 1, oversampling: 4 }), 0);
    const figure = buildTimeSamplesFigure(long, plotThemes.light);
    const magnitude = figure.data[2] as { x: Float64Array; y: Float64Array };
    expect(magnitude.y.length).toBeLessThanOrEqual(MAX_TIME_POINTS);
    expect(Math.max(...magnitude.y)).toBe(long.peak.magnitude);
    expect(Math.min(...(figure.data[0] as { y: Float64Array }).y)).toBe(Math.min(...long.inPhase));
    // Times stay ascending (each bucket's two points in time order).
    for (let i = 1; i < magnitude.x.length; i++) expect(magnitude.x[i]!).toBeGreaterThanOrEqual(magnitude.x[i - 1]!);
    // A short symbol (LTE 1.4 MHz, 137 samples) is drawn sample by sample.
    expect((buildTimeSamplesFigure(series, plotThemes.light).data[0] as { y: Float64Array }).y.length).toBe(series.inPhase.length);
  });

  it('follows the colour scheme', () => {
    expect(buildTimeSamplesFigure(series, plotThemes.dark).layout.paper_bgcolor).toBe(plotThemes.dark.background);
    expect(buildTimeSamplesFigure(series, plotThemes.light).layout.paper_bgcolor).toBe(plotThemes.light.background);
  });
});
