import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { rippleDbToDelta } from '../../../src/dsp/resample/kaiserWindow';
import { createCircularResampler, resampleCircular } from '../../../src/dsp/resample/polyphaseResampler';
import { designResampler, type ResamplerDesign } from '../../../src/dsp/resample/resamplerDesign';
import { expectCloseArray } from '../../helpers/expectClose';
import { gaussianIq, hannSpectrum, tonesIq } from '../../helpers/iqTestSignals';
import { TEST_SEED } from '../../helpers/seed';

const EDGE_HZ = 9.0075e6;
const designs = new Map<number, ResamplerDesign>();
function design(inHz: number, outHz: number): ResamplerDesign {
  const key = inHz * 1e3 + outHz;
  if (!designs.has(key)) designs.set(key, designResampler({ inputRateHz: inHz, outputRateHz: outHz, passbandEdgeHz: EDGE_HZ }));
  return designs.get(key)!;
}

/** y[m] straight from the definition: upsample by L, filter with h, delay D removed, keep every M-th; x periodic. */
function naiveOutput(d: ResamplerDesign, x: Float64Array, m: number): [number, number] {
  const n = x.length / 2;
  let re = 0;
  let im = 0;
  const t = m * d.down + d.delayInterpolatedSamples;
  for (let j = 0; j < d.numTaps; j++) {
    const u = t - j;
    if (((u % d.up) + d.up) % d.up !== 0) continue;
    const i = (((u / d.up) % n) + n) % n;
    re += d.taps[j]! * x[2 * i]!;
    im += d.taps[j]! * x[2 * i + 1]!;
  }
  return [re, im];
}

/** Frequency of a single tone from the mean phase step: f = fs/(2π)·arg Σ y[n+1]·conj(y[n]) (common practice). */
function toneFrequencyHz(iq: Float64Array, fs: number): number {
  let re = 0;
  let im = 0;
  for (let n = 0; n + 1 < iq.length / 2; n++) {
    const a = iq[2 * n]!, b = iq[2 * n + 1]!, c = iq[2 * n + 2]!, e = iq[2 * n + 3]!;
    re += c * a + e * b;
    im += e * a - c * b;
  }
  return (fs * Math.atan2(im, re)) / (2 * Math.PI);
}

function concat(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length);
  out.set(a);
  out.set(b, a.length);
  return out;
}

