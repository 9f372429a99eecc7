import { describe, expect, it } from 'vitest';
import { defaultWaveformConfig, parseWaveformConfig, parseWaveformConfigJson } from '../../src/config/configParse';
import { DspError } from '../../src/dsp/errors';
import { allowedDftRbCounts } from '../../src/dsp/waveform/transformPrecoding';
import { effectiveWaveform } from '../../src/dsp/waveform/waveformPlan';

function errorOf(input: unknown): DspError {
  try {
    parseWaveformConfig(input);
  } catch (e) {
    return e as DspError;
  }
  throw new Error('expected an error');
}

describe('waveform configuration', () => {
  it('defaults to LTE 20 MHz uplink DFT-s-OFDM QPSK, full allocation, PN9, 14 symbols, oversampling 1', () => {
    const c = defaultWaveformConfig();
    expect(c).toMatchObject({ standard: 'lte', link: 'uplink', bandwidthMHz: 20, modulation: 'qpsk', symbols: 14, oversampling: 1, data: { source: 'pn9' } });
    expect(effectiveWaveform(c)).toBe('dft-s-ofdm');
    expect(c.allocation).toBeUndefined();
  });

  it('names unknown fields and out-of-range values with what is allowed', () => {
    const e = errorOf({ bandwdith: 20, oversampling: 17 });
    expect(e.code).toBe('INVALID_CONFIG');
    expect(e.message).toMatch(/unknown field "bandwdith"/);
    expect(e.message).toMatch(/oversampling: must be a whole number from 1 to 16/);
    const issues = e.details?.issues as { path: string }[];
    expect(issues.map((i) => i.path).sort()).toEqual(['(top level)', 'oversampling']);
    expect(errorOf({ modulation: '32qam' }).message).toMatch(/modulation: must be one of bpsk, pi\/2-bpsk, qpsk/);
    expect(errorOf({ data: { source: 'pn11' } }).message).toMatch(/source must be one of pn9/);
  });

  it('checks allocations against the grid and each other, naming the block', () => {
    expect(errorOf({ allocation: { startRb: 90, numRb: 20 } }).message).toMatch(/exceed the grid of 100 RB.*at most 10/);
    expect(
      errorOf({ allocation: [{ startRb: 0, numRb: 10 }, { startRb: 5, numRb: 10 }], waveform: 'ofdm' }).message,
    ).toMatch(/overlaps/);
    expect(errorOf({ allocation: { startRb: 0, numRb: 7 } }).details?.issues).toEqual([
      expect.objectContaining({ path: 'allocation' }),
    ]);
  });

  // TS 36.211 §5.3.3: M_RB = 2^a·3^b·5^c; the 34 allowed values up to 100 (REFERENCE.md §2, derived).
  it('allows exactly the 2·3·5-smooth DFT sizes and names the nearest ones otherwise', () => {
    expect(allowedDftRbCounts(100)).toEqual([
      1, 2, 3, 4, 5, 6, 8, 9, 10, 12, 15, 16, 18, 20, 24, 25, 27, 30, 32, 36, 40, 45, 48, 50, 54, 60, 64, 72, 75, 80, 81, 90, 96, 100,
    ]);
    expect(() => parseWaveformConfig({ allocation: { startRb: 0, numRb: 60 } })).not.toThrow();
    expect(() => parseWaveformConfig({ allocation: { startRb: 0, numRb: 75 } })).not.toThrow();
    const e = errorOf({ allocation: { startRb: 0, numRb: 7 } });
    expect(e.code).toBe('UNSUPPORTED_SIZE');
    expect(e.message).toMatch(/Nearest allowed: 6 RB \(M_sc 72\) or 8 RB \(M_sc 96\)/);
    expect(errorOf({ allocation: { startRb: 0, numRb: 11 } }).message).toMatch(/10 RB .* or 12 RB/);
    // The same 7 RB is fine for plain OFDM, which has no DFT.
    expect(() => parseWaveformConfig({ allocation: { startRb: 0, numRb: 7 }, waveform: 'ofdm' })).not.toThrow();
  });

  it('keeps waveforms and modulations to their standards', () => {
    expect(errorOf({ link: 'downlink', waveform: 'dft-s-ofdm' }).message).toMatch(/uplink waveform/);
    expect(errorOf({ waveform: 'ofdm', modulation: 'pi/2-bpsk' }).message).toMatch(/TS 38.211 §6.3.1.2/);
    expect(errorOf({ standard: 'nr', bandwidthMHz: 100, subcarrierSpacingKHz: 15 }).message).toMatch(/Table 5.3.2-1/);
    expect(errorOf({ mapping: 'interleaved', interleaveFactor: 7 }).message).toMatch(/allowed factors/);
  });

  it('reports bad JSON with the source named', () => {
    expect(() => parseWaveformConfigJson('{"standard": lte}', 'cfg.json')).toThrow(/^cfg\.json: not valid JSON \(.+\)\.$/);
  });
});
