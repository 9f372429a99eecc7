import type { WaveformConfig } from '../../config/schema';
import { effectiveWaveform } from './waveformPlan';

/**
 * One-line description of what a configuration transmits, without its length: grid, subcarrier spacing, link,
 * waveform, mapping and modulation. The one wording for file metadata, CLI summaries and measurement reports.
 * - Grid: "LTE 20 MHz" (15 kHz, not printed), "NR 20 MHz 30 kHz", "custom FFT 512 (25 RB) 30 kHz".
 * - Mapping is printed for DFT-s-OFDM and for any interleaved mapping (plain OFDM is always localized).
 *
 * Example: "LTE 1.4 MHz uplink dft-s-ofdm localized 16qam".
 * @param config a validated configuration (parseWaveformConfig output)
 */
export function describeWaveform(config: WaveformConfig): string {
  const waveform = effectiveWaveform(config);
  const mapping = waveform === 'dft-s-ofdm' || config.mapping === 'interleaved' ? ` ${config.mapping}` : '';
  return `${describeGrid(config)} ${config.link} ${waveform}${mapping} ${config.modulation}`;
}

/**
 * `describeWaveform` followed by the configuration's own length and oversampling, e.g.
 * "NR 20 MHz 30 kHz downlink ofdm 64qam, 14 symbols, oversampling 2". For generated files and their summaries; a
 * measurement report uses `describeWaveform`, since its run sets its own length and oversampling.
 */
export function describeConfig(config: WaveformConfig): string {
  return `${describeWaveform(config)}, ${config.symbols} symbols, oversampling ${config.oversampling}`;
}

function describeGrid(config: WaveformConfig): string {
  switch (config.standard) {
    case 'lte':
      return `LTE ${config.bandwidthMHz} MHz`;
    case 'nr':
      // 30 kHz when absent, as in resolveNumerology.
      return `NR ${config.bandwidthMHz} MHz ${config.subcarrierSpacingKHz ?? 30} kHz`;
    case 'custom': {
      // bandwidthMHz plays no part in a custom grid; its FFT size, RB count and spacing (default 15 kHz) define it.
      const size = config.custom ? ` FFT ${config.custom.fftSize} (${config.custom.numRb} RB)` : '';
      return `custom${size} ${config.subcarrierSpacingKHz ?? 15} kHz`;
    }
  }
}
