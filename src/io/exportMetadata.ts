import type { ResolvedLevel } from '../dsp/level/levelScale';
import type { CcdfPoint, PowerSummary } from '../dsp/level/powerStats';
import { describeConfig } from '../dsp/waveform/configDescription';
import { symbolLayoutOf } from '../dsp/waveform/waveformPlan';
import type { ExportPlan } from './exportPlan';
import { quantisationSnrDb, type QuantisationTally } from './iqCodecs';
import { datatypeInfo } from './iqDatatypes';
import { SIDECAR_FORMAT, SIDECAR_VERSION } from './iqSidecar';
import { buildSigmfMeta, type SigmfAnnotation } from './sigmfMeta';
import { pow } from '../dsp/math/expLog';

/** Most slot annotations written; beyond it each copy of the record gets one annotation instead. */
export const MAX_ANNOTATIONS = 100_000;
/** `core:recorder` / sidecar recorder. */
export const RECORDER = 'crestline generate';

/** What an export did to the level, for the person running it and for the file's metadata. */
export interface ExportReport {
  readonly format: string;
  readonly datatype: string;
  readonly sampleRateHz: number;
  readonly numSamples: number;
  readonly durationS: number;
  readonly level: ResolvedLevel;
  /** The written samples: RMS, peak |x|², largest |I|/|Q|, dBFS (0 dBFS = |x| = 1). */
  readonly rmsDbfs: number;
  readonly peakDbfs: number;
  readonly peakComponentDbfs: number;
  readonly crestFactorDb: number;
  readonly ccdf: readonly CcdfPoint[];
  /** Integer formats only. */
  readonly quantisation?:
    | { readonly fullScaleCode: number; readonly clippedSamples: number; readonly clippedPercent: number; readonly quantisationSnrDb: number }
    | undefined;
  readonly warnings: readonly string[];
}

export interface MetadataInput {
  readonly plan: ExportPlan;
  readonly level: ResolvedLevel;
  /** Statistics of one copy at the output rate before scaling. */
  readonly formulaSummary: PowerSummary;
  /** Statistics of one copy as written (scaled, shifted). */
  readonly writtenSummary: PowerSummary;
  readonly quantisation: QuantisationTally | undefined;
  readonly sha512Hex: string;
  readonly dataBytes: number;
  /** What the transmitter blocks did, when the configuration has any. */
  readonly transmitter?: { readonly report: { readonly steps: readonly string[] }; readonly warnings: readonly string[] } | undefined;
}

/** Builds the report and the metadata text (SigMF meta or our sidecar) of a finished export. */
export function buildExportMetadata(input: MetadataInput): { text: string; report: ExportReport } {
  const { plan, level, writtenSummary: w } = input;
  const warnings = [...plan.warnings, ...(input.transmitter?.warnings ?? [])];
  let quantisation: ExportReport['quantisation'];
  if (input.quantisation) {
    const t = input.quantisation;
    const clippedPercent = (100 * t.clippedSamples) / Math.max(1, t.numSamples);
    quantisation = {
      fullScaleCode: datatypeInfo(plan.format.datatype).fullScaleCode,
      clippedSamples: t.clippedSamples,
      clippedPercent,
      quantisationSnrDb: quantisationSnrDb(t),
    };
    if (t.clippedSamples > 0) {
      warnings.push(
        `CLIPPING: ${t.clippedSamples} of ${t.numSamples} samples (${clippedPercent.toPrecision(3)} %) had I or Q beyond full scale and were clipped (peak component ${w.peakComponentDb.toFixed(2)} dBFS); lower --level-dbfs.`,
      );
    }
  } else if (level.mode !== 'formula' && w.maxComponentAbs > 1) {
    warnings.push(`Float samples reach ${w.peakComponentDb.toFixed(2)} dBFS (|I| or |Q| above 1.0); an instrument that reads ±1.0 as full scale will clip them.`);
  }
  if (level.mode === 'auto' && level.probability !== undefined && level.probability * input.formulaSummary.numSamples < 10) {
    warnings.push(
      `level auto: the record has ${input.formulaSummary.numSamples} samples, too few for a stable CCDF level at ${level.probability}; the level used (${level.ccdfLevelDb?.toFixed(2)} dB above the mean) is close to the record's peak. Export more symbols or set --level-dbfs.`,
    );
  }
  const report: ExportReport = {
    format: plan.format.format,
    datatype: plan.format.datatype,
    sampleRateHz: plan.sampleRateHz,
    numSamples: plan.numSamples,
    durationS: plan.numSamples / plan.sampleRateHz,
    level,
    rmsDbfs: w.rmsDb,
    peakDbfs: w.peakDb,
    peakComponentDbfs: w.peakComponentDb,
    crestFactorDb: w.crestFactorDb,
    ccdf: w.ccdf,
    quantisation,
    warnings,
  };
  const crestline = {
    config: plan.config,
    num_samples: plan.numSamples,
    scaling: scalingFacts(input, report),
    export: exportFacts(plan),
    ...(input.transmitter ? { transmitter: { steps: input.transmitter.report.steps } } : {}),
  };
  const description = plan.options.description ?? `Crestline waveform: ${describeConfig(plan.config)}`;
  if (plan.format.container === 'sigmf') {
    const meta = buildSigmfMeta({
      datatype: plan.format.datatype as 'cf32_le' | 'ci16_le' | 'ci8',
      sampleRateHz: plan.sampleRateHz,
      sha512Hex: input.sha512Hex,
      description,
      recorder: RECORDER,
      author: plan.options.author,
      centerFrequencyHz: plan.centerFrequencyHz,
      crestline,
      annotations: slotAnnotations(plan),
    });
    return { text: `${JSON.stringify(meta, null, 2)}\n`, report };
  }
  const sidecar: Record<string, unknown> = {
    format: SIDECAR_FORMAT,
    version: SIDECAR_VERSION,
    container: plan.format.container,
    datatype: plan.format.datatype,
    sampleRateHz: plan.sampleRateHz,
    numSamples: plan.numSamples,
    dataOffsetBytes: plan.headerBytes,
    dataLengthBytes: input.dataBytes - plan.headerBytes,
    sha512: input.sha512Hex,
  };
  if (plan.centerFrequencyHz !== undefined) sidecar.centerFrequencyHz = plan.centerFrequencyHz;
  sidecar.description = description;
  if (plan.options.author !== undefined) sidecar.author = plan.options.author;
  sidecar.recorder = RECORDER;
  Object.assign(sidecar, crestline.config ? { config: crestline.config } : {}, { scaling: crestline.scaling, export: crestline.export });
  if (crestline.transmitter) sidecar.transmitter = crestline.transmitter;
  return { text: `${JSON.stringify(sidecar, null, 2)}\n`, report };
}

