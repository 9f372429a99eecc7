import { DspError } from '../errors';
import { measureLowpass, type LowpassMeasurement } from './filterResponse';
import { kaiserBeta, kaiserOrder, kaiserWindow, rippleDbToDelta } from './kaiserWindow';
import { findRateRatio } from './rationalRatio';
import { log10, pow } from '../math/expLog';
import { sin } from '../math/trig';

/** Default peak-to-peak passband ripple of the resampling filter, dB. */
export const DEFAULT_PASSBAND_RIPPLE_DB = 0.01;
/** Default stopband attenuation of the resampling filter, dB. */
export const DEFAULT_STOPBAND_ATTENUATION_DB = 80;
/** Longest prototype filter designed (taps at the interpolated rate L·fs_in). */
export const MAX_PROTOTYPE_TAPS = 1 << 20;

/** What the user asks of a rate conversion. */
export interface ResamplerSpec {
  readonly inputRateHz: number;
  readonly outputRateHz: number;
  /** One-sided edge of the band to keep, Hz: the signal occupies |f| ≤ passbandEdgeHz. */
  readonly passbandEdgeHz: number;
  /** Peak-to-peak passband ripple, dB (default 0.01). */
  readonly passbandRippleDb?: number | undefined;
  /** Stopband attenuation, dB (default 80). */
  readonly stopbandAttenuationDb?: number | undefined;
}

/**
 * A rational L/M resampler: one Kaiser-window lowpass prototype at rate L·fs_in, split into L polyphase branches.
 * Plain data; `measured` is the response the taps actually achieve.
 */
export interface ResamplerDesign {
  readonly up: number;
  readonly down: number;
  readonly inputRateHz: number;
  /** fs_in · L / M (exact). */
  readonly outputRateHz: number;
  readonly passbandEdgeHz: number;
  /** min(fs_in, fs_out) − passband edge: where images (interpolation) or aliases (decimation) begin. */
  readonly stopbandEdgeHz: number;
  readonly passbandRippleDb: number;
  readonly stopbandAttenuationDb: number;
  readonly kaiserBeta: number;
  /** Prototype length K (odd, so the delay D = (K − 1)/2 is a whole number of interpolated samples). */
  readonly numTaps: number;
  readonly tapsPerPhase: number;
  readonly delayInterpolatedSamples: number;
  /** Prototype h[n], K values, passband gain L. */
  readonly taps: Float64Array;
  /** Polyphase branches: phaseTaps[p·Q + q] = h[p + q·L] (0 past K), L × Q values. */
  readonly phaseTaps: Float64Array;
  readonly measured: LowpassMeasurement;
}

/**
 * Designs an L/M resampler. Prototype: ideal lowpass with cutoff ωc = (ωp + ωs)/2 times a Kaiser window,
 * h[n] = L·(ωc/π)·sinc(ωc(n − D)/π)·w[n] (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.5.3 and
 * §4.7.3 for the L/M structure). δ = min(δp, δs) fixes A = −20·log10 δ, β and the order; the length then grows until
 * the measured response meets both the ripple and the attenuation asked for.
 * @throws DspError INVALID_CONFIG when the band does not fit, a figure is out of range, or the filter would be too long
 */
