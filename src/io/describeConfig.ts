import type { WaveformConfig } from '../config/schema';
import { effectiveWaveform } from '../dsp/waveform/waveformPlan';

/** One-line description of a configuration, for file metadata and summaries. */
export function describeConfig(config: WaveformConfig): string {
  const waveform = effectiveWaveform(config);
  const scs = config.standard === 'nr' ? ` ${config.subcarrierSpacingKHz ?? 30} kHz` : '';
  return `${config.standard.toUpperCase()} ${config.bandwidthMHz} MHz${scs} ${config.link} ${waveform} ${config.modulation}, ${config.symbols} symbols, oversampling ${config.oversampling}`;
}
