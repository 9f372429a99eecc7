import { DspError } from '../errors';
import type { AmplifierModel } from './amplifierModel';
import { log10, pow } from '../math/expLog';

/** How hard the amplifier is driven: input or output back-off from saturation, dB. */
export interface DriveSpec {
  readonly reference: 'ibo' | 'obo';
  readonly backoffDb: number;
}

/** A resolved operating point; both back-offs are reported whichever one was asked for. */
export interface DrivePoint {
  /** Linear amplitude factor applied to the signal before the model. */
  readonly inputScale: number;
  /** 10·log10(r_sat² / P_in,avg), dB. */
  readonly iboDb: number;
  /** 10·log10(A_sat² / P_out,avg), dB, measured on the amplified signal. */
  readonly oboDb: number;
  /** Mean |x|² after scaling (model units). */
  readonly meanInputPower: number;
  /** Mean |y|² at the output (model units). */
  readonly meanOutputPower: number;
}

/** Back-off search tolerance, dB: the search stops when OBO is within a tenth of this of the target or the IBO bracket is this narrow. */
export const DRIVE_TOLERANCE_DB = 1e-5;

/**
 * Finds the input scale that gives the wanted back-off for this model and this signal.
 * IBO fixes the scale directly: s = r_sat / √(P_in·10^{IBO/10}). OBO depends on the signal's envelope
 * statistics, so it is found by measurement: the mean output power is evaluated on the actual signal and the IBO
 * is bracketed (2 dB steps from the small-signal prediction) then narrowed by false position (Illinois) to DRIVE_TOLERANCE_DB. For models whose
 * output folds back (Saleh) the search stops where OBO stops falling.
 * @param signalIq the signal at unit scale, 2N values (any mean power > 0)
 * @throws DspError INVALID_CONFIG when the signal is silent or the OBO asked for cannot be reached, with the least reachable OBO
 */
export function solveDrive(model: AmplifierModel, signalIq: Float64Array, drive: DriveSpec): DrivePoint {
  if (!Number.isFinite(drive.backoffDb)) {
    throw new DspError('INVALID_CONFIG', `amplifier drive: back-off must be a finite number of dB; got ${drive.backoffDb}.`, { field: 'amplifier.backoffDb' });
  }
  let power = 0;
  for (let i = 0; i < signalIq.length; i++) power += signalIq[i]! * signalIq[i]!;
  const meanInput = power / (signalIq.length / 2);
  if (!(meanInput > 0)) throw new DspError('INVALID_CONFIG', 'amplifier drive: the signal has zero power, so back-off is undefined.');
  const meanOutputAt = createOutputPowerMeter(model, signalIq);
  const rSat = model.inputSaturationAmplitude;
  const aSat2 = model.outputSaturationAmplitude * model.outputSaturationAmplitude;
  const scaleOf = (iboDb: number): number => rSat / Math.sqrt(meanInput * pow(10, iboDb / 10));
  const point = (iboDb: number): DrivePoint => {
    const s = scaleOf(iboDb);
    const out = meanOutputAt(s);
    return { inputScale: s, iboDb, oboDb: 10 * log10(aSat2 / out), meanInputPower: meanInput * s * s, meanOutputPower: out };
  };
  if (drive.reference === 'ibo') return point(drive.backoffDb);

  const target = drive.backoffDb;
  const linearOffsetDb = 20 * log10(model.outputSaturationAmplitude / (model.smallSignalGainLinear * rSat));
  let a = point(target - linearOffsetDb);
  const step = 2;
  const maxSteps = 60;
  let b: DrivePoint | undefined;
  if (a.oboDb < target) {
    for (let i = 0; i < maxSteps && !b; i++) {
      const next = point(a.iboDb + step);
      if (next.oboDb >= target) b = next;
      else a = next;
    }
    if (b) [a, b] = [b, a];
  } else {
    for (let i = 0; i < maxSteps && !b; i++) {
      const next = point(a.iboDb - step);
      if (next.oboDb < target) b = next;
      else if (next.oboDb >= a.oboDb) break; // fold-back: OBO no longer falls as the drive rises
      else a = next;
    }
  }
  if (!b) {
    const least = leastObo(point, a.iboDb, step);
    throw new DspError(
      'INVALID_CONFIG',
      `amplifier drive: output back-off ${target} dB cannot be reached with this model and signal; the least reachable OBO is ${least.oboDb.toFixed(2)} dB (at IBO ${least.iboDb.toFixed(2)} dB).`,
      { field: 'amplifier.backoffDb', leastOboDb: least.oboDb },
    );
  }
  // a: OBO ≥ target (less drive, higher IBO); b: OBO < target. Illinois false position on f(IBO) = OBO − target
  // (Dowell & Jarratt, BIT 11:168–174, 1971): keeps the bracket like bisection, converges superlinearly.
  let hi = a;
  let lo = b;
  let fHi = hi.oboDb - target;
  let fLo = lo.oboDb - target;
  let side = 0;
  for (let it = 0; it < 100 && Math.abs(hi.iboDb - lo.iboDb) > DRIVE_TOLERANCE_DB; it++) {
    let ibo = (lo.iboDb * fHi - hi.iboDb * fLo) / (fHi - fLo);
    if (!(ibo > Math.min(lo.iboDb, hi.iboDb) && ibo < Math.max(lo.iboDb, hi.iboDb))) ibo = (lo.iboDb + hi.iboDb) / 2;
    const mid = point(ibo);
    const f = mid.oboDb - target;
    if (Math.abs(f) < DRIVE_TOLERANCE_DB / 10) return mid;
    if (f >= 0) {
      hi = mid;
      fHi = f;
      if (side === 1) fLo /= 2;
      side = 1;
    } else {
      lo = mid;
      fLo = f;
      if (side === -1) fHi /= 2;
      side = -1;
    }
  }
  return Math.abs(fHi) <= Math.abs(fLo) ? hi : lo;
}

