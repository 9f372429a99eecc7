/**
 * Mixed-radix FFT for sizes N = 2^a·3^b·5^c·7^d, forward X[k] = Σ_n x[n] e^{−j2πkn/N}, in double precision.
 *
 * Stockham autosort, decimation in frequency (common practice; e.g. Van Loan, "Computational Frameworks for the
 * Fast Fourier Transform", §1.7): with n = p·m at a stage of stride s (n·s = N),
 *   y[q + s(p·j + u)] = W_n^{j·u} · Σ_{t<p} x[q + s(j + t·m)] · W_p^{t·u},   j < m, q < s, u < p,
 * then the same on n' = m with stride s·p. The output ends in natural order, so there is no bit reversal; the
 * buffers ping-pong between `out` and one scratch buffer. Radix 4, 2, 3 and 5 have dedicated butterflies; 7 uses a
 * small DFT table. Twiddles are precomputed per stage from exact angles (j·u mod n), so the error stays near
 * machine precision (~1e-15·log N relative).
 * Buffers are interleaved (re, im), 2N values; `data` is read only by the first stage and never written.
 */
import { cos, sin } from '../math/trig';
export interface StockhamFft {
  readonly size: number;
  forward(data: Float64Array, out: Float64Array): void;
}

interface Stage {
  readonly radix: number;
  /** Sub-transform length n at this stage (n = radix·m). */
  readonly n: number;
  /** Stride s = N / n. */
  readonly stride: number;
  /** W_n^{j·u}, u = 1…radix−1, for j < m: interleaved, index 2·(j·(radix−1) + u − 1). */
  readonly twiddles: Float64Array;
}

/** Radices for `size` (largest first for 2s: 4 then 2), or null when a prime factor above 7 remains. */
export function stockhamRadices(size: number): number[] | null {
  if (!Number.isInteger(size) || size < 2) return null;
  const radices: number[] = [];
  let m = size;
  while (m % 4 === 0) {
    radices.push(4);
    m /= 4;
  }
  if (m % 2 === 0) {
    radices.push(2);
    m /= 2;
  }
  for (const p of [3, 5, 7]) {
    while (m % p === 0) {
      radices.push(p);
      m /= p;
    }
  }
  return m === 1 ? radices : null;
}

/** Plans the FFT of `size` (which must be 7-smooth, see stockhamRadices). */
export function createStockhamFft(size: number): StockhamFft {
  const radices = stockhamRadices(size);
  if (!radices) throw new Error(`createStockhamFft: ${size} is not of the form 2^a·3^b·5^c·7^d`);
  const stages: Stage[] = [];
  let n = size;
  for (const radix of radices) {
    const m = n / radix;
    const twiddles = new Float64Array(2 * m * (radix - 1));
    for (let j = 0; j < m; j++) {
      for (let u = 1; u < radix; u++) {
        const angle = (-2 * Math.PI * ((j * u) % n)) / n;
        twiddles[2 * (j * (radix - 1) + u - 1)] = cos(angle);
        twiddles[2 * (j * (radix - 1) + u - 1) + 1] = sin(angle);
      }
    }
    stages.push({ radix, n, stride: size / n, twiddles });
    n = m;
  }
  const scratch = new Float64Array(2 * size);
  const dft7 = smallDftTable(7);
  return {
    size,
    forward(data, out) {
      const count = stages.length;
      let src = data;
      for (let i = 0; i < count; i++) {
        // The last stage writes `out`; earlier ones alternate so that this holds.
        const dst = (count - 1 - i) % 2 === 0 ? out : scratch;
        const st = stages[i]!;
        switch (st.radix) {
          case 4:
            stage4(src, dst, st.n / 4, st.stride, st.twiddles);
            break;
          case 2:
            stage2(src, dst, st.n / 2, st.stride, st.twiddles);
            break;
          case 3:
            stage3(src, dst, st.n / 3, st.stride, st.twiddles);
            break;
          case 5:
            stage5(src, dst, st.n / 5, st.stride, st.twiddles);
            break;
          default:
            stageGeneric(src, dst, st.radix, st.n / st.radix, st.stride, st.twiddles, dft7);
        }
        src = dst;
      }
    },
  };
}

// NOTE: the radix stages repeat the same index arithmetic on purpose: one flat loop per radix, no shared helper
// calls in the butterflies (this is the transform behind every non-power-of-two DFT).
function stage2(x: Float64Array, y: Float64Array, m: number, s: number, tw: Float64Array): void {
  for (let j = 0; j < m; j++) {
    const w1r = tw[2 * j]!;
    const w1i = tw[2 * j + 1]!;
    for (let q = 0; q < s; q++) {
      const i0 = 2 * (q + s * j);
      const i1 = i0 + 2 * s * m;
      const a0r = x[i0]!, a0i = x[i0 + 1]!, a1r = x[i1]!, a1i = x[i1 + 1]!;
      const o = 2 * (q + 2 * s * j);
      y[o] = a0r + a1r;
      y[o + 1] = a0i + a1i;
      const br = a0r - a1r, bi = a0i - a1i;
      y[o + 2 * s] = br * w1r - bi * w1i;
      y[o + 2 * s + 1] = br * w1i + bi * w1r;
    }
  }
}

