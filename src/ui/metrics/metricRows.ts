/**
 * The metrics summary: one row per figure with its unit, how it is defined and which standard it follows, built
 * from the engine's results (values are formatted, never recomputed). Pure, so it is tested without a browser.
 */
import type { BackoffResult, CcdfResult, EvmResult, SpectrumResult } from '../../worker/client';

export type MetricStatus = 'pass' | 'fail' | null;

export interface MetricRow {
  id: string;
  label: string;
  /** Formatted value, or "–" while unknown. */
  value: string;
  unit: string;
  /** How the value is defined and measured (tooltip). */
  definition: string;
  /** The standard or reference it follows. */
  standard: string;
  status: MetricStatus;
  /** The limit it is checked against, formatted with its unit. */
  limit: string | null;
  group: 'Envelope' | 'Spectrum' | 'Modulation quality' | 'Amplifier';
}

export interface MetricInputs {
  spectrum: SpectrumResult | null;
  evm: EvmResult | null;
  backoff: BackoffResult | null;
  hasAmplifier: boolean;
  ccdf?: CcdfResult | null;
  /** Probability keys for the PAPR and CCDF rows. */
  probabilities?: readonly string[];
  /** Which run the statistics come from ("quick run", "long run"). */
  ccdfSource?: string;
}

const fixed = (v: number | null | undefined, digits: number) => (v === null || v === undefined || !Number.isFinite(v) ? '–' : v.toFixed(digits));

export const ACLR_DEFINITION =
  'Adjacent channel leakage ratio: filtered mean power in the assigned channel over the filtered mean power centred on the adjacent channel, from the Welch PSD integrated through each channel filter.';

function standardOfAclr(source: string): string {
  return source.replace(/ \(from memory — verify\)/, ' (limits from memory — verify)');
}

/** Rows for the spectrum: ACLR per adjacent channel (worst of lower/upper), 99 % OBW. */
function spectrumRows(spectrum: SpectrumResult | null): MetricRow[] {
  const primary = spectrum === null ? null : (spectrum.transmitted ?? spectrum.waveform);
  const rows: MetricRow[] = [];
  const values = primary?.aclr.values ?? [];
  const pairs = new Map<string, (typeof values)[number][]>();
  for (const v of values) {
    const name = v.label.replace(/ [−+]$/, '');
    pairs.set(name, [...(pairs.get(name) ?? []), v]);
  }
  for (const [name, both] of pairs) {
    const worst = both.reduce((a, b) => (b.aclrDb < a.aclrDb ? b : a));
    rows.push({
      id: `aclr-${worst.key.replace(/(Lower|Upper)$/, '')}`,
      label: name,
      value: fixed(worst.aclrDb, 1),
      unit: 'dB',
      definition: `${ACLR_DEFINITION} Worse of the two sides (${both.map((v) => `${v.label.slice(-1)} ${fixed(v.aclrDb, 1)} dB`).join(', ')}); offset ±${fixed(Math.abs(worst.offsetHz) / 1e6, 2)} MHz, filter ${worst.filter}.`,
      standard: standardOfAclr(worst.source),
      status: null,
      limit: null,
      group: 'Spectrum',
    });
  }
  if (rows.length === 0) {
    rows.push({ id: 'aclr', label: 'ACLR', value: '–', unit: 'dB', definition: ACLR_DEFINITION, standard: 'TS 36.101 §6.6.2.3 / TS 38.101-1 §6.5.2.4', status: null, limit: null, group: 'Spectrum' });
  }
  const obw = primary?.occupiedBandwidth;
  rows.push({
    id: 'obw',
    label: 'Occupied bandwidth',
    value: obw === undefined ? '–' : fixed(obw.occupiedBandwidthHz / 1e6, 3),
    unit: 'MHz',
    definition: 'Width containing 99 % of the total integrated power of the spectrum, 0.5 % left outside on each side (crossings interpolated within the PSD bin).',
    standard: 'TS 36.101 §6.6.1 / TS 38.101-1 §6.5.1 (from memory — verify)',
    status: null,
    limit: null,
    group: 'Spectrum',
  });
  return rows;
}

