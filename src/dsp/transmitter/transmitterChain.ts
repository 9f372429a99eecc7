import type { WaveformConfig } from '../../config/schema';
import { createAmplifierFromConfig, driveOfConfig } from '../amplifier/createAmplifier';
import { amplifyAtDrive, type DrivePoint } from '../amplifier/drive';
import { applyImpairments, type ImpairmentsReport } from '../impairments/applyImpairments';
import { clipAndFilter, type ClipAndFilterReport } from '../paprReduction/clipAndFilter';
import { applyTimeWindowing } from '../shaping/timeWindowing';
import type { SymbolLayout, WaveformPlan } from '../waveform/waveformPlan';

/** True when the configuration asks for any transmitter block after generation (PAPR reduction, windowing, impairments, amplifier). */
export function hasTransmitterChain(config: Pick<WaveformConfig, 'paprReduction' | 'windowing' | 'impairments' | 'amplifier'>): boolean {
  return Boolean(config.paprReduction || config.windowing || config.impairments || config.amplifier);
}

/** What the transmitter chain did to a generated waveform. */
export interface TransmitterReport {
  /** Steps applied, in order. */
  readonly steps: readonly string[];
  readonly paprReduction?: ClipAndFilterReport;
  readonly windowingRampSamples?: number;
  readonly impairments?: ImpairmentsReport;
  readonly amplifier?: { readonly description: string; readonly drive: DrivePoint };
}

/** The parts of a generated waveform the chain reads. */
export interface ChainInput {
  readonly plan: WaveformPlan;
  readonly symbolLayout: readonly SymbolLayout[];
  readonly waveformIq: Float64Array;
  readonly sampleRateHz: number;
}

/**
 * Runs a generated waveform through the configured transmitter, in the order a transmitter has its blocks:
 * PAPR reduction on each symbol (clip and filter) → raised-cosine windowing of the symbol edges → impairments
 * (sample clock, DAC, IQ modulator, LO leakage, phase noise) → power amplifier at its drive. Sub-objects that are
 * absent are skipped; with none of them the output equals the input. Spectrum shaping is not here: it is part of
 * generation (the DFT output), see shaping/blockShaping.ts.
 * @param config the configuration (defaults applied); its `paprReduction`, `windowing`, `impairments`, `amplifier`
 * @returns a new buffer (the input is not modified), the report and warnings
 */
export function applyTransmitterChain(
  wave: ChainInput,
  config: Pick<WaveformConfig, 'paprReduction' | 'windowing' | 'impairments' | 'amplifier' | 'oversampling'>,
): { outputIq: Float64Array; report: TransmitterReport; warnings: string[] } {
  let signal = wave.waveformIq;
  const steps: string[] = [];
  const warnings: string[] = [];
  const report: { -readonly [K in keyof TransmitterReport]: TransmitterReport[K] } = { steps };
  if (config.paprReduction) {
    const result = clipAndFilter(wave.plan, wave.symbolLayout, signal, config.paprReduction);
    signal = result.outputIq;
    report.paprReduction = result.report;
    steps.push(`clip and filter (CR ${config.paprReduction.clippingRatioDb} dB, ${config.paprReduction.iterations} iterations)`);
  }
  if (config.windowing) {
    const ramp = config.windowing.rampLengthSamples * config.oversampling;
    signal = applyTimeWindowing(signal, wave.symbolLayout, ramp, wave.plan.numerology.halfSubcarrierShift ? -1 : 1, new Float64Array(signal.length));
    report.windowingRampSamples = ramp;
    steps.push(`raised-cosine windowing (${ramp} samples)`);
  }
  if (config.impairments) {
    const result = applyImpairments(signal, config.impairments, wave.sampleRateHz);
    signal = result.outputIq;
    report.impairments = result.report;
    warnings.push(...result.warnings);
    steps.push(...result.report.applied);
  }
  if (config.amplifier) {
    const model = createAmplifierFromConfig(config.amplifier);
    const result = amplifyAtDrive(model, signal, driveOfConfig(config.amplifier));
    signal = result.outputIq;
    report.amplifier = { description: model.description, drive: result.drive };
    warnings.push(...result.warnings);
    steps.push(`amplifier ${model.description} at IBO ${result.drive.iboDb.toFixed(2)} dB / OBO ${result.drive.oboDb.toFixed(2)} dB`);
  }
  return { outputIq: signal === wave.waveformIq ? Float64Array.from(signal) : signal, report, warnings };
}
