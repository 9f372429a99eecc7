import { getPowerOfTwoEngine, isPowerOfTwo } from './fftJsEngine';

/**
 * Forward DFT kernels of any size, X[k] = Σ_n x[n] e^{-j2πkn/N}, all O(N log N):
 * - powers of two: fft.js (radix-4);
 * - N = p·M with a small prime p (3, 5, 7): one decimation-in-time Cooley–Tukey stage over p sub-transforms of
 *   size M (common practice; e.g. 1536 = 3·512, 1200 = 3·5·5·16, 300 = 3·5·5·4);
 * - anything else: Bluestein's chirp-z identity over a power-of-two convolution.
 * Buffers are interleaved (re, im), 2N values; `data` and `out` must be distinct.
 */
export interface Transformer {
  readonly size: number;
  readonly method: 'power-of-two' | 'mixed-radix' | 'bluestein' | 'trivial';
  forward(data: Float64Array, out: Float64Array): void;
}

const SMALL_PRIMES = [3, 5, 7];
const cache = new Map<number, Transformer>();

/** Returns the cached kernel for `size` (a positive integer). */
export function getTransformer(size: number): Transformer {
  const hit = cache.get(size);
  if (hit) return hit;
  let made: Transformer;
  if (size === 1) made = trivialTransformer();
  else if (isPowerOfTwo(size)) made = powerOfTwoTransformer(size);
  else {
    const p = SMALL_PRIMES.find((q) => size % q === 0);
    made = p !== undefined ? mixedRadixTransformer(p, size / p) : bluesteinTransformer(size);
  }
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

/**
 * One Cooley–Tukey stage: x[p·m + r] → Y_r = DFT_M, then
 * X[k1 + M·k2] = Σ_r (W_N^{r·k1} Y_r[k1]) W_p^{r·k2}.
 */
function mixedRadixTransformer(p: number, m: number): Transformer {
  const n = p * m;
  const sub = getTransformer(m);
  // NOTE: one scratch pair per plan; sizes strictly shrink down the recursion, so no plan re-enters itself.
  const gathered = new Float64Array(2 * n);
  const transformed = new Float64Array(2 * n);
  const twiddleRe = new Float64Array(p * m);
  const twiddleIm = new Float64Array(p * m);
  for (let r = 0; r < p; r++) {
    for (let k1 = 0; k1 < m; k1++) {
      const angle = (-2 * Math.PI * ((r * k1) % n)) / n;
      twiddleRe[r * m + k1] = Math.cos(angle);
      twiddleIm[r * m + k1] = Math.sin(angle);
    }
  }
  const rootRe = new Float64Array(p * p);
  const rootIm = new Float64Array(p * p);
  for (let a = 0; a < p; a++) {
    for (let b = 0; b < p; b++) {
      const angle = (-2 * Math.PI * ((a * b) % p)) / p;
      rootRe[a * p + b] = Math.cos(angle);
      rootIm[a * p + b] = Math.sin(angle);
    }
  }
  const tRe = new Float64Array(p);
  const tIm = new Float64Array(p);
  // Views made once: the hot loop allocates nothing.
  const gatheredViews = Array.from({ length: p }, (_, r) => gathered.subarray(2 * r * m, 2 * (r + 1) * m));
  const transformedViews = Array.from({ length: p }, (_, r) => transformed.subarray(2 * r * m, 2 * (r + 1) * m));
  return {
    size: n,
    method: 'mixed-radix',
    forward(data, out) {
      for (let r = 0; r < p; r++) {
        const base = 2 * r * m;
        for (let q = 0; q < m; q++) {
          const src = 2 * (q * p + r);
          gathered[base + 2 * q] = data[src]!;
          gathered[base + 2 * q + 1] = data[src + 1]!;
        }
        sub.forward(gatheredViews[r]!, transformedViews[r]!);
      }
      for (let k1 = 0; k1 < m; k1++) {
        for (let r = 0; r < p; r++) {
          const yRe = transformed[2 * (r * m + k1)]!;
          const yIm = transformed[2 * (r * m + k1) + 1]!;
          const wRe = twiddleRe[r * m + k1]!;
          const wIm = twiddleIm[r * m + k1]!;
          tRe[r] = yRe * wRe - yIm * wIm;
          tIm[r] = yRe * wIm + yIm * wRe;
        }
        for (let k2 = 0; k2 < p; k2++) {
          let sRe = 0;
          let sIm = 0;
          for (let r = 0; r < p; r++) {
            const cRe = rootRe[r * p + k2]!;
            const cIm = rootIm[r * p + k2]!;
            sRe += tRe[r]! * cRe - tIm[r]! * cIm;
            sIm += tRe[r]! * cIm + tIm[r]! * cRe;
          }
          out[2 * (k1 + m * k2)] = sRe;
          out[2 * (k1 + m * k2) + 1] = sIm;
        }
      }
    },
  };
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
    chirpRe[i] = Math.cos(angle);
    chirpIm[i] = Math.sin(angle);
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
