import { assertSeparateOutput, DspError } from '../errors';
import { log10, pow } from '../math/expLog';
import { cos, sin } from '../math/trig';

/**
 * The contract every power-amplifier model meets. Amplitudes are in the model's own units (the signal's
 * amplitude once it is scaled to the drive), so a model only needs to know where it saturates:
 * - `inputSaturationAmplitude` r_sat: the input amplitude that defines 0 dB input back-off (IBO);
 * - `outputSaturationAmplitude` A_sat: the output amplitude that defines 0 dB output back-off (OBO).
 * Back-off follows the usual definitions (common practice): IBO = 10·log10(r_sat² / P_in,avg),
 * OBO = 10·log10(A_sat² / P_out,avg); "saturation" is the AM/AM peak (Saleh, table, polynomial) or the
 * limiting level (Rapp, soft limiter).
 */
export interface AmplifierModel {
  readonly kind: 'rapp' | 'saleh' | 'limiter' | 'polynomial' | 'memory-polynomial' | 'table';
  /** One line for reports, e.g. "Rapp p = 2, G = 0 dB, A_sat = 1 (output)". */
  readonly description: string;
  /** Small-signal gain |A(r)/r| as r → 0, linear amplitude ratio. */
  readonly smallSignalGainLinear: number;
  /** r_sat: input amplitude of 0 dB IBO. */
  readonly inputSaturationAmplitude: number;
  /** A_sat: output amplitude of 0 dB OBO. */
  readonly outputSaturationAmplitude: number;
  /** True when the output depends only on the present input sample (AM/AM and AM/PM describe it fully). */
  readonly memoryless: boolean;
  /** Static AM/AM: output amplitude for a constant-envelope input of amplitude `inputAmplitude` (≥ 0). */
  amAm(inputAmplitude: number): number;
  /** Static AM/PM: output phase shift in radians for that input amplitude. */
  amPmRad(inputAmplitude: number): number;
  /**
   * Amplifies `inputScale · inIq` into `outIq` (both 2·N values, distinct buffers). Memoryless models do this
   * sample by sample through AM/AM and AM/PM; models with memory use their own recursion.
   */
  apply(inIq: Float64Array, inputScale: number, outIq: Float64Array): Float64Array;
  /** Non-fatal notes from building the model (e.g. a table that never saturates). */
  readonly warnings: readonly string[];
}

/**
 * y = A(s·|x|)·e^{j(arg x + Φ(s·|x|))} for every sample: the memoryless band-pass nonlinearity of
 * Saleh 1981 §II (complex envelope form). Shared by every memoryless model.
 * @param inIq input, 2N values; @param inputScale s (linear amplitude); @param outIq output, 2N values
 */
export function applyMemoryless(
  model: Pick<AmplifierModel, 'amAm' | 'amPmRad'>,
  hasAmPm: boolean,
  inIq: Float64Array,
  inputScale: number,
  outIq: Float64Array,
): Float64Array {
  assertSeparateOutput(inIq, outIq, 'Amplifier');
  for (let i = 0; i < inIq.length; i += 2) {
    const re = inIq[i]! * inputScale;
    const im = inIq[i + 1]! * inputScale;
    const r = Math.hypot(re, im);
    if (r === 0) {
      outIq[i] = 0;
      outIq[i + 1] = 0;
      continue;
    }
    const ratio = model.amAm(r) / r;
    if (!hasAmPm) {
      outIq[i] = re * ratio;
      outIq[i + 1] = im * ratio;
      continue;
    }
    const phi = model.amPmRad(r);
    const c = cos(phi);
    const s = sin(phi);
    outIq[i] = ratio * (re * c - im * s);
    outIq[i + 1] = ratio * (re * s + im * c);
  }
  return outIq;
}

/** Throws INVALID_CONFIG unless `value` is finite and > 0; `field` names it in the message. */
export function requirePositive(value: number, field: string, unit = ''): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new DspError('INVALID_CONFIG', `${field} must be a positive number${unit ? ` (${unit})` : ''}; got ${value}.`, { field });
  }
}

/** 20·log10(x); −Infinity for 0. */
export function amplitudeToDb(amplitude: number): number {
  return 20 * log10(amplitude);
}

/** 10^(dB/20). */
export function dbToAmplitude(db: number): number {
  return pow(10, db / 20);
}
