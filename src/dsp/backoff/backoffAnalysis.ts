import type { WaveformConfig } from '../../config/schema';
import type { AmplifierModel } from '../amplifier/amplifierModel';
import { DspError } from '../errors';
import { aclrPlanFor, aclrSpanHz } from '../metrics/aclr';
import type { Modulation } from '../modulation/constellations';
import { applyTransmitterChain } from '../transmitter/transmitterChain';
import { generateWaveform } from '../waveform/waveformGenerator';
import { createWaveformPlan } from '../waveform/waveformPlan';
import { createWaveformMetrics, defaultBackoffRbwHz } from './backoffMetrics';
import { solveBackoff, type BackoffLimits, type BackoffSolution } from './backoffSolver';
import { createBackoffEvaluator, sweepBackoff, type BackoffSweepPoint } from './backoffSweep';
import { defaultAclrLimit, defaultEvmLimitFor, type SourcedLimit } from './limits';
import { mprAllowanceFor, type MprAllowance } from './mpr';

export interface BackoffAnalysisOptions {
  readonly model: AmplifierModel;
  /** Sweep axis (default OBO). */
  readonly axis?: 'obo' | 'ibo';
  /** Sweep start, dB (default 1). */
  readonly fromDb?: number;
  readonly toDb?: number;
  readonly stepDb?: number;
  /** Bisection stops below this bracket width, dB (default 0.05). */
  readonly toleranceDb?: number;
  /** EVM budget, %; default the standard's limit for the modulation. */
  readonly evmLimitPercent?: number;
  /** ACLR limit for every adjacent channel (a number) or per channel key; default the standard's limits. */
  readonly aclrLimitDb?: number | Readonly<Record<string, number>>;
  /** Saturated output power of the PA, dBm (gives absolute output powers). */
  readonly psatDbm?: number;
  readonly rbwHz?: number;
}

export interface BackoffAnalysis {
  readonly axis: 'obo' | 'ibo';
  readonly amplifier: string;
  readonly oversampling: number;
  readonly limits: { readonly evm: SourcedLimit | null; readonly aclr: Readonly<Record<string, SourcedLimit>> };
  /** Swept points and bisection points, ascending in back-off. */
  readonly curve: readonly BackoffSweepPoint[];
  readonly solution: BackoffSolution;
  readonly requiredOboDb: number | null;
  readonly requiredIboDb: number | null;
  /** P_sat − required OBO, dBm (null without psatDbm or without an answer). */
  readonly usableOutputDbm: number | null;
  readonly psatDbm: number | null;
  readonly mpr: MprAllowance | null;
  readonly methods: { readonly evm: string; readonly aclr: string };
  readonly warnings: readonly string[];
}

/**
 * The back-off answer for one configuration and one amplifier: generates the waveform (raising oversampling until the
 * adjacent channels fit), applies the configured PAPR reduction, windowing and impairments, sweeps the back-off
 * measuring EVM, ACLR, envelope statistics and output power, and solves for the least back-off meeting every limit
 * (backoffSolver.ts). The configuration's own `amplifier` is ignored: `options.model` is the amplifier.
 */
