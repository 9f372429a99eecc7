import { DspError } from '../dsp/errors';
import type { IqDatatype } from './iqDatatypes';

/**
 * Two-channel WAV for IQ: left = I, right = Q (REFERENCE §9, common practice). RIFF/WAVE layout per the Microsoft
 * "Multimedia Programming Interface and Data Specifications 1.0" (1991): a `fmt ` chunk (format tag 1 = PCM, 3 = IEEE
 * float), for non-PCM a `fact` chunk with the frame count, then `data`. Interleaved stereo int16 is byte-for-byte the
 * ci16_le layout and stereo float32 the cf32_le layout, so the sample encoders are shared.
 */
export type WavDatatype = Extract<IqDatatype, 'ci16_le' | 'cf32_le'>;

/** Largest data chunk a RIFF file can describe (its sizes are 32-bit), less room for the header. */
export const MAX_WAV_DATA_BYTES = 0xffffffff - 64;

export const WAVE_FORMAT_PCM = 1;
export const WAVE_FORMAT_IEEE_FLOAT = 3;
export const WAVE_FORMAT_EXTENSIBLE = 0xfffe;

/** The header rate is a 32-bit integer: a non-integer rate is rounded there (the exact one goes in the sidecar). */
export function wavHeaderRateHz(sampleRateHz: number): number {
  return Math.round(sampleRateHz);
}

/**
 * Builds the header that precedes `numSamples` complex samples of `datatype`.
 * @throws DspError INVALID_CONFIG when the data would pass the RIFF 4 GiB limit or the rate does not fit 32 bits
 */
export function encodeWavHeader(datatype: WavDatatype, numSamples: number, sampleRateHz: number): Uint8Array {
  const isFloat = datatype === 'cf32_le';
  const bytesPerComponent = isFloat ? 4 : 2;
  const blockAlign = 2 * bytesPerComponent;
  const dataBytes = numSamples * blockAlign;
  if (dataBytes > MAX_WAV_DATA_BYTES) {
    throw new DspError(
      'INVALID_CONFIG',
      `format: a WAV file holds at most ${Math.floor(MAX_WAV_DATA_BYTES / blockAlign)} ${isFloat ? 'float32' : 'int16'} stereo frames (RIFF sizes are 32-bit); this export has ${numSamples}. Use a SigMF or raw format.`,
      { field: 'format' },
    );
  }
  const rate = wavHeaderRateHz(sampleRateHz);
  if (rate < 1 || rate > 0xffffffff || rate * blockAlign > 0xffffffff) {
    throw new DspError('INVALID_CONFIG', `rate: ${sampleRateHz} Hz does not fit a WAV header's 32-bit rate and byte-rate fields.`, { field: 'rate' });
  }
  const fmtSize = isFloat ? 18 : 16;
  const factBytes = isFloat ? 12 : 0;
  const headerBytes = 12 + 8 + fmtSize + factBytes + 8;
  const out = new Uint8Array(headerBytes);
  const v = new DataView(out.buffer);
  let o = 0;
  const tag = (s: string): void => {
    for (let i = 0; i < 4; i++) v.setUint8(o + i, s.charCodeAt(i));
    o += 4;
  };
  const u32 = (x: number): void => {
    v.setUint32(o, x, true);
    o += 4;
  };
  const u16 = (x: number): void => {
    v.setUint16(o, x, true);
    o += 2;
  };
  tag('RIFF');
  u32(headerBytes - 8 + dataBytes);
  tag('WAVE');
  tag('fmt ');
  u32(fmtSize);
  u16(isFloat ? WAVE_FORMAT_IEEE_FLOAT : WAVE_FORMAT_PCM);
  u16(2);
  u32(rate);
  u32(rate * blockAlign);
  u16(blockAlign);
  u16(8 * bytesPerComponent);
  if (isFloat) {
    u16(0);
    tag('fact');
    u32(4);
    u32(numSamples);
  }
  tag('data');
  u32(dataBytes);
  return out;
}

