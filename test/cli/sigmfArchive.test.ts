import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { parseExportOptions } from '../../src/io/exportOptions';
import { planExport } from '../../src/io/exportPlan';
import { ExportCancelledError, streamExportToFiles } from '../../src/cli/streamExport';
import { runCli, workDir } from './cliHarness';

const config = { standard: 'lte', bandwidthMHz: 3, modulation: '64qam', referenceSignals: { enabled: true } };
const hasTar = (() => {
  try {
    execFileSync('tar', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
})();

async function archived() {
  const { dir, configPath } = workDir(config);
  const g = await runCli(['generate', '--config', configPath, '--out', join(dir, 'rec'), '--format', 'sigmf-archive', '--no-progress']);
  expect(g.code, g.stderr).toBe(0);
  return { dir, configPath, path: join(dir, 'rec.sigmf'), out: g.stdout };
}

describe('generate --format sigmf-archive, and reading .sigmf archives back', () => {
  it('writes only BASE.sigmf (SigMF spec: the archive extension is .sigmf), holding rec/, rec/rec.sigmf-data, rec/rec.sigmf-meta', async () => {
    const { dir, path, out } = await archived();
    expect(readdirSync(dir).sort()).toEqual(['cfg.json', 'rec.sigmf']);
    expect(out).toMatch(/wrote .*rec\.sigmf: 3840 samples/);
    // A ustar file is a whole number of 512-byte blocks (POSIX ustar, common practice).
    expect(readFileSync(path).length % 512).toBe(0);
  });

  it.skipIf(!hasTar)('the system tar (an independent reader) lists and extracts the members the SigMF spec names', async () => {
    const { dir, configPath, path } = await archived();
    // SigMF spec 1.x Archive section: directory N, N/N.sigmf-meta, N/N.sigmf-data for a Recording N.
    const listed = execFileSync('tar', ['-tf', path], { encoding: 'utf8' }).trim().split('\n').sort();
    expect(listed).toEqual(['rec/', 'rec/rec.sigmf-data', 'rec/rec.sigmf-meta']);
    const x = mkdtempSync(join(tmpdir(), 'crestline-untar-'));
    execFileSync('tar', ['-xf', path, '-C', x]);
    // The data member holds exactly the bytes of the plain SigMF export at the same level (auto, the archive's default).
    const g = await runCli(['generate', '--config', configPath, '--out', join(dir, 'pair'), '--format', 'sigmf-cf32', '--level-mode', 'auto', '--no-progress']);
    expect(g.code, g.stderr).toBe(0);
    expect(readFileSync(join(x, 'rec', 'rec.sigmf-data')).equals(readFileSync(join(dir, 'pair.sigmf-data')))).toBe(true);
    const meta = JSON.parse(readFileSync(join(x, 'rec', 'rec.sigmf-meta'), 'utf8'));
    expect(meta.global['core:datatype']).toBe('cf32_le');
    // The extracted pair is an ordinary SigMF recording for inspect.
    const r = await runCli(['inspect', join(x, 'rec', 'rec.sigmf-meta')]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/checksum\s+SHA-512 verified/);
  });

  it('inspect and analyze read the archive directly; analyze takes the configuration from its metadata', async () => {
    const { path } = await archived();
    const i = await runCli(['inspect', path, '--json']);
    expect(i.code, i.stderr).toBe(0);
    const s = JSON.parse(i.stdout);
    expect(s).toMatchObject({ datatype: 'cf32_le', sampleRateHz: 3.84e6, numSamples: 3840, checksum: 'verified' });
    expect(s.data).toBe(`${path}:rec/rec.sigmf-data`);
    expect(parseWaveformConfig(s.crestline.config)).toEqual(parseWaveformConfig(config));
    const a = await runCli(['analyze', '--iq', path, '--json']);
    expect(a.code, a.stderr).toBe(0);
    const j = JSON.parse(a.stdout);
    // cf32_le quantisation bound, derived in test/cli/analyze.test.ts: 2·2^-24 as a fraction.
    expect(j.evmRmsPercent).toBeLessThan(100 * 2 * 2 ** -24);
    expect(j.ber).toBe(0);
    expect(j.configSource).toBe(`${path}:rec/rec.sigmf-meta (embedded)`);
  });

  it('a corrupted or truncated archive is refused with a message naming the archive and what is wrong', async () => {
    const { dir, path } = await archived();
    const bytes = readFileSync(path);
    const header = Buffer.from(bytes);
    header[600] = header[600]! ^ 0x20; // inside the second header (the data member's name)
    writeFileSync(join(dir, 'h.sigmf'), header);
    const h = await runCli(['inspect', join(dir, 'h.sigmf')]);
    expect(h.code).toBe(2);
    expect(h.stderr).toMatch(/h\.sigmf: tar header at byte 512 has checksum \d+ but its bytes sum to \d+: the archive is corrupted\./);
    expect(h.stderr).not.toMatch(/\.ts:\d+/);

    const data = Buffer.from(bytes);
    data[1024 + 100] = data[1024 + 100]! ^ 0xff; // a sample of the data member
    writeFileSync(join(dir, 'd.sigmf'), data);
    const d = await runCli(['analyze', '--iq', join(dir, 'd.sigmf')]);
    expect(d.code).toBe(2);
    expect(d.stderr).toMatch(/d\.sigmf:rec\/rec\.sigmf-data: SHA-512 .* does not match .* in .*d\.sigmf:rec\/rec\.sigmf-meta/);

    writeFileSync(join(dir, 't.sigmf'), bytes.subarray(0, 4096));
    const t = await runCli(['inspect', join(dir, 't.sigmf')]);
    expect(t.code).toBe(2);
    expect(t.stderr).toMatch(/t\.sigmf: member "rec\/rec\.sigmf-data" needs 30720 bytes but the archive ends after 3072: the file is truncated/);
  });

  it('a cancelled or refused write leaves no file behind', async () => {
    const { dir, configPath } = workDir(config);
    const plan = planExport(parseWaveformConfig(config), parseExportOptions({ format: 'sigmf-archive' }));
    const controller = new AbortController();
    controller.abort();
    await expect(streamExportToFiles(plan, join(dir, 'gone'), { signal: controller.signal })).rejects.toBeInstanceOf(ExportCancelledError);
    const long = await runCli(['generate', '--config', configPath, '--out', join(dir, 'n'.repeat(45)), '--format', 'sigmf-archive', '--no-progress']);
    expect(long.code).toBe(2);
    expect(long.stderr).toMatch(/too long: the member .* would be 102 bytes and tar names here are at most 100/);
    expect(readdirSync(dir)).toEqual(['cfg.json']);
  });
});
