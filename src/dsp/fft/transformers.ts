import { getPowerOfTwoEngine, isPowerOfTwo } from './fftJsEngine';
import { createStockhamFft, stockhamRadices } from './stockham';
import { cos, sin } from '../math/trig';

/**
 * Forward DFT kernels of any size, X[k] = Σ_n x[n] e^{-j2πkn/N}, all O(N log N):
 * - powers of two: fft.js (radix-4);
 * - N = 2^a·3^b·5^c·7^d otherwise: an iterative Stockham mixed-radix FFT with radix-4/2/3/5/7 butterflies
 *   (stockham.ts; e.g. 1536 = 4^4·2·3, 1200 = 4^2·3·5^2, 300 = 4·3·5^2), 3–9× faster than one Cooley–Tukey
 *   stage over fft.js sub-transforms;
 * - anything else: Bluestein's chirp-z identity over a power-of-two convolution.
 * Buffers are interleaved (re, im), 2N values; `data` and `out` must be distinct.
 */
export interface Transformer {
  readonly size: number;
  readonly method: 'power-of-two' | 'mixed-radix' | 'bluestein' | 'trivial';
  forward(data: Float64Array, out: Float64Array): void;
}

const cache = new Map<number, Transformer>();

/** Returns the cached kernel for `size` (a positive integer). */
export function getTransformer(size: number): Transformer {
  const hit = cache.get(size);
  if (hit) return hit;
  let made: Transformer;
  if (size === 1) made = trivialTransformer();
  else if (isPowerOfTwo(size)) made = powerOfTwoTransformer(size);
  else made = stockhamRadices(size) ? mixedRadixTransformer(size) : bluesteinTransformer(size);
  cache.set(size, made);
  return made;
}

function trivialTransformer(): Transformer {
  return {
    size: 1,
    method: 'trivial',
    forward(data, out) {
      out[0] = data[0]!;
      out[1] = data[1]!;
    },
  };
}

function powerOfTwoTransformer(size: number): Transformer {
  const engine = getPowerOfTwoEngine(size);
  return { size, method: 'power-of-two', forward: (data, out) => engine.forward(data, out) };
}

/** Sizes 2^a·3^b·5^c·7^d: the iterative Stockham mixed-radix FFT (stockham.ts), radix 4/2/3/5/7 butterflies. */
function mixedRadixTransformer(size: number): Transformer {
  const fft = createStockhamFft(size);
  return { size, method: 'mixed-radix', forward: (data, out) => fft.forward(data, out) };
}

/**
 * Bluestein: X[k] = conj(w_k) Σ_n (x[n] conj(w_n)) w_{k−n}, w_n = e^{jπn²/N}, the sum a circular convolution of
 * length L ≥ 2N−1 (power of two) done with fft.js.
 */
function bluesteinTransformer(n: number): Transformer {
  let l = 2;
  while (l < 2 * n - 1) l *= 2;
  const engine = getPowerOfTwoEngine(l);
  const chirpRe = new Float64Array(n);
  const chirpIm = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    // i² mod 2N keeps the angle small, so the chirp stays exact for large N.
    const angle = (Math.PI * ((i * i) % (2 * n))) / n;
    chirpRe[i] = cos(angle);
    chirpIm[i] = sin(angle);
  }
  const kernel = new Float64Array(2 * l);
  kernel[0] = chirpRe[0]!;
  kernel[1] = chirpIm[0]!;
  for (let i = 1; i < n; i++) {
    kernel[2 * i] = chirpRe[i]!;
    kernel[2 * i + 1] = chirpIm[i]!;
    kernel[2 * (l - i)] = chirpRe[i]!;
    kernel[2 * (l - i) + 1] = chirpIm[i]!;
  }
  const kernelSpectrum = new Float64Array(2 * l);
  engine.forward(kernel, kernelSpectrum);
  const a = new Float64Array(2 * l);
  const aSpectrum = new Float64Array(2 * l);
  const conv = new Float64Array(2 * l);
  return {
    size: n,
    method: 'bluestein',
    forward(data, out) {
      a.fill(0);
      for (let i = 0; i < n; i++) {
        const xr = data[2 * i]!;
        const xi = data[2 * i + 1]!;
        a[2 * i] = xr * chirpRe[i]! + xi * chirpIm[i]!;
        a[2 * i + 1] = xi * chirpRe[i]! - xr * chirpIm[i]!;
      }
      engine.forward(a, aSpectrum);
      for (let i = 0; i < l; i++) {
        const ar = aSpectrum[2 * i]!;
        const ai = aSpectrum[2 * i + 1]!;
        const kr = kernelSpectrum[2 * i]!;
        const ki = kernelSpectrum[2 * i + 1]!;
        aSpectrum[2 * i] = ar * kr - ai * ki;
        aSpectrum[2 * i + 1] = ar * ki + ai * kr;
      }
      engine.inverseRaw(aSpectrum, conv);
      for (let k = 0; k < n; k++) {
        const cr = conv[2 * k]! / l;
        const ci = conv[2 * k + 1]! / l;
        out[2 * k] = cr * chirpRe[k]! + ci * chirpIm[k]!;
        out[2 * k + 1] = ci * chirpRe[k]! - cr * chirpIm[k]!;
      }
    },
  };
}