function evmRows(evm: EvmResult | null): MetricRow[] {
  const e = evm?.evm ?? null;
  const limit = e?.evmLimitPercent;
  return [
    {
      id: 'evm',
      label: 'EVM (RMS)',
      value: e === null ? '–' : fixed(e.evmRmsPercent, e.evmRmsPercent < 1 ? 3 : 2),
      unit: '%',
      definition: `Error vector magnitude: √(Σ|z′ − i|² / (N·P0)) over the allocated data elements after equalisation; ${e?.method ?? 'reference receiver, known timing, no channel'}.`,
      standard: e === null || e.limitSource === 'none' ? 'TS 36.101 Annex F / TS 38.101-1 Annex F' : `Annex F method; limit ${e.limitSource}`,
      status: e?.pass === undefined ? null : e.pass ? 'pass' : 'fail',
      limit: limit === undefined ? null : `≤ ${limit} %`,
      group: 'Modulation quality',
    },
  ];
}

function amplifierRows(spectrum: SpectrumResult | null): MetricRow[] {
  const drive = spectrum?.amplifier?.drive;
  if (drive === undefined || drive === null) return [];
  return [
    {
      id: 'obo',
      label: 'Output back-off (configured)',
      value: fixed(drive.oboDb, 2),
      unit: 'dB',
      definition: 'OBO = 10·log10(A_sat² / P_out,avg), measured on the amplified waveform at the configured drive.',
      standard: 'common practice (PA back-off definitions)',
      status: null,
      limit: null,
      group: 'Amplifier',
    },
    {
      id: 'ibo',
      label: 'Input back-off',
      value: fixed(drive.iboDb, 2),
      unit: 'dB',
      definition: 'IBO = 10·log10(r_sat² / P_in,avg) at the drive that gives the configured back-off.',
      standard: 'common practice (PA back-off definitions)',
      status: null,
      limit: null,
      group: 'Amplifier',
    },
  ];
}

export function buildMetricRows(inputs: MetricInputs): MetricRow[] {
  return [
    ...envelopeRows(inputs.ccdf ?? null, inputs.probabilities ?? [], inputs.ccdfSource ?? 'quick run'),
    ...evmRows(inputs.evm),
    ...spectrumRows(inputs.spectrum), ...amplifierRows(inputs.spectrum), ...backoffRows(inputs.backoff, inputs.hasAmplifier)];
}

/** Rows for the back-off answer: required OBO with its uncertainty and what limits it, usable output, MPR context. */
export function backoffRows(backoff: BackoffResult | null, hasAmplifier: boolean): MetricRow[] {
  if (!hasAmplifier) return [];
  const a = backoff?.analysis ?? null;
  const s = a?.solution ?? null;
  const limiting = s === null || s.limitingMetric === null ? '' : s.limitingMetric === 'evm' ? 'limited by EVM' : `limited by ACLR ${s.limitingChannel ?? ''}`;
  const rows: MetricRow[] = [
    {
      id: 'required-obo',
      label: 'Required back-off',
      value: a === null ? '–' : a.requiredOboDb === null ? 'not reached' : `${fixed(a.requiredOboDb, 2)}${s?.uncertaintyDb ? ` ± ${fixed(s.uncertaintyDb, 2)}` : ''}`,
      unit: 'dB',
      definition: `Least output back-off at which EVM and every ACLR meet their limits: swept 1–15 dB, then bracketed and bisected; uncertainty from the bracket and the limiting metric's statistical error over its slope${limiting ? `; ${limiting}` : ''}.`,
      standard: a === null ? 'limits: TS 36.101 / TS 38.101-1' : `EVM ${a.limits.evm?.source ?? 'no limit'}; ACLR ${Object.values(a.limits.aclr)[0]?.source ?? 'no limit'}`,
      status: a === null ? null : a.requiredOboDb === null ? 'fail' : null,
      limit: null,
      group: 'Amplifier',
    },
    {
      id: 'usable-power',
      label: 'Usable mean output',
      value: a === null || a.requiredOboDb === null ? '–' : a.usableOutputDbm !== null ? fixed(a.usableOutputDbm, 2) : fixed(-a.requiredOboDb, 2),
      unit: a?.usableOutputDbm !== null && a?.usableOutputDbm !== undefined ? 'dBm' : 'dB re P_sat',
      definition: 'Mean output power the amplifier can deliver while meeting the limits: P_sat − required OBO.',
      standard: 'common practice (PA back-off definitions)',
      status: null,
      limit: null,
      group: 'Amplifier',
    },
  ];
  if (a?.mpr) {
    rows.push({
      id: 'mpr',
      label: 'MPR allowance',
      value: `≤ ${fixed(a.mpr.maxMprDb, 1)}`,
      unit: 'dB',
      definition: `Maximum power reduction the standard allows for this allocation (${a.mpr.condition}), for comparison with the measured back-off.`,
      standard: a.mpr.source,
      status: null,
      limit: null,
      group: 'Amplifier',
    });
  }
  return rows;
}

