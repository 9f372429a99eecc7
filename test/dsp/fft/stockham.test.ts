import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/dsp/data/rng';
import { createStockhamFft, stockhamRadices } from '../../../src/dsp/fft/stockham';
import { expectCloseArray, maxAbs } from '../../helpers/expectClose';
import { naiveDft, randomIq } from '../../helpers/naiveDft';
import { TEST_SEED } from '../../helpers/seed';

// Independent reference from npm: fft-js (Vail Systems, MIT), its plain O(N²) DFT.
const require = createRequire(import.meta.url);
const fftJsRef = require('fft-js') as { dft: (v: [number, number][]) => [number, number][] };

// Double-precision FFT error grows about ε·log N·‖x‖ per output (common practice); this bound leaves a wide margin.
const relTol = 1e-13;

describe(`Stockham mixed-radix FFT (seed ${TEST_SEED})`, () => {
  const rng = createRng(TEST_SEED);
  const gauss = () => rng.nextGaussian();

  it('factors 7-smooth sizes into radix 4, 2, 3, 5, 7 and refuses others', () => {
    expect(stockhamRadices(1200)).toEqual([4, 4, 3, 5, 5]);
    expect(stockhamRadices(1536)).toEqual([4, 4, 4, 4, 2, 3]);
    expect(stockhamRadices(98)).toEqual([2, 7, 7]);
    expect(stockhamRadices(13)).toBeNull();
    expect(stockhamRadices(1)).toBeNull();
    expect(() => createStockhamFft(22)).toThrow(/2\^a·3\^b·5\^c·7\^d/);
  });

  // Every butterfly alone (2, 3, 4, 5, 7), each next to the others, strides > 1, and the DFT-spreading sizes
  // M_sc = 12·M_RB of TS 36.211 §5.3.3 (12, 36, 180, 300, 1200) plus LTE's 1536-point IFFT.
  const sizes = [2, 3, 4, 5, 7, 6, 8, 10, 14, 15, 21, 35, 49, 60, 98, 105, 210, 12, 36, 180, 300, 1200, 1536];
  for (const n of sizes) {
    it(`size ${n} equals the O(N²) definition`, () => {
      const x = randomIq(n, gauss);
      const out = new Float64Array(2 * n);
      createStockhamFft(n).forward(x, out);
      expectCloseArray(out, naiveDft(x), relTol * maxAbs(x) * n, `stockham ${n}`);
    });
  }

  for (const n of [60, 300, 343]) {
    it(`size ${n} equals fft-js's independent DFT`, () => {
      const x = randomIq(n, gauss);
      const out = new Float64Array(2 * n);
      createStockhamFft(n).forward(x, out);
      const ref = Float64Array.from(fftJsRef.dft(Array.from({ length: n }, (_, i) => [x[2 * i]!, x[2 * i + 1]!] as [number, number])).flat());
      expectCloseArray(out, ref, relTol * maxAbs(x) * n, `fft-js ${n}`);
    });
  }

  it('leaves its input untouched and gives the same result on reuse (scratch ping-pong)', () => {
    const n = 1200;
    const x = randomIq(n, gauss);
    const copy = x.slice();
    const fft = createStockhamFft(n);
    const first = new Float64Array(2 * n);
    const second = new Float64Array(2 * n);
    fft.forward(x, first);
    fft.forward(x, second);
    expect(x).toEqual(copy);
    expect(second).toEqual(first);
  });

  it('keeps Parseval: Σ|X|² = N·Σ|x|² at 6144 points (4·1536, LTE 15 MHz at 4× oversampling)', () => {
    // Parseval's relation for the unnormalised DFT (Proakis & Manolakis, Digital Signal Processing, §7.2; common practice).
    const n = 6144;
    const x = randomIq(n, gauss);
    const out = new Float64Array(2 * n);
    createStockhamFft(n).forward(x, out);
    let ex = 0;
    let eX = 0;
    for (let i = 0; i < 2 * n; i++) {
      ex += x[i]! * x[i]!;
      eX += out[i]! * out[i]!;
    }
    expect(Math.abs(eX / (n * ex) - 1)).toBeLessThan(1e-13);
  });
});
