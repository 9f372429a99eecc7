/**
 * The worker's back-off request: the engine's analyzeBackoff with the configuration's own amplifier and the same
 * defaults as `crestline backoff` (sweep 1…15 dB in 1 dB steps, bisection to 0.05 dB, the standard's limits), so the
 * panel and the CLI give the same answer. The analysis is plain data and is passed through unchanged.
 */
import { parseWaveformConfig } from '../../config/configParse';
import { createAmplifierFromConfig } from '../../dsp/amplifier/createAmplifier';
import { analyzeBackoff } from '../../dsp/backoff/backoffAnalysis';
import { DspError } from '../../dsp/errors';
import type { EngineDispatchHost, HandlerOutput } from '../engineDispatch';
import { PROTOCOL_VERSION, type BackoffRequest, type BackoffResponse } from '../protocol';

/** Sweep defaults of `crestline backoff` (src/cli/commands/backoff.ts). */
export const BACKOFF_SWEEP = { fromDb: 1, toDb: 15, stepDb: 1, toleranceDb: 0.05 } as const;

export function runBackoffRequest(request: BackoffRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const config = parseWaveformConfig(request.config);
  if (config.amplifier === undefined) {
    throw new DspError('INVALID_CONFIG', 'amplifier: the back-off analysis needs an amplifier model; switch one on under Amplifier.', { field: 'amplifier' });
  }
  const analysis = analyzeBackoff(config, {
    model: createAmplifierFromConfig(config.amplifier),
    axis: config.amplifier.backoffReference,
    ...BACKOFF_SWEEP,
    ...(request.psatDbm !== undefined ? { psatDbm: request.psatDbm } : {}),
  });
  const response: BackoffResponse = { type: 'backoff-result', id: request.id, protocolVersion: PROTOCOL_VERSION, config, analysis, elapsedMs: host.now() - startMs };
  return { response, transfer: [] };
}
