/**
 * The worker's EVM request: generate, run the configured transmitter chain, and measure EVM with known timing and
 * no channel, choosing the engine's measurement as the back-off sweep does (src/dsp/backoff/backoffMetrics.ts): the
 * reference receiver at both Annex F window positions (equaliser from the reference signals, or from the known
 * transmit grid for data-only waveforms), or — with spectrum shaping, which that receiver does not undo — the
 * known-timing grid check (src/dsp/txcheck/gridEvm.ts). Only src/dsp calls.
 */
import { parseWaveformConfig } from '../../config/configParse';
import { measureEvm } from '../../dsp/receiver/evmMeasurement';
import { applyTransmitterChain } from '../../dsp/transmitter/transmitterChain';
import { measureGridEvm } from '../../dsp/txcheck/gridEvm';
import { generateWaveform } from '../../dsp/waveform/waveformGenerator';
import type { EngineDispatchHost, HandlerOutput } from '../engineDispatch';
import type { EvmPayload } from '../measurementTypes';
import { PROTOCOL_VERSION, type EvmRequest, type EvmResponse } from '../protocol';

export function runEvmRequest(request: EvmRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const config = parseWaveformConfig(request.config);
  const wave = generateWaveform(config);
  const chain = applyTransmitterChain(wave, config);
  const shaped = wave.plan.allocations.some((a) => a.shaping !== undefined);
  const referenceOn = config.referenceSignals?.enabled === true;
  let evm: EvmPayload;
  if (shaped) {
    const r = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, chain.outputIq, { gridKinds: wave.gridKinds });
    evm = {
      method: 'known-timing grid check after matched combining of the shaped spectrum (one complex gain; TS 36.101 Annex F.2 form)',
      evmRmsPercent: r.evmRmsPercent,
      evmStandardErrorPercent: r.evmStandardErrorPercent,
      evmPeakPercent: null,
      evmLimitPercent: undefined,
      pass: undefined,
      limitSource: 'none',
      perModulation: [],
      perSymbolPercent: Array.from(r.perSymbolEvmPercent),
      perSubcarrierPercent: [],
      constellationIq: null,
      window: null,
      transmitterSteps: [...chain.report.steps],
      warnings: [...wave.warnings, ...chain.warnings],
    };
  } else {
    const { report } = measureEvm(wave.plan, chain.outputIq, {
      timing: 'known',
      knownTimingOffsetSamples: 0,
      channelEstimation: referenceOn ? 'reference' : 'known-grid',
      ...(referenceOn ? {} : { transmittedGridIq: wave.gridIq }),
    });
    evm = {
      method: `reference receiver, known timing, ZF from ${referenceOn ? 'the reference signals' : 'the known transmit grid'}, larger of the two Annex F window positions (TS 36.101 / TS 38.101-1 Annex F)`,
      evmRmsPercent: report.evmRmsPercent,
      evmStandardErrorPercent: null,
      evmPeakPercent: report.evmPeakPercent,
      evmLimitPercent: report.evmLimitPercent,
      pass: report.pass,
      limitSource: report.limitSource,
      perModulation: report.perModulation,
      perSymbolPercent: [...report.perSymbolPercent],
      perSubcarrierPercent: [...report.perSubcarrierPercent],
      constellationIq: Float64Array.from(report.constellationIq).buffer,
      window: report.window,
      transmitterSteps: [...chain.report.steps],
      warnings: [...wave.warnings, ...chain.warnings, ...report.warnings],
    };
  }
  const response: EvmResponse = { type: 'evm-result', id: request.id, protocolVersion: PROTOCOL_VERSION, config, evm, elapsedMs: host.now() - startMs };
  return { response, transfer: evm.constellationIq ? [evm.constellationIq] : [] };
}
