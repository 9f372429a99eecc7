import { describe, expect, it } from 'vitest';
import type { BackoffResult, SpectrumResult } from '../../../src/worker/client';
import { buildComparisonRows, comparisonCsv } from '../../../src/ui/compare/comparisonRows';
import { buildMetricRows } from '../../../src/ui/metrics/metricRows';
import type { ScenarioMeasurement } from '../../../src/ui/state/measurementsSlice';

// Table logic on hand-made engine results (the engine's own numbers are tested in test/dsp).

const spectrum = (eutraDb: number, utraDb: number, obwHz: number): SpectrumResult =>
  ({
    waveform: {
      aclr: {
        assignedPower: 1,
        assignedFilter: 'rect',
        method: 'm',
        values: [
          { key: 'eutraLower', label: 'E-UTRA ACLR1 −', offsetHz: -10e6, filter: 'rect', aclrDb: eutraDb + 1, source: 'TS 36.101 §6.6.2.3 (from memory — verify)' },
          { key: 'eutraUpper', label: 'E-UTRA ACLR1 +', offsetHz: 10e6, filter: 'rect', aclrDb: eutraDb, source: 'TS 36.101 §6.6.2.3 (from memory — verify)' },
          { key: 'utra1Lower', label: 'UTRA ACLR1 −', offsetHz: -7.5e6, filter: 'rrc', aclrDb: utraDb, source: 's' },
        ],
      },
      occupiedBandwidth: { occupiedBandwidthHz: obwHz, lowerHz: -obwHz / 2, upperHz: obwHz / 2, totalPower: 1 },
    },
    transmitted: null,
    amplifier: null,
  }) as unknown as SpectrumResult;
const backoff = (oboDb: number | null): BackoffResult => ({ analysis: { requiredOboDb: oboDb } }) as unknown as BackoffResult;

const scenarios = [
  { id: 'a', name: 'DFT-s-OFDM', description: '', config: { waveform: 'dft-s-ofdm' }, pinnedAtMs: 1 },
  { id: 'b', name: 'OFDM', description: '', config: { waveform: 'ofdm' }, pinnedAtMs: 2 },
];
const measurements: Record<string, ScenarioMeasurement> = {
  a: { key: 'a', errors: {}, spectrum: spectrum(34.6, 35.5, 7.13e6), backoff: backoff(4.94) },
  b: { key: 'b', errors: {}, spectrum: spectrum(32.1, 32.7, 7.16e6), backoff: backoff(6.19) },
};

describe('comparison rows', () => {
  it('subtracts the baseline and says which way is better', () => {
    const rows = buildComparisonRows(scenarios, measurements, 'b');
    const a = rows[0]!;
    expect(a.cells['required-obo']).toEqual({ value: 4.94, delta: expect.closeTo(-1.25, 12), verdict: 'better' });
    expect(a.cells['aclr-same']).toEqual({ value: 34.6, delta: expect.closeTo(2.5, 12), verdict: 'better' }); // worse side: 34.6
    expect(a.cells.obw).toEqual({ value: 7.13, delta: expect.closeTo(-0.03, 12), verdict: 'better' });
    expect(a.differences).toEqual(['waveform: ofdm → dft-s-ofdm']);
    expect(rows[1]!.isBaseline).toBe(true);
    expect(rows[1]!.cells['required-obo']!.delta).toBeNull();
  });

  it('leaves unknown figures empty, and writes the table as CSV', () => {
    const rows = buildComparisonRows(scenarios, { a: measurements.a! }, 'b');
    expect(rows[0]!.cells['required-obo']).toEqual({ value: 4.94, delta: null, verdict: null });
    const csv = comparisonCsv(buildComparisonRows(scenarios, measurements, 'b')).trim().split('\n');
    expect(csv[0]).toContain('required-obo_dB');
    // CCDF, PAPR and CM are empty here (no statistics measured in this test).
    expect(csv[1]).toBe('DFT-s-OFDM,no,,,,,,,34.6,2.5,35.5,2.8,7.13,-0.03,4.94,-1.25,waveform: ofdm → dft-s-ofdm');
  });
});

describe('metric rows', () => {
  it('shows the worse side of each ACLR with its unit, definition and standard', () => {
    const rows = buildMetricRows({ spectrum: spectrum(30, 33, 9e6), evm: null, backoff: null, hasAmplifier: false });
    const eutra = rows.find((r) => r.id === 'aclr-eutra')!;
    expect(eutra).toMatchObject({ label: 'E-UTRA ACLR1', value: '30.0', unit: 'dB', group: 'Spectrum' });
    expect(eutra.definition).toContain('Worse of the two sides');
    expect(eutra.standard).toContain('TS 36.101');
    expect(rows.find((r) => r.id === 'obw')).toMatchObject({ value: '9.000', unit: 'MHz' });
    expect(rows.find((r) => r.id === 'evm')).toMatchObject({ value: '–', unit: '%' });
    expect(rows.some((r) => r.id === 'required-obo')).toBe(false);
  });

  it('reports the back-off answer or that it was not reached', () => {
    const analysis = (requiredOboDb: number | null) =>
      ({
        analysis: {
          requiredOboDb,
          usableOutputDbm: null,
          solution: { uncertaintyDb: requiredOboDb === null ? null : 0.04, limitingMetric: 'aclr', limitingChannel: 'utra1Lower' },
          limits: { evm: null, aclr: {} },
          mpr: null,
        },
      }) as unknown as BackoffResult;
    const solved = buildMetricRows({ spectrum: null, evm: null, backoff: analysis(4.9), hasAmplifier: true });
    expect(solved.find((r) => r.id === 'required-obo')).toMatchObject({ value: '4.90 ± 0.04', status: null });
    expect(solved.find((r) => r.id === 'usable-power')).toMatchObject({ value: '-4.90', unit: 'dB re P_sat' });
    const failed = buildMetricRows({ spectrum: null, evm: null, backoff: analysis(null), hasAmplifier: true });
    expect(failed.find((r) => r.id === 'required-obo')).toMatchObject({ value: 'not reached', status: 'fail' });
  });
});
