import { assertSeparateOutput, DspError } from '../errors';
import { applyMemoryless, requirePositive, type AmplifierModel } from './amplifierModel';
import { atan2 } from '../math/atan';

/** A complex coefficient as [re, im]. */
export type ComplexPair = readonly [number, number];

export interface PolynomialParams {
  /**
   * a_{k,m} as coefficients[m][k − 1]: memory tap m = 0…M−1, order k = 1…K. One row (M = 1) is the memoryless
   * polynomial. Even orders are allowed; set them to [0, 0] for the odd-order-only form.
   */
  readonly coefficients: readonly (readonly ComplexPair[])[];
  /** Largest input amplitude the fit is valid for; the saturation search stops there. */
  readonly maxInputAmplitude: number;
  /** r_sat when the static AM/AM has no peak below maxInputAmplitude (e.g. a fit of the linear region only). */
  readonly inputSaturationAmplitude?: number;
}

/**
 * Polynomial and memory-polynomial PA models (common practice for measured PAs; J. Kim & K. Konstantinou,
 * "Digital predistortion of wideband signals based on power amplifier model with memory", Electron. Lett.
 * 37(23):1417–1418, 2001):
 *   y[n] = Σ_{m=0}^{M−1} Σ_{k=1}^{K} a_{k,m} · x[n−m] · |x[n−m]|^{k−1}.
 * Samples before the record's start are taken from its end (the record is one period of a looped signal).
 * The static AM/AM–AM/PM (constant-envelope input) is S(r) = Σ_k (Σ_m a_{k,m}) r^k: A(r) = |S(r)|, Φ(r) = arg S(r) − arg S'(0).
 * Saturation is the first local maximum of A(r) on (0, maxInputAmplitude], or inputSaturationAmplitude when given.
 */
export function createPolynomialModel(params: PolynomialParams): AmplifierModel {
  const rows = params.coefficients;
  if (!Array.isArray(rows) || rows.length === 0 || rows.some((row) => !Array.isArray(row) || row.length === 0)) {
    throw new DspError('INVALID_CONFIG', 'amplifier.coefficients must be a non-empty list of memory taps, each a non-empty list of [re, im] pairs (order 1 first).', {
      field: 'amplifier.coefficients',
    });
  }
  const numTaps = rows.length;
  const maxOrder = Math.max(...rows.map((row) => row.length));
  const re = new Float64Array(numTaps * maxOrder);
  const im = new Float64Array(numTaps * maxOrder);
  rows.forEach((row: readonly ComplexPair[], m: number) =>
    row.forEach((c: ComplexPair, k: number) => {
      if (!Array.isArray(c) || c.length !== 2 || !Number.isFinite(c[0]) || !Number.isFinite(c[1])) {
        throw new DspError('INVALID_CONFIG', `amplifier.coefficients[${m}][${k}] must be a pair [re, im] of finite numbers; got ${JSON.stringify(c)}.`, {
          field: `amplifier.coefficients.${m}.${k}`,
        });
      }
      re[m * maxOrder + k] = c[0];
      im[m * maxOrder + k] = c[1];
    }),
  );
  requirePositive(params.maxInputAmplitude, 'amplifier.maxInputAmplitude');
  // Static curve coefficients b_k = Σ_m a_{k,m}.
  const bRe = new Float64Array(maxOrder);
  const bIm = new Float64Array(maxOrder);
  for (let m = 0; m < numTaps; m++) {
    for (let k = 0; k < maxOrder; k++) {
      bRe[k]! += re[m * maxOrder + k]!;
      bIm[k]! += im[m * maxOrder + k]!;
    }
  }
  const gain = Math.hypot(bRe[0]!, bIm[0]!);
  if (!(gain > 0)) {
    throw new DspError('INVALID_CONFIG', 'amplifier.coefficients: the linear terms (order 1) sum to zero, so the model has no small-signal gain.', {
      field: 'amplifier.coefficients',
    });
  }
  const phase0 = atan2(bIm[0]!, bRe[0]!);
  const staticAt = (r: number): [number, number] => {
    let sRe = 0;
    let sIm = 0;
    let rk = r;
    for (let k = 0; k < maxOrder; k++) {
      sRe += bRe[k]! * rk;
      sIm += bIm[k]! * rk;
      rk *= r;
    }
    return [sRe, sIm];
  };
  const amAm = (r: number): number => Math.hypot(...staticAt(r));
  const amPmRad = (r: number): number => {
    if (r === 0) return 0;
    const [sRe, sIm] = staticAt(r);
    return wrapPi(atan2(sIm, sRe) - phase0);
  };
  const rSat = params.inputSaturationAmplitude ?? findFirstPeak(amAm, params.maxInputAmplitude);
  if (rSat === undefined) {
    throw new DspError(
      'INVALID_CONFIG',
      `amplifier: the polynomial's AM/AM has no peak below maxInputAmplitude ${params.maxInputAmplitude}; give amplifier.inputSaturationAmplitude (the input amplitude of 0 dB IBO).`,
      { field: 'amplifier.inputSaturationAmplitude' },
    );
  }
  requirePositive(rSat, 'amplifier.inputSaturationAmplitude');
  const memoryless = numTaps === 1;
  const model: AmplifierModel = {
    kind: memoryless ? 'polynomial' : 'memory-polynomial',
    description: `${memoryless ? 'polynomial' : 'memory polynomial'} K = ${maxOrder}, M = ${numTaps}, r_sat = ${rSat.toPrecision(4)}`,
    smallSignalGainLinear: gain,
    inputSaturationAmplitude: rSat,
    outputSaturationAmplitude: amAm(rSat),
    memoryless,
    amAm,
    amPmRad,
    apply: memoryless
      ? (inIq, inputScale, outIq) => applyMemoryless(model, true, inIq, inputScale, outIq)
      : (inIq, inputScale, outIq) => applyMemoryPolynomial(re, im, numTaps, maxOrder, inIq, inputScale, outIq),
    warnings: [],
  };
  return model;
}

