import { readFileSync } from 'node:fs';
import { Ajv } from 'ajv';
import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { DspError } from '../../src/dsp/errors';
import { exportToMemory } from '../../src/io/exportMemory';
import { parseSigmfMeta } from '../../src/io/sigmfMeta';

// JSON Schema written for these tests from the SigMF specification v1.2.x (sigmf-schema.json; REFERENCE §9).
const schema = JSON.parse(readFileSync(new URL('./schema/sigmf-meta.schema.json', import.meta.url), 'utf8')) as object;
const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);

function problemOf(text: string): string {
  try {
    parseSigmfMeta(text, 'rec.sigmf-meta');
  } catch (err) {
    expect(err).toBeInstanceOf(DspError);
    expect((err as DspError).code).toBe('INVALID_FILE');
    expect((err as DspError).message).toMatch(/^rec\.sigmf-meta: /);
    return String((err as DspError).details?.problem);
  }
  throw new Error('expected an error');
}

describe('SigMF metadata', () => {
  it('the schema accepts the minimal valid meta (REFERENCE §10 #22) and rejects a meta without core:version', () => {
    expect(validate({ global: { 'core:datatype': 'cf32_le', 'core:version': '1.2.6' }, captures: [], annotations: [] })).toBe(true);
    expect(validate({ global: { 'core:datatype': 'cf32_le' }, captures: [], annotations: [] })).toBe(false);
    expect(validate({ global: { 'core:datatype': 'cf32_le', 'core:version': '1.2.6' }, captures: [], annotations: [], extra: 1 })).toBe(false);
  });

  it('every SigMF format Crestline writes validates (ajv 8.20.0), with one capture and one annotation per slot', () => {
    const config = parseWaveformConfig({ symbols: 28, carrierFrequencyHz: 2.6e9 });
    for (const format of ['sigmf-cf32', 'sigmf-ci16', 'sigmf-ci8'] as const) {
      const out = exportToMemory(config, { format, author: 'Test Bench 3', repeat: 2 });
      const meta = JSON.parse(out.metaText) as Record<string, any>;
      expect(validate(meta), JSON.stringify(validate.errors)).toBe(true);
      const g = meta.global;
      expect(g['core:datatype']).toBe({ 'sigmf-cf32': 'cf32_le', 'sigmf-ci16': 'ci16_le', 'sigmf-ci8': 'ci8' }[format]);
      expect(g['core:sample_rate']).toBe(30.72e6);
      expect(g['core:author']).toBe('Test Bench 3');
      expect(g['core:recorder']).toBe('crestline generate');
      expect(g['core:sha512']).toBe(out.sha512Hex);
      expect(g['crestline:config']).toEqual(config);
      expect(meta.captures).toEqual([{ 'core:sample_start': 0, 'core:frequency': 2.6e9 }]);
      // 28 symbols = 4 LTE slots of 7 (TS 36.211 §5.6), twice: 8 annotations tiling the file.
      const ann = meta.annotations as Record<string, number | string>[];
      expect(ann).toHaveLength(8);
      expect(ann.map((a) => a['core:sample_count']).reduce((s: number, c) => s + Number(c), 0)).toBe(2 * 4 * 15360);
      expect(ann[1]!['core:sample_start']).toBe(15360);
      expect(String(ann[0]!['core:label']).length).toBeLessThanOrEqual(20);
      // Full allocation, 100 RB: the band is ±9 MHz around the carrier (36.101 Table 5.6-1, 18 MHz transmission bandwidth).
      expect(ann[0]!['core:freq_lower_edge']).toBeCloseTo(2.6e9 - 9e6, 3);
      expect(ann[0]!['core:freq_upper_edge']).toBeCloseTo(2.6e9 + 9e6, 3);
    }
  });

  it('without a carrier the annotation edges are baseband and there is no core:frequency', () => {
    const out = exportToMemory(parseWaveformConfig({ symbols: 7, allocation: { startRb: 10, numRb: 5 } }), { format: 'sigmf-ci16', freqOffsetHz: 1e6 });
    const meta = JSON.parse(out.metaText) as Record<string, any>;
    expect(validate(meta)).toBe(true);
    expect(meta.captures[0]['core:frequency']).toBeUndefined();
    // RB 10..14 of 100 on the uplink: subcarriers k = 120..179 at (k − 600 + ½)·15 kHz, ±7.5 kHz, then +1 MHz.
    expect(meta.annotations[0]['core:freq_lower_edge']).toBeCloseTo((120 - 600) * 15e3 + 1e6, 6);
    expect(meta.annotations[0]['core:freq_upper_edge']).toBeCloseTo((180 - 600) * 15e3 + 1e6, 6);
  });

  it('reads back what it wrote, with our namespace', () => {
    const out = exportToMemory(parseWaveformConfig({ symbols: 7 }), { format: 'sigmf-ci8' });
    const d = parseSigmfMeta(out.metaText, 'x');
    expect(d.datatype).toBe('ci8');
    expect(d.sampleRateHz).toBe(30.72e6);
    expect(d.sha512Hex).toBe(out.sha512Hex);
    expect(d.crestline.num_samples).toBe(15360);
    expect((d.crestline.scaling as Record<string, unknown>).levelMode).toBe('auto');
  });

  it('each malformed meta gives its own problem', () => {
    const ok = { global: { 'core:datatype': 'ci16_le', 'core:version': '1.2.0', 'core:sample_rate': 1e6 }, captures: [], annotations: [] };
    const withGlobal = (g: Record<string, unknown>): string => JSON.stringify({ ...ok, global: { ...ok.global, ...g } });
    expect(problemOf('{"global": {')).toBe('json');
    expect(problemOf('[]')).toBe('structure');
    expect(problemOf(JSON.stringify({ global: ok.global, captures: [] }))).toBe('structure');
    expect(problemOf(JSON.stringify({ ...ok, extra: true }))).toBe('structure');
    expect(problemOf(withGlobal({ 'core:datatype': 'cf16_le' }))).toBe('datatype');
    expect(problemOf(withGlobal({ 'core:datatype': 'ri16_le' }))).toBe('datatype');
    expect(problemOf(withGlobal({ 'core:sample_rate': -5 }))).toBe('sample-rate');
    expect(problemOf(withGlobal({ 'core:sample_rate': '1e6' }))).toBe('sample-rate');
    expect(problemOf(withGlobal({ 'core:sha512': 'abc' }))).toBe('checksum-field');
    expect(problemOf(withGlobal({ 'core:num_channels': 2 }))).toBe('unsupported');
    expect(() => parseSigmfMeta(JSON.stringify(ok), 'x')).not.toThrow();
  });
});
