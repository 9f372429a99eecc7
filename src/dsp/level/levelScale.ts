import { DspError } from '../errors';
import { ccdfPoint, type PowerStats } from './powerStats';
import { pow } from '../math/expLog';

/**
 * How loud a file is written. Full scale (0 dBFS) is a complex sample of magnitude 1 (|x|² = 1), so a sample at
 * 0 dBFS has |I|, |Q| ≤ 1 and never clips an integer format (common practice for IQ files; see REFERENCE §9).
 * - formula: the standards' baseband formula values, unscaled (scale 1)
 * - linear: a fixed factor
 * - rms / peak: mean power or largest |x|² of the record at `levelDbfs`
 * - auto: RMS at −(CCDF level at `probability` + `marginDb`) dBFS, i.e. the power exceeded by that fraction of the
 *   record's own samples sits `marginDb` below full scale (defaults 1e-4 and 1 dB)
 */
export type LevelSpec =
  | { readonly mode: 'formula' }
  | { readonly mode: 'linear'; readonly scaleLinear: number }
  | { readonly mode: 'rms'; readonly levelDbfs: number }
  | { readonly mode: 'peak'; readonly levelDbfs: number }
  | { readonly mode: 'auto'; readonly marginDb?: number | undefined; readonly probability?: number | undefined };

/** Margin of the auto level below full scale, dB. */
export const DEFAULT_AUTO_MARGIN_DB = 1;
/** CCDF probability whose level the auto mode fits under full scale. */
export const DEFAULT_AUTO_PROBABILITY = 1e-4;

/** The scale chosen and why. */
export interface ResolvedLevel {
  readonly mode: LevelSpec['mode'];
  /** Factor applied to the formula-scale samples. */
  readonly scaleLinear: number;
  /** The level asked for (rms/peak), dBFS. */
  readonly requestedDbfs?: number | undefined;
  /** auto: the CCDF level of the record at `probability`, dB above its mean, and the margin kept. */
  readonly ccdfLevelDb?: number | undefined;
  readonly probability?: number | undefined;
  readonly marginDb?: number | undefined;
}

/** True when the spec needs the record's statistics (a pass over the data) before the scale is known. */
export function levelNeedsStats(spec: LevelSpec): boolean {
  return spec.mode === 'rms' || spec.mode === 'peak' || spec.mode === 'auto';
}

/** Checks a spec's numbers; throws DspError INVALID_CONFIG naming the field. */
export function validateLevelSpec(spec: LevelSpec): void {
  const bad = (field: string, value: unknown, allowed: string): never => {
    throw new DspError('INVALID_CONFIG', `${field} ${String(value)} is out of range: ${allowed}.`, { field });
  };
  switch (spec.mode) {
    case 'formula':
      return;
    case 'linear':
      if (!(Number.isFinite(spec.scaleLinear) && spec.scaleLinear > 0)) bad('scaleLinear', spec.scaleLinear, 'a positive, finite factor');
      return;
    case 'rms':
    case 'peak':
      if (!(Number.isFinite(spec.levelDbfs) && spec.levelDbfs >= -150 && spec.levelDbfs <= 20)) bad('levelDbfs', spec.levelDbfs, 'allowed −150 to +20 dBFS');
      return;
    case 'auto':
      if (spec.marginDb !== undefined && !(spec.marginDb >= 0 && spec.marginDb <= 40)) bad('marginDb', spec.marginDb, 'allowed 0 to 40 dB');
      if (spec.probability !== undefined && !(spec.probability > 0 && spec.probability < 1)) bad('probability', spec.probability, 'allowed between 0 and 1');
      return;
  }
}

/**
 * Resolves a level spec to the factor applied to the formula-scale record whose statistics are `stats`
 * (needed for rms, peak and auto).
 */
export function resolveLevel(spec: LevelSpec, stats: PowerStats | undefined): ResolvedLevel {
  validateLevelSpec(spec);
  if (spec.mode === 'formula') return { mode: 'formula', scaleLinear: 1 };
  if (spec.mode === 'linear') return { mode: 'linear', scaleLinear: spec.scaleLinear };
  if (!stats || stats.numSamples === 0 || !(stats.sumPower > 0)) {
    throw new DspError('INTERNAL', `Level mode "${spec.mode}" needs the statistics of a record with non-zero power.`);
  }
  const meanPower = stats.sumPower / stats.numSamples;
  if (spec.mode === 'rms') {
    return { mode: 'rms', scaleLinear: Math.sqrt(pow(10, spec.levelDbfs / 10) / meanPower), requestedDbfs: spec.levelDbfs };
  }
  if (spec.mode === 'peak') {
    return { mode: 'peak', scaleLinear: Math.sqrt(pow(10, spec.levelDbfs / 10) / stats.maxPower), requestedDbfs: spec.levelDbfs };
  }
  const probability = spec.probability ?? DEFAULT_AUTO_PROBABILITY;
  const marginDb = spec.marginDb ?? DEFAULT_AUTO_MARGIN_DB;
  const ccdfLevelDb = ccdfPoint(stats, probability).levelDb;
  const rmsDbfs = -(ccdfLevelDb + marginDb);
  return {
    mode: 'auto',
    scaleLinear: Math.sqrt(pow(10, rmsDbfs / 10) / meanPower),
    requestedDbfs: rmsDbfs,
    ccdfLevelDb,
    probability,
    marginDb,
  };
}
