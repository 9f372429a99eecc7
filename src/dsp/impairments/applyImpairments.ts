import type { ImpairmentsConfig } from '../../config/transmitterSchema';
import { createRng } from '../data/rng';
import { applyDcOffset } from './dcOffset';
import { fullScaleFromHeadroom, quantizeDac } from './dacQuantizer';
import { applyIqImbalance, imageRejectionRatioDb } from './iqImbalance';
import { applyPhaseNoise, generateMaskPhaseNoise, generateWienerPhaseNoise } from './phaseNoise';
import { applySampleClockOffset } from './sampleClockOffset';

/** What the impairments did, for reports. */
export interface ImpairmentsReport {
  readonly applied: readonly string[];
  readonly sampleClockPpm?: number;
  readonly dacFullScaleAmplitude?: number;
  /** Share of rail values beyond the DAC's full scale (0…1). */
  readonly dacClippedFraction?: number;
  readonly imageRejectionRatioDb?: number;
  readonly dcOffsetIq?: readonly [number, number];
  /** RMS of the phase-noise process over the record (after removing its mean), degrees. */
  readonly phaseNoiseRmsDeg?: number;
}

/**
 * Applies the configured transmitter impairments in the order a transmitter has them: the DAC's sample clock,
 * then its quantiser, then the IQ modulator (gain/phase imbalance, LO leakage), then the LO's phase noise, which
 * multiplies everything after the mixer (leakage included). Absent sub-objects are skipped.
 * @param inIq 2N values (not modified); @param sampleRateHz the output rate (oversampling included)
 * @returns a new buffer with the impaired signal
 */
export function applyImpairments(
  inIq: Float64Array,
  config: ImpairmentsConfig,
  sampleRateHz: number,
): { outputIq: Float64Array; report: ImpairmentsReport; warnings: string[] } {
  let signal: Float64Array = Float64Array.from(inIq);
  const applied: string[] = [];
  const warnings: string[] = [];
  const report: { -readonly [K in keyof ImpairmentsReport]: ImpairmentsReport[K] } = { applied };
  if (config.sampleClockPpm !== undefined && config.sampleClockPpm !== 0) {
    signal = applySampleClockOffset(signal, config.sampleClockPpm, new Float64Array(signal.length));
    applied.push(`sample clock ${config.sampleClockPpm} ppm`);
    report.sampleClockPpm = config.sampleClockPpm;
  }
  if (config.dac) {
    const fullScale = config.dac.fullScaleAmplitude ?? fullScaleFromHeadroom(signal, config.dac.headroomDb);
    const clipped = quantizeDac(signal, config.dac.bits, fullScale, signal);
    applied.push(`DAC ${config.dac.bits} bits`);
    report.dacFullScaleAmplitude = fullScale;
    report.dacClippedFraction = clipped;
    if (clipped > 0) warnings.push(`impairments.dac: ${(100 * clipped).toFixed(3)} % of rail values exceeded full scale and clipped.`);
  }
  if (config.iqImbalance) {
    applyIqImbalance(signal, config.iqImbalance.gainDb, config.iqImbalance.phaseDeg, signal);
    applied.push(`IQ imbalance ${config.iqImbalance.gainDb} dB / ${config.iqImbalance.phaseDeg}°`);
    report.imageRejectionRatioDb = imageRejectionRatioDb(config.iqImbalance.gainDb, config.iqImbalance.phaseDeg);
  }
  if (config.dcOffset) {
    report.dcOffsetIq = applyDcOffset(signal, config.dcOffset.levelDbc, config.dcOffset.phaseDeg, signal);
    applied.push(`LO leakage ${config.dcOffset.levelDbc} dBc`);
  }
  if (config.phaseNoise) {
    const n = signal.length / 2;
    const rng = createRng(config.seed);
    const phase = new Float64Array(n);
    if (config.phaseNoise.linewidthHz !== undefined) generateWienerPhaseNoise(config.phaseNoise.linewidthHz, sampleRateHz, rng, phase);
    if (config.phaseNoise.mask) {
      const masked = generateMaskPhaseNoise(config.phaseNoise.mask, sampleRateHz, rng, new Float64Array(n));
      for (let i = 0; i < n; i++) phase[i]! += masked[i]!;
    }
    applyPhaseNoise(signal, phase, signal);
    let mean = 0;
    for (let i = 0; i < n; i++) mean += phase[i]!;
    mean /= n;
    let variance = 0;
    for (let i = 0; i < n; i++) variance += (phase[i]! - mean) * (phase[i]! - mean);
    report.phaseNoiseRmsDeg = (Math.sqrt(variance / n) * 180) / Math.PI;
    applied.push('phase noise');
  }
  return { outputIq: signal, report, warnings };
}
