import { assertLength, DspError } from '../errors';
import { createFftPlan, fftForward, ifftRaw } from '../fft/fftPlan';
import { gridSubcarrierFrequencyHz } from '../waveform/subcarrierLayout';
import { occupiedSubcarriers } from '../waveform/allocation';
import type { SymbolLayout, WaveformPlan } from '../waveform/waveformPlan';
import { outOfBandPowerRatioDb, recordPaprDb } from './outOfBandPower';
import { log10, pow } from '../math/expLog';
import { cos, sin } from '../math/trig';

export interface ClipAndFilterOptions {
  /** Clipping level over the record's RMS amplitude, dB (CR = 20·log10(A/σ)). */
  readonly clippingRatioDb: number;
  readonly iterations: number;
  /** Bins kept by the filter: the allocated (occupied) subcarriers, or every grid subcarrier. */
  readonly filter: 'allocated' | 'grid';
}

export interface ClipAndFilterReport {
  readonly paprBeforeDb: number;
  readonly paprAfterDb: number;
  /** paprBeforeDb − paprAfterDb (peak over mean of the whole record). */
  readonly paprGainDb: number;
  /** In-band error the processing adds on the occupied subcarriers after a complex gain fit, RMS %. */
  readonly evmCostPercent: number;
  /** Out-of-band over in-band power (record periodogram, outside the transmission bandwidth), dB. */
  readonly outOfBandBeforeDb: number;
  /** The same after clipping once without filtering (what clipping alone would emit). */
  readonly outOfBandClipOnlyDb: number;
  readonly outOfBandAfterDb: number;
  /** Mean power after over before, dB (clipping removes some power). */
  readonly powerChangeDb: number;
}

/**
 * Iterative clipping and filtering for PAPR reduction (J. Armstrong, "Peak-to-average power reduction for OFDM
 * by repeated clipping and frequency domain filtering", Electronics Letters 38(5):246–247, 2002). For every symbol the
 * useful part (CP removed, LTE-uplink ramp and NR phase undone, so it is exactly periodic) is, `iterations` times,
 * clipped to amplitude A = σ·10^{CR/20} with its phase kept (σ² the record's mean power), transformed, and every bin
 * outside the kept set zeroed; then the CP is rebuilt. Clipping works on the oversampled signal, so the peaks it
 * removes are the analogue ones (oversampling ≥ 4 recommended; Armstrong used 8). Each filtering pass regrows some
 * peaks, hence the repetition.
 * @param waveformIq the generated waveform, 2·(total samples); not modified
 */
