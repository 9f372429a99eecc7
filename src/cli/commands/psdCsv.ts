import { normalisePsd, type SpectrumMeasurement } from '../../dsp/metrics/spectrumMeasurement';

/** The spectrum as CSV: a commented header with the settings, then frequency_hz, dBc/Hz and dBc per RBW. */
export function spectrumCsv(m: SpectrumMeasurement): string {
  const { dbcPerHz, dbcPerRbw } = normalisePsd(m.psd, m.aclr.assignedPower);
  const lines = [
    `# Crestline spectrum: Welch, ${m.psd.window} window, RBW ${m.psd.rbwHz.toFixed(1)} Hz, ${m.psd.numSegments} segments of ${m.psd.segmentLength}, ${(m.sampleRateHz / 1e6).toFixed(3)} Msps`,
    `# dBc is relative to the in-channel power (${m.aclr.assignedFilter} filter); ${m.symbols} symbols, data ${m.dataSource}, oversampling ${m.oversampling}`,
    'frequency_hz,psd_dbc_per_hz,psd_dbc_per_rbw',
  ];
  for (let i = 0; i < dbcPerHz.length; i++) {
    lines.push(`${m.psd.frequenciesHz[i]!.toFixed(1)},${dbcPerHz[i]!.toFixed(3)},${dbcPerRbw[i]!.toFixed(3)}`);
  }
  return `${lines.join('\n')}\n`;
}