function stage4(x: Float64Array, y: Float64Array, m: number, s: number, tw: Float64Array): void {
  const sm2 = 2 * s * m;
  const s2 = 2 * s;
  for (let j = 0; j < m; j++) {
    const w1r = tw[6 * j]!, w1i = tw[6 * j + 1]!;
    const w2r = tw[6 * j + 2]!, w2i = tw[6 * j + 3]!;
    const w3r = tw[6 * j + 4]!, w3i = tw[6 * j + 5]!;
    for (let q = 0; q < s; q++) {
      const i0 = 2 * (q + s * j);
      const a0r = x[i0]!, a0i = x[i0 + 1]!;
      const a1r = x[i0 + sm2]!, a1i = x[i0 + sm2 + 1]!;
      const a2r = x[i0 + 2 * sm2]!, a2i = x[i0 + 2 * sm2 + 1]!;
      const a3r = x[i0 + 3 * sm2]!, a3i = x[i0 + 3 * sm2 + 1]!;
      const t0r = a0r + a2r, t0i = a0i + a2i;
      const t1r = a0r - a2r, t1i = a0i - a2i;
      const t2r = a1r + a3r, t2i = a1i + a3i;
      const t3r = a1r - a3r, t3i = a1i - a3i;
      const o = 2 * (q + 4 * s * j);
      y[o] = t0r + t2r;
      y[o + 1] = t0i + t2i;
      // b1 = t1 − j·t3, b2 = t0 − t2, b3 = t1 + j·t3 (W_4 = −j).
      const b1r = t1r + t3i, b1i = t1i - t3r;
      const b2r = t0r - t2r, b2i = t0i - t2i;
      const b3r = t1r - t3i, b3i = t1i + t3r;
      y[o + s2] = b1r * w1r - b1i * w1i;
      y[o + s2 + 1] = b1r * w1i + b1i * w1r;
      y[o + 2 * s2] = b2r * w2r - b2i * w2i;
      y[o + 2 * s2 + 1] = b2r * w2i + b2i * w2r;
      y[o + 3 * s2] = b3r * w3r - b3i * w3i;
      y[o + 3 * s2 + 1] = b3r * w3i + b3i * w3r;
    }
  }
}

/** sin(2π/3) = √3/2. */
const S3 = Math.sqrt(3) / 2;

function stage3(x: Float64Array, y: Float64Array, m: number, s: number, tw: Float64Array): void {
  const sm2 = 2 * s * m;
  const s2 = 2 * s;
  for (let j = 0; j < m; j++) {
    const w1r = tw[4 * j]!, w1i = tw[4 * j + 1]!;
    const w2r = tw[4 * j + 2]!, w2i = tw[4 * j + 3]!;
    for (let q = 0; q < s; q++) {
      const i0 = 2 * (q + s * j);
      const a0r = x[i0]!, a0i = x[i0 + 1]!;
      const a1r = x[i0 + sm2]!, a1i = x[i0 + sm2 + 1]!;
      const a2r = x[i0 + 2 * sm2]!, a2i = x[i0 + 2 * sm2 + 1]!;
      const t1r = a1r + a2r, t1i = a1i + a2i;
      const t2r = a1r - a2r, t2i = a1i - a2i;
      const mr = a0r - 0.5 * t1r, mi = a0i - 0.5 * t1i;
      const o = 2 * (q + 3 * s * j);
      y[o] = a0r + t1r;
      y[o + 1] = a0i + t1i;
      // b1 = m − j(√3/2)·t2, b2 = m + j(√3/2)·t2 (W_3 = −1/2 − j√3/2).
      const b1r = mr + S3 * t2i, b1i = mi - S3 * t2r;
      const b2r = mr - S3 * t2i, b2i = mi + S3 * t2r;
      y[o + s2] = b1r * w1r - b1i * w1i;
      y[o + s2 + 1] = b1r * w1i + b1i * w1r;
      y[o + 2 * s2] = b2r * w2r - b2i * w2i;
      y[o + 2 * s2 + 1] = b2r * w2i + b2i * w2r;
    }
  }
}

const C51 = cos((2 * Math.PI) / 5);
const C52 = cos((4 * Math.PI) / 5);
const S51 = sin((2 * Math.PI) / 5);
const S52 = sin((4 * Math.PI) / 5);

