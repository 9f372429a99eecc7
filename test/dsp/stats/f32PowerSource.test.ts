import { beforeAll, describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { loadF32Fft, uninstallF32Fft } from '../../../src/dsp/fft/f32Fft';
import { createPowerSource } from '../../../src/dsp/stats/powerSource';
import { createWaveformPlan } from '../../../src/dsp/waveform/waveformPlan';
import { TEST_SEED } from '../../helpers/seed';

// Stated precision of the f32 path (PFFFT, IEEE single precision): each power sample within 5e-6 of its symbol's
// peak power, each symbol's PAPR within 1e-4 dB of the f64 path (the workbench promises 0.01 dB). Seen with the
// default seed: ≤ 6e-7 of the peak and ≤ 3e-6 dB.
const powerTolOfPeak = 5e-6;
const paprTolDb = 1e-4;

function planOf(input: WaveformConfigInput) {
  return createWaveformPlan(parseWaveformConfig(input));
}

/** Worst power error relative to each symbol's peak, and worst per-symbol PAPR difference in dB. */
function compare(a: Float32Array | Float64Array, b: Float64Array, samplesPerSymbol: number) {
  let worstPower = 0;
  let worstPaprDb = 0;
  for (let base = 0; base < b.length; base += samplesPerSymbol) {
    let peakA = 0;
    let peakB = 0;
    let sumA = 0;
    let sumB = 0;
    for (let i = base; i < base + samplesPerSymbol; i++) {
      peakA = Math.max(peakA, a[i]!);
      peakB = Math.max(peakB, b[i]!);
      sumA += a[i]!;
      sumB += b[i]!;
    }
    for (let i = base; i < base + samplesPerSymbol; i++) worstPower = Math.max(worstPower, Math.abs(a[i]! - b[i]!) / peakB);
    worstPaprDb = Math.max(worstPaprDb, Math.abs(10 * Math.log10(peakA / sumA) - 10 * Math.log10(peakB / sumB)));
  }
  return { worstPower, worstPaprDb };
}

const CASES: { name: string; input: WaveformConfigInput }[] = [
  { name: 'LTE 20 MHz downlink OFDM QPSK, os 4 (8192 points)', input: { link: 'downlink', oversampling: 4 } },
  { name: 'LTE 20 MHz uplink DFT-s-OFDM QPSK, os 4 (PFFFT spreading, M = 1200)', input: { oversampling: 4 } },
  { name: 'LTE 15 MHz uplink DFT-s-OFDM 16QAM, os 1 (1536 points, M = 900 spread in f64)', input: { bandwidthMHz: 15, modulation: '16qam' } },
  {
    name: 'NR 20 MHz uplink DFT-s-OFDM, 64QAM and QPSK blocks with power offsets, os 2',
    input: {
      standard: 'nr',
      bandwidthMHz: 20,
      waveform: 'dft-s-ofdm',
      oversampling: 2,
      allocation: [
        { startRb: 0, numRb: 12, modulation: '64qam', powerOffsetDb: -3 },
        { startRb: 20, numRb: 25, powerOffsetDb: 2 },
      ],
    },
  },
  { name: 'NR 10 MHz uplink DFT-s-OFDM π/2-BPSK, os 4', input: { standard: 'nr', bandwidthMHz: 10, waveform: 'dft-s-ofdm', modulation: 'pi/2-bpsk', oversampling: 4 } },
  { name: 'LTE 1.4 MHz uplink interleaved DFT-s-OFDM, os 4 (M = 18)', input: { bandwidthMHz: 1.4, mapping: 'interleaved', interleaveFactor: 4, oversampling: 4 } },
];

describe(`createPowerSource f32 (seed ${TEST_SEED})`, () => {
  beforeAll(async () => {
    const loaded = await loadF32Fft([() => import('@echogarden/pffft-wasm/simd')]);
    expect(loaded.backend).not.toBeNull();
  });

  for (const c of CASES) {
    it(`agrees with the f64 path to ${powerTolOfPeak} of the peak and ${paprTolDb} dB PAPR: ${c.name}`, () => {
      const plan = planOf(c.input);
      const f32 = createPowerSource(plan, { precision: 'f32' });
      const f64 = createPowerSource(plan);
      expect(f32.samplesPerSymbol).toBe(f64.samplesPerSymbol);
      expect(f32.expectedMeanPower).toBe(f64.expectedMeanPower);
      const count = 4;
      const a = new Float32Array(count * f32.samplesPerSymbol);
      const b = new Float64Array(count * f64.samplesPerSymbol);
      f32.fillSymbolPowers(TEST_SEED, 2, count, a);
      f64.fillSymbolPowers(TEST_SEED, 2, count, b);
      const { worstPower, worstPaprDb } = compare(a, b, f64.samplesPerSymbol);
      expect(worstPower, `seed ${TEST_SEED}`).toBeLessThanOrEqual(powerTolOfPeak);
      expect(worstPaprDb, `seed ${TEST_SEED}`).toBeLessThanOrEqual(paprTolDb);
      // Not a copy of the f64 path: single-precision rounding shows.
      expect(worstPower).toBeGreaterThan(0);
    });
  }

  it('two f32 sources sharing one cached transform of the same size keep their own bins', () => {
    // Same 8192-point IFFT, different occupied bins: the second must clear the first one's values.
    const wide = planOf({ link: 'downlink', oversampling: 4 });
    const narrow = planOf({ link: 'downlink', oversampling: 4, allocation: { startRb: 40, numRb: 6 } });
    const sources = [wide, narrow].map((p) => ({ f32: createPowerSource(p, { precision: 'f32' }), f64: createPowerSource(p) }));
    const n = sources[0]!.f32.samplesPerSymbol;
    for (const order of [0, 1, 0, 1]) {
      const s = sources[order]!;
      const a = new Float64Array(n);
      const b = new Float64Array(n);
      s.f32.fillSymbolPowers(TEST_SEED + order, 0, 1, a);
      s.f64.fillSymbolPowers(TEST_SEED + order, 0, 1, b);
      expect(compare(a, b, n).worstPower).toBeLessThanOrEqual(powerTolOfPeak);
    }
  });

  it('runs the exact f64 path for sizes PFFFT cannot do and when no backend is installed', () => {
    // custom 1000-point FFT: not a multiple of 16.
    const odd = planOf({ standard: 'custom', link: 'downlink', waveform: 'ofdm', custom: { fftSize: 1000, numRb: 50, cpLengthSamples: 72 } });
    const lte = planOf({ link: 'downlink', oversampling: 2 });
    const check = (plan: ReturnType<typeof planOf>) => {
      const f32 = createPowerSource(plan, { precision: 'f32' });
      const f64 = createPowerSource(plan);
      const a = new Float64Array(2 * f32.samplesPerSymbol);
      const b = new Float64Array(2 * f64.samplesPerSymbol);
      f32.fillSymbolPowers(TEST_SEED, 0, 2, a);
      f64.fillSymbolPowers(TEST_SEED, 0, 2, b);
      expect(a).toEqual(b);
    };
    check(odd);
    uninstallF32Fft();
    check(lte);
  });
});
