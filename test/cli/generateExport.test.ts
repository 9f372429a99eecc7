import { spawn } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { streamExportToFiles, ExportCancelledError } from '../../src/cli/streamExport';
import { parseWaveformConfig } from '../../src/config/configParse';
import { generateWaveform } from '../../src/dsp/waveform/waveformGenerator';
import { encodeCf32Le } from '../../src/io/cf32';
import { exportToMemory } from '../../src/io/exportMemory';
import { planExport } from '../../src/io/exportPlan';
import { runCli, workDir } from './cliHarness';

describe('crestline generate: export formats, levels, cancel', () => {
  it('default: SigMF cf32_le at the waveform rate, formula scale, exactly the in-memory waveform; no caution line', async () => {
    const { dir, configPath } = workDir({ symbols: 14 });
    const r = await runCli(['generate', '--config', configPath, '--out', join(dir, 'a')]);
    expect(r.code).toBe(0);
    const data = readFileSync(join(dir, 'a.sigmf-data'));
    expect(Buffer.from(encodeCf32Le(generateWaveform(parseWaveformConfig({ symbols: 14 })).waveformIq)).equals(data)).toBe(true);
    const meta = JSON.parse(readFileSync(join(dir, 'a.sigmf-meta'), 'utf8'));
    expect(meta.global['core:datatype']).toBe('cf32_le');
    expect(meta.global['core:sample_rate']).toBe(30.72e6);
    expect(r.stdout).toMatch(/30720 samples, 1\.000 ms at 30\.720 Msps, mean power .* dB \(re 1, unscaled formula\)/);
    expect(r.stderr).not.toMatch(/caution/);
    expect(readdirSync(dir).sort()).toEqual(['a.sigmf-data', 'a.sigmf-meta', 'cfg.json']);
  });

  it('writes the same bytes as the browser’s in-memory export for every kind of format', async () => {
    const input = { link: 'downlink', bandwidthMHz: 10, symbols: 14, carrierFrequencyHz: 1.8e9 };
    const { dir, configPath } = workDir(input);
    const config = parseWaveformConfig(input);
    for (const [format, flags, options] of [
      ['sigmf-ci16', ['--level-dbfs', '-14'], { level: { mode: 'rms', levelDbfs: -14 } }],
      ['raw-i16be', ['--rate', '61.44e6', '--freq-offset', '2e6'], { sampleRateHz: 61.44e6, freqOffsetHz: 2e6 }],
      ['wav16', ['--level-mode', 'peak', '--level-dbfs', '-1', '--repeat', '2'], { level: { mode: 'peak', levelDbfs: -1 }, repeat: 2 }],
      ['csv', ['--scale', '0.01', '--author', 'Bench 4'], { level: { mode: 'linear', scaleLinear: 0.01 }, author: 'Bench 4' }],
      ['sigmf-ci8', ['--center-frequency', '1.805e9'], { centerFrequencyHz: 1.805e9 }],
    ] as const) {
      const base = join(dir, format);
      const r = await runCli(['generate', '--config', configPath, '--out', base, '--format', format, ...flags]);
      expect(r.code, r.stderr).toBe(0);
      expect(r.stderr).toMatch(/caution: transmit this waveform only where you are licensed/);
      const mem = exportToMemory(config, { format, ...options } as never);
      expect(Buffer.from(mem.data).equals(readFileSync(`${base}${mem.dataSuffix}`)), format).toBe(true);
      expect(readFileSync(`${base}${mem.metaSuffix}`, 'utf8'), format).toBe(mem.metaText);
    }
  });

  it('bad flags give a clear message and exit code 2', async () => {
    const { dir, configPath } = workDir({ symbols: 7 });
    const cases: [string[], RegExp][] = [
      [['--format', 'mp3'], /--format "mp3" is not a format; allowed: sigmf-cf32/],
      [['--level-mode', 'peak'], /--level-mode peak needs --level-dbfs/],
      [['--rate', 'fast'], /--rate "fast" is not a number/],
      [['--scale', '0.1', '--level-dbfs', '-3'], /cannot be combined/],
      [['--repeat', '0'], /--repeat 0 must be a whole number/],
      [['--rate', '15.36e6'], /does not fit a 15\.3600 Msps rate/],
    ];
    for (const [flags, message] of cases) {
      const r = await runCli(['generate', '--config', configPath, '--out', join(dir, 'x'), ...flags]);
      expect(r.code, flags.join(' ')).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(/ at .*\.ts:\d+/);
    }
    expect(readdirSync(dir)).toEqual(['cfg.json']);
  });

  it('cancel mid-export leaves no file with a final name and no temporary either', async () => {
    const { dir } = workDir({});
    const plan = planExport(parseWaveformConfig({ symbols: 700, oversampling: 2 }), { format: 'sigmf-ci16' });
    const controller = new AbortController();
    let progressed = 0;
    await expect(
      streamExportToFiles(plan, join(dir, 'c'), {
        signal: controller.signal,
        onProgress: () => {
          if (++progressed === 3) controller.abort();
        },
      }),
    ).rejects.toBeInstanceOf(ExportCancelledError);
    expect(readdirSync(dir)).toEqual(['cfg.json']);
  });

  it('SIGINT during a long export: exit 130, nothing left behind', async () => {
    const { dir, configPath } = workDir({ link: 'downlink', symbols: 2800, oversampling: 4 });
    const child = spawn(process.execPath, [join(process.cwd(), 'bin/crestline.js'), 'generate', '--config', configPath, '--out', join(dir, 'big'), '--format', 'sigmf-ci16'], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    let sent = false;
    child.stderr.on('data', (d: Buffer) => {
      stderr += d.toString();
      if (!sent && /progress \[#/.test(stderr)) {
        sent = true;
        child.kill('SIGINT');
      }
    });
    const code = await new Promise<number | null>((resolve) => child.on('exit', (c) => resolve(c)));
    expect(sent).toBe(true);
    expect(code).toBe(130);
    expect(stderr).toMatch(/cancelled: .*big\.sigmf-data was not written/);
    expect(readdirSync(dir)).toEqual(['cfg.json']);
    expect(existsSync(join(dir, 'big.sigmf-meta'))).toBe(false);
  }, 60_000);
});