function scalingFacts(input: MetadataInput, report: ExportReport): Record<string, unknown> {
  const { level } = input;
  return {
    scaleLinear: level.scaleLinear,
    note:
      level.mode === 'formula'
        ? 'samples are the standard baseband formula values, unscaled'
        : 'samples are the standard baseband formula values times scaleLinear; 0 dBFS is a complex sample of magnitude 1',
    meanPowerLinear: input.formulaSummary.meanPower,
    levelMode: level.mode,
    // rms and auto: the RMS level aimed at; peak: the peak level aimed at.
    ...(level.requestedDbfs !== undefined ? { targetDbfs: level.requestedDbfs } : {}),
    ...(level.mode === 'auto' ? { ccdfLevelDb: level.ccdfLevelDb, ccdfProbability: level.probability, marginDb: level.marginDb } : {}),
    fullScale: 'complex magnitude 1 = 0 dBFS; integer codes are round(x * fullScaleCode), clipped to the type',
    rmsDbfs: report.rmsDbfs,
    peakDbfs: report.peakDbfs,
    peakComponentDbfs: report.peakComponentDbfs,
    crestFactorDb: report.crestFactorDb,
    ccdf: report.ccdf.map((p) => ({ probability: p.probability, levelDb: round(p.levelDb, 3), reliable: p.reliable })),
    ...(report.quantisation ? { quantisation: report.quantisation } : {}),
  };
}

function exportFacts(plan: ExportPlan): Record<string, unknown> {
  const r = plan.resampler;
  return {
    options: plan.options,
    level: plan.level,
    nativeSampleRateHz: plan.nativeRateHz,
    sampleRateHz: plan.sampleRateHz,
    periodSamples: plan.periodSamples,
    repeat: plan.repeat,
    loopUnitSymbols: plan.loopUnitSymbols,
    seamlessLoop: plan.seamlessLoop,
    occupiedBandHz: plan.occupiedBandHz,
    freqOffset: plan.shift
      ? { requestedHz: plan.shift.requestedHz, appliedHz: plan.shift.appliedHz, snapped: plan.shift.snapped, periodic: plan.shift.periodic }
      : null,
    resampler: r
      ? {
          method: 'rational polyphase, Kaiser-window FIR, circular (the record is one loop period)',
          up: r.up,
          down: r.down,
          numTaps: r.numTaps,
          tapsPerPhase: r.tapsPerPhase,
          kaiserBeta: r.kaiserBeta,
          passbandEdgeHz: r.passbandEdgeHz,
          stopbandEdgeHz: r.stopbandEdgeHz,
          designPassbandRippleDb: r.passbandRippleDb,
          designStopbandAttenuationDb: r.stopbandAttenuationDb,
          measuredPassbandRippleDb: r.measured.passbandRippleDb,
          measuredStopbandAttenuationDb: r.measured.stopbandAttenuationDb,
        }
      : null,
  };
}

/** One annotation per slot of each copy (or per copy past MAX_ANNOTATIONS), band edges of the allocation. */
function slotAnnotations(plan: ExportPlan): SigmfAnnotation[] {
  const wp = plan.waveformPlan;
  const perSlot = wp.numerology.symbolsPerSlot;
  const numSlots = Math.ceil(plan.config.symbols / perSlot);
  const toOut = (nativeSample: number): number =>
    plan.resampler ? Math.min(plan.periodSamples, Math.round((nativeSample * plan.resampler.up) / plan.resampler.down)) : nativeSample;
  const rf = plan.centerFrequencyHz ?? 0;
  const edges = { freqLowerEdgeHz: rf + plan.occupiedBandHz.lowerHz, freqUpperEdgeHz: rf + plan.occupiedBandHz.upperHz };
  const out: SigmfAnnotation[] = [];
  if (numSlots * plan.repeat > MAX_ANNOTATIONS) {
    for (let c = 0; c < plan.repeat; c++) out.push({ sampleStart: c * plan.periodSamples, sampleCount: plan.periodSamples, label: `copy ${c}`, ...edges });
    return out;
  }
  const starts: number[] = [];
  for (let s = 0; s < numSlots; s++) starts.push(toOut(symbolLayoutOf(wp, s * perSlot).startSample));
  starts.push(plan.periodSamples);
  for (let c = 0; c < plan.repeat; c++) {
    for (let s = 0; s < numSlots; s++) {
      out.push({
        sampleStart: c * plan.periodSamples + starts[s]!,
        sampleCount: starts[s + 1]! - starts[s]!,
        label: plan.repeat > 1 ? `copy ${c} slot ${s}` : `slot ${s}`,
        ...edges,
      });
    }
  }
  return out;
}

function round(x: number, digits: number): number {
  const f = pow(10, digits);
  return Math.round(x * f) / f;
}
