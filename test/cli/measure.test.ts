import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { TEST_SEED } from '../helpers/seed';

async function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(['node', 'crestline', ...args], { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

const dir = mkdtempSync(join(tmpdir(), 'crestline-measure-'));
const cfg = join(dir, 'cfg.json');
writeFileSync(cfg, JSON.stringify({ standard: 'lte', bandwidthMHz: 1.4, link: 'uplink', modulation: '16qam' }));
const common = ['measure', '--config', cfg, '--symbols', '1200', '--block-symbols', '100', '--seed', String(TEST_SEED), '--json'];

describe('crestline measure', () => {
  it('gives identical JSON on 1 worker (in-process) and 2 worker threads, with the fields the issue asks for', async () => {
    const one = await run([...common, '--workers', '1']);
    const two = await run([...common, '--workers', '2']);
    expect(one.code, one.err).toBe(0);
    expect(two.code, two.err).toBe(0);
    expect(two.out).toBe(one.out);
    const r = JSON.parse(one.out);
    for (const key of ['paprDb', 'ccdfDb', 'paprDefinition', 'cubicMetricDb', 'aclrDb', 'occupiedBandwidthHz', 'meanPowerDb', 'symbols', 'oversampling']) {
      expect(r, key).toHaveProperty(key);
    }
    expect(Object.keys(r.paprDb)).toEqual(['1e-1', '1e-2', '1e-3', '1e-4', '1e-5']);
    expect(r.symbols).toBe(1200);
    // The configuration says oversampling 1; measure runs the statistics at 4 and says so.
    expect(r.oversampling).toBe(4);
    expect(r.notes.join(' ')).toMatch(/run at oversampling 4 \(the configuration says 1\)/);
    // 1200 symbols resolve 1e-1 and 1e-2 only; the rest are null with a warning.
    expect(r.paprDb['1e-2']).not.toBeNull();
    expect(r.paprDb['1e-3']).toBeNull();
    expect(r.paprCi95Db['1e-1']).toHaveLength(2);
    expect(r.warnings.join(' ')).toMatch(/PAPR at 1e-3, 1e-4, 1e-5: the run has 1200 symbols/);
    // LTE 1.4 MHz uplink: E-UTRA and UTRA ACLR1 only (no UTRA ACLR2 below 5 MHz, TS 36.101 §6.6.2.3, from memory).
    expect(Object.keys(r.aclrDb).sort()).toEqual(['eutraLower', 'eutraUpper', 'utra1Lower', 'utra1Upper']);
    // 6 RB × 180 kHz = 1.08 MHz transmission bandwidth (TS 36.101 Table 5.6-1): the 99 % OBW lies just inside it.
    expect(r.occupiedBandwidthHz).toBeGreaterThan(1.0e6);
    expect(r.occupiedBandwidthHz).toBeLessThan(1.08e6);
  });

  it('--precision f32 (PFFFT WebAssembly): identical on 1 and 2 workers, and within a 0.01 dB bin of f64', async () => {
    const one = await run([...common, '--workers', '1', '--precision', 'f32']);
    const two = await run([...common, '--workers', '2', '--precision', 'f32']);
    expect(one.code, one.err).toBe(0);
    expect(two.out).toBe(one.out);
    const f32 = JSON.parse(one.out);
    const f64 = JSON.parse((await run([...common, '--workers', '1'])).out);
    expect(f32.precision).toBe('f32');
    expect(f32.notes.join(' ')).toMatch(/single precision on pffft-wasm/);
    // f32 powers agree with f64 to 5e-6 of each symbol's peak (test/dsp/stats), so a level moves by one bin at most.
    for (const key of ['1e-1', '1e-2']) {
      expect(Math.abs(f32.paprDb[key] - f64.paprDb[key])).toBeLessThanOrEqual(0.01 + 1e-9);
      expect(Math.abs(f32.ccdfDb[key] - f64.ccdfDb[key])).toBeLessThanOrEqual(0.01 + 1e-9);
    }
  });

  it('shards written with --shard k/n --out and combined with crestline merge reproduce the single run exactly', async () => {
    const single = await run([...common, '--workers', '2']);
    const files: string[] = [];
    for (const k of [1, 2, 3]) {
      const file = join(dir, `shard${k}.json`);
      const r = await run([...common, '--workers', '1', '--shard', `${k}/3`, '--out', file]);
      expect(r.code, r.err).toBe(0);
      expect(r.out).toMatch(new RegExp(`wrote .*shard${k}\\.json: shard ${k}/3`));
      files.push(file);
    }
    const merged = await run(['merge', files[2]!, files[0]!, files[1]!, '--json']);
    expect(merged.code, merged.err).toBe(0);
    expect(merged.out).toBe(single.out);
    // Reporting options apply at merge time too: dBFS = dB − 20·log10(A_fs) (powerLevels.ts; common practice).
    const dbfs = JSON.parse((await run(['merge', ...files, '--json', '--full-scale', '100', '--papr-mean', 'symbol'])).out);
    expect(dbfs.meanPowerDbfs).toBeCloseTo(dbfs.meanPowerDb - 40, 2);
    expect(dbfs.paprDb).toEqual(dbfs.paprSymbolMeanDb);
    expect(dbfs.paprDefinition).toMatch(/that symbol's own mean power/);
    const missing = await run(['merge', files[0]!, files[1]!]);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/Shard 3\/3 missing/);
  });

  it('prints a readable table and writes the spectrum CSV atomically', async () => {
    const csv = join(dir, 'psd.csv');
    const r = await run(['measure', '--config', cfg, '--symbols', '300', '--workers', '1', '--psd-out', csv, '--window', 'blackman-harris']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/Crestline measurement: LTE 1\.4 MHz uplink dft-s-ofdm localized 16qam/);
    expect(r.out).toMatch(/PAPR, peak \/ run mean/);
    expect(r.out).toMatch(/Cubic metric +\d/);
    expect(r.out).toMatch(/UTRA ACLR1 \+ +\+3\.20 MHz/);
    const text = readFileSync(csv, 'utf8').split('\n');
    expect(text[0]).toMatch(/blackman-harris window/);
    expect(text[2]).toBe('frequency_hz,psd_dbc_per_hz,psd_dbc_per_rbw');
    expect(readdirSync(dir).some((f) => f.startsWith('.crestline-tmp'))).toBe(false);
  });

  it('refuses bad input with a clear message and exit code 2', async () => {
    const noOut = await run(['measure', '--config', cfg, '--shard', '1/2']);
    expect(noOut.code).toBe(2);
    expect(noOut.err).toMatch(/--shard needs --out FILE/);
    const badMean = await run(['measure', '--config', cfg, '--papr-mean', 'peak']);
    expect(badMean.err).toMatch(/--papr-mean must be "run" .* got "peak"/);
    const badSymbols = await run(['measure', '--config', cfg, '--symbols', '1e3']);
    expect(badSymbols.err).toMatch(/--symbols must be a whole number from 1 to 1000000000; got "1e3"/);
    const badShard = await run(['measure', '--config', cfg, '--shard', '3/2', '--out', join(dir, 'x.json')]);
    expect(badShard.err).toMatch(/--shard must be k\/n/);
    writeFileSync(join(dir, 'bad.json'), JSON.stringify({ standard: 'lte', allocation: { startRb: 0, numRb: 7 } }));
    const badConfig = await run(['measure', '--config', join(dir, 'bad.json')]);
    expect(badConfig.code).toBe(2);
    expect(badConfig.err).toMatch(/crestline: allocation: DFT-s-OFDM needs M_RB/);
    writeFileSync(join(dir, 'junk.json'), '{"format":"other"}');
    const junk = await run(['merge', join(dir, 'junk.json')]);
    expect(junk.code).toBe(2);
    expect(junk.err).toMatch(/junk\.json: not a Crestline shard result/);
  });
});
