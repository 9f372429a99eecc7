import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, workDir } from './cliHarness';

// One configuration for every format: LTE 5 MHz (FFT 512, 7.68 Msps, common practice), 16QAM, reference signals on.
const config = { standard: 'lte', bandwidthMHz: 5, modulation: '16qam', referenceSignals: { enabled: true } };
const fftSize = 512;
const rateHz = 7.68e6;

/** Generates `format` as BASE "rec" in a fresh directory; returns the directory and the data file's path. */
async function generated(format: string, suffix: string) {
  const { dir, configPath } = workDir(config);
  const g = await runCli(['generate', '--config', configPath, '--out', join(dir, 'rec'), '--format', format, '--no-progress']);
  expect(g.code, g.stderr).toBe(0);
  return { dir, configPath, dataPath: join(dir, `rec${suffix}`), sidecarPath: join(dir, `rec${suffix}.json`) };
}

async function analyze(args: string[]) {
  const r = await runCli(['analyze', ...args, '--json']);
  expect(r.code, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
}

// Float32 formats (derived, as in test/cli/analyze.test.ts): each component rounded to float32 has relative error
// ≤ 2^-24; the data elements get at most that share and the channel estimate from the same samples as much again.
const cf32BoundPercent = 100 * 2 * 2 ** -24;
// CSV writes each double as its shortest round-trip text (ECMAScript Number::toString, spec), so the samples read back
// bit-exact and only the receiver's own float64 arithmetic remains (~log2(N)·2^-53 ≈ 1e-15 relative, from memory).
// The ceiling 1e-10 % sits 5 orders under the float32 bound: a CSV written at float32 precision fails it.
const float64CeilingPercent = 1e-10;

// Integer formats (derived, as in test/cli/analyze.test.ts): rounding leaves |e| ≤ Δ/2 per component, Δ = 1/full-scale
// code, at most Δ²/2 per sample, spread over N FFT bins against scale²·E_RE = scale² per data element, doubled for the
// channel estimate: EVM ≤ 2·√(Δ²/2 / (N·scale²)). Uniform rounding noise, Δ²/6 per sample (common practice), predicts
// the typical value, which the measurement must reach too (so a file read at the wrong scale or precision fails).
function integerBoundsPercent(fullScaleCode: number, scaleLinear: number) {
  const delta = 1 / fullScaleCode;
  return {
    bound: 100 * 2 * Math.sqrt(delta ** 2 / 2 / (fftSize * scaleLinear ** 2)),
    uniform: 100 * Math.sqrt(delta ** 2 / 6 / (fftSize * scaleLinear ** 2)),
  };
}

const FORMATS = [
  { format: 'raw-f32', suffix: '.iq', datatype: 'cf32_le', fullScaleCode: undefined },
  { format: 'raw-i16le', suffix: '.iq', datatype: 'ci16_le', fullScaleCode: 32767 },
  { format: 'raw-i16be', suffix: '.iq', datatype: 'ci16_be', fullScaleCode: 32767 },
  { format: 'raw-i8', suffix: '.iq', datatype: 'ci8', fullScaleCode: 127 },
  { format: 'wav16', suffix: '.wav', datatype: 'ci16_le', fullScaleCode: 32767 },
  { format: 'wavf32', suffix: '.wav', datatype: 'cf32_le', fullScaleCode: undefined },
  { format: 'csv', suffix: '.csv', datatype: 'cf64_le', fullScaleCode: undefined },
] as const;

describe('crestline analyze reads every format generate writes', () => {
  for (const f of FORMATS) {
    it(`${f.format}: configuration, rate and datatype from the sidecar; EVM within the format's quantisation bound, BER 0`, async () => {
      const { dataPath, sidecarPath } = await generated(f.format, f.suffix);
      const scale = JSON.parse(readFileSync(sidecarPath, 'utf8')).scaling.scaleLinear as number;
      // No --config: the sidecar's configuration is used.
      const j = await analyze(['--iq', dataPath]);
      expect(j.configSource).toBe(`${sidecarPath} (embedded)`);
      expect(j.datatype).toBe(f.datatype);
      expect(j.sampleRateHz).toBe(rateHz);
      expect(j.numSamples).toBe(7680); // 14 symbols = 1 ms at 7.68 Msps
      expect(j.ber).toBe(0);
      expect(j.pass).toBe(true);
      expect(j.timingOffsetSamples).toBe(0);
      if (f.fullScaleCode !== undefined) {
        const { bound, uniform } = integerBoundsPercent(f.fullScaleCode, scale);
        expect(j.evmRmsPercent).toBeLessThan(bound);
        expect(j.evmRmsPercent).toBeGreaterThan(0.8 * uniform);
      } else if (f.format === 'csv') {
        expect(j.evmRmsPercent).toBeLessThan(float64CeilingPercent);
      } else {
        expect(j.evmRmsPercent).toBeLessThan(cf32BoundPercent);
        // The auto level (not a power of two) makes float32 rounding visible: the file really holds float32.
        expect(j.evmRmsPercent).toBeGreaterThan(float64CeilingPercent);
      }
      // Sidecar path given instead of the data file: the same recording.
      const again = await analyze(['--iq', sidecarPath]);
      expect(again.evmRmsPercent).toBe(j.evmRmsPercent);
    });
  }

  it('without a sidecar: raw needs --raw-format and --rate, WAV takes its header, CSV needs --rate; --config gives the configuration', async () => {
    const raw = await generated('raw-i16be', '.iq');
    rmSync(raw.sidecarPath);
    const bare = await analyze(['--config', raw.configPath, '--iq', raw.dataPath, '--raw-format', 'i16be', '--rate', String(rateHz)]);
    expect(bare.datatype).toBe('ci16_be');
    expect(bare.ber).toBe(0);
    expect(bare.warnings.join('\n')).toMatch(/no sidecar; format and rate as given on the command line/);

    const wav = await generated('wav16', '.wav');
    rmSync(wav.sidecarPath);
    const w = await analyze(['--config', wav.configPath, '--iq', wav.dataPath]);
    expect(w.sampleRateHz).toBe(rateHz);
    expect(w.ber).toBe(0);

    const csv = await generated('csv', '.csv');
    rmSync(csv.sidecarPath);
    const c = await analyze(['--config', csv.configPath, '--iq', csv.dataPath, '--rate', '7680000']);
    expect(c.evmRmsPercent).toBeLessThan(float64CeilingPercent);
  });
});

describe('crestline analyze: errors name the file or option and what is allowed', () => {
  it('an unknown format, a bad --raw-format and a file without configuration', async () => {
    const raw = await generated('raw-i8', '.iq');
    const foreign = join(raw.dir, 'capture.bin');
    writeFileSync(foreign, readFileSync(raw.dataPath));
    const unknown = await runCli(['analyze', '--config', raw.configPath, '--iq', foreign]);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/capture\.bin: cannot tell the format: expected \.sigmf-meta\/\.sigmf-data, a \.sigmf archive, \.wav, \.csv, or raw \.iq/);
    const badFormat = await runCli(['analyze', '--config', raw.configPath, '--iq', foreign, '--raw-format', 'f64', '--rate', '7.68e6']);
    expect(badFormat.code).toBe(2);
    expect(badFormat.stderr).toMatch(/--raw-format "f64" is not a raw format; allowed: f32le, i16le, i16be, i8, u8/);
    const noConfig = await runCli(['analyze', '--iq', foreign, '--raw-format', 'i8', '--rate', '7.68e6']);
    expect(noConfig.code).toBe(2);
    expect(noConfig.stderr).toMatch(/capture\.bin: no metadata file, so no configuration; give --config <file>/);
  });

  it('a missing rate: raw without sidecar, CSV without sidecar, and a --rate that is not a number', async () => {
    const raw = await generated('raw-f32', '.iq');
    rmSync(raw.sidecarPath);
    const rawNoRate = await runCli(['analyze', '--config', raw.configPath, '--iq', raw.dataPath, '--raw-format', 'f32le']);
    expect(rawNoRate.code).toBe(2);
    expect(rawNoRate.stderr).toMatch(/--raw-format needs --rate <Hz> as well/);
    const csv = await generated('csv', '.csv');
    rmSync(csv.sidecarPath);
    const csvNoRate = await runCli(['analyze', '--config', csv.configPath, '--iq', csv.dataPath]);
    expect(csvNoRate.code).toBe(2);
    expect(csvNoRate.stderr).toMatch(/rec\.csv: the sample rate is not known \(no sidecar\); give it with --rate <Hz>/);
    const notNumber = await runCli(['analyze', '--config', csv.configPath, '--iq', csv.dataPath, '--rate', '7.68 MHz']);
    expect(notNumber.code).toBe(2);
    expect(notNumber.stderr).toMatch(/--rate "7\.68 MHz" is not a number of Hz/);
  });

  it('a truncated raw, WAV or CSV file is refused with the file named', async () => {
    const raw = await generated('raw-i16le', '.iq');
    const rawBytes = readFileSync(raw.dataPath);
    // Whole samples missing: the sidecar's numSamples says more (4 bytes = one ci16_le sample).
    writeFileSync(raw.dataPath, rawBytes.subarray(0, rawBytes.length - 4));
    const cut = await runCli(['analyze', '--iq', raw.dataPath]);
    expect(cut.code).toBe(2);
    expect(cut.stderr).toMatch(/rec\.iq: holds 7679 samples but .*rec\.iq\.json says 7680: the data file is truncated/);
    writeFileSync(raw.dataPath, rawBytes.subarray(0, rawBytes.length - 3));
    const partial = await runCli(['analyze', '--iq', raw.dataPath]);
    expect(partial.code).toBe(2);
    expect(partial.stderr).toMatch(/not a whole number of ci16_le samples/);

    const wav = await generated('wavf32', '.wav');
    const wavBytes = readFileSync(wav.dataPath);
    writeFileSync(wav.dataPath, wavBytes.subarray(0, wavBytes.length - 8));
    const wavCut = await runCli(['analyze', '--iq', wav.dataPath]);
    expect(wavCut.code).toBe(2);
    expect(wavCut.stderr).toMatch(/rec\.wav: the data chunk says 61440 bytes but only 61432 follow the header: the file is truncated/);

    const csv = await generated('csv', '.csv');
    const text = readFileSync(csv.dataPath, 'utf8');
    writeFileSync(csv.dataPath, text.slice(0, text.lastIndexOf('\n', text.length - 2) + 1));
    const csvCut = await runCli(['analyze', '--iq', csv.dataPath]);
    expect(csvCut.code).toBe(2);
    expect(csvCut.stderr).toMatch(/rec\.csv: holds 7679 samples but .*rec\.csv\.json says 7680: the data file is truncated/);
  });
});
