import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { TEST_SEED } from '../helpers/seed';

async function run(args: string[]): Promise<{ code: number; out: string[]; err: string[] }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(['node', 'crestline', ...args], { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, out, err };
}

describe('crestline backoff', () => {
  const dir = mkdtempSync(join(tmpdir(), 'crestline-backoff-'));
  const base = { bandwidthMHz: 1.4, modulation: 'qpsk', symbols: 14, data: { source: 'random', seed: TEST_SEED }, windowing: { rampLengthSamples: 2 } };
  const cfg1 = join(dir, 'dfts.json');
  const cfg2 = join(dir, 'ofdm.json');
  writeFileSync(cfg1, JSON.stringify({ ...base, waveform: 'dft-s-ofdm' }));
  writeFileSync(cfg2, JSON.stringify({ ...base, waveform: 'ofdm' }));

  it('prints the curve and the answer as JSON, with a comparison', { timeout: 60000 }, async () => {
    const r = await run(['backoff', '--config', cfg1, '--pa', 'rapp', '--smoothness', '2', '--psat-dbm', '26', '--from', '1', '--to', '9', '--evm-limit', '10', '--compare', cfg2, '--json']);
    expect(r.code, r.err.join('\n')).toBe(0);
    const json = JSON.parse(r.out.join('\n'));
    expect(json.curve.length).toBeGreaterThan(8);
    const p = json.curve[0];
    expect(Object.keys(p)).toEqual(expect.arrayContaining(['oboDb', 'evmRmsPercent', 'aclrDb', 'meanOutputDbm']));
    expect(Object.keys(p.aclrDb).sort()).toEqual(['eutraLower', 'eutraUpper', 'utra1Lower', 'utra1Upper']);
    expect(p.meanOutputDbm).toBeCloseTo(26 - p.oboDb, 3);
    expect(['evm', 'aclr']).toContain(json.limitingMetric);
    expect(json.usableOutputDbm).toBeCloseTo(26 - json.requiredOboDb, 3);
    expect(json.limits.evmPercent.value).toBe(10);
    expect(json.compare.usablePowerDifferenceDb).toBeCloseTo(json.compare.requiredOboDb - json.requiredOboDb, 3);
    expect(json.compare.usablePowerDifferenceDb).toBeGreaterThan(0); // DFT-s-OFDM can transmit more (common practice)
  });

  it('reads a measured table and takes P_sat from it', { timeout: 60000 }, async () => {
    const table = join(dir, 'pa.csv');
    const rows = ['input_dbm,gain_db,phase_deg'];
    for (let pin = -10; pin <= 16; pin += 2) {
      // Rapp p = 2, G = 14 dB, P_sat = 27 dBm sampled into a table (invented test PA).
      const a = 10 ** (14 / 20) * 10 ** (pin / 20);
      const asat = 10 ** (27 / 20);
      const out = a / (1 + (a / asat) ** 4) ** 0.25;
      rows.push(`${pin},${(20 * Math.log10(out / 10 ** (pin / 20))).toFixed(4)},${(pin / 4).toFixed(3)}`);
    }
    writeFileSync(table, rows.join('\n'));
    const r = await run(['backoff', '--config', cfg1, '--pa', `table:${table}`, '--from', '2', '--to', '10', '--json']);
    expect(r.code, r.err.join('\n')).toBe(0);
    const json = JSON.parse(r.out.join('\n'));
    expect(json.psatDbm).toBeGreaterThan(26);
    expect(json.psatDbm).toBeLessThan(27);
    expect(json.usableOutputDbm).toBeCloseTo(json.psatDbm - json.requiredOboDb, 3);
  });

  it('prints a readable report and fails with exit code 2 on bad options', { timeout: 60000 }, async () => {
    const r = await run(['backoff', '--config', cfg1, '--pa', 'clip', '--from', '2', '--to', '8', '--step', '2']);
    expect(r.code, r.err.join('\n')).toBe(0);
    expect(r.out.join('\n')).toMatch(/required OBO \d+\.\d+ dB/);
    expect(r.out.join('\n')).toMatch(/MPR ≤ 1 dB/);
    const bad = await run(['backoff', '--config', cfg1, '--pa', 'tube']);
    expect(bad.code).toBe(2);
    expect(bad.err.join('\n')).toMatch(/--pa "tube" is not known/);
    const noPa = await run(['backoff', '--config', cfg1]);
    expect(noPa.code).toBe(2);
    expect(noPa.err.join('\n')).toMatch(/--pa is required/);
    const badLimit = await run(['backoff', '--config', cfg1, '--pa', 'rapp', '--aclr-limit', 'utra1=x']);
    expect(badLimit.code).toBe(2);
  });
});
