import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { DspError } from '../../src/dsp/errors';
import { MAX_CSV_SAMPLES, decodeCsvIq, encodeCsvIq } from '../../src/io/csvIq';
import { exportToMemory } from '../../src/io/exportMemory';
import {
  createIqDataReader,
  describeRawSource,
  describeSigmfSource,
  describeWavSource,
  readCsvSource,
  type IqSource,
} from '../../src/io/importIq';
import { encodeIq } from '../../src/io/iqCodecs';
import { sha512Hex } from '../../src/io/sha512';

const config = parseWaveformConfig({ symbols: 7, bandwidthMHz: 5 });

function problemOf(fn: () => unknown): string {
  try {
    fn();
  } catch (err) {
    expect(err).toBeInstanceOf(DspError);
    expect((err as DspError).code).toBe('INVALID_FILE');
    return String((err as DspError).details?.problem);
  }
  throw new Error('expected an INVALID_FILE error');
}

function readAll(source: IqSource, bytes: Uint8Array, pieces = 1, ignoreChecksum = false) {
  const reader = createIqDataReader(source, { ignoreChecksum, keepSamples: true });
  const step = Math.ceil(bytes.length / pieces);
  for (let i = 0; i < bytes.length; i += step) reader.push(bytes.subarray(i, i + step));
  return reader.finish();
}

function withMetaField(metaText: string, key: string, value: unknown): string {
  const meta = JSON.parse(metaText) as { global: Record<string, unknown> };
  meta.global[key] = value;
  return JSON.stringify(meta);
}

