import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { computeOccupiedBandwidth } from '../../../src/dsp/metrics/occupiedBandwidth';
import { measureSpectrum, normalisePsd } from '../../../src/dsp/metrics/spectrumMeasurement';
import type { PowerSpectrum } from '../../../src/dsp/metrics/welchPsd';

function flatSpectrum(widthHz: number, binWidthHz: number, numBins: number): PowerSpectrum {
  const frequenciesHz = new Float64Array(numBins);
  const psdPerHz = new Float64Array(numBins);
  for (let i = 0; i < numBins; i++) {
    frequenciesHz[i] = (i - numBins / 2 + 0.5) * binWidthHz;
    psdPerHz[i] = Math.abs(frequenciesHz[i]!) < widthHz / 2 ? 2 : 0;
  }
  return { frequenciesHz, psdPerHz, binWidthHz, rbwHz: binWidthHz, sampleRateHz: numBins * binWidthHz, window: 'hann', segmentLength: numBins, numSegments: 1 };
}

describe('99 % occupied bandwidth', () => {
  it('a flat spectrum W wide occupies 0.99·W, centred (derived)', () => {
    const obw = computeOccupiedBandwidth(flatSpectrum(10e6, 10e3, 4096));
    // 1000 non-zero bins of 10 kHz between −5 and +5 MHz (bin centres −4.995…+4.995 MHz): 10 MHz flat.
    expect(obw.occupiedBandwidthHz).toBeCloseTo(0.99 * 10e6, 0);
    expect(obw.lowerHz).toBeCloseTo(-obw.upperHz, 3);
  });
});

describe('spectrum of a configured waveform', () => {
  it('LTE 20 MHz downlink OFDM, full grid: OBW ≈ 0.99 × N_RB·180 kHz = 17.82 MHz, within the 18 MHz transmission BW (TS 36.101 §5.6)', () => {
    const config = parseWaveformConfig({ standard: 'lte', link: 'downlink', bandwidthMHz: 20, data: { source: 'random', seed: 7 } });
    const m = measureSpectrum(config, { oversampling: 2, symbols: 70 });
    const obw = m.occupiedBandwidth.occupiedBandwidthHz;
    // A flat 1200-subcarrier spectrum gives 0.99·18 MHz; the sinc skirts of the un-windowed symbols add a little.
    expect(obw).toBeGreaterThan(0.99 * 18e6 - 60e3);
    expect(obw).toBeLessThan(18e6);
    expect(m.psd.rbwHz).toBeGreaterThan(19e3);
    expect(m.psd.rbwHz).toBeLessThan(21e3);
    // Un-windowed OFDM leaks: E-UTRA ACLR finite, well above 20 dB; UTRA ACLR2 further out is larger than ACLR1.
    const byKey = Object.fromEntries(m.aclr.values.map((v) => [v.key, v.aclrDb]));
    expect(byKey.eutraUpper).toBeGreaterThan(20);
    expect(byKey.utra2Upper).toBeGreaterThan(byKey.utra1Upper!);
    const { dbcPerHz, dbcPerRbw } = normalisePsd(m.psd, m.aclr.assignedPower);
    const centre = m.psd.frequenciesHz.length / 2 + 100;
    // 1200 equal subcarriers over 18 MHz: in-channel PSD ≈ −10·log10(18e6) = −72.55 dBc/Hz (derived).
    expect(dbcPerHz[centre]).toBeGreaterThan(-72.55 - 1.5);
    expect(dbcPerHz[centre]).toBeLessThan(-72.55 + 1.5);
    expect(dbcPerRbw[centre]! - dbcPerHz[centre]!).toBeCloseTo(10 * Math.log10(m.psd.rbwHz), 9);
  });

  it('regenerates at a higher oversampling, with a warning, when the adjacent channels do not fit', () => {
    const config = parseWaveformConfig({ standard: 'lte', bandwidthMHz: 5, data: { source: 'pn9' } });
    const m = measureSpectrum(config, { oversampling: 1 });
    // LTE 5 MHz at 7.68 Msps: UTRA ACLR2 at ±(2.5 + 7.5) MHz with the RRC's ±2.34 MHz reaches ±12.34 MHz, so the
    // spectrum needs ≥ 24.7 Msps → oversampling 4 (30.72 Msps).
    expect(m.oversampling).toBe(4);
    expect(m.warnings.join(' ')).toMatch(/reach ±12\.34 MHz, beyond the ±3\.84 MHz .* regenerated at oversampling 4 \(30\.72 Msps\)/);
    expect(m.dataSource).toBe('pn9');
    expect(m.aclr.values.every((v) => Number.isFinite(v.aclrDb))).toBe(true);
  });
});
