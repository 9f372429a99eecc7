import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { parseWaveformConfig } from '../../src/config/configParse';
import { generateWaveform } from '../../src/dsp/waveform/waveformGenerator';
import { decodeCf32Le } from '../../src/io/cf32';

async function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(['node', 'crestline', ...args], { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

describe('crestline generate', () => {
  it('writes a SigMF pair whose data is the formula samples in cf32_le and whose meta regenerates them', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-gen-'));
    const cfg = { standard: 'lte', bandwidthMHz: 1.4, modulation: '16qam', symbols: 7 };
    writeFileSync(join(dir, 'cfg.json'), JSON.stringify(cfg));
    const r = await run(['generate', '--config', join(dir, 'cfg.json'), '--out', join(dir, 'wave')]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/960 samples, 0.500 ms at 1.920 Msps, mean power/);
    const data = readFileSync(join(dir, 'wave.sigmf-data'));
    const meta = JSON.parse(readFileSync(join(dir, 'wave.sigmf-meta'), 'utf8'));
    // SigMF: required global core:datatype and core:version; sha512 of the data file (SigMF spec, REFERENCE.md §9).
    expect(meta.global['core:datatype']).toBe('cf32_le');
    expect(meta.global['core:version']).toMatch(/^\d+\.\d+\.\d+$/);
    expect(meta.global['core:sample_rate']).toBe(1.92e6);
    expect(meta.global['core:sha512']).toBe(createHash('sha512').update(data).digest('hex'));
    expect(Object.keys(meta).sort()).toEqual(['annotations', 'captures', 'global']);
    // 8 bytes per complex cf32 sample.
    expect(data.byteLength).toBe(960 * 8);
    const regenerated = generateWaveform(parseWaveformConfig(meta.global['crestline:config']));
    const decoded = decodeCf32Le(new Uint8Array(data));
    const asF32 = Float32Array.from(regenerated.waveformIq);
    expect(Array.from(decoded)).toEqual(Array.from(asF32));
  });

  it('refuses bad input with a clear message, exit code 2 and no files left', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-bad-'));
    writeFileSync(join(dir, 'cfg.json'), JSON.stringify({ standard: 'lte', allocation: { startRb: 0, numRb: 7 } }));
    const r = await run(['generate', '--config', join(dir, 'cfg.json'), '--out', join(dir, 'wave')]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/crestline: allocation: DFT-s-OFDM needs M_RB/);
    expect(r.err).not.toMatch(/at .*\.ts:/); // no stack trace without --verbose
    expect(readdirSync(dir)).toEqual(['cfg.json']);
    const missing = await run(['generate', '--config', join(dir, 'nope.json'), '--out', join(dir, 'w')]);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/Cannot read configuration file/);
  });
});
