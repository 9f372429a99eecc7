import { DspError } from '../errors';

/**
 * Optional single-precision FFT backend for statistics (PAPR / CCDF Monte-Carlo): PFFFT compiled to WebAssembly
 * (the `@echogarden/pffft-wasm` build, BSD-3). src/dsp never loads it: the CLI, the worker or the bench loads the
 * package (which reads its own .wasm file) and hands the instantiated module to `installF32Fft`. Until then, and
 * for sizes PFFFT cannot do, the f32 statistics path uses the exact f64 transforms instead.
 *
 * Waveform generation never uses this backend: fft.js (f64) stays the exact path.
 */
export interface PffftModule {
  /** View of the module's heap; replaced when the heap grows (re-read it after allocating). */
  readonly HEAPF32: Float32Array;
  /** transform: 0 real, 1 complex. Returns a setup pointer, 0 when N is not 2^a·3^b·5^c. */
  _pffft_new_setup(n: number, transform: number): number;
  _pffft_aligned_malloc(numBytes: number): number;
  /** direction: 0 forward e^{−j2πkn/N}, 1 backward e^{+j2πkn/N}; unscaled; z-domain in PFFFT's internal order. */
  _pffft_transform(setup: number, input: number, output: number, work: number, direction: number): void;
  /** Same with the z-domain as interleaved complex numbers in natural order. */
  _pffft_transform_ordered(setup: number, input: number, output: number, work: number, direction: number): void;
  /** direction 0: internal → natural order; 1: natural → internal. */
  _pffft_zreorder(setup: number, input: number, output: number, direction: number): void;
  /** 4 for the SIMD build, 1 for the scalar build. */
  _pffft_simd_size(): number;
}

let installed: PffftModule | null = null;

/**
 * Makes `module` the f32 backend after checking its shape and one small transform against a direct DFT.
 * @throws DspError INTERNAL when the object is not a PFFFT module or its transform is wrong
 */
export function installF32Fft(module: unknown): void {
  const m = module as Partial<PffftModule> | null;
  const needed = ['_pffft_new_setup', '_pffft_aligned_malloc', '_pffft_transform', '_pffft_transform_ordered', '_pffft_zreorder', '_pffft_simd_size'] as const;
  const missing = m === null || typeof m !== 'object' ? ['(not an object)'] : needed.filter((name) => typeof m[name] !== 'function');
  if (missing.length > 0 || !(m!.HEAPF32 instanceof Float32Array)) {
    throw new DspError('INTERNAL', `installF32Fft needs an instantiated PFFFT WebAssembly module; missing: ${missing.join(', ') || 'HEAPF32'}.`);
  }
  selfTest(m as PffftModule);
  installed = m as PffftModule;
  transforms.clear();
}

/** An Emscripten module factory as a package's default export (`import('@echogarden/pffft-wasm/simd')`). */
export type PffftPackageLoader = () => Promise<{ default: (overrides?: Record<string, unknown>) => Promise<unknown> }>;

/**
 * Tries each loader in turn (e.g. the SIMD build, then the scalar build), instantiates its module and installs
 * the first that passes the self-test. The caller owns the `import()`, so src/dsp never names the package.
 * @returns the backend's name, or null with the reasons when none loaded (statistics then run in f64)
 */
export async function loadF32Fft(loaders: readonly PffftPackageLoader[]): Promise<{ backend: string | null; failures: string[] }> {
  const failures: string[] = [];
  for (const load of loaders) {
    try {
      const pkg = await load();
      installF32Fft(await pkg.default());
      return { backend: f32FftBackendName(), failures };
    } catch (err) {
      failures.push(err instanceof Error ? err.message : String(err));
    }
  }
  return { backend: null, failures };
}

/** Removes the f32 backend (tests use this to exercise the fallback). */
export function uninstallF32Fft(): void {
  installed = null;
  transforms.clear();
}

/** Name of the installed f32 backend, or null when statistics run on the f64 transforms. */
export function f32FftBackendName(): string | null {
  if (!installed) return null;
  return installed._pffft_simd_size() === 4 ? 'pffft-wasm simd (f32)' : 'pffft-wasm scalar (f32)';
}

/** True when PFFFT plans a complex transform of `size` points: a multiple of 16 of the form 2^a·3^b·5^c. */
export function isF32FftSize(size: number): boolean {
  if (!Number.isInteger(size) || size < 16 || size % 16 !== 0) return false;
  let m = size;
  for (const p of [2, 3, 5]) while (m % p === 0) m /= p;
  return m === 1;
}

/**
 * One complex PFFFT transform of fixed size with its buffers in the WASM heap. Write `input()`, call `run`,
 * read `output()`. The views are re-made if the heap has grown since the last call.
 */