describe('reading IQ files back, with validation', () => {
  const ci16 = exportToMemory(config, { format: 'sigmf-ci16' });
  const cf32 = exportToMemory(config, { format: 'sigmf-cf32', level: { mode: 'rms', levelDbfs: -10 } });

  it('verifies SHA-512 and decodes the same samples however the bytes are chunked (odd chunk sizes split samples)', () => {
    const source = describeSigmfSource(ci16.metaText, 'a.sigmf-meta', 'a.sigmf-data', ci16.data.length);
    const whole = readAll(source, ci16.data);
    const split = readAll(source, ci16.data, 7);
    expect(whole.checksum).toBe('verified');
    expect(whole.sha512Hex).toBe(sha512Hex(ci16.data));
    expect(Array.from(split.iq!)).toEqual(Array.from(whole.iq!));
    // LTE 5 MHz: 7.68 Msps, one 0.5 ms slot = 3840 samples (TS 36.211 §5.6; FFT 512, common practice).
    expect(whole.numSamples).toBe(3840);
  });

  it('truncated data: the count no longer matches crestline:num_samples', () => {
    const cut = ci16.data.subarray(0, ci16.data.length - 400);
    expect(problemOf(() => describeSigmfSource(ci16.metaText, 'a.sigmf-meta', 'a.sigmf-data', cut.length))).toBe('truncated');
  });

  it('odd byte count: not a whole number of samples', () => {
    expect(problemOf(() => describeSigmfSource(ci16.metaText, 'a.sigmf-meta', 'a.sigmf-data', ci16.data.length - 1))).toBe('length');
  });

  it('wrong or unknown datatype, bad JSON', () => {
    expect(problemOf(() => describeSigmfSource(withMetaField(ci16.metaText, 'core:datatype', 'ci12_le'), 'm', 'd', 8))).toBe('datatype');
    expect(problemOf(() => describeSigmfSource(ci16.metaText.slice(0, 100), 'm', 'd', 8))).toBe('json');
  });

  it('checksum mismatch is an error unless overridden, then a warning', () => {
    const source = describeSigmfSource(ci16.metaText, 'a.sigmf-meta', 'a.sigmf-data', ci16.data.length);
    const flipped = ci16.data.slice();
    flipped[1000] = flipped[1000]! ^ 1;
    expect(problemOf(() => readAll(source, flipped))).toBe('checksum');
    const r = readAll(source, flipped, 3, true);
    expect(r.checksum).toBe('mismatch-ignored');
    expect(r.warnings.join(' ')).toMatch(/SHA-512 does not match/);
  });

  it('NaN or Inf in float data names the sample', () => {
    const bad = cf32.data.slice();
    new DataView(bad.buffer).setFloat32(8 * 123 + 4, Number.NaN, true);
    const noSha = withMetaField(cf32.metaText, 'core:sha512', undefined);
    const source = describeSigmfSource(noSha, 'b.sigmf-meta', 'b.sigmf-data', bad.length);
    try {
      readAll(source, bad);
      expect.unreachable();
    } catch (err) {
      expect((err as DspError).details?.problem).toBe('nan');
      expect((err as DspError).message).toMatch(/b\.sigmf-data: sample 123 has a non-finite Q value/);
    }
    const cf64 = new Uint8Array(32);
    encodeIq('cf64_le', new Float64Array([0, 0, Infinity, 0]), cf64);
    const meta64 = JSON.stringify({ global: { 'core:datatype': 'cf64_le', 'core:version': '1.2.0', 'core:sample_rate': 1e6 }, captures: [], annotations: [] });
    expect(problemOf(() => readAll(describeSigmfSource(meta64, 'c.sigmf-meta', 'c.sigmf-data', 32), cf64))).toBe('nan');
  });

  it('a file that shrank between the size check and the read is reported as truncated', () => {
    const source = describeSigmfSource(ci16.metaText, 'a.sigmf-meta', 'a.sigmf-data', ci16.data.length);
    expect(problemOf(() => readAll(source, ci16.data.subarray(0, 4000)))).toBe('truncated');
  });

  it('round-trips every format: floats bit-exact, integers within half an LSB of the scaled samples', () => {
    // Reference: the same export as doubles (CSV keeps full double precision, ECMAScript Number::toString).
    const level = { mode: 'rms', levelDbfs: -12 } as const;
    const reference = readCsvSource(exportToMemory(config, { format: 'csv', level }).data, 'r.csv', undefined, { keepSamples: true }).result.iq!;
    for (const [format, halfLsb] of [
      ['raw-f32', 0],
      ['raw-i16le', 0.5 / 32767],
      ['raw-i16be', 0.5 / 32767],
      ['raw-i8', 0.5 / 127],
      ['wavf32', 0],
      ['wav16', 0.5 / 32767],
    ] as const) {
      const out = exportToMemory(config, { format, level });
      const source = format.startsWith('wav')
        ? describeWavSource(out.data.subarray(0, 256), 'x.wav', out.data.length, { text: out.metaText, name: 'x.wav.json' })
        : describeRawSource(out.metaText, 'x.iq.json', 'x.iq', out.data.length);
      const r = readAll(source, out.data, 5);
      expect(r.checksum, format).toBe('verified');
      expect(source.sampleRateHz).toBe(7.68e6);
      const got = r.iq!;
      expect(got.length).toBe(reference.length);
      for (let i = 0; i < got.length; i++) {
        const expected = halfLsb === 0 ? Math.fround(reference[i]!) : reference[i]!;
        const err = Math.abs(got[i]! - expected);
        if (!(err <= halfLsb * (1 + 1e-9))) throw new Error(`${format}: value ${i} off by ${err}`);
      }
    }
  });

  it('raw sidecar problems: bad JSON, wrong sample count, bad rate', () => {
    const out = exportToMemory(config, { format: 'raw-i8' });
    expect(problemOf(() => describeRawSource('{', 'x.iq.json', 'x.iq', out.data.length))).toBe('json');
    expect(problemOf(() => describeRawSource(out.metaText, 'x.iq.json', 'x.iq', out.data.length - 20))).toBe('truncated');
    const side = JSON.parse(out.metaText) as Record<string, unknown>;
    expect(problemOf(() => describeRawSource(JSON.stringify({ ...side, sampleRateHz: -1 }), 'x.iq.json', 'x.iq', out.data.length))).toBe('sample-rate');
    expect(problemOf(() => describeRawSource(JSON.stringify({ ...side, datatype: 'ci4' }), 'x.iq.json', 'x.iq', out.data.length))).toBe('sidecar');
  });

  it('CSV: bit-exact round trip, NaN and malformed lines named by line, size limit', () => {
    const iq = new Float64Array([0.1, -0.2, 1 / 3, -0, 5e-324, 123456.789]);
    expect(Array.from(decodeCsvIq(new TextDecoder().decode(encodeCsvIq(iq)), 'x'))).toEqual(Array.from(iq));
    expect(problemOf(() => decodeCsvIq('I,Q\n0.1,0.2\n0.3,NaN\n', 'x.csv'))).toBe('nan');
    expect(() => decodeCsvIq('0.1,0.2\n0.3\n', 'x.csv')).toThrow(/x\.csv, line 2: expected two fields/);
    expect(problemOf(() => decodeCsvIq('0.1,abc\n', 'x.csv'))).toBe('csv');
    expect(problemOf(() => decodeCsvIq('0,0\n'.repeat(MAX_CSV_SAMPLES + 1), 'x.csv'))).toBe('size');
  });
});