export function clipAndFilter(
  plan: WaveformPlan,
  layouts: readonly SymbolLayout[],
  waveformIq: Float64Array,
  options: ClipAndFilterOptions,
): { outputIq: Float64Array; report: ClipAndFilterReport } {
  if (!Number.isInteger(options.iterations) || options.iterations < 1) {
    throw new DspError('INVALID_CONFIG', `paprReduction.iterations must be a whole number ≥ 1; got ${options.iterations}.`, { field: 'paprReduction.iterations' });
  }
  if (!(options.clippingRatioDb >= 0 && options.clippingRatioDb <= 20)) {
    throw new DspError('INVALID_CONFIG', `paprReduction.clippingRatioDb must be from 0 to 20 dB; got ${options.clippingRatioDb}.`, {
      field: 'paprReduction.clippingRatioDb',
    });
  }
  const n = plan.ofdm.ifftSize;
  const total = waveformIq.length / 2;
  let meanPower = 0;
  for (let i = 0; i < waveformIq.length; i++) meanPower += waveformIq[i]! * waveformIq[i]!;
  meanPower /= total;
  const clipAmplitude = Math.sqrt(meanPower) * pow(10, options.clippingRatioDb / 20);
  const keep = new Uint8Array(n);
  const subcarrierSets = options.filter === 'grid' ? [Int32Array.from({ length: plan.numerology.numGridSubcarriers }, (_, g) => g)] : plan.allocations.map(occupiedSubcarriers);
  for (const set of subcarrierSets) for (const g of set) keep[plan.ofdm.bins[g]!] = 1;
  const occupied = new Uint8Array(n);
  for (const block of plan.allocations) for (const g of occupiedSubcarriers(block)) occupied[plan.ofdm.bins[g]!] = 1;

  const fft = createFftPlan(n);
  const periodic = new Float64Array(2 * n);
  const spectrum = new Float64Array(2 * n);
  const original = new Float64Array(2 * n);
  const outputIq = new Float64Array(waveformIq.length);
  const clipOnlyIq = new Float64Array(waveformIq.length);
  let crossRe = 0;
  let crossIm = 0;
  let refPower = 0;
  let outPower = 0;
  for (const layout of layouts) {
    assertLength({ length: layout.fftSize }, n, 'Symbol layout FFT size');
    const cp = layout.cpLengthSamples;
    const rotation = symbolRotation(plan, layout);
    for (let m = 0; m < n; m++) {
      const [c, s] = rotation(cp + m);
      const re = waveformIq[2 * (layout.startSample + cp + m)]!;
      const im = waveformIq[2 * (layout.startSample + cp + m) + 1]!;
      periodic[2 * m] = re * c + im * s;
      periodic[2 * m + 1] = im * c - re * s;
    }
    fftForward(fft, periodic, original);
    for (let it = 0; it < options.iterations; it++) {
      clipInPlace(periodic, clipAmplitude);
      if (it === 0) writeSymbol(clipOnlyIq, layout, periodic, rotation);
      fftForward(fft, periodic, spectrum);
      for (let b = 0; b < n; b++) {
        if (!keep[b]) {
          spectrum[2 * b] = 0;
          spectrum[2 * b + 1] = 0;
        }
      }
      ifftRaw(fft, spectrum, periodic);
      for (let i = 0; i < 2 * n; i++) periodic[i]! /= n;
    }
    // Final spectrum = FFT of the last filtered periodic part = `spectrum` (masked). Compare on occupied bins.
    for (let b = 0; b < n; b++) {
      if (!occupied[b]) continue;
      const xr = original[2 * b]!;
      const xi = original[2 * b + 1]!;
      const yr = spectrum[2 * b]!;
      const yi = spectrum[2 * b + 1]!;
      crossRe += yr * xr + yi * xi;
      crossIm += yi * xr - yr * xi;
      refPower += xr * xr + xi * xi;
      outPower += yr * yr + yi * yi;
    }
    writeSymbol(outputIq, layout, periodic, rotation);
  }
  // Σ|y − αx|² with α = Σy·x*/Σ|x|² equals Σ|y|² − |Σy·x*|²/Σ|x|².
  const alpha2 = (crossRe * crossRe + crossIm * crossIm) / (refPower * refPower);
  const errorPower = outPower - alpha2 * refPower;
  const evmCostPercent = 100 * Math.sqrt(Math.max(0, errorPower) / (alpha2 * refPower));
  const { lowHz, highHz } = transmissionEdgesHz(plan);
  const rate = plan.sampleRateHz;
  const paprBeforeDb = recordPaprDb(waveformIq);
  const paprAfterDb = recordPaprDb(outputIq);
  let after = 0;
  for (let i = 0; i < outputIq.length; i++) after += outputIq[i]! * outputIq[i]!;
  return {
    outputIq,
    report: {
      paprBeforeDb,
      paprAfterDb,
      paprGainDb: paprBeforeDb - paprAfterDb,
      evmCostPercent,
      outOfBandBeforeDb: outOfBandPowerRatioDb(waveformIq, rate, lowHz, highHz),
      outOfBandClipOnlyDb: outOfBandPowerRatioDb(clipOnlyIq, rate, lowHz, highHz),
      outOfBandAfterDb: outOfBandPowerRatioDb(outputIq, rate, lowHz, highHz),
      powerChangeDb: 10 * log10(after / total / meanPower),
    },
  };
}

/** Edges of the transmission bandwidth (lowest and highest grid subcarrier ± Δf/2), Hz. */
export function transmissionEdgesHz(plan: WaveformPlan): { lowHz: number; highHz: number } {
  const num = plan.numerology;
  const half = num.subcarrierSpacingHz / 2;
  return {
    lowHz: gridSubcarrierFrequencyHz(num, 0) - half,
    highHz: gridSubcarrierFrequencyHz(num, num.numGridSubcarriers - 1) + half,
  };
}

/** (cos, sin) of the phase that position p of the extended symbol carries on top of its periodic part. */
function symbolRotation(plan: WaveformPlan, layout: SymbolLayout): (p: number) => [number, number] {
  const ramp = plan.ofdm.rampsIq[layout.symbolIndex % plan.ofdm.cpLengthsSamples.length];
  const phases = plan.ofdm.symbolPhaseRad;
  const theta = phases.length > 0 ? phases[layout.symbolIndex % phases.length]! : 0;
  const c0 = cos(theta);
  const s0 = sin(theta);
  if (!ramp) return () => [c0, s0];
  return (p) => {
    const c = ramp[2 * p]!;
    const s = ramp[2 * p + 1]!;
    return [c * c0 - s * s0, c * s0 + s * c0];
  };
}

function clipInPlace(iq: Float64Array, amplitude: number): void {
  for (let i = 0; i < iq.length; i += 2) {
    const r = Math.hypot(iq[i]!, iq[i + 1]!);
    if (r > amplitude) {
      const g = amplitude / r;
      iq[i]! *= g;
      iq[i + 1]! *= g;
    }
  }
}

/** Writes CP + useful part of one symbol from its periodic part, re-applying the symbol's rotation. */
function writeSymbol(outIq: Float64Array, layout: SymbolLayout, periodic: Float64Array, rotation: (p: number) => [number, number]): void {
  const n = layout.fftSize;
  const cp = layout.cpLengthSamples;
  for (let p = 0; p < cp + n; p++) {
    const m = (((p - cp) % n) + n) % n;
    const [c, s] = rotation(p);
    const re = periodic[2 * m]!;
    const im = periodic[2 * m + 1]!;
    outIq[2 * (layout.startSample + p)] = re * c - im * s;
    outIq[2 * (layout.startSample + p) + 1] = re * s + im * c;
  }
}
