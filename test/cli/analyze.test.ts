import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';

async function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(['node', 'crestline', ...args], { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

async function generated(cfg: object, extra: string[] = []) {
  const dir = mkdtempSync(join(tmpdir(), 'crestline-analyze-'));
  writeFileSync(join(dir, 'cfg.json'), JSON.stringify(cfg));
  const g = await run(['generate', '--config', join(dir, 'cfg.json'), '--out', join(dir, 'rec'), '--no-progress', ...extra]);
  expect(g.code, g.err).toBe(0);
  return dir;
}

// Quantisation bound of cf32_le (derived): each component is rounded to float32 with relative error ≤ 2^-24, so the
// error power is at most 2^-48 of the signal's; after the FFT it lands on the data elements at most in proportion, and
// the channel estimate made from the same samples can add as much again: EVM ≤ 2·2^-24 ≈ 1.2e-5 % for unit-power data.
const cf32BoundPercent = 100 * 2 * 2 ** -24;

describe('crestline analyze', () => {
  it('reports EVM below the cf32 quantisation bound, the limit and verdict, BER 0, CFO ≈ 0 and timing 0 for a file from generate', async () => {
    const dir = await generated({ standard: 'lte', bandwidthMHz: 3, modulation: '64qam', referenceSignals: { enabled: true } });
    const r = await run(['analyze', '--config', join(dir, 'cfg.json'), '--iq', join(dir, 'rec.sigmf-data'), '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    for (const key of ['evmRmsPercent', 'evmPeakPercent', 'evmLimitPercent', 'pass', 'ber', 'cfoHz', 'timingOffsetSamples']) expect(j).toHaveProperty(key);
    expect(j.evmRmsPercent).toBeLessThan(cf32BoundPercent);
    expect(j.evmPeakPercent).toBeLessThan(100 * 2 ** -16);
    expect(j.evmLimitPercent).toBe(8); // 64QAM, TS 36.101 Table 6.5.2.1.1-1
    expect(j.pass).toBe(true);
    expect(j.ber).toBe(0);
    expect(Math.abs(j.cfoHz)).toBeLessThan(1e-3);
    expect(j.timingOffsetSamples).toBe(0);
    expect(j.datatype).toBe('cf32_le');
    expect(j.channelEstimation).toMatch(/reference signals/);
  });

  // Integer datatypes (derived): rounding leaves |e| ≤ Δ/2 per component, Δ = 1/full-scale code, so at most Δ²/2 error
  // power per sample; the FFT spreads it over N bins while a data element carries scale²·E_RE (E_RE = 1), so the error
  // part of EVM is at most √(Δ²/2 / (N·scale²)), doubled for the channel estimate made from the same samples. Uniform
  // rounding noise (Δ²/6 per sample, common practice) predicts the typical value, which the measurement must also reach.
  for (const [format, fullScale] of [
    ['sigmf-ci16', 32767],
    ['sigmf-ci8', 127],
  ] as const) {
    it(`${format}: EVM below the quantisation bound of the datatype and near the uniform-noise value`, async () => {
      const dir = await generated({ standard: 'lte', bandwidthMHz: 5, modulation: '16qam', referenceSignals: { enabled: true } }, ['--format', format]);
      const meta = JSON.parse(readFileSync(join(dir, 'rec.sigmf-meta'), 'utf8'));
      const scale = meta.global['crestline:scaling'].scaleLinear as number;
      const r = await run(['analyze', '--config', join(dir, 'cfg.json'), '--iq', join(dir, 'rec'), '--json']);
      expect(r.code, r.err).toBe(0);
      const j = JSON.parse(r.out);
      const delta = 1 / fullScale;
      const n = 512;
      const boundPercent = 100 * 2 * Math.sqrt(delta ** 2 / 2 / (n * scale ** 2));
      const uniformPercent = 100 * Math.sqrt(delta ** 2 / 6 / (n * scale ** 2));
      expect(j.datatype).toBe(format === 'sigmf-ci16' ? 'ci16_le' : 'ci8');
      expect(j.evmRmsPercent).toBeLessThan(boundPercent);
      expect(j.evmRmsPercent).toBeGreaterThan(0.8 * uniformPercent);
      expect(j.ber).toBe(0);
    });
  }

  it('demodulates a data-only recording from the known grid and says so; prints a readable report without --json', async () => {
    const dir = await generated({ standard: 'nr', bandwidthMHz: 10, subcarrierSpacingKHz: 30, modulation: 'pi/2-bpsk' });
    const r = await run(['analyze', '--config', join(dir, 'cfg.json'), '--iq', join(dir, 'rec')]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/EVM .* % RMS/);
    expect(r.out).toMatch(/limit 30\.0 % → PASS/);
    expect(r.out).toMatch(/BER 0\.00 \(0 of \d+ bits\)/);
    expect(r.out).toMatch(/data-aided: estimated from the known transmitted grid, reference signals off/);
  });

  it('fails clearly on a sample-rate mismatch, a damaged file and a missing file', async () => {
    const dir = await generated({ standard: 'lte', bandwidthMHz: 1.4 });
    writeFileSync(join(dir, 'other.json'), JSON.stringify({ standard: 'lte', bandwidthMHz: 3 }));
    const rate = await run(['analyze', '--config', join(dir, 'other.json'), '--iq', join(dir, 'rec')]);
    expect(rate.code).toBe(2);
    expect(rate.err).toMatch(/sample rate 1920000 Hz differs from the configuration's 3840000 Hz/);

    const data = readFileSync(join(dir, 'rec.sigmf-data'));
    writeFileSync(join(dir, 'rec.sigmf-data'), data.subarray(0, data.length - 3));
    const truncated = await run(['analyze', '--config', join(dir, 'cfg.json'), '--iq', join(dir, 'rec')]);
    expect(truncated.code).toBe(2);
    expect(truncated.err).toMatch(/not a whole number of cf32_le samples/);
    writeFileSync(join(dir, 'rec.sigmf-data'), data);

    const damaged = Buffer.from(data);
    damaged[100] = damaged[100]! ^ 0xff;
    writeFileSync(join(dir, 'rec.sigmf-data'), damaged);
    const checksum = await run(['analyze', '--config', join(dir, 'cfg.json'), '--iq', join(dir, 'rec')]);
    expect(checksum.code).toBe(2);
    expect(checksum.err).toMatch(/SHA-512 .* does not match/);

    const missing = await run(['analyze', '--config', join(dir, 'cfg.json'), '--iq', join(dir, 'nothing.sigmf-data')]);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/Cannot read IQ file/);
  });
});

describe('crestline link', () => {
  it('sweeps Eb/N0 and prints JSON points with AWGN theory', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-link-'));
    writeFileSync(join(dir, 'cfg.json'), JSON.stringify({ standard: 'lte', bandwidthMHz: 1.4, symbols: 14 }));
    const r = await run(['link', '--config', join(dir, 'cfg.json'), '--channel', 'awgn', '--ebn0', '0:4:2', '--repeats', '1', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.points.map((p: { ebN0Db: number }) => p.ebN0Db)).toEqual([0, 2, 4]);
    expect(j.points[0].theoryBer).toBeCloseTo(7.865e-2, 4); // Q(√(2Eb/N0)) at 0 dB, REFERENCE.md §6
    expect(j.points[0].ber).toBeGreaterThan(0.05);
  });

  it('rejects a bad --ebn0 and a bad --channel with the allowed forms', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-link-'));
    writeFileSync(join(dir, 'cfg.json'), '{}');
    const range = await run(['link', '--config', join(dir, 'cfg.json'), '--channel', 'awgn', '--ebn0', '10:0:1']);
    expect(range.code).toBe(2);
    expect(range.err).toMatch(/--ebn0 "10:0:1" needs B ≥ A; write A:B:STEP/);
    const channel = await run(['link', '--config', join(dir, 'cfg.json'), '--channel', 'rayleigh', '--ebn0', '0']);
    expect(channel.code).toBe(2);
    expect(channel.err).toMatch(/use awgn, epa, eva, etu/);
  });
});
