import { assertLength, DspError } from '../errors';
import { getPowerOfTwoEngine } from './fftJsEngine';
import { getTransformer } from './transformers';

/**
 * A DFT plan: plain readonly data (it can cross to a worker); the kernels it names are cached per size.
 * `method` says which algorithm runs: fft.js for powers of two, mixed radix for sizes with factors 3/5/7,
 * Bluestein otherwise.
 */
export interface FftPlan {
  readonly fftSize: number;
  readonly method: 'power-of-two' | 'mixed-radix' | 'bluestein' | 'trivial';
}

/** Largest transform the engine plans (2^22 points, 64 MiB of complex doubles per buffer). */
export const MAX_FFT_SIZE = 1 << 22;

/** Creates a plan for an `fftSize`-point complex DFT (any integer 1…2^22). */
export function createFftPlan(fftSize: number): FftPlan {
  if (!Number.isInteger(fftSize) || fftSize < 1 || fftSize > MAX_FFT_SIZE) {
    throw new DspError(
      'UNSUPPORTED_SIZE',
      `FFT size ${fftSize} is not supported: it must be a whole number from 1 to ${MAX_FFT_SIZE}.`,
      { fftSize },
    );
  }
  return { fftSize, method: getTransformer(fftSize).method };
}

/**
 * Forward DFT without scaling: X[k] = Σ_{n=0}^{N−1} x[n] e^{−j2πkn/N}.
 * @param inIq interleaved input, 2N values
 * @param outIq interleaved output, 2N values, not the same buffer as `inIq`
 */
export function fftForward(plan: FftPlan, inIq: Float64Array, outIq: Float64Array): Float64Array {
  checkBuffers(plan, inIq, outIq);
  getTransformer(plan.fftSize).forward(inIq, outIq);
  return outIq;
}

const conjScratch = new Map<number, Float64Array>();

/**
 * Inverse DFT without scaling: x[n] = Σ_{k=0}^{N−1} X[k] e^{+j2πkn/N} (no 1/N).
 * Powers of two run fft.js's inverse kernel directly; other sizes use conj(DFT(conj(X))).
 */
export function ifftRaw(plan: FftPlan, inIq: Float64Array, outIq: Float64Array): Float64Array {
  checkBuffers(plan, inIq, outIq);
  const n = plan.fftSize;
  if (plan.method === 'power-of-two') {
    getPowerOfTwoEngine(n).inverseRaw(inIq, outIq);
    return outIq;
  }
  let scratch = conjScratch.get(n);
  if (!scratch) {
    scratch = new Float64Array(2 * n);
    conjScratch.set(n, scratch);
  }
  for (let i = 0; i < 2 * n; i += 2) {
    scratch[i] = inIq[i]!;
    scratch[i + 1] = -inIq[i + 1]!;
  }
  getTransformer(n).forward(scratch, outIq);
  for (let i = 1; i < 2 * n; i += 2) outIq[i] = -outIq[i]!;
  return outIq;
}

/** Multiplies every value of an interleaved buffer by `scale` in place. */
export function scaleInPlace(iq: Float64Array, scale: number): Float64Array {
  for (let i = 0; i < iq.length; i++) iq[i] = iq[i]! * scale;
  return iq;
}

/** Unitary forward DFT (1/√N), as transform precoding uses (TS 36.211 §5.3.3). */
export function fftUnitary(plan: FftPlan, inIq: Float64Array, outIq: Float64Array): Float64Array {
  fftForward(plan, inIq, outIq);
  return scaleInPlace(outIq, 1 / Math.sqrt(plan.fftSize));
}

/** Unitary inverse DFT (1/√N): undoes `fftUnitary`. */
export function ifftUnitary(plan: FftPlan, inIq: Float64Array, outIq: Float64Array): Float64Array {
  ifftRaw(plan, inIq, outIq);
  return scaleInPlace(outIq, 1 / Math.sqrt(plan.fftSize));
}

function checkBuffers(plan: FftPlan, inIq: Float64Array, outIq: Float64Array): void {
  assertLength(inIq, 2 * plan.fftSize, `FFT input (${plan.fftSize} points)`);
  assertLength(outIq, 2 * plan.fftSize, `FFT output (${plan.fftSize} points)`);
  if (inIq === outIq || inIq.buffer === outIq.buffer && inIq.byteOffset === outIq.byteOffset) {
    throw new DspError('INTERNAL', 'FFT input and output must be different buffers.');
  }
}