/** Rows for the envelope: PAPR and power CCDF at the chosen probabilities (with 95 % intervals), cubic metric, crest factor. */
export function envelopeRows(ccdf: CcdfResult | null, probabilities: readonly string[], source: string): MetricRow[] {
  const r = ccdf?.report ?? null;
  const ci = (interval: readonly [number | null, number | null] | null | undefined) =>
    interval === null || interval === undefined || interval[0] === null || interval[1] === null ? '' : ` (95 %: ${interval[0].toFixed(2)}…${interval[1].toFixed(2)})`;
  const rows: MetricRow[] = [];
  for (const key of probabilities) {
    const k = key as keyof NonNullable<typeof r>['paprRunMeanDb'];
    rows.push({
      id: `papr-${key}`,
      label: `PAPR at ${key}`,
      value: r === null ? '–' : r.paprRunMeanDb[k] === null ? 'n/a' : fixed(r.paprRunMeanDb[k], 2),
      unit: 'dB',
      definition: `Level exceeded by a fraction ${key} of OFDM symbols: ${r?.paprRunMeanDefinition ?? 'peak |x|² of each symbol over the mean power'}${r === null ? '' : ci(r.paprRunMeanCi95Db[k])}. "n/a": too few symbols for ten beyond that probability (${source}).`,
      standard: 'common practice (van Nee & Prasad 2000, ch. 6); levels and Wilson 95 % intervals from the measurement engine',
      status: null,
      limit: null,
      group: 'Envelope',
    });
  }
  for (const key of probabilities) {
    const k = key as keyof NonNullable<typeof r>['ccdfDb'];
    rows.push({
      id: `ccdf-${key}`,
      label: `Power CCDF at ${key}`,
      value: r === null ? '–' : r.ccdfDb[k] === null ? 'n/a' : fixed(r.ccdfDb[k], 2),
      unit: 'dB',
      definition: `Instantaneous power over the mean exceeded by a fraction ${key} of the samples: ${r?.ccdfDefinition ?? ''}${r === null ? '' : ci(r.ccdfCi95Db[k])} (${source}).`,
      standard: 'common practice (CCDF of |x|², van Nee & Prasad 2000, ch. 6)',
      status: null,
      limit: null,
      group: 'Envelope',
    });
  }
  rows.push({
    id: 'cm',
    label: 'Cubic metric',
    value: r === null ? '–' : fixed(r.cubicMetricDb, 2),
    unit: 'dB',
    definition: `${r?.cubicMetricDefinition ?? 'CM = (20·log10 rms(v_norm³) − 1.52 dB) / 1.56'}; raw ${r === null ? '–' : fixed(r.cubicMetricRawDb, 2)} dB.`,
    standard: 'TS 25.101 §6.2.2 (unrounded, the LTE study form)',
    status: null,
    limit: null,
    group: 'Envelope',
  });
  rows.push({
    id: 'crest',
    label: 'Crest factor (run)',
    value: r === null ? '–' : fixed(r.crestFactorDb, 2),
    unit: 'dB',
    definition: `Largest |x|² of the whole Monte-Carlo run over its mean power; grows with the run length (${source}).`,
    standard: 'common practice',
    status: null,
    limit: null,
    group: 'Envelope',
  });
  return rows;
}