function stage5(x: Float64Array, y: Float64Array, m: number, s: number, tw: Float64Array): void {
  const sm2 = 2 * s * m;
  const s2 = 2 * s;
  for (let j = 0; j < m; j++) {
    const w = 8 * j;
    const w1r = tw[w]!, w1i = tw[w + 1]!, w2r = tw[w + 2]!, w2i = tw[w + 3]!;
    const w3r = tw[w + 4]!, w3i = tw[w + 5]!, w4r = tw[w + 6]!, w4i = tw[w + 7]!;
    for (let q = 0; q < s; q++) {
      const i0 = 2 * (q + s * j);
      const a0r = x[i0]!, a0i = x[i0 + 1]!;
      const a1r = x[i0 + sm2]!, a1i = x[i0 + sm2 + 1]!;
      const a2r = x[i0 + 2 * sm2]!, a2i = x[i0 + 2 * sm2 + 1]!;
      const a3r = x[i0 + 3 * sm2]!, a3i = x[i0 + 3 * sm2 + 1]!;
      const a4r = x[i0 + 4 * sm2]!, a4i = x[i0 + 4 * sm2 + 1]!;
      const t1r = a1r + a4r, t1i = a1i + a4i;
      const t2r = a2r + a3r, t2i = a2i + a3i;
      const t3r = a1r - a4r, t3i = a1i - a4i;
      const t4r = a2r - a3r, t4i = a2i - a3i;
      const m1r = a0r + C51 * t1r + C52 * t2r, m1i = a0i + C51 * t1i + C52 * t2i;
      const m2r = a0r + C52 * t1r + C51 * t2r, m2i = a0i + C52 * t1i + C51 * t2i;
      const n1r = S51 * t3r + S52 * t4r, n1i = S51 * t3i + S52 * t4i;
      const n2r = S52 * t3r - S51 * t4r, n2i = S52 * t3i - S51 * t4i;
      // b1 = m1 − j·n1, b4 = m1 + j·n1, b2 = m2 − j·n2, b3 = m2 + j·n2 (W_5 = cos 2π/5 − j sin 2π/5).
      const b1r = m1r + n1i, b1i = m1i - n1r;
      const b4r = m1r - n1i, b4i = m1i + n1r;
      const b2r = m2r + n2i, b2i = m2i - n2r;
      const b3r = m2r - n2i, b3i = m2i + n2r;
      const o = 2 * (q + 5 * s * j);
      y[o] = a0r + t1r + t2r;
      y[o + 1] = a0i + t1i + t2i;
      y[o + s2] = b1r * w1r - b1i * w1i;
      y[o + s2 + 1] = b1r * w1i + b1i * w1r;
      y[o + 2 * s2] = b2r * w2r - b2i * w2i;
      y[o + 2 * s2 + 1] = b2r * w2i + b2i * w2r;
      y[o + 3 * s2] = b3r * w3r - b3i * w3i;
      y[o + 3 * s2 + 1] = b3r * w3i + b3i * w3r;
      y[o + 4 * s2] = b4r * w4r - b4i * w4i;
      y[o + 4 * s2 + 1] = b4r * w4i + b4i * w4r;
    }
  }
}

/** W_p^{t·u} for t, u < p, interleaved at 2·(t·p + u). */
function smallDftTable(p: number): Float64Array {
  const table = new Float64Array(2 * p * p);
  for (let t = 0; t < p; t++) {
    for (let u = 0; u < p; u++) {
      const angle = (-2 * Math.PI * ((t * u) % p)) / p;
      table[2 * (t * p + u)] = cos(angle);
      table[2 * (t * p + u) + 1] = sin(angle);
    }
  }
  return table;
}

function stageGeneric(x: Float64Array, y: Float64Array, p: number, m: number, s: number, tw: Float64Array, table: Float64Array): void {
  for (let j = 0; j < m; j++) {
    for (let q = 0; q < s; q++) {
      const i0 = 2 * (q + s * j);
      const o = 2 * (q + p * s * j);
      for (let u = 0; u < p; u++) {
        let br = 0;
        let bi = 0;
        for (let t = 0; t < p; t++) {
          const ar = x[i0 + 2 * s * m * t]!;
          const ai = x[i0 + 2 * s * m * t + 1]!;
          const cr = table[2 * (t * p + u)]!;
          const ci = table[2 * (t * p + u) + 1]!;
          br += ar * cr - ai * ci;
          bi += ar * ci + ai * cr;
        }
        if (u === 0) {
          y[o] = br;
          y[o + 1] = bi;
        } else {
          const wr = tw[2 * (j * (p - 1) + u - 1)]!;
          const wi = tw[2 * (j * (p - 1) + u - 1) + 1]!;
          y[o + 2 * s * u] = br * wr - bi * wi;
          y[o + 2 * s * u + 1] = br * wi + bi * wr;
        }
      }
    }
  }
}
