import { describe, expect, it } from 'vitest';
import { createRng, deriveBlockSeed } from '../../../src/dsp/data/rng';
import { createSosFading, fillSosFading } from '../../../src/dsp/channel/sumOfSinusoids';
import { TEST_SEED } from '../../helpers/seed';

/** J0(x) = (1/π)∫_0^π cos(x·sin θ) dθ (Bessel's integral; Abramowitz & Stegun 9.1.18), trapezoidal rule on a periodic integrand. */
function besselJ0(x: number): number {
  const n = 2000;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += Math.cos(x * Math.sin((Math.PI * (i + 0.5)) / n));
  return sum / n;
}

const dopplerHz = 70;
const sampleRateHz = 2000;
const numProcesses = 400;
const numSamples = 256;

function ensemble(seed: number): Float64Array[] {
  return Array.from({ length: numProcesses }, (_, i) => {
    const f = createSosFading(dopplerHz, 20, createRng(deriveBlockSeed(seed, i)));
    return fillSosFading(f, 0.01 * i, sampleRateHz, new Float64Array(2 * numSamples));
  });
}

describe(`sum-of-sinusoids Rayleigh fading (Xiao, Zheng & Beaulieu 2006), seed ${TEST_SEED}`, () => {
  const processes = ensemble(TEST_SEED);

  it('has unit average power E|g|² = 1 (ensemble of 400 processes, 3 % tolerance)', () => {
    let sum = 0;
    for (const g of processes) for (let i = 0; i < g.length; i++) sum += g[i]! * g[i]!;
    expect(Math.abs(sum / (numProcesses * numSamples) - 1)).toBeLessThan(0.03);
  });

  it('has autocorrelation R(τ) = J0(2π f_D τ) (Clarke/Jakes classical spectrum; REFERENCE.md §8), within 0.06', () => {
    // First zero of J0 at 2π f_D τ = 2.4048 (derived): τ = 5.47 ms, i.e. about 11 samples at 2 kHz.
    for (const lag of [0, 2, 5, 11, 20, 40]) {
      let re = 0;
      let im = 0;
      let count = 0;
      for (const g of processes) {
        for (let n = 0; n + lag < numSamples; n += 8) {
          re += g[2 * (n + lag)]! * g[2 * n]! + g[2 * (n + lag) + 1]! * g[2 * n + 1]!;
          im += g[2 * (n + lag) + 1]! * g[2 * n]! - g[2 * (n + lag)]! * g[2 * n + 1]!;
          count++;
        }
      }
      const theory = besselJ0((2 * Math.PI * dopplerHz * lag) / sampleRateHz);
      expect(Math.abs(re / count - theory), `lag ${lag}: ${re / count} vs J0 ${theory}`).toBeLessThan(0.06);
      expect(Math.abs(im / count), `lag ${lag}: imaginary part`).toBeLessThan(0.06);
    }
  });

  it('keeps all its power inside |f| ≤ f_D: the Doppler spectrum is band-limited (classical spectrum support)', () => {
    // Periodogram of each process (Hann window), summed; fraction of power beyond 1.2·f_D.
    const n = numSamples;
    let inside = 0;
    let outside = 0;
    for (const g of processes.slice(0, 100)) {
      for (let b = 0; b < n; b++) {
        const f = (b < n / 2 ? b : b - n) * (sampleRateHz / n);
        let re = 0;
        let im = 0;
        for (let t = 0; t < n; t++) {
          const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * t) / n);
          const angle = (-2 * Math.PI * b * t) / n;
          re += w * (g[2 * t]! * Math.cos(angle) - g[2 * t + 1]! * Math.sin(angle));
          im += w * (g[2 * t]! * Math.sin(angle) + g[2 * t + 1]! * Math.cos(angle));
        }
        if (Math.abs(f) <= 1.2 * dopplerHz) inside += re * re + im * im;
        else outside += re * re + im * im;
      }
    }
    expect(outside / (inside + outside)).toBeLessThan(0.01);
  });

  it('has a Rayleigh envelope: P(|g|² ≤ x) = 1 − e^{−x} at x = 0.1, 0.5, 1, 2 (within 0.03)', () => {
    const values: number[] = [];
    for (const g of processes) for (let t = 0; t < numSamples; t += 16) values.push(g[2 * t]! ** 2 + g[2 * t + 1]! ** 2);
    for (const x of [0.1, 0.5, 1, 2]) {
      const fraction = values.filter((v) => v <= x).length / values.length;
      expect(Math.abs(fraction - (1 - Math.exp(-x))), `x = ${x}`).toBeLessThan(0.03);
    }
  });

  it('refuses an output that is not whole complex samples, saying what is allowed', () => {
    // Interleaved IQ: 2 values per complex sample (src/dsp complex-buffer convention, common practice).
    const fading = createSosFading(10, 20, createRng(TEST_SEED));
    expect(() => fillSosFading(fading, 0, sampleRateHz, new Float64Array(9))).toThrow(
      'fillSosFading outIq has 9 values; allowed: an even number (2 per complex sample, re then im), e.g. 8 or 10.',
    );
  });

  it('is reproducible from its seed', () => {
    const a = ensemble(TEST_SEED)[3]!;
    expect(Array.from(a)).toEqual(Array.from(processes[3]!));
  });
});