export interface F32ComplexTransform {
  readonly size: number;
  /** 2·size floats. */
  input(): Float32Array;
  /** 2·size floats. */
  output(): Float32Array;
  /** Runs the transform, unscaled. `ordered` false keeps the z-domain in PFFFT's internal order (see zPositions). */
  run(direction: 'forward' | 'backward', ordered: boolean): void;
  /**
   * Where bin k's real part sits in an internal-order z-domain buffer (its imaginary part: zIm[k]).
   * Lets a caller fill or read the z-domain without a reorder pass.
   */
  readonly zRe: Int32Array;
  readonly zIm: Int32Array;
  /**
   * Whoever last wrote the input. Transforms are cached per size and shared within a thread; a user that relies
   * on input values persisting between runs (only some bins rewritten) checks and sets this.
   */
  owner: unknown;
}

const transforms = new Map<number, F32ComplexTransform>();

/** The cached transform of `size`, or null without a backend or for a size PFFFT cannot do. */
export function getF32Transform(size: number): F32ComplexTransform | null {
  if (!installed || !isF32FftSize(size)) return null;
  const hit = transforms.get(size);
  if (hit) return hit;
  const made = makeTransform(installed, size);
  transforms.set(size, made);
  return made;
}

function makeTransform(m: PffftModule, size: number): F32ComplexTransform {
  const setup = m._pffft_new_setup(size, 1);
  if (setup === 0) throw new DspError('UNSUPPORTED_SIZE', `PFFFT cannot plan a ${size}-point complex transform (needs 16·2^a·3^b·5^c).`);
  const bytes = 8 * size;
  const inPtr = m._pffft_aligned_malloc(bytes);
  const outPtr = m._pffft_aligned_malloc(bytes);
  const workPtr = m._pffft_aligned_malloc(bytes);
  let heap = m.HEAPF32;
  let inView = heap.subarray(inPtr >> 2, (inPtr >> 2) + 2 * size);
  let outView = heap.subarray(outPtr >> 2, (outPtr >> 2) + 2 * size);
  const refresh = () => {
    if (m.HEAPF32 !== heap) {
      heap = m.HEAPF32;
      inView = heap.subarray(inPtr >> 2, (inPtr >> 2) + 2 * size);
      outView = heap.subarray(outPtr >> 2, (outPtr >> 2) + 2 * size);
    }
  };
  // Internal positions: reorder a natural-order buffer whose values name their own slots (re of bin k = k + 1,
  // im = −(k + 1); exact in f32 for size < 2^23).
  for (let k = 0; k < size; k++) {
    inView[2 * k] = k + 1;
    inView[2 * k + 1] = -(k + 1);
  }
  m._pffft_zreorder(setup, inPtr, outPtr, 1);
  refresh();
  const zRe = new Int32Array(size);
  const zIm = new Int32Array(size);
  for (let j = 0; j < 2 * size; j++) {
    const v = outView[j]!;
    if (v > 0) zRe[v - 1] = j;
    else zIm[-v - 1] = j;
  }
  return {
    size,
    zRe,
    zIm,
    owner: null,
    input() {
      refresh();
      return inView;
    },
    output() {
      refresh();
      return outView;
    },
    run(direction, ordered) {
      const d = direction === 'forward' ? 0 : 1;
      if (ordered) m._pffft_transform_ordered(setup, inPtr, outPtr, workPtr, d);
      else m._pffft_transform(setup, inPtr, outPtr, workPtr, d);
    },
  };
}

/** A 48-point forward and backward transform against a direct DFT: catches a wrong build or sign convention. */
function selfTest(m: PffftModule): void {
  const size = 48;
  const t = makeTransform(m, size);
  const x = new Float64Array(2 * size);
  for (let i = 0; i < 2 * size; i++) x[i] = Math.sin(1.7 * i + 0.3) + 0.25 * Math.cos(0.37 * i * i);
  for (const direction of ['forward', 'backward'] as const) {
    t.input().set(x);
    t.run(direction, true);
    const out = t.output();
    const sign = direction === 'forward' ? -1 : 1;
    let worst = 0;
    for (let k = 0; k < size; k++) {
      let re = 0;
      let im = 0;
      for (let n = 0; n < size; n++) {
        const a = (sign * 2 * Math.PI * ((k * n) % size)) / size;
        re += x[2 * n]! * Math.cos(a) - x[2 * n + 1]! * Math.sin(a);
        im += x[2 * n]! * Math.sin(a) + x[2 * n + 1]! * Math.cos(a);
      }
      worst = Math.max(worst, Math.abs(out[2 * k]! - re), Math.abs(out[2 * k + 1]! - im));
    }
    if (!(worst < 1e-3)) {
      throw new DspError('INTERNAL', `The PFFFT module failed its ${direction} self-test (error ${worst} on a 48-point transform).`);
    }
  }
}
