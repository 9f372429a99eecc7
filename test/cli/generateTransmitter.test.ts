import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { applyTransmitterChain } from '../../src/dsp/transmitter/transmitterChain';
import { generateWaveform } from '../../src/dsp/waveform/waveformGenerator';
import { encodeCf32Le } from '../../src/io/cf32';
import { runCli, workDir } from './cliHarness';

describe('crestline generate with transmitter blocks', () => {
  it('writes the waveform after the configured impairments and amplifier, and records the steps', async () => {
    const input = {
      standard: 'lte',
      bandwidthMHz: 1.4,
      symbols: 14,
      impairments: { iqImbalance: { gainDb: 0.5, phaseDeg: 2 } },
      amplifier: { model: 'rapp', smoothness: 2, backoffDb: 4 },
    };
    const { dir, configPath } = workDir(input);
    const r = await runCli(['generate', '--config', configPath, '--out', join(dir, 'tx')]);
    expect(r.code, r.stderr).toBe(0);
    const config = parseWaveformConfig(input);
    const expected = applyTransmitterChain(generateWaveform(config), config).outputIq;
    const clean = generateWaveform(parseWaveformConfig({ standard: 'lte', bandwidthMHz: 1.4, symbols: 14 })).waveformIq;
    const data = readFileSync(join(dir, 'tx.sigmf-data'));
    // Same bytes as the chain run in memory; and not the clean waveform (the blocks did act).
    expect(Buffer.from(encodeCf32Le(expected)).equals(data)).toBe(true);
    expect(Buffer.from(encodeCf32Le(clean)).equals(data)).toBe(false);
    const meta = JSON.parse(readFileSync(join(dir, 'tx.sigmf-meta'), 'utf8'));
    const steps: string[] = meta.global['crestline:transmitter'].steps;
    expect(steps.some((s) => /amplifier/.test(s))).toBe(true);
    expect(steps.some((s) => /IQ|imbalance/i.test(s))).toBe(true);
  });
});