export function analyzeBackoff(config: WaveformConfig, options: BackoffAnalysisOptions): BackoffAnalysis {
  const warnings: string[] = [];
  const axis = options.axis ?? 'obo';
  const base = createWaveformPlan({ ...config, oversampling: 1 });
  const numerology = base.numerology;
  const rbw = options.rbwHz ?? defaultBackoffRbwHz(numerology.channelBandwidthHz);
  const needed = Math.ceil((2 * (aclrSpanHz(aclrPlanFor(numerology)) + 4 * rbw)) / numerology.sampleRateHz);
  let oversampling = config.oversampling;
  if (needed > oversampling) {
    if (needed > 16) throw new DspError('UNSUPPORTED_SIZE', `The adjacent channels need oversampling ${needed}, more than the 16 the generator offers.`);
    warnings.push(`Oversampling raised from ${config.oversampling} to ${needed} so the spectrum covers every adjacent channel.`);
    oversampling = needed;
  }
  const runConfig: WaveformConfig = { ...config, oversampling, amplifier: undefined };
  const wave = generateWaveform(runConfig);
  warnings.push(...wave.warnings);
  const chain = applyTransmitterChain(wave, runConfig);
  warnings.push(...chain.warnings);
  const metrics = createWaveformMetrics(wave, rbw);

  const modulations = wave.plan.allocations.map((a) => a.modulation as Modulation);
  const evmLimit: SourcedLimit | null =
    options.evmLimitPercent !== undefined ? { value: options.evmLimitPercent, source: 'user budget' } : defaultEvmLimitFor(numerology, modulations);
  const aclrLimits: Record<string, SourcedLimit> = {};
  for (const key of metrics.aclrChannels) {
    const given = options.aclrLimitDb;
    if (typeof given === 'number') aclrLimits[key] = { value: given, source: 'user limit' };
    else if (given && given[key] !== undefined) aclrLimits[key] = { value: given[key]!, source: 'user limit' };
    else {
      const d = defaultAclrLimit(numerology, key);
      if (d) aclrLimits[key] = d;
    }
  }
  if (Object.keys(aclrLimits).length === 0) warnings.push('No ACLR limit applies (custom numerology without --aclr-limit): only EVM is checked.');
  const limits: BackoffLimits = {
    ...(evmLimit ? { evmPercent: evmLimit.value } : {}),
    aclrDb: Object.fromEntries(Object.entries(aclrLimits).map(([k, v]) => [k, v.value])),
  };

  const evaluate = createBackoffEvaluator(options.model, chain.outputIq, metrics, axis);
  const sweep = sweepBackoff(evaluate, options.fromDb ?? 1, options.toDb ?? 15, options.stepDb ?? 1);
  if (sweep.skipped.length > 0) warnings.push(`${sweep.skipped.length} back-off point(s) skipped: ${sweep.skipped[0]!.reason}`);
  const solution = solveBackoff(sweep.points, evaluate, limits, options.toleranceDb ?? 0.05);
  warnings.push(...options.model.warnings);
  const top = sweep.points[sweep.points.length - 1];
  if (top && solution.limitingMetric === 'aclr' && solution.limitingChannel) {
    const floorMargin = top.aclrDb[solution.limitingChannel]! - limits.aclrDb![solution.limitingChannel]!;
    if (floorMargin < 1) {
      warnings.push(
        `ACLR ${solution.limitingChannel} is only ${floorMargin.toFixed(2)} dB above its limit even at ${top.backoffDb} dB back-off: the waveform's own spectrum (rectangular symbol edges) nearly fails it, so the answer is sensitive to that floor; consider windowing, spectrum shaping or more symbols.`,
      );
    }
  }
  const curve = [...sweep.points, ...(solution.bisectionPoints as BackoffSweepPoint[])].sort((a, b) => a.backoffDb - b.backoffDb);
  const answer = solution.status === 'not-reached' ? null : solution.point;
  const psat = options.psatDbm ?? null;
  const block = wave.plan.allocations[0]!;
  const spanStart = block.startRb;
  const spanEnd = wave.plan.allocations[wave.plan.allocations.length - 1]!;
  const numRbSpan = spanEnd.startRb + spanEnd.numRb - spanStart;
  if (wave.plan.allocations.length > 1) warnings.push('MPR context uses the span of all allocation blocks and the first block\'s modulation.');
  const mpr = mprAllowanceFor(numerology, config.bandwidthMHz, spanStart, numRbSpan, block.modulation as Modulation, wave.plan.waveform) ?? null;
  return {
    axis,
    amplifier: options.model.description,
    oversampling,
    limits: { evm: evmLimit, aclr: aclrLimits },
    curve,
    solution,
    requiredOboDb: answer?.oboDb ?? null,
    requiredIboDb: answer?.iboDb ?? null,
    usableOutputDbm: psat !== null && answer ? psat - answer.oboDb : null,
    psatDbm: psat,
    mpr,
    methods: metrics.methods,
    warnings,
  };
}