function applyMemoryPolynomial(
  re: Float64Array,
  im: Float64Array,
  numTaps: number,
  maxOrder: number,
  inIq: Float64Array,
  inputScale: number,
  outIq: Float64Array,
): Float64Array {
  assertSeparateOutput(inIq, outIq, 'Amplifier');
  const n = inIq.length / 2;
  for (let i = 0; i < n; i++) {
    let yRe = 0;
    let yIm = 0;
    for (let m = 0; m < numTaps; m++) {
      const j = 2 * ((((i - m) % n) + n) % n);
      const xRe = inIq[j]! * inputScale;
      const xIm = inIq[j + 1]! * inputScale;
      const r = Math.hypot(xRe, xIm);
      // Σ_k a_{k,m} r^{k−1}, then times x.
      let cRe = 0;
      let cIm = 0;
      let rk = 1;
      for (let k = 0; k < maxOrder; k++) {
        cRe += re[m * maxOrder + k]! * rk;
        cIm += im[m * maxOrder + k]! * rk;
        rk *= r;
      }
      yRe += cRe * xRe - cIm * xIm;
      yIm += cRe * xIm + cIm * xRe;
    }
    outIq[2 * i] = yRe;
    outIq[2 * i + 1] = yIm;
  }
  return outIq;
}

/** First local maximum of f on (0, rMax]: a 2000-point scan, then golden-section refinement. */
function findFirstPeak(f: (r: number) => number, rMax: number): number | undefined {
  const steps = 2000;
  let previous = f(0);
  for (let i = 1; i <= steps; i++) {
    const r = (rMax * i) / steps;
    const value = f(r);
    if (value < previous) return goldenMax(f, (rMax * Math.max(0, i - 2)) / steps, r);
    previous = value;
  }
  return undefined;
}

function goldenMax(f: (r: number) => number, lo: number, hi: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  for (let it = 0; it < 80; it++) {
    const c = b - g * (b - a);
    const d = a + g * (b - a);
    if (f(c) > f(d)) b = d;
    else a = c;
  }
  return (a + b) / 2;
}

function wrapPi(angle: number): number {
  return angle - 2 * Math.PI * Math.round(angle / (2 * Math.PI));
}
