import { describe, expect, it } from 'vitest';
import { createQuantisationTally, decodeIq, encodeIq, quantisationSnrDb } from '../../src/io/iqCodecs';
import { bytesPerSample, datatypeInfo, samplesInBytes, type IqDatatype } from '../../src/io/iqDatatypes';
import { decodeCf32Le, encodeCf32Le } from '../../src/io/cf32';
import { createRng } from '../../src/dsp/data/rng';
import { DspError } from '../../src/dsp/errors';
import { TEST_SEED } from '../helpers/seed';

function uniformIq(n: number, seed: number, amplitude = 1): Float64Array {
  const rng = createRng(seed);
  const out = new Float64Array(2 * n);
  for (let i = 0; i < out.length; i++) out[i] = amplitude * (2 * rng.nextFloat() - 1);
  return out;
}

describe(`IQ sample codecs (seed ${TEST_SEED})`, () => {
  it('float formats round-trip bit-exactly (cf32 for single-precision values, cf64 for any double)', () => {
    const doubles = uniformIq(1000, TEST_SEED, 3);
    const singles = doubles.map((x) => Math.fround(x));
    expect(Array.from(decodeCf32Le(encodeCf32Le(singles)))).toEqual(Array.from(singles));
    const cf64 = decodeIq('cf64_le', encodeIq('cf64_le', doubles, new Uint8Array(doubles.length * 8)));
    expect(Array.from(cf64)).toEqual(Array.from(doubles));
  });

  it('integer formats round-trip within half an LSB of full scale (REFERENCE §9: round(x·32767))', () => {
    const x = uniformIq(2000, TEST_SEED + 1, 0.999);
    for (const dt of ['ci16_le', 'ci16_be', 'ci8', 'ci32_le'] as const) {
      const info = datatypeInfo(dt);
      const halfLsb = 0.5 / info.fullScaleCode;
      const back = decodeIq(dt, encodeIq(dt, x, new Uint8Array(x.length * info.bytesPerComponent)));
      let worst = 0;
      for (let i = 0; i < x.length; i++) worst = Math.max(worst, Math.abs(back[i]! - x[i]!));
      expect(worst, dt).toBeLessThanOrEqual(halfLsb * (1 + 1e-9));
    }
  });

  it('writes the byte order each format names (int16 0.5 → code 16384 = 0x4000)', () => {
    const iq = new Float64Array([0.5, -1]);
    expect(Array.from(encodeIq('ci16_le', iq, new Uint8Array(4)))).toEqual([0x00, 0x40, 0x01, 0x80]);
    expect(Array.from(encodeIq('ci16_be', iq, new Uint8Array(4)))).toEqual([0x40, 0x00, 0x80, 0x01]);
    expect(Array.from(encodeIq('ci8', iq, new Uint8Array(2)))).toEqual([64, 0x81]);
  });

  it('clips beyond full scale, counts clipped samples and includes clipping in the quantisation error', () => {
    const iq = new Float64Array([1.2, 0, 0, -1.01, 0.3, 0.3, 0.9999, -1.00001]);
    const tally = createQuantisationTally();
    const bytes = encodeIq('ci16_le', iq, new Uint8Array(16), tally);
    const codes = new Int16Array(bytes.buffer);
    expect(Array.from(codes)).toEqual([32767, 0, 0, -32768, 9830, 9830, 32764, -32767]);
    // Sample 1: I 1.2 clips; sample 2: Q −1.01·32767 = −33094.7 clips to −32768; sample 4: −1.00001 rounds to −32767, in range.
    expect(tally.clippedSamples).toBe(2);
    expect(tally.errorEnergy).toBeGreaterThan((1.2 - 1) ** 2);
  });

  it('measures the quantisation SNR of full-range uniform samples as Widrow\'s Δ²/12 model predicts (96.3 dB for int16)', () => {
    // Uniform x in [−1, 1]: signal power 1/3 per component; error variance Δ²/12 with Δ = 1/32767
    // (Widrow & Kollár, Quantization Noise, 2008, ch. 4), so SNR = 10·log10(4·32767²) = 96.33 dB (derived).
    const x = uniformIq(50_000, TEST_SEED + 2);
    const tally = createQuantisationTally();
    encodeIq('ci16_le', x, new Uint8Array(x.length * 2), tally);
    const toleranceDb = 0.1;
    expect(Math.abs(quantisationSnrDb(tally) - 10 * Math.log10(4 * 32767 ** 2))).toBeLessThan(toleranceDb);
    const t8 = createQuantisationTally();
    encodeIq('ci8', x, new Uint8Array(x.length), t8);
    expect(Math.abs(quantisationSnrDb(t8) - 10 * Math.log10(4 * 127 ** 2))).toBeLessThan(toleranceDb);
  });

  it('decodes cu8 as offset binary (u − 127.5)/127.5 and cf64/ci32 at their widths', () => {
    expect(Array.from(decodeIq('cu8', new Uint8Array([0, 255])))).toEqual([-1, 1]);
    const ci32 = new Uint8Array(8);
    new DataView(ci32.buffer).setInt32(0, 2147483647, true);
    new DataView(ci32.buffer).setInt32(4, -1073741824, true);
    const v = decodeIq('ci32_le', ci32);
    expect(v[0]).toBe(1);
    expect(v[1]).toBeCloseTo(-0.5, 9);
  });

  it('checks that a byte count is a whole number of samples (REFERENCE §10 #23: 1000 samples = 8000/4000/2000 B)', () => {
    const cases: [IqDatatype, number][] = [
      ['cf32_le', 8000],
      ['ci16_le', 4000],
      ['ci8', 2000],
    ];
    for (const [dt, bytes] of cases) {
      expect(bytesPerSample(dt) * 1000).toBe(bytes);
      expect(samplesInBytes(dt, bytes, 'x')).toBe(1000);
    }
    try {
      samplesInBytes('ci16_le', 4002, 'rec.sigmf-data');
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(DspError);
      expect((err as DspError).code).toBe('INVALID_FILE');
      expect((err as DspError).details?.problem).toBe('length');
      expect((err as DspError).message).toMatch(/rec\.sigmf-data.*4002 bytes.*ci16_le.*4 bytes/);
    }
  });
});