/** What a WAV header says about its IQ data. */
export interface WavInfo {
  readonly datatype: WavDatatype;
  readonly sampleRateHz: number;
  readonly dataOffsetBytes: number;
  readonly dataLengthBytes: number;
  readonly numSamples: number;
}

/**
 * Parses and checks a WAV header for IQ use: RIFF/WAVE, 2 channels, PCM 16-bit or IEEE float 32-bit (plain or
 * WAVE_FORMAT_EXTENSIBLE), a data chunk that fits the file and holds whole frames.
 * @param headBytes at least the first bytes of the file up to the data chunk (64 KiB is plenty)
 * @param fileBytes total file size
 * @throws DspError INVALID_FILE naming `sourceName` and the problem (details.problem)
 */
export function parseWavHeader(headBytes: Uint8Array, fileBytes: number, sourceName: string): WavInfo {
  const fail = (problem: string, message: string): never => {
    throw new DspError('INVALID_FILE', `${sourceName}: ${message}`, { problem });
  };
  const v = new DataView(headBytes.buffer, headBytes.byteOffset, headBytes.byteLength);
  const tagAt = (o: number): string => String.fromCharCode(v.getUint8(o), v.getUint8(o + 1), v.getUint8(o + 2), v.getUint8(o + 3));
  if (headBytes.length < 12 || tagAt(0) !== 'RIFF' || tagAt(8) !== 'WAVE') {
    fail('header', 'not a WAV file (no RIFF/WAVE header).');
  }
  let o = 12;
  let fmt: { tag: number; channels: number; rate: number; blockAlign: number; bits: number } | undefined;
  while (o + 8 <= headBytes.length) {
    const id = tagAt(o);
    const size = v.getUint32(o + 4, true);
    const body = o + 8;
    if (id === 'fmt ') {
      if (size < 16 || body + size > headBytes.length) fail('header', `the fmt chunk is ${size} bytes; at least 16 are needed.`);
      let tag = v.getUint16(body, true);
      if (tag === WAVE_FORMAT_EXTENSIBLE && size >= 40) tag = v.getUint16(body + 24, true);
      fmt = {
        tag,
        channels: v.getUint16(body + 2, true),
        rate: v.getUint32(body + 4, true),
        blockAlign: v.getUint16(body + 12, true),
        bits: v.getUint16(body + 14, true),
      };
    } else if (id === 'data') {
      if (!fmt) return fail('header', 'the data chunk comes before any fmt chunk.');
      let datatype: WavDatatype | undefined;
      if (fmt.tag === WAVE_FORMAT_PCM && fmt.bits === 16) datatype = 'ci16_le';
      else if (fmt.tag === WAVE_FORMAT_IEEE_FLOAT && fmt.bits === 32) datatype = 'cf32_le';
      if (!datatype) {
        return fail('datatype', `format tag ${fmt.tag} with ${fmt.bits}-bit samples is not supported; IQ WAV must be 16-bit PCM (tag 1) or 32-bit float (tag 3).`);
      }
      if (fmt.channels !== 2) fail('channels', `it has ${fmt.channels} channel(s); IQ WAV needs 2 (left = I, right = Q).`);
      if (fmt.blockAlign !== 2 * (fmt.bits / 8)) fail('header', `block align ${fmt.blockAlign} does not match 2 channels of ${fmt.bits} bits.`);
      if (!(fmt.rate > 0)) fail('sample-rate', `the header sample rate is ${fmt.rate} Hz; it must be positive.`);
      const available = fileBytes - body;
      if (size > available) {
        fail('truncated', `the data chunk says ${size} bytes but only ${available} follow the header: the file is truncated.`);
      }
      if (size % fmt.blockAlign !== 0) {
        fail('length', `the data chunk holds ${size} bytes, not a whole number of ${fmt.blockAlign}-byte stereo frames.`);
      }
      return { datatype, sampleRateHz: fmt.rate, dataOffsetBytes: body, dataLengthBytes: size, numSamples: size / fmt.blockAlign };
    }
    o = body + size + (size % 2);
  }
  return fail(fmt ? 'truncated' : 'header', fmt ? 'no data chunk was found: the file is truncated.' : 'no fmt chunk was found.');
}