function leastObo(point: (iboDb: number) => DrivePoint, fromIboDb: number, step: number): DrivePoint {
  let best = point(fromIboDb);
  for (let d = -2 * step; d <= 2 * step; d += step / 8) {
    const p = point(fromIboDb + d);
    if (p.oboDb < best.oboDb) best = p;
  }
  return best;
}

/**
 * Returns s ↦ mean |y|² of the amplified signal at input scale s. Memoryless models need only the envelope,
 * computed once; models with memory amplify the whole signal each time.
 */
export function createOutputPowerMeter(model: AmplifierModel, signalIq: Float64Array): (inputScale: number) => number {
  const n = signalIq.length / 2;
  if (model.memoryless) {
    const envelope = new Float64Array(n);
    for (let i = 0; i < n; i++) envelope[i] = Math.hypot(signalIq[2 * i]!, signalIq[2 * i + 1]!);
    return (s) => {
      let sum = 0;
      for (let i = 0; i < n; i++) {
        const a = model.amAm(s * envelope[i]!);
        sum += a * a;
      }
      return sum / n;
    };
  }
  const scratch = new Float64Array(signalIq.length);
  return (s) => {
    model.apply(signalIq, s, scratch);
    let sum = 0;
    for (let i = 0; i < scratch.length; i++) sum += scratch[i]! * scratch[i]!;
    return sum / n;
  };
}

/**
 * Amplifies `signalIq` at the drive asked for. Returns the output (a new buffer, 2N values), the operating point,
 * and warnings (e.g. the share of samples driven past the input saturation amplitude).
 */
export function amplifyAtDrive(
  model: AmplifierModel,
  signalIq: Float64Array,
  drive: DriveSpec,
): { outputIq: Float64Array; drive: DrivePoint; warnings: string[] } {
  const point = solveDrive(model, signalIq, drive);
  const outputIq = model.apply(signalIq, point.inputScale, new Float64Array(signalIq.length));
  const warnings = [...model.warnings];
  if (model.kind === 'polynomial' || model.kind === 'memory-polynomial') {
    let over = 0;
    const limit = model.inputSaturationAmplitude / point.inputScale;
    for (let i = 0; i < signalIq.length; i += 2) if (Math.hypot(signalIq[i]!, signalIq[i + 1]!) > limit) over++;
    if (over > 0) {
      warnings.push(`amplifier: ${((100 * over) / (signalIq.length / 2)).toFixed(2)} % of samples exceed the polynomial's saturation input; the fit is extrapolated there.`);
    }
  }
  return { outputIq, drive: point, warnings };
}
