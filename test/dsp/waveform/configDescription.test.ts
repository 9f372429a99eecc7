import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { describeConfig, describeWaveform } from '../../../src/dsp/waveform/configDescription';
import { exportToMemory } from '../../../src/io/exportMemory';
import { TEST_SEED } from '../../helpers/seed';
import { runStatistics } from '../montecarlo/runStatistics';

const describedAs = (input: WaveformConfigInput) => describeWaveform(parseWaveformConfig(input));

describe('one-line configuration description', () => {
  it('names the grid of each standard, with the spacing where the standard lets it vary', () => {
    // Wording: Crestline's own (configDescription.ts). LTE is always 15 kHz (TS 36.211 §4), so no spacing is printed.
    expect(describedAs({ standard: 'lte', bandwidthMHz: 1.4, modulation: '16qam' })).toBe('LTE 1.4 MHz uplink dft-s-ofdm localized 16qam');
    // NR defaults to 30 kHz when subcarrierSpacingKHz is absent (schema.ts default, as resolveNumerology applies it).
    expect(describedAs({ standard: 'nr', bandwidthMHz: 20, link: 'downlink', modulation: '64qam' })).toBe('NR 20 MHz 30 kHz downlink ofdm 64qam');
    expect(describedAs({ standard: 'nr', bandwidthMHz: 5, subcarrierSpacingKHz: 15 })).toBe('NR 5 MHz 15 kHz uplink dft-s-ofdm localized qpsk');
  });

  it('describes a custom numerology by its FFT size, RB count and spacing, never by the unused bandwidthMHz', () => {
    // A custom grid is custom.fftSize × subcarrierSpacingKHz (default 15 kHz; schema.ts); bandwidthMHz plays no part.
    const custom = { fftSize: 512, numRb: 25, cpLengthSamples: 36 };
    expect(describedAs({ standard: 'custom', custom, subcarrierSpacingKHz: 30, link: 'downlink' })).toBe('custom FFT 512 (25 RB) 30 kHz downlink ofdm qpsk');
    const byDefault = describedAs({ standard: 'custom', custom, bandwidthMHz: 20 });
    expect(byDefault).toBe('custom FFT 512 (25 RB) 15 kHz uplink dft-s-ofdm localized qpsk');
    expect(byDefault).not.toMatch(/MHz/);
  });

  it('prints the mapping for DFT-s-OFDM and for interleaved OFDM only', () => {
    // Plain OFDM data is always contiguous per block, so "localized" would add nothing (Crestline's wording).
    expect(describedAs({ link: 'downlink', waveform: 'ofdm' })).toBe('LTE 20 MHz downlink ofdm qpsk');
    expect(describedAs({ link: 'downlink', waveform: 'ofdm', mapping: 'interleaved' })).toBe('LTE 20 MHz downlink ofdm interleaved qpsk');
    expect(describedAs({ mapping: 'interleaved', interleaveFactor: 4 })).toBe('LTE 20 MHz uplink dft-s-ofdm interleaved qpsk');
  });

  it('adds the length and oversampling for files and summaries', () => {
    // Wording: Crestline's own; symbols and oversampling as given in the configuration.
    expect(describeConfig(parseWaveformConfig({ symbols: 28, oversampling: 2 }))).toBe('LTE 20 MHz uplink dft-s-ofdm localized qpsk, 28 symbols, oversampling 2');
  });

  it('is the wording of the SigMF description and of the measurement report', async () => {
    // One implementation for both (the io and the Monte-Carlo report used to disagree); checked at their outputs.
    const input: WaveformConfigInput = { standard: 'custom', custom: { fftSize: 128, numRb: 6, cpLengthSamples: 9 }, subcarrierSpacingKHz: 30, symbols: 2 };
    const config = parseWaveformConfig(input);
    const meta = JSON.parse(exportToMemory(config).metaText) as { global: Record<string, unknown> };
    expect(meta.global['core:description']).toBe('Crestline waveform: custom FFT 128 (6 RB) 30 kHz uplink dft-s-ofdm localized qpsk, 2 symbols, oversampling 1');
    const { report } = await runStatistics(input, { symbols: 20, blockSymbols: 10, seed: TEST_SEED });
    expect(report.configuration, `seed ${TEST_SEED}`).toBe('custom FFT 128 (6 RB) 30 kHz uplink dft-s-ofdm localized qpsk');
  });
});
