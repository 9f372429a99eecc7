import FFT from 'fft.js';
import { cos, sin } from '../math/trig';

/**
 * Typed facade over fft.js (powers of two only, double precision).
 *
 * fft.js's `inverseTransform` divides by N. The engine's formulas (TS 36.211 §5.6/§6.12) carry no 1/N, so the
 * unscaled inverse runs fft.js's internal radix-4 kernel with its inverse flag set and skips that division:
 * one pass less over the data and no rounding from a later multiply by N.
 */
interface FftJsInternals {
  /** Twiddles cos(πi/N), −sin(πi/N) at [i], [i + 1] for even i < 2N (fft.js 4.0.4, lib/fft.js constructor). */
  table: number[];
  _out: Float64Array | null;
  _data: Float64Array | null;
  _inv: number;
  _transform4(): void;
}

export interface PowerOfTwoEngine {
  readonly size: number;
  /** Forward transform, X[k] = Σ x[n] e^{-j2πkn/N}. `out` and `data` are interleaved, 2N values, distinct. */
  forward(data: Float64Array, out: Float64Array): void;
  /** Unscaled inverse, x[n] = Σ X[k] e^{+j2πkn/N}. */
  inverseRaw(data: Float64Array, out: Float64Array): void;
}

const cache = new Map<number, PowerOfTwoEngine>();

/** Returns a cached fft.js engine for `size` (a power of two ≥ 2). */
export function getPowerOfTwoEngine(size: number): PowerOfTwoEngine {
  const hit = cache.get(size);
  if (hit) return hit;
  const fft = new FFT(size) as unknown as FFT & FftJsInternals;
  // fft.js fills its table with Math.cos/Math.sin, whose last bits differ between JavaScript engines (ECMA-262
  // §21.3.2); rewrite it with the deterministic ones, same layout and same angle expression.
  const table = fft.table;
  for (let i = 0; i < table.length; i += 2) {
    const angle = (Math.PI * i) / size;
    table[i] = cos(angle);
    table[i + 1] = -sin(angle);
  }
  const engine: PowerOfTwoEngine = {
    size,
    forward(data, out) {
      fft.transform(out, data);
    },
    inverseRaw(data, out) {
      if (out === data) throw new Error('Input and output buffers must be different');
      fft._out = out;
      fft._data = data;
      fft._inv = 1;
      fft._transform4();
      fft._out = null;
      fft._data = null;
      fft._inv = 0;
    },
  };
  cache.set(size, engine);
  return engine;
}

/** True for 2, 4, 8, … (fft.js needs size > 1). */
export function isPowerOfTwo(size: number): boolean {
  return Number.isInteger(size) && size >= 2 && (size & (size - 1)) === 0;
}
