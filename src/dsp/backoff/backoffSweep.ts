import type { AmplifierModel } from '../amplifier/amplifierModel';
import { solveDrive } from '../amplifier/drive';
import { DspError } from '../errors';
import { recordPaprDb } from '../paprReduction/outOfBandPower';
import type { BackoffPoint } from './backoffSolver';
import { powerCcdfLevelsDb, type BackoffMetrics } from './backoffMetrics';

/** A sweep point with what the amplifier did to the envelope. */
export interface BackoffSweepPoint extends BackoffPoint {
  /** Mean output power relative to the saturated output power A_sat², dB (= −OBO). */
  readonly meanOutputDbRelSat: number;
  /** Peak over mean of the amplified record, dB. */
  readonly paprAfterDb: number;
  /** Instantaneous-power CCDF levels after the PA, dB over the mean. */
  readonly powerCcdfDb: { readonly '1e-3': number | null; readonly '1e-4': number | null };
}

/**
 * Returns backoffDb ↦ measured point: the drive for that back-off on `axis` is solved on the actual signal
 * (amplifier/drive.ts), the signal is amplified, and EVM, ACLR and the envelope statistics are measured on the output.
 * @param signalIq the PA input at unit scale (after any PAPR reduction, windowing and impairments)
 */
export function createBackoffEvaluator(
  model: AmplifierModel,
  signalIq: Float64Array,
  metrics: BackoffMetrics,
  axis: 'obo' | 'ibo',
): (backoffDb: number) => BackoffSweepPoint {
  const outputIq = new Float64Array(signalIq.length);
  return (backoffDb) => {
    const drive = solveDrive(model, signalIq, { reference: axis, backoffDb });
    model.apply(signalIq, drive.inputScale, outputIq);
    const evm = metrics.evm(outputIq);
    const aclr = metrics.aclr(outputIq);
    return {
      backoffDb,
      iboDb: drive.iboDb,
      oboDb: drive.oboDb,
      evmRmsPercent: evm.evmRmsPercent,
      evmStandardErrorPercent: evm.evmStandardErrorPercent,
      aclrDb: aclr.aclrDb,
      aclrStandardErrorDb: aclr.standardErrorDb,
      meanOutputDbRelSat: -drive.oboDb,
      paprAfterDb: recordPaprDb(outputIq),
      powerCcdfDb: powerCcdfLevelsDb(outputIq),
    };
  };
}

/**
 * Measures the points fromDb, fromDb + stepDb, … ≤ toDb. Back-offs the amplifier cannot reach (an OBO below a
 * fold-back TWT's minimum) are skipped and listed.
 */
export function sweepBackoff(
  evaluate: (backoffDb: number) => BackoffSweepPoint,
  fromDb: number,
  toDb: number,
  stepDb: number,
): { points: BackoffSweepPoint[]; skipped: { backoffDb: number; reason: string }[] } {
  if (!(stepDb > 0) || !(toDb >= fromDb) || (toDb - fromDb) / stepDb > 400) {
    throw new DspError('INVALID_CONFIG', `Back-off sweep ${fromDb}…${toDb} dB in steps of ${stepDb} dB: need from ≤ to, step > 0 and at most 400 points.`, {
      field: 'sweep',
    });
  }
  const points: BackoffSweepPoint[] = [];
  const skipped: { backoffDb: number; reason: string }[] = [];
  const count = Math.floor((toDb - fromDb) / stepDb + 1e-9);
  for (let i = 0; i <= count; i++) {
    const backoffDb = Math.round((fromDb + i * stepDb) * 1e9) / 1e9;
    try {
      points.push(evaluate(backoffDb));
    } catch (err) {
      if (err instanceof DspError && err.code === 'INVALID_CONFIG' && err.details?.leastOboDb !== undefined) {
        skipped.push({ backoffDb, reason: err.message });
        continue;
      }
      throw err;
    }
  }
  return { points, skipped };
}
