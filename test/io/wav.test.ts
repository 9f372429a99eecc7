import { WaveFile } from 'wavefile';
import { describe, expect, it } from 'vitest';
import { DspError } from '../../src/dsp/errors';
import { decodeIq, encodeIq } from '../../src/io/iqCodecs';
import { encodeWavHeader, parseWavHeader } from '../../src/io/wav';
import { TEST_SEED } from '../helpers/seed';
import { gaussianIq } from '../helpers/iqTestSignals';

function wavFile(datatype: 'ci16_le' | 'cf32_le', iq: Float64Array, rateHz: number): Uint8Array {
  const header = encodeWavHeader(datatype, iq.length / 2, rateHz);
  const data = encodeIq(datatype, iq, new Uint8Array(iq.length * (datatype === 'cf32_le' ? 4 : 2)));
  const out = new Uint8Array(header.length + data.length);
  out.set(header);
  out.set(data, header.length);
  return out;
}

function problemOf(fn: () => unknown): string | undefined {
  try {
    fn();
  } catch (err) {
    expect(err).toBeInstanceOf(DspError);
    expect((err as DspError).code).toBe('INVALID_FILE');
    return (err as DspError).details?.problem as string;
  }
  return undefined;
}

describe(`WAV IQ files (seed ${TEST_SEED})`, () => {
  const iq = gaussianIq(500, TEST_SEED, 0.25);

  it('writes headers an independent reader (npm wavefile 11.0.0) parses: 2 channels, PCM16 tag 1 / float32 tag 3, rate', () => {
    for (const [datatype, tag, bits] of [
      ['ci16_le', 1, 16],
      ['cf32_le', 3, 32],
    ] as const) {
      const bytes = wavFile(datatype, iq, 1_920_000);
      const wav = new WaveFile(bytes);
      const fmt = wav.fmt as { audioFormat: number; numChannels: number; sampleRate: number; bitsPerSample: number; blockAlign: number };
      expect(fmt.audioFormat, datatype).toBe(tag);
      expect(fmt.numChannels).toBe(2);
      expect(fmt.sampleRate).toBe(1_920_000);
      expect(fmt.bitsPerSample).toBe(bits);
      expect(fmt.blockAlign).toBe((2 * bits) / 8);
      // wavefile's own de-interleaving: channel 0 = I, channel 1 = Q.
      const channels = wav.getSamples(false, Float64Array) as unknown as Float64Array[];
      const ours = decodeIq(datatype, bytes.subarray(parseWavHeader(bytes, bytes.length, 'x').dataOffsetBytes));
      const scale = datatype === 'ci16_le' ? 32767 : 1;
      for (const n of [0, 1, 250, 499]) {
        expect(channels[0]![n]! / scale).toBeCloseTo(ours[2 * n]!, 12);
        expect(channels[1]![n]! / scale).toBeCloseTo(ours[2 * n + 1]!, 12);
      }
    }
  });

  it('round-trips through our reader: float32 exactly, PCM16 within half an LSB; rate rounded in the header', () => {
    const f = wavFile('cf32_le', iq, 33_333_333.333);
    const info = parseWavHeader(f, f.length, 'f.wav');
    expect(info).toMatchObject({ datatype: 'cf32_le', sampleRateHz: 33_333_333, numSamples: 500 });
    const back = decodeIq('cf32_le', f.subarray(info.dataOffsetBytes));
    for (let i = 0; i < iq.length; i++) expect(back[i]).toBe(Math.fround(iq[i]!));
    const p = wavFile('ci16_le', iq, 8000);
    const pi = parseWavHeader(p, p.length, 'p.wav');
    const b16 = decodeIq('ci16_le', p.subarray(pi.dataOffsetBytes));
    for (let i = 0; i < iq.length; i++) expect(Math.abs(b16[i]! - iq[i]!)).toBeLessThanOrEqual(0.5 / 32767 + 1e-15);
  });

  it('rejects each kind of broken header with its own problem code', () => {
    const good = wavFile('ci16_le', iq, 48000);
    expect(problemOf(() => parseWavHeader(new TextEncoder().encode('not a wav file at all'), 21, 'a.wav'))).toBe('header');
    expect(problemOf(() => parseWavHeader(good, good.length - 10, 'b.wav'))).toBe('truncated');
    const mono = good.slice();
    new DataView(mono.buffer).setUint16(22, 1, true);
    new DataView(mono.buffer).setUint16(32, 2, true);
    expect(problemOf(() => parseWavHeader(mono, mono.length, 'c.wav'))).toBe('channels');
    const bits24 = good.slice();
    new DataView(bits24.buffer).setUint16(34, 24, true);
    expect(problemOf(() => parseWavHeader(bits24, bits24.length, 'd.wav'))).toBe('datatype');
    const odd = good.slice();
    new DataView(odd.buffer).setUint32(40, 4 * 500 - 2, true);
    expect(problemOf(() => parseWavHeader(odd, odd.length, 'e.wav'))).toBe('length');
  });

  it('refuses an export past the RIFF 32-bit size limit', () => {
    expect(() => encodeWavHeader('cf32_le', 2 ** 29, 1e6)).toThrow(/at most .* frames/);
  });
});
