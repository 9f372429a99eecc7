import { evmLimitFor } from './evmLimits';
import { evmWindowFor, type EvmWindow } from './evmWindow';
import { computeEvm, type EvmResult } from './evm';
import { receiveWaveform, type ChannelEstimationMode, type ReceiverResult } from './referenceReceiver';
import type { WaveformPlan } from '../waveform/waveformPlan';
import type { Modulation } from '../modulation/constellations';

/**
 * EVM as the standards measure it (TS 36.101 Annex F; TS 38.101-1 Annex F): synchronise once (CP-based timing and
 * fractional CFO, or known timing), then demodulate with the FFT window at both ends of the EVM window W (evmWindow.ts),
 * each time with a zero-forcing equaliser whose coefficients are the time-averaged LS estimates (the static-channel
 * equaliser of Annex F), compute EVM at both positions and report the larger. Limits per modulation from evmLimits.ts.
 */
/** How `measureEvm` synchronises and estimates the channel. */
export interface EvmMeasurementOptions {
  readonly timing?: 'cp' | 'known';
  readonly knownTimingOffsetSamples?: number;
  readonly channelEstimation?: ChannelEstimationMode;
  readonly transmittedGridIq?: Float64Array;
  readonly frequencyWindow?: number;
  /** Replaces W (samples at the record's rate). */
  readonly windowLengthSamples?: number;
}

/** The EVM figures as a report or the CLI prints them; percentages RMS unless named peak. */
export interface EvmReport {
  readonly evmRmsPercent: number;
  readonly evmPeakPercent: number;
  /** The tightest limit among the modulations present (undefined when none applies). */
  readonly evmLimitPercent: number | undefined;
  readonly pass: boolean | undefined;
  readonly limitSource: string;
  readonly perModulation: readonly {
    readonly modulation: Modulation;
    readonly evmRmsPercent: number;
    readonly limitPercent: number | undefined;
    readonly pass: boolean | undefined;
  }[];
  readonly window: EvmWindow;
  readonly evmLowPercent: number;
  readonly evmHighPercent: number;
  readonly reportedPosition: 'low' | 'high';
  readonly perSymbolPercent: readonly number[];
  readonly perSubcarrierPercent: readonly number[];
  /** Equalised symbols at the reported position, fill order, for constellation plots. */
  readonly constellationIq: Float64Array;
  readonly cfoHz: number;
  readonly timingOffsetSamples: number;
  readonly channelEstimationNote: string;
  readonly warnings: readonly string[];
}

/** The report plus the nominal demodulation it came with. */
export interface EvmMeasurement {
  readonly report: EvmReport;
  /** Demodulation with the window at the CP centre (for BER). */
  readonly nominal: ReceiverResult;
}

/** Measures EVM of `rxIq`, a recording of `plan`'s waveform (see above). */
export function measureEvm(plan: WaveformPlan, rxIq: Float64Array, options: EvmMeasurementOptions = {}): EvmMeasurement {
  const window = evmWindowFor(plan, options.windowLengthSamples);
  const common = {
    ...(options.channelEstimation !== undefined ? { channelEstimation: options.channelEstimation } : {}),
    ...(options.transmittedGridIq !== undefined ? { transmittedGridIq: options.transmittedGridIq } : {}),
    frequencyWindow: options.frequencyWindow ?? 7,
    timeInterpolation: 'average' as const,
    equalizer: 'zf' as const,
  };
  const nominal = receiveWaveform(plan, rxIq, {
    ...common,
    timing: options.timing ?? 'cp',
    knownTimingOffsetSamples: options.knownTimingOffsetSamples ?? 0,
    windowAdvanceSamples: window.centreAdvanceSamples,
  });
  const at = (advance: number): { rx: ReceiverResult; evm: EvmResult } => {
    const rx = receiveWaveform(plan, rxIq, {
      ...common,
      timing: 'known',
      knownTimingOffsetSamples: nominal.timingOffsetSamples,
      knownCfoHz: nominal.cfoHz,
      windowAdvanceSamples: advance,
    });
    return { rx, evm: computeEvm(plan, rx) };
  };
  const low = at(window.lowAdvanceSamples);
  const high = at(window.highAdvanceSamples);
  const worst = high.evm.rmsPercent > low.evm.rmsPercent ? high : low;
  const perModulation = worst.evm.perModulation.map((m) => {
    const limit = evmLimitFor(plan.numerology.standard, plan.numerology.link, m.modulation);
    return {
      modulation: m.modulation,
      evmRmsPercent: m.rmsPercent,
      limitPercent: limit.limitPercent,
      pass: limit.limitPercent === undefined ? undefined : m.rmsPercent <= limit.limitPercent,
      source: limit.source,
    };
  });
  const limited = perModulation.filter((m) => m.limitPercent !== undefined);
  const tightest = limited.reduce<(typeof limited)[number] | undefined>((t, m) => (t === undefined || m.limitPercent! < t.limitPercent! ? m : t), undefined);
  const warnings = [...nominal.warnings, ...worst.rx.warnings];
  if (limited.length < perModulation.length) warnings.push(`No EVM limit for ${perModulation.filter((m) => m.limitPercent === undefined).map((m) => m.modulation).join(', ')} here.`);
  return {
    nominal,
    report: {
      evmRmsPercent: worst.evm.rmsPercent,
      evmPeakPercent: worst.evm.peakPercent,
      evmLimitPercent: tightest?.limitPercent,
      pass: limited.length === 0 ? undefined : limited.every((m) => m.pass === true),
      limitSource: tightest ? perModulation.filter((m) => m.limitPercent !== undefined).map((m) => `${m.modulation}: ${m.source}`).join('; ') : 'none',
      perModulation: perModulation.map(({ modulation, evmRmsPercent, limitPercent, pass }) => ({ modulation, evmRmsPercent, limitPercent, pass })),
      window,
      evmLowPercent: low.evm.rmsPercent,
      evmHighPercent: high.evm.rmsPercent,
      reportedPosition: worst === high ? 'high' : 'low',
      perSymbolPercent: Array.from(worst.evm.perSymbolPercent),
      perSubcarrierPercent: Array.from(worst.evm.perSubcarrierPercent),
      constellationIq: worst.rx.dataSymbolsIq,
      cfoHz: nominal.cfoHz,
      timingOffsetSamples: nominal.timingOffsetSamples,
      channelEstimationNote: nominal.channelEstimationNote,
      warnings: [...new Set(warnings)],
    },
  };
}
