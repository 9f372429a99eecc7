import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { DspError } from '../../src/dsp/errors';
import { generateWaveform } from '../../src/dsp/waveform/waveformGenerator';
import { encodeCf32Le } from '../../src/io/cf32';
import { exportToMemory } from '../../src/io/exportMemory';
import { parseExportOptions } from '../../src/io/exportOptions';
import { runExport } from '../../src/io/exportPipeline';
import { planExport } from '../../src/io/exportPlan';
import { decodeIq } from '../../src/io/iqCodecs';
import { parseIqSidecar } from '../../src/io/iqSidecar';
import { parseWavHeader } from '../../src/io/wav';
import { sha512Hex } from '../../src/io/sha512';
import { hannSpectrum, meanPower } from '../helpers/iqTestSignals';

function powerDb(iq: Float64Array): number {
  return 10 * Math.log10(meanPower(iq));
}

describe('export pipeline', () => {
  it('keeps the default generate output bit-exact: cf32_le of the formula samples at the waveform rate', () => {
    for (const input of [{}, { standard: 'nr', link: 'downlink', bandwidthMHz: 20, carrierFrequencyHz: 3.5e9, symbols: 28 }, { oversampling: 2, symbols: 9 }]) {
      const config = parseWaveformConfig(input);
      const out = exportToMemory(config);
      const before = encodeCf32Le(generateWaveform(config).waveformIq);
      expect(sha512Hex(out.data)).toBe(sha512Hex(before));
      const meta = JSON.parse(out.metaText) as { global: Record<string, any> };
      expect(meta.global['crestline:scaling'].scaleLinear).toBe(1);
      expect(meta.global['crestline:scaling'].note).toBe('samples are the standard baseband formula values, unscaled');
    }
  });

  it('hits RMS and peak levels in dBFS (0 dBFS = |x| = 1) and the auto level from the record’s own CCDF', () => {
    const config = parseWaveformConfig({ link: 'downlink', symbols: 14, data: { source: 'random', seed: 11 } });
    const rms = decodeIq('cf32_le', exportToMemory(config, { level: { mode: 'rms', levelDbfs: -12 } }).data);
    const toleranceDb = 1e-4; // float32 rounding only
    expect(Math.abs(powerDb(rms) + 12)).toBeLessThan(toleranceDb);
    const peak = decodeIq('cf32_le', exportToMemory(config, { level: { mode: 'peak', levelDbfs: -1 } }).data);
    let maxP = 0;
    for (let i = 0; i < peak.length; i += 2) maxP = Math.max(maxP, peak[i]! ** 2 + peak[i + 1]! ** 2);
    expect(Math.abs(10 * Math.log10(maxP) + 1)).toBeLessThan(toleranceDb);
    const auto = exportToMemory(config, { format: 'raw-f32' });
    const x = decodeIq('cf32_le', auto.data);
    const powers = Float64Array.from({ length: x.length / 2 }, (_, i) => x[2 * i]! ** 2 + x[2 * i + 1]! ** 2).sort();
    // Exact order statistic of the written samples: the level exceeded by 1e-4 of them, dBFS.
    const exceeded = 10 * Math.log10(powers[powers.length - 1 - Math.floor(1e-4 * powers.length)]!);
    // Auto level: that power sits 1 dB (margin) below full scale, to within the 0.01 dB histogram bin.
    expect(exceeded).toBeGreaterThan(-1 - 0.011);
    expect(exceeded).toBeLessThan(-1 + 0.011);
    expect(auto.report.level.mode).toBe('auto');
  });

  it('integer formats report clipping loudly and the quantisation SNR', () => {
    const config = parseWaveformConfig({ link: 'downlink', symbols: 14, data: { source: 'random', seed: 3 } });
    const hot = exportToMemory(config, { format: 'sigmf-ci16', level: { mode: 'rms', levelDbfs: -3 } });
    const q = hot.report.quantisation!;
    expect(q.clippedSamples).toBeGreaterThan(0);
    expect(hot.report.warnings.some((w) => w.startsWith('CLIPPING:'))).toBe(true);
    // Independent count: samples with I or Q at the int16 extremes in the file.
    const codes = new Int16Array(hot.data.buffer, hot.data.byteOffset, hot.data.length / 2);
    let atRail = 0;
    for (let i = 0; i < codes.length; i += 2) if (Math.abs(codes[i]!) >= 32767 || Math.abs(codes[i + 1]!) >= 32767) atRail++;
    expect(q.clippedSamples).toBeLessThanOrEqual(atRail);
    expect(q.clippedSamples).toBeGreaterThan(0.9 * atRail);
    expect(q.clippedPercent).toBeCloseTo((100 * q.clippedSamples) / 30720, 10);
    const cool = exportToMemory(config, { format: 'sigmf-ci16' });
    expect(cool.report.quantisation!.clippedSamples).toBe(0);
    // Auto level on OFDM: about 10.6 dB below full scale RMS, so SNR ≈ 96.3 − 10.6 − 3 (complex peak vs component) ≈ 82 dB (derived, loose).
    expect(cool.report.quantisation!.quantisationSnrDb).toBeGreaterThan(75);
    expect(cool.report.quantisation!.quantisationSnrDb).toBeLessThan(90);
  });

  it('records enough in the metadata to regenerate the file bit-exactly', () => {
    const config = parseWaveformConfig({ standard: 'nr', link: 'uplink', bandwidthMHz: 10, subcarrierSpacingKHz: 30, symbols: 28 });
    const first = exportToMemory(config, { format: 'sigmf-ci16', sampleRateHz: 61.44e6, freqOffsetHz: 250e3, repeat: 2, stopbandAttenuationDb: 70 });
    const meta = JSON.parse(first.metaText) as { global: Record<string, any> };
    const again = exportToMemory(parseWaveformConfig(meta.global['crestline:config']), parseExportOptions(meta.global['crestline:export'].options));
    expect(again.sha512Hex).toBe(first.sha512Hex);
    expect(again.metaText).toBe(first.metaText);
    expect(meta.global['crestline:export'].resampler.designStopbandAttenuationDb).toBe(70);
    expect(meta.global['crestline:export'].resampler.measuredStopbandAttenuationDb).toBeGreaterThanOrEqual(70);
  });

  it('a looping file played twice shows no extra sidelobes at the seam; an unsnapped offset does', () => {
    // LTE 5 MHz (±2.25 MHz occupied) resampled ×4 to 30.72 Msps: beyond ~5.4 MHz the filter leaves ≥ 80 dB, so any
    // out-of-band power in a window comes from a discontinuity (common practice; Harris 1978 on windowed spectra).
    const config = parseWaveformConfig({ bandwidthMHz: 5, symbols: 14, data: { source: 'random', seed: 5 } });
    const oobDb = (x: Float64Array, centre: number): number => {
      const len = 1024;
      const offsetBins = (1e6 / 30.72e6) * len;
      const bins = Array.from({ length: len }, (_, k) => k).filter((k) => {
        const f = ((k + len / 2) % len) - len / 2 - offsetBins;
        return Math.abs(f) > (7e6 / 30.72e6) * len;
      });
      const p = hannSpectrum(x, centre - len / 2, len, bins);
      return 10 * Math.log10(p.reduce((s, v) => s + v, 0));
    };
    const seamVsInside = (exactFreqOffset: boolean): number => {
      const out = exportToMemory(config, { sampleRateHz: 30.72e6, freqOffsetHz: 1e6 + 333, exactFreqOffset, level: { mode: 'rms', levelDbfs: -15 } });
      const x = decodeIq('cf32_le', out.data);
      const n = x.length / 2;
      const twice = new Float64Array(2 * x.length);
      twice.set(x);
      twice.set(x, x.length);
      const inside = Math.max(...[n / 2, n / 2 + 2200, n / 4, (3 * n) / 4].map((c) => oobDb(twice, c)));
      return oobDb(twice, n) - inside;
    };
    const marginDb = 1;
    const clean = seamVsInside(false);
    const stepped = seamVsInside(true);
    console.info(`seam vs inside out-of-band power: snapped ${clean.toFixed(2)} dB, unsnapped ${stepped.toFixed(2)} dB`);
    expect(clean).toBeLessThan(marginDb);
    expect(stepped).toBeGreaterThan(10);
  });

  it('repeats whole copies (identical when the loop is seamless) and progresses to 100 %', () => {
    const config = parseWaveformConfig({ bandwidthMHz: 1.4, symbols: 14 });
    const plan = planExport(config, { format: 'raw-i16le', repeat: 3, freqOffsetHz: 10e3, sampleRateHz: 3.84e6 });
    expect(plan.seamlessLoop).toBe(true);
    const steps = runExport(plan);
    const chunks: Uint8Array[] = [];
    let last = 0;
    let result;
    for (;;) {
      const s = steps.next();
      if (s.done) {
        result = s.value;
        break;
      }
      if (s.value.kind === 'data') chunks.push(s.value.bytes);
      else {
        expect(s.value.doneSamples).toBeGreaterThanOrEqual(last);
        last = s.value.doneSamples;
        expect(s.value.doneSamples).toBeLessThanOrEqual(s.value.totalSamples);
      }
    }
    const data = Buffer.concat(chunks);
    const copy = data.length / 3;
    // LTE 1.4 MHz: 1.92 Msps, 1 ms = 1920 samples (TS 36.101 F.5.3-1), ×2 → 3840 samples of 4 bytes.
    expect(copy).toBe(3840 * 4);
    expect(data.subarray(0, copy).equals(data.subarray(copy, 2 * copy))).toBe(true);
    expect(data.subarray(0, copy).equals(data.subarray(2 * copy))).toBe(true);
    expect(result.sha512Hex).toBe(sha512Hex(data));
  });

  it('WAV keeps the exact rate in its sidecar and a rounded one in the header', () => {
    const out = exportToMemory(parseWaveformConfig({ symbols: 14 }), { format: 'wavf32', sampleRateHz: 1e8 / 3 });
    const side = parseIqSidecar(out.metaText, 'x.wav.json');
    expect(side.sampleRateHz).toBe((30.72e6 * 625) / 576);
    expect(parseWavHeader(out.data, out.data.length, 'x.wav').sampleRateHz).toBe(33_333_333);
    expect(out.report.warnings.some((w) => /whole number: 33333333 Hz/.test(w))).toBe(true);
  });

  it('bad options and impossible exports name what to change', () => {
    const config = parseWaveformConfig({ symbols: 14 });
    const field = (fn: () => unknown): unknown => {
      try {
        fn();
      } catch (err) {
        expect(err).toBeInstanceOf(DspError);
        return (err as DspError).details?.field ?? (err as DspError).details?.issues;
      }
      throw new Error('expected an error');
    };
    expect(field(() => planExport(config, { format: 'csv', repeat: 40 }))).toBe('format');
    expect(field(() => planExport(config, { sampleRateHz: 15.36e6 }))).toBe('rate');
    expect(field(() => planExport(config, { freqOffsetHz: 7e6 }))).toBe('freqOffsetHz');
    expect(JSON.stringify(field(() => planExport(config, { format: 'mp3' as never })))).toMatch(/format/);
    expect(JSON.stringify(field(() => planExport(config, { level: { mode: 'rms', levelDbfs: 50 } })))).toMatch(/level/);
  });
});
