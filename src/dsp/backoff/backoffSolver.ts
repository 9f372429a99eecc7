import { DspError } from '../errors';

/** One measured operating point of a back-off sweep. */
export interface BackoffPoint {
  /** Back-off on the sweep's axis (OBO or IBO), dB. */
  readonly backoffDb: number;
  readonly iboDb: number;
  readonly oboDb: number;
  readonly evmRmsPercent: number;
  /** Statistical standard error of the EVM estimate, % (0 when unknown). */
  readonly evmStandardErrorPercent: number;
  /** ACLR per adjacent channel key, dB (positive). */
  readonly aclrDb: Readonly<Record<string, number>>;
  /** Statistical standard error of each ACLR, dB (0 or absent when unknown). */
  readonly aclrStandardErrorDb?: Readonly<Record<string, number>>;
}

/** The limits the answer must meet; a metric without a limit is not checked. */
export interface BackoffLimits {
  /** Largest RMS EVM allowed, %. */
  readonly evmPercent?: number;
  /** Smallest ACLR allowed per adjacent channel key, dB. */
  readonly aclrDb?: Readonly<Record<string, number>>;
}

export interface BackoffSolution {
  /** 'solved': bracketed and bisected; 'below-range': the smallest back-off swept already passes; 'not-reached': the largest fails. */
  readonly status: 'solved' | 'below-range' | 'not-reached';
  /** Least back-off found to meet every limit (the passing end of the final bracket), dB; null when not reached. */
  readonly requiredBackoffDb: number | null;
  /** Final bracket [failing, passing] on the back-off axis, dB. */
  readonly bracketDb: readonly [number, number] | null;
  /** Half the final bracket width, dB. */
  readonly bisectionUncertaintyDb: number | null;
  /** Back-off uncertainty from the limiting metric's statistical error divided by its slope, dB (0 when unknown). */
  readonly statisticalUncertaintyDb: number | null;
  /** √(bisection² + statistical²), dB. */
  readonly uncertaintyDb: number | null;
  readonly limitingMetric: 'evm' | 'aclr' | null;
  /** For ACLR, the adjacent channel that limits. */
  readonly limitingChannel: string | null;
  /** The measured point at requiredBackoffDb (or the last point swept when not reached). */
  readonly point: BackoffPoint | null;
  /** Points measured during bisection, in order. */
  readonly bisectionPoints: readonly BackoffPoint[];
  readonly message: string;
}

/** Margins of a point against the limits, in dB: EVM 20·log10(limit/EVM), ACLR (ACLR − limit). ≥ 0 passes. */
export function limitMargins(point: BackoffPoint, limits: BackoffLimits): { key: string; metric: 'evm' | 'aclr'; marginDb: number }[] {
  const out: { key: string; metric: 'evm' | 'aclr'; marginDb: number }[] = [];
  if (limits.evmPercent !== undefined) out.push({ key: 'evm', metric: 'evm', marginDb: 20 * Math.log10(limits.evmPercent / point.evmRmsPercent) });
  for (const [key, limit] of Object.entries(limits.aclrDb ?? {})) {
    const value = point.aclrDb[key];
    if (value === undefined) throw new DspError('INVALID_CONFIG', `ACLR limit given for channel "${key}", which the measurement does not have; channels: ${Object.keys(point.aclrDb).join(', ')}.`);
    out.push({ key, metric: 'aclr', marginDb: value - limit });
  }
  return out;
}

function passes(point: BackoffPoint, limits: BackoffLimits): boolean {
  return limitMargins(point, limits).every((m) => m.marginDb >= 0);
}

/**
 * The least back-off that meets every limit, found on measured curves: among the swept points (ascending back-off)
 * the first one from which every larger back-off also passes is the upper end of a bracket whose lower end is the
 * point before it (which fails); the bracket is then bisected by measuring at its midpoint until it is narrower than
 * `toleranceDb`. The answer is the passing end (conservative). Its uncertainty combines half the final bracket with the
 * limiting metric's statistical error (EVM or ACLR standard error, as a margin in dB) divided by that metric's slope across
 * the swept bracket (infinite when the margin does not grow with back-off there: the answer is then noise-limited). The limiting metric is the one that fails at the bracket's lower end with the least margin at the answer.
 * @param curve measured points (any order; at least 2)
 * @param evaluate measures a new point at a back-off (used for bisection only)
 */
