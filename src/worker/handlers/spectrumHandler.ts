/**
 * The worker's spectrum request: the generated waveform's Welch PSD, ACLR and 99 % OBW (measureSpectrum), and —
 * when the configuration has a transmitter chain (PAPR reduction, windowing, impairments, amplifier) — the same
 * measurement of what the chain transmits, plus the amplifier's AM/AM and AM/PM. Only src/dsp calls, composed.
 */
import { parseWaveformConfig } from '../../config/configParse';
import type { WaveformConfig } from '../../config/schema';
import { computeAmplifierCurves } from '../../dsp/amplifier/amplifierCurves';
import { createAmplifierFromConfig } from '../../dsp/amplifier/createAmplifier';
import { aclrPlanFor, computeAclr, type AclrPlan, type AclrResult } from '../../dsp/metrics/aclr';
import { describeFilter, filterNoiseBandwidthHz } from '../../dsp/metrics/channelFilter';
import { computeOccupiedBandwidth, type OccupiedBandwidth } from '../../dsp/metrics/occupiedBandwidth';
import { measureSpectrum } from '../../dsp/metrics/spectrumMeasurement';
import { computeWelchPsd, type PowerSpectrum } from '../../dsp/metrics/welchPsd';
import { applyTransmitterChain } from '../../dsp/transmitter/transmitterChain';
import { generateWaveform } from '../../dsp/waveform/waveformGenerator';
import { createWaveformPlan } from '../../dsp/waveform/waveformPlan';
import type { EngineDispatchHost, HandlerOutput } from '../engineDispatch';
import type { AmplifierPayload, MeasurementBand, SpectrumPayload } from '../measurementTypes';
import { PROTOCOL_VERSION, type SpectrumRequest, type SpectrumResponse } from '../protocol';

/** Symbols the interactive spectrum analyses at least and at most (a subframe up to ten). */
export const SPECTRUM_SYMBOLS_MIN = 14;
export const SPECTRUM_SYMBOLS_MAX = 140;

/** True when the configuration has a block after generation that changes the transmitted samples. */
export function hasTransmitterChain(config: WaveformConfig): boolean {
  return config.paprReduction !== undefined || config.windowing !== undefined || config.impairments !== undefined || config.amplifier !== undefined;
}

/** The channels of the engine's ACLR plan, for shading on the plot. */
export function measurementBands(plan: AclrPlan): MeasurementBand[] {
  return [
    { key: 'assigned', label: 'assigned channel', centreHz: 0, widthHz: filterNoiseBandwidthHz(plan.assignedFilter), filter: describeFilter(plan.assignedFilter) },
    ...plan.channels.map((c) => ({ key: c.key, label: c.label, centreHz: c.offsetHz, widthHz: filterNoiseBandwidthHz(c.filter), filter: describeFilter(c.filter) })),
  ];
}

function packSpectrum(
  psd: PowerSpectrum,
  aclr: AclrResult,
  occupiedBandwidth: OccupiedBandwidth,
  facts: { oversampling: number; symbols: number; source: string; warnings: string[]; bands: MeasurementBand[] },
): SpectrumPayload {
  return {
    frequenciesHz: Float64Array.from(psd.frequenciesHz).buffer,
    psdPerHz: Float64Array.from(psd.psdPerHz).buffer,
    binWidthHz: psd.binWidthHz,
    rbwHz: psd.rbwHz,
    sampleRateHz: psd.sampleRateHz,
    window: psd.window,
    segmentLength: psd.segmentLength,
    numSegments: psd.numSegments,
    aclr,
    occupiedBandwidth,
    ...facts,
  };
}

export function runSpectrumRequest(request: SpectrumRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const config = parseWaveformConfig(request.config);
  const symbols = request.symbols ?? Math.min(SPECTRUM_SYMBOLS_MAX, Math.max(SPECTRUM_SYMBOLS_MIN, config.symbols));
  const measured = measureSpectrum(config, { oversampling: config.oversampling, symbols });
  const bands = measurementBands(aclrPlanFor(createWaveformPlan({ ...config, oversampling: 1 }).numerology));
  const waveform = packSpectrum(measured.psd, measured.aclr, measured.occupiedBandwidth, {
    bands,
    oversampling: measured.oversampling,
    symbols: measured.symbols,
    source: `generated waveform (${measured.dataSource} data)`,
    warnings: [...measured.warnings],
  });

  let transmitted: SpectrumPayload | null = null;
  let amplifier: AmplifierPayload | null = null;
  if (hasTransmitterChain(config)) {
    // The same record measureSpectrum analysed (rate, symbols, data), through the configured transmitter.
    const runConfig: WaveformConfig = { ...config, oversampling: measured.oversampling, symbols: measured.symbols };
    const wave = generateWaveform(runConfig);
    const chain = applyTransmitterChain(wave, runConfig);
    const psd = computeWelchPsd(chain.outputIq, { sampleRateHz: wave.sampleRateHz, rbwHz: wave.plan.numerology.channelBandwidthHz / 1000, window: 'hann' });
    transmitted = packSpectrum(psd, computeAclr(psd, aclrPlanFor(wave.plan.numerology)), computeOccupiedBandwidth(psd), {
      oversampling: measured.oversampling,
      symbols: measured.symbols,
      bands,
      source: chain.report.steps.join(' → '),
      warnings: chain.warnings,
    });
    if (config.amplifier !== undefined) {
      const model = createAmplifierFromConfig(config.amplifier);
      const curves = computeAmplifierCurves(model);
      amplifier = {
        description: model.description,
        inputDbRelSat: curves.inputDbRelSat.buffer as ArrayBuffer,
        outputDbRelSat: curves.outputDbRelSat.buffer as ArrayBuffer,
        gainCompressionDb: curves.gainCompressionDb.buffer as ArrayBuffer,
        phaseDeg: curves.phaseDeg.buffer as ArrayBuffer,
        inputP1dbRelSatDb: curves.inputP1dbRelSatDb,
        drive: chain.report.amplifier?.drive ?? null,
        memoryless: model.memoryless,
      };
    }
  }
  const response: SpectrumResponse = {
    type: 'spectrum-result',
    id: request.id,
    protocolVersion: PROTOCOL_VERSION,
    config,
    waveform,
    transmitted,
    amplifier,
    elapsedMs: host.now() - startMs,
  };
  const transfer: ArrayBuffer[] = [waveform.frequenciesHz, waveform.psdPerHz];
  if (transmitted) transfer.push(transmitted.frequenciesHz, transmitted.psdPerHz);
  if (amplifier) transfer.push(amplifier.inputDbRelSat, amplifier.outputDbRelSat, amplifier.gainCompressionDb, amplifier.phaseDeg);
  return { response, transfer };
}
