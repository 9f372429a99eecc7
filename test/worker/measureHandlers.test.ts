import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { createAmplifierFromConfig } from '../../src/dsp/amplifier/createAmplifier';
import { analyzeBackoff } from '../../src/dsp/backoff/backoffAnalysis';
import { measureSpectrum } from '../../src/dsp/metrics/spectrumMeasurement';
import { createEngineClient } from '../../src/worker/client';
import { InProcessWorker } from './inProcessWorker';

// The spectrum and EVM requests must pass the engine's results through unchanged (no DSP in the worker), and the
// transmitter chain must show the physics it models: a compressing amplifier spreads the spectrum and adds EVM.

/** LTE 5 MHz uplink, 25 RB (TS 36.101 Table 5.6-1), QPSK: small enough for a quick test. */
const base = { standard: 'lte', bandwidthMHz: 5, symbols: 14, modulation: 'qpsk' };
/** Rapp PA (p = 2) at 2 dB OBO: well into compression for an OFDM-like envelope (common practice). */
const hardPa = { model: 'rapp', smoothness: 2, backoffDb: 2 };

function client() {
  return createEngineClient({ createWorker: () => new InProcessWorker(), poolSize: 1 });
}

describe('spectrum request', () => {
  it('returns measureSpectrum’s PSD, ACLR and OBW for a waveform without a transmitter chain', async () => {
    const c = client();
    const result = await c.spectrum(base);
    const expected = measureSpectrum(parseWaveformConfig(base), { oversampling: 1, symbols: 14 });
    expect(result.waveform.psdPerHz).toEqual(expected.psd.psdPerHz);
    expect(result.waveform.frequenciesHz).toEqual(expected.psd.frequenciesHz);
    expect(result.waveform.aclr).toEqual(expected.aclr);
    expect(result.waveform.occupiedBandwidth).toEqual(expected.occupiedBandwidth);
    expect(result.waveform.oversampling).toBe(expected.oversampling);
    expect(result.transmitted).toBeNull();
    expect(result.amplifier).toBeNull();
    c.dispose();
  });

  it('adds the transmitted spectrum and the amplifier curves when an amplifier is configured', async () => {
    const c = client();
    const result = await c.spectrum({ ...base, amplifier: hardPa });
    expect(result.transmitted).not.toBeNull();
    const before = result.waveform.aclr.values.find((v) => v.key === 'eutraUpper')!.aclrDb;
    const after = result.transmitted!.aclr.values.find((v) => v.key === 'eutraUpper')!.aclrDb;
    // Spectral regrowth: compression raises the adjacent-channel power (common practice).
    expect(after).toBeLessThan(before - 3);
    const amp = result.amplifier!;
    expect(amp.inputDbRelSat.length).toBe(amp.outputDbRelSat.length);
    expect(amp.drive?.oboDb).toBeCloseTo(2, 3); // the drive solved on the waveform meets the configured OBO
    // Rapp: output never exceeds saturation (0 dB re A_sat), and the small-signal gain is 0 dB (Rapp 1991 form).
    expect(Math.max(...amp.outputDbRelSat)).toBeLessThanOrEqual(1e-9);
    expect(amp.gainCompressionDb[0]).toBeCloseTo(0, 2);
    c.dispose();
  });
});

describe('EVM request', () => {
  it('measures essentially no EVM on the ideal waveform and more after a compressing amplifier', async () => {
    const c = client();
    const clean = await c.evm(base);
    expect(clean.evm.evmRmsPercent).toBeLessThan(0.01);
    expect(clean.evm.transmitterSteps).toEqual([]);
    expect(clean.evm.constellationIq!.length).toBe(2 * 14 * 300); // 25 RB × 12 data symbols × 14 symbols
    expect(clean.evm.perSymbolPercent).toHaveLength(14);
    const compressed = await c.evm({ ...base, amplifier: hardPa });
    expect(compressed.evm.evmRmsPercent).toBeGreaterThan(1);
    expect(compressed.evm.evmLimitPercent).toBe(17.5); // QPSK UE EVM limit 17.5 %, TS 36.101 Table 6.5.2.1.1-1
    expect(compressed.evm.transmitterSteps[0]).toMatch(/^amplifier/);
    c.dispose();
  });
});

describe('back-off request', () => {
  it('answers with analyzeBackoff for the configuration’s amplifier and the CLI’s sweep defaults', async () => {
    const c = client();
    const config = { ...base, amplifier: { model: 'rapp', smoothness: 2 } };
    const result = await c.backoff(config);
    const parsed = parseWaveformConfig(config);
    const expected = analyzeBackoff(parsed, { model: createAmplifierFromConfig(parsed.amplifier!), axis: 'obo', fromDb: 1, toDb: 15, stepDb: 1, toleranceDb: 0.05 });
    expect(result.analysis).toEqual(expected);
    expect(result.analysis.requiredOboDb).not.toBeNull();
    c.dispose();
  });

  it('says which field is missing when there is no amplifier', async () => {
    const c = client();
    const error = await c.backoff(base).catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'INVALID_CONFIG', message: expect.stringContaining('needs an amplifier'), details: { field: 'amplifier' } });
    c.dispose();
  });
});
