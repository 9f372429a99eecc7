/**
 * The comparison table: one row per pinned scenario with its key figures and their differences from the baseline.
 * Figures are the engine's (spectrum ACLR/OBW, back-off answer); this helper only picks, formats and subtracts.
 */
import type { SavedScenario } from '../persist/workspaceArchive';
import type { ScenarioMeasurement } from '../state/measurementsSlice';
import { configDifferences, describeDifference } from './configDifferences';

/** A figure that better values move one way: "lower" (back-off, PAPR) or "higher" (ACLR). */
export interface ComparisonColumn {
  id: string;
  label: string;
  unit: string;
  better: 'lower' | 'higher';
  /** Tooltip: what the figure is. */
  definition: string;
  read(measurement: ScenarioMeasurement | undefined): number | null;
}

const worstAclr = (m: ScenarioMeasurement | undefined, prefix: (key: string) => boolean): number | null => {
  const s = m?.spectrum;
  if (s === undefined) return null;
  const values = (s.transmitted ?? s.waveform).aclr.values.filter((v) => prefix(v.key)).map((v) => v.aclrDb);
  return values.length === 0 ? null : Math.min(...values);
};

export const COMPARISON_COLUMNS: readonly ComparisonColumn[] = [
  {
    id: 'ccdf-1e-4',
    label: 'CCDF 1e-4',
    unit: 'dB',
    better: 'lower',
    definition: 'Instantaneous power over the mean exceeded by 1e-4 of the samples (1024 random symbols at ≥ 4×).',
    read: (m) => m?.ccdf?.report.ccdfDb['1e-4'] ?? null,
  },
  {
    id: 'papr-1e-2',
    label: 'PAPR 1e-2',
    unit: 'dB',
    better: 'lower',
    definition: 'Symbol PAPR (peak over the run mean) exceeded by 1e-2 of the symbols.',
    read: (m) => m?.ccdf?.report.paprRunMeanDb['1e-2'] ?? null,
  },
  {
    id: 'cm',
    label: 'CM',
    unit: 'dB',
    better: 'lower',
    definition: 'Cubic metric, TS 25.101 §6.2.2 (unrounded).',
    read: (m) => m?.ccdf?.report.cubicMetricDb ?? null,
  },
  {
    id: 'aclr-same',
    label: 'ACLR1',
    unit: 'dB',
    better: 'higher',
    definition: 'E-UTRA / NR ACLR1, worse side, of the transmitted spectrum (after the amplifier when there is one).',
    read: (m) => worstAclr(m, (k) => k.startsWith('eutraL') || k.startsWith('eutraU') || k.startsWith('nrL') || k.startsWith('nrU') || k.startsWith('adjacent')),
  },
  {
    id: 'aclr-utra1',
    label: 'UTRA ACLR1',
    unit: 'dB',
    better: 'higher',
    definition: 'UTRA ACLR1, worse side, of the transmitted spectrum.',
    read: (m) => worstAclr(m, (k) => k.startsWith('utra1')),
  },
  {
    id: 'obw',
    label: '99 % OBW',
    unit: 'MHz',
    better: 'lower',
    definition: 'Occupied bandwidth holding 99 % of the power.',
    read: (m) => {
      const s = m?.spectrum;
      return s === undefined ? null : (s.transmitted ?? s.waveform).occupiedBandwidth.occupiedBandwidthHz / 1e6;
    },
  },
  {
    id: 'required-obo',
    label: 'Req. OBO',
    unit: 'dB',
    better: 'lower',
    definition: 'Least output back-off meeting the EVM and ACLR limits with the scenario’s amplifier.',
    read: (m) => m?.backoff?.analysis.requiredOboDb ?? null,
  },
];

export interface ComparisonCell {
  value: number | null;
  /** value − baseline value; null for the baseline itself or when either is unknown. */
  delta: number | null;
  /** Whether the difference is an improvement over the baseline. */
  verdict: 'better' | 'worse' | 'same' | null;
}

export interface ComparisonRow {
  scenario: SavedScenario;
  isBaseline: boolean;
  cells: Record<string, ComparisonCell>;
  differences: string[] | null;
}

/** Differences smaller than this count as "same" (the figures' display resolution). */
export const SAME_WITHIN = 0.005;

export function buildComparisonRows(
  scenarios: readonly SavedScenario[],
  measurements: Readonly<Record<string, ScenarioMeasurement>>,
  baselineId: string | null,
): ComparisonRow[] {
  const baseline = scenarios.find((s) => s.id === baselineId) ?? null;
  const baseMeasurement = baseline === null ? undefined : measurements[baseline.id];
  return scenarios.map((scenario) => {
    const m = measurements[scenario.id];
    const isBaseline = scenario.id === baseline?.id;
    const cells: Record<string, ComparisonCell> = {};
    for (const column of COMPARISON_COLUMNS) {
      const value = column.read(m);
      const base = baseline === null ? null : column.read(baseMeasurement);
      const delta = isBaseline || value === null || base === null ? null : value - base;
      const verdict =
        delta === null ? null : Math.abs(delta) < SAME_WITHIN ? 'same' : (delta < 0) === (column.better === 'lower') ? 'better' : 'worse';
      cells[column.id] = { value, delta, verdict };
    }
    const diff = baseline === null || isBaseline ? null : configDifferences(baseline.config, scenario.config);
    return { scenario, isBaseline, cells, differences: diff === null ? null : diff.map(describeDifference) };
  });
}

/** The table as CSV (scenario, each figure and its difference), for the comparison's CSV export. */
export function comparisonCsv(rows: readonly ComparisonRow[]): string {
  const header = ['scenario', 'baseline', ...COMPARISON_COLUMNS.flatMap((c) => [`${c.id}_${c.unit}`, `${c.id}_delta_${c.unit}`]), 'differs_from_baseline'];
  const quote = (v: string) => (/[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);
  const num = (v: number | null) => (v === null ? '' : String(Math.round(v * 1e4) / 1e4));
  const lines = rows.map((r) =>
    [
      quote(r.scenario.name),
      r.isBaseline ? 'yes' : 'no',
      ...COMPARISON_COLUMNS.flatMap((c) => [num(r.cells[c.id]?.value ?? null), num(r.cells[c.id]?.delta ?? null)]),
      quote((r.differences ?? []).join('; ')),
    ].join(','),
  );
  return `${[header.join(','), ...lines].join('\n')}\n`;
}