export function solveBackoff(
  curve: readonly BackoffPoint[],
  evaluate: (backoffDb: number) => BackoffPoint,
  limits: BackoffLimits,
  toleranceDb = 0.05,
): BackoffSolution {
  if (limits.evmPercent === undefined && Object.keys(limits.aclrDb ?? {}).length === 0) {
    throw new DspError('INVALID_CONFIG', 'The back-off solver needs at least one limit (EVM % or ACLR dB).');
  }
  if (curve.length < 2) throw new DspError('INVALID_CONFIG', `The back-off sweep needs at least 2 points; got ${curve.length}.`);
  const sorted = [...curve].sort((a, b) => a.backoffDb - b.backoffDb);
  let first = sorted.length;
  while (first > 0 && passes(sorted[first - 1]!, limits)) first--;
  const last = sorted[sorted.length - 1]!;
  const empty = { bracketDb: null, bisectionUncertaintyDb: null, statisticalUncertaintyDb: null, uncertaintyDb: null, bisectionPoints: [] };
  if (first === sorted.length) {
    const worst = limitMargins(last, limits).sort((a, b) => a.marginDb - b.marginDb)[0]!;
    return {
      ...empty,
      status: 'not-reached',
      requiredBackoffDb: null,
      limitingMetric: worst.metric,
      limitingChannel: worst.metric === 'aclr' ? worst.key : null,
      point: last,
      message: `No swept back-off up to ${last.backoffDb.toFixed(2)} dB meets the limits; ${worst.key} misses by ${(-worst.marginDb).toFixed(2)} dB there. Sweep further.`,
    };
  }
  if (first === 0) {
    return {
      ...empty,
      status: 'below-range',
      requiredBackoffDb: sorted[0]!.backoffDb,
      limitingMetric: null,
      limitingChannel: null,
      point: sorted[0]!,
      message: `The smallest back-off swept (${sorted[0]!.backoffDb.toFixed(2)} dB) already meets every limit; the answer is at most that. Sweep lower.`,
    };
  }
  const gridLo = sorted[first - 1]!;
  const gridHi = sorted[first]!;
  let lo = gridLo;
  let hi = gridHi;
  const bisectionPoints: BackoffPoint[] = [];
  while (hi.backoffDb - lo.backoffDb > toleranceDb && bisectionPoints.length < 40) {
    const mid = evaluate((lo.backoffDb + hi.backoffDb) / 2);
    bisectionPoints.push(mid);
    if (passes(mid, limits)) hi = mid;
    else lo = mid;
  }
  const failing = new Set(limitMargins(lo, limits).filter((m) => m.marginDb < 0).map((m) => m.key));
  const atAnswer = limitMargins(hi, limits).filter((m) => failing.has(m.key)).sort((a, b) => a.marginDb - b.marginDb);
  const limiting = atAnswer[0] ?? limitMargins(hi, limits).sort((a, b) => a.marginDb - b.marginDb)[0]!;
  const marginOf = (p: BackoffPoint): number => limitMargins(p, limits).find((m) => m.key === limiting.key)!.marginDb;
  const slope = (marginOf(gridHi) - marginOf(gridLo)) / (gridHi.backoffDb - gridLo.backoffDb);
  let statistical = 0;
  const marginError =
    limiting.metric === 'evm'
      ? hi.evmStandardErrorPercent > 0
        ? 20 * Math.log10(1 + hi.evmStandardErrorPercent / hi.evmRmsPercent)
        : 0
      : (hi.aclrStandardErrorDb?.[limiting.key] ?? 0);
  if (marginError > 0 && slope > 0) statistical = marginError / slope;
  else if (marginError > 0) statistical = Number.POSITIVE_INFINITY;
  const half = (hi.backoffDb - lo.backoffDb) / 2;
  return {
    status: 'solved',
    requiredBackoffDb: hi.backoffDb,
    bracketDb: [lo.backoffDb, hi.backoffDb],
    bisectionUncertaintyDb: half,
    statisticalUncertaintyDb: statistical,
    uncertaintyDb: Math.hypot(half, statistical),
    limitingMetric: limiting.metric,
    limitingChannel: limiting.metric === 'aclr' ? limiting.key : null,
    point: hi,
    bisectionPoints,
    message: `Least back-off ${hi.backoffDb.toFixed(2)} dB, limited by ${limiting.metric === 'evm' ? 'EVM' : `ACLR ${limiting.key}`} (bracket ${lo.backoffDb.toFixed(3)}…${hi.backoffDb.toFixed(3)} dB).`,
  };
}
