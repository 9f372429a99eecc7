import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { encodeIq } from '../../src/io/iqCodecs';
import { runCli, workDir } from './cliHarness';

describe('crestline inspect', () => {
  const input = { link: 'downlink', bandwidthMHz: 5, symbols: 14, data: { source: 'random', seed: 2 } };
  const { dir, configPath } = workDir(input);

  it('prints format, rate, duration, level, CCDF and the embedded configuration for every format', async () => {
    for (const [format, file] of [
      ['sigmf-ci16', 'a.sigmf-meta'],
      ['raw-i8', 'a.iq'],
      ['wavf32', 'a.wav'],
      ['csv', 'a.csv'],
    ] as const) {
      const g = await runCli(['generate', '--config', configPath, '--out', join(dir, 'a'), '--format', format, '--level-dbfs', '-15']);
      expect(g.code, g.stderr).toBe(0);
      const r = await runCli(['inspect', join(dir, file)]);
      expect(r.code, r.stderr).toBe(0);
      expect(r.stdout).toMatch(/sample rate\s+7\.680000 Msps/);
      // 1 ms of LTE 5 MHz at 7.68 Msps (FFT 512, common practice).
      expect(r.stdout).toMatch(/samples\s+7680, 1\.000000 ms/);
      expect(r.stdout).toMatch(/checksum\s+SHA-512 verified/);
      const rms = Number(/RMS (-?\d+\.\d+) dBFS/.exec(r.stdout)![1]);
      // int8 quantisation moves the RMS by a few thousandths of a dB at −15 dBFS.
      expect(Math.abs(rms + 15)).toBeLessThan(0.02);
      expect(r.stdout).toMatch(/crest factor \d+\.\d+ dB/);
      expect(r.stdout).toMatch(/1e-3\s+\d+\.\d+ dB/);
      expect(r.stdout).toMatch(/configuration \(crestline namespace\):/);
      const json = r.stdout.slice(r.stdout.indexOf('{'));
      expect(parseWaveformConfig(JSON.parse(json))).toEqual(parseWaveformConfig(input));
    }
  });

  it('--json gives the same facts as data', async () => {
    await runCli(['generate', '--config', configPath, '--out', join(dir, 'j'), '--format', 'sigmf-ci8']);
    const r = await runCli(['inspect', join(dir, 'j.sigmf-data'), '--json']);
    const s = JSON.parse(r.stdout);
    expect(s).toMatchObject({ datatype: 'ci8', sampleRateHz: 7.68e6, numSamples: 7680, checksum: 'verified' });
    expect(s.crestline.scaling.levelMode).toBe('auto');
  });

  it('a corrupted file fails with a message naming it (no stack trace); --ignore-checksum downgrades it to a warning', async () => {
    await runCli(['generate', '--config', configPath, '--out', join(dir, 'c'), '--format', 'sigmf-ci16']);
    const path = join(dir, 'c.sigmf-data');
    const bytes = readFileSync(path);
    bytes[100] = bytes[100]! ^ 0xff;
    writeFileSync(path, bytes);
    const r = await runCli(['inspect', path]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/c\.sigmf-data: SHA-512 .* does not match .* in .*c\.sigmf-meta/);
    expect(r.stderr).not.toMatch(/\.ts:\d+/);
    const ok = await runCli(['inspect', path, '--ignore-checksum']);
    expect(ok.code).toBe(0);
    expect(ok.stdout).toMatch(/SHA-512 MISMATCH/);
    expect(ok.stderr).toMatch(/warning: .*does not match/);
    writeFileSync(path, bytes.subarray(0, bytes.length - 6));
    const cut = await runCli(['inspect', path]);
    expect(cut.code).toBe(2);
    expect(cut.stderr).toMatch(/not a whole number of ci16_le samples/);
  });

  it('reads a raw file without sidecar when told its format and rate; refuses to guess otherwise', async () => {
    const path = join(dir, 'foreign.iq');
    const iq = new Float64Array([0.5, -0.5, 0.25, 0, -1, 1]);
    writeFileSync(path, encodeIq('ci16_be', iq, new Uint8Array(12)));
    const r = await runCli(['inspect', path, '--raw-format', 'i16be', '--rate', '1e6']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/samples\s+3, 0\.003000 ms/);
    const guess = await runCli(['inspect', path]);
    expect(guess.code).toBe(2);
    expect(guess.stderr).toMatch(/cannot tell the format/);
    const missing = await runCli(['inspect', join(dir, 'nothing.sigmf-meta')]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/nothing\.sigmf-meta: cannot open the SigMF metadata file/);
  });
});