describe(`circular rational polyphase resampler (seed ${TEST_SEED})`, () => {
  it('matches the direct upsample–filter–decimate definition, streamed or in memory, primed or deferred', () => {
    const x = gaussianIq(3000, TEST_SEED);
    for (const outHz of [122.88e6, 100e6, 23.04e6]) {
      const d = design(30.72e6, outHz);
      const whole = resampleCircular(d, x);
      expect(whole.length / 2).toBe(Math.floor((3000 * d.up) / d.down));
      for (const m of [0, 1, 2, 100, whole.length / 2 - 2, whole.length / 2 - 1]) {
        const [re, im] = naiveOutput(d, x, m);
        expect(Math.abs(whole[2 * m]! - re) + Math.abs(whole[2 * m + 1]! - im), `${outHz} output ${m}`).toBeLessThan(1e-12);
      }
      // Deferred start, fed in uneven chunks: outputs firstOutput… then the leading ones once the tail is known.
      const r = createCircularResampler(d, 3000);
      const parts: Float64Array[] = [];
      for (let i = 0; i < 3000; i += 331) parts.push(r.push(x.subarray(2 * i, 2 * Math.min(3000, i + 331))));
      parts.push(r.finish());
      const streamed = [r.leadingIq(), ...parts].reduce(concat);
      expectCloseArray(streamed, whole, 0, `streamed ${outHz}`);
      // Primed with the tail the deferred pass found: strictly in order, same numbers.
      const primed = createCircularResampler(d, 3000, r.tailIq());
      expectCloseArray(concat(primed.push(x), primed.finish()), whole, 0, `primed ${outHz}`);
    }
  });

  it('preserves a tone’s frequency at every instrument rate', () => {
    const fs = 30.72e6;
    const toneHz = 3.1e6; // 3100 whole cycles in 1 ms, inside the ±9 MHz passband
    const x = tonesIq(30720, [{ cyclesPerSample: toneHz / fs, amplitude: 1, phaseRad: 0.3 }]);
    for (const outHz of [122.88e6, 100e6, 61.44e6, 245.76e6]) {
      const y = resampleCircular(design(fs, outHz), x);
      const toleranceHz = 0.5; // 0.16 ppb: a wrong ratio would be off by kHz
      expect(Math.abs(toneFrequencyHz(y, outHz) - toneHz), `${outHz}`).toBeLessThan(toleranceHz);
    }
  });

  it('resample-then-back EVM stays below the design bound 2δp + δp² + 2δs (derived from the passband and stopband limits)', () => {
    // Band-limited periodic test signal: 60 tones with whole cycles over 1 ms, all within ±8.9 MHz.
    const fs = 30.72e6;
    const n = 30720;
    const rng = createRng(TEST_SEED + 7);
    const tones = Array.from({ length: 60 }, () => ({
      cyclesPerSample: Math.round((2 * rng.nextFloat() - 1) * 8900) / n,
      amplitude: 0.5 + rng.nextFloat(),
      phaseRad: 2 * Math.PI * rng.nextFloat(),
    }));
    const x = tonesIq(n, tones);
    const bound = 2 * rippleDbToDelta(0.01) + rippleDbToDelta(0.01) ** 2 + 2 * 10 ** (-80 / 20);
    for (const outHz of [122.88e6, 100e6, 61.44e6, 245.76e6]) {
      const up = resampleCircular(design(fs, outHz), x);
      const back = resampleCircular(design(outHz, fs), up);
      let err = 0;
      let sig = 0;
      for (let i = 0; i < x.length; i++) {
        err += (back[i]! - x[i]!) ** 2;
        sig += x[i]! ** 2;
      }
      const evm = Math.sqrt(err / sig);
      console.info(`round trip 30.72 → ${outHz / 1e6} → 30.72 Msps: EVM ${(100 * evm).toFixed(4)} % (${(20 * Math.log10(evm)).toFixed(1)} dB), bound ${(100 * bound).toFixed(4)} %`);
      expect(evm, `${outHz}`).toBeLessThan(bound);
    }
  });

  it('a resampled loop played twice has no extra sidelobes at the seam; zero-history (non-circular) filtering does', () => {
    // Hann-window leakage far from a tone is tiny; a discontinuity spreads power over all bins (common practice;
    // Harris, "On the use of windows…", Proc. IEEE 1978).
    const fs = 30.72e6;
    const n = 3072;
    const x = tonesIq(n, [{ cyclesPerSample: 301 / n, amplitude: 1, phaseRad: 0 }]);
    const d = design(fs, 100e6);
    const y = resampleCircular(d, x);
    const linear = createCircularResampler(d, n, new Float64Array(2 * d.tapsPerPhase));
    const yLinear = concat(linear.push(x), linear.finish());
    const len = 2048;
    const ny = y.length / 2;
    const farBins = Array.from({ length: len }, (_, k) => k).filter((k) => Math.min(Math.abs(k - Math.round((301 / n) * (fs / 100e6) * len)), len - Math.abs(k - Math.round((301 / n) * (fs / 100e6) * len))) > 40);
    const oob = (sig: Float64Array, start: number): number => {
      const p = hannSpectrum(sig, start, len, farBins);
      return p.reduce((s, v) => s + v, 0);
    };
    const twice = concat(y, y);
    const inside = oob(twice, 1000);
    const seam = oob(twice, ny - len / 2);
    const twiceLinear = concat(yLinear, yLinear);
    const seamLinear = oob(twiceLinear, ny - len / 2);
    const insideLinear = oob(twiceLinear, 2000);
    const marginDb = 3;
    expect(10 * Math.log10(seam / inside)).toBeLessThan(marginDb);
    // Negative control: the zero-history start transient shows at the seam.
    expect(10 * Math.log10(seamLinear / insideLinear)).toBeGreaterThan(20);
  });
});