export function designResampler(spec: ResamplerSpec): ResamplerDesign {
  const rippleDb = spec.passbandRippleDb ?? DEFAULT_PASSBAND_RIPPLE_DB;
  const attenuationDb = spec.stopbandAttenuationDb ?? DEFAULT_STOPBAND_ATTENUATION_DB;
  if (!(rippleDb >= 1e-4 && rippleDb <= 3)) {
    throw new DspError('INVALID_CONFIG', `passbandRippleDb ${rippleDb} is out of range: allowed 0.0001 to 3 dB.`, { field: 'passbandRippleDb' });
  }
  if (!(attenuationDb >= 20 && attenuationDb <= 180)) {
    throw new DspError('INVALID_CONFIG', `stopbandAttenuationDb ${attenuationDb} is out of range: allowed 20 to 180 dB.`, {
      field: 'stopbandAttenuationDb',
    });
  }
  const { up, down } = findRateRatio(spec.inputRateHz, spec.outputRateHz);
  const narrowHz = Math.min(spec.inputRateHz, spec.outputRateHz);
  const passHz = spec.passbandEdgeHz;
  const stopHz = narrowHz - passHz;
  if (!(passHz > 0) || !(stopHz > passHz)) {
    throw new DspError(
      'INVALID_CONFIG',
      `rate: the occupied band ±${(passHz / 1e6).toFixed(4)} MHz does not fit a ${(narrowHz / 1e6).toFixed(4)} Msps rate with room for a filter transition; choose a rate above ${((2 * passHz) / 1e6).toFixed(4)} Msps.`,
      { field: 'rate' },
    );
  }
  const protoRateHz = spec.inputRateHz * up;
  const wp = (2 * Math.PI * passHz) / protoRateHz;
  const ws = (2 * Math.PI * stopHz) / protoRateHz;
  const delta = Math.min(rippleDbToDelta(rippleDb), pow(10, -attenuationDb / 20));
  const a = -20 * log10(delta);
  const beta = kaiserBeta(a);
  let numTaps = kaiserOrder(a, ws - wp) + 1;
  if (numTaps % 2 === 0) numTaps++;
  for (let attempt = 0; ; attempt++) {
    if (numTaps > MAX_PROTOTYPE_TAPS) {
      throw new DspError(
        'INVALID_CONFIG',
        `rate: the resampling filter would need ${numTaps} taps (more than ${MAX_PROTOTYPE_TAPS}); relax stopbandAttenuationDb (${attenuationDb}) or passbandRippleDb (${rippleDb}), or pick a rate with a simpler ratio (now ${up}/${down}).`,
        { field: 'rate' },
      );
    }
    const taps = kaiserLowpass(numTaps, (wp + ws) / 2, beta, up);
    const measured = measureLowpass(taps, up, wp, ws);
    // A small margin on the attenuation so that a finer grid than the FFT's still finds the spec met.
    const meets = measured.passbandRippleDb <= rippleDb && measured.stopbandAttenuationDb >= attenuationDb + 0.05;
    if (meets || attempt >= 40) {
      if (!meets) throw new DspError('INTERNAL', `Kaiser design did not converge for ${up}/${down} at ${numTaps} taps.`);
      const tapsPerPhase = Math.ceil(numTaps / up);
      const phaseTaps = new Float64Array(up * tapsPerPhase);
      for (let p = 0; p < up; p++) {
        for (let q = 0; q < tapsPerPhase; q++) {
          const j = p + q * up;
          phaseTaps[p * tapsPerPhase + q] = j < numTaps ? taps[j]! : 0;
        }
      }
      return {
        up,
        down,
        inputRateHz: spec.inputRateHz,
        outputRateHz: (spec.inputRateHz * up) / down,
        passbandEdgeHz: passHz,
        stopbandEdgeHz: stopHz,
        passbandRippleDb: rippleDb,
        stopbandAttenuationDb: attenuationDb,
        kaiserBeta: beta,
        numTaps,
        tapsPerPhase,
        delayInterpolatedSamples: (numTaps - 1) / 2,
        taps,
        phaseTaps,
        measured,
      };
    }
    numTaps += 2 * Math.max(1, Math.ceil(numTaps / 100));
  }
}

/** K-tap windowed-sinc lowpass, cutoff ωc rad/sample, passband gain `gain`, Kaiser β. */
function kaiserLowpass(numTaps: number, cutoffRad: number, beta: number, gain: number): Float64Array {
  const taps = kaiserWindow(beta, new Float64Array(numTaps));
  const d = (numTaps - 1) / 2;
  const fc = cutoffRad / Math.PI;
  for (let n = 0; n < numTaps; n++) {
    const x = fc * (n - d);
    const sinc = x === 0 ? 1 : sin(Math.PI * x) / (Math.PI * x);
    taps[n] = taps[n]! * gain * fc * sinc;
  }
  return taps;
}
