import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { runLinkSimulation } from '../../../src/dsp/link/linkSimulation';
import { generateWaveform } from '../../../src/dsp/waveform/waveformGenerator';
import { TEST_SEED } from '../../helpers/seed';

describe(`link-level sweep, seed ${TEST_SEED}`, () => {
  const dataOnly = generateWaveform(parseWaveformConfig({ bandwidthMHz: 1.4, symbols: 14 }));
  const withRs = generateWaveform(parseWaveformConfig({ bandwidthMHz: 1.4, symbols: 14, referenceSignals: { enabled: true } }));

  it('is reproducible from its seed and reports the three noise figures consistently', () => {
    const a = runLinkSimulation(dataOnly, { channel: 'eva', ebN0Db: [5, 10], seed: TEST_SEED, repeats: 2 });
    const b = runLinkSimulation(dataOnly, { channel: 'eva', ebN0Db: [5, 10], seed: TEST_SEED, repeats: 2 });
    expect(a.points).toEqual(b.points);
    for (const p of a.points) expect(p.esN0Db - p.ebN0Db).toBeCloseTo(10 * Math.log10(2), 9); // Es/N0 = Eb/N0 + 10·log10(2): QPSK, 2 bits per symbol (common practice)
    expect(a.dopplerHz).toBe(70); // EVA70, the default pairing (TS 36.101 Table B.2.1-5)
    expect(a.channelKnowledge).toBe('ideal');
  });

  it('fading BER falls with Eb/N0 and stays above AWGN theory (Rayleigh diversity loss); RS-based estimation with ETU 300 Hz', () => {
    const r = runLinkSimulation(withRs, { channel: 'etu', ebN0Db: [0, 10, 20], seed: TEST_SEED, repeats: 3 });
    expect(r.channelKnowledge).toBe('reference');
    expect(r.points[0]!.ber).toBeGreaterThan(r.points[1]!.ber);
    expect(r.points[1]!.ber).toBeGreaterThan(r.points[2]!.ber);
    expect(r.points[1]!.ber).toBeGreaterThan(1e-3); // AWGN QPSK at 10 dB: Q(√(2·10)) = 3.9e-6 (Proakis, 5th ed., ch. 4)
  });

  it('recovers a CFO and a fractional timing offset with CP synchronisation (no errors at Eb/N0 = 15 dB in AWGN)', () => {
    const r = runLinkSimulation(withRs, { channel: 'awgn', ebN0Db: [15], seed: TEST_SEED, repeats: 2, cfoHz: 2100, timingOffsetSamples: 12.4, sync: 'cp' });
    expect(r.points[0]!.bitErrors).toBe(0);
  });

  it('rejects a repeat count below 1', () => {
    expect(() => runLinkSimulation(dataOnly, { channel: 'awgn', ebN0Db: [0], seed: 1, repeats: 0 })).toThrowError(/repeats 0/);
  });
});
