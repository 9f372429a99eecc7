import { useMemo } from 'react';
import { buildComparisonRows, COMPARISON_COLUMNS, comparisonCsv, type ComparisonCell } from '../compare/comparisonRows';
import { downloadFile } from '../download';
import { useAppStore } from '../state/AppStoreContext';
import { displayName } from './configFields';

/** Short description of a configuration for the table (the schema's defaults where a field is left out). */
function summarize(config: Record<string, unknown>): { carrier: string; waveform: string; allocation: string } {
  const standard = String(config.standard ?? 'lte').toUpperCase();
  const bandwidth = config.standard === 'custom' ? 'custom grid' : `${String(config.bandwidthMHz ?? 20)} MHz`;
  const link = String(config.link ?? 'uplink');
  const waveform = String(config.waveform ?? (link === 'downlink' ? 'ofdm' : 'dft-s-ofdm'));
  const blocks = config.allocation === undefined ? [] : ([config.allocation].flat() as { startRb?: unknown; numRb?: unknown; modulation?: unknown }[]);
  const modulation = displayName(String(config.modulation ?? 'qpsk'));
  const allocation =
    blocks.length === 0
      ? `whole grid, ${modulation}`
      : blocks.map((b) => `${String(b.numRb)} RB @${String(b.startRb)} ${displayName(String(b.modulation ?? config.modulation ?? 'qpsk'))}`).join(' + ');
  return { carrier: `${standard} ${bandwidth} ${link}`, waveform: displayName(waveform), allocation };
}

function Cell({ cell, digits }: { cell: ComparisonCell | undefined; digits: number }) {
  if (cell === undefined || cell.value === null) return <td className="num muted">…</td>;
  return (
    <td className="num">
      {cell.value.toFixed(digits)}
      {cell.delta !== null && (
        <span className={`delta delta-${cell.verdict ?? 'same'}`}>
          {' '}
          ({cell.delta >= 0 ? '+' : '−'}
          {Math.abs(cell.delta).toFixed(digits)})
        </span>
      )}
    </td>
  );
}

/** The pinned scenarios side by side: key figures with their differences from the baseline, and what differs. */
export function ComparisonTable() {
  const scenarios = useAppStore((state) => state.scenarios);
  const baselineId = useAppStore((state) => state.baselineId);
  const measurements = useAppStore((state) => state.scenarioMeasurements);
  const rows = useMemo(() => buildComparisonRows(scenarios, measurements, baselineId), [scenarios, measurements, baselineId]);
  const baseline = scenarios.find((s) => s.id === baselineId) ?? null;
  if (scenarios.length === 0) return null;
  return (
    <section className="panel comparison-panel plot-wide" aria-labelledby="comparison-heading" data-panel="comparison">
      <div className="plot-panel-head">
        <h2 id="comparison-heading">
          Scenario comparison{baseline !== null && <span className="muted"> — differences against {baseline.name}</span>}
        </h2>
        <div className="plot-actions">
          <button type="button" className="small-button" onClick={() => downloadFile(comparisonCsv(rows), 'crestline-comparison.csv', 'text/csv')}>
            CSV
          </button>
        </div>
      </div>
      <div className="table-scroll">
        <table className="comparison-table">
          <thead>
            <tr>
              <th scope="col">Scenario</th>
              <th scope="col">Configuration</th>
              {COMPARISON_COLUMNS.map((c) => (
                <th key={c.id} scope="col" className="num" title={c.definition}>
                  {c.label}
                  <br />
                  <span className="unit">{c.unit}</span>
                </th>
              ))}
              <th scope="col">Differs from baseline in</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row, i) => {
              const summary = summarize(row.scenario.config);
              return (
                <tr key={row.scenario.id} className={row.isBaseline ? 'is-baseline' : undefined} data-scenario-id={row.scenario.id}>
                  <th scope="row">
                    <span className={`series-swatch series-${i % 6}`} aria-hidden="true" />
                    {row.scenario.name}
                    {row.isBaseline && <span className="badge">baseline</span>}
                  </th>
                  <td className="config-summary">
                    {summary.carrier} · {summary.waveform}
                    <br />
                    {summary.allocation}
                  </td>
                  {COMPARISON_COLUMNS.map((c) => (
                    <Cell key={c.id} cell={row.cells[c.id]} digits={c.id === 'obw' ? 3 : 2} />
                  ))}
                  <td className="differences">
                    {row.isBaseline
                      ? '—'
                      : row.differences === null
                        ? 'not comparable (invalid configuration)'
                        : row.differences.length === 0
                          ? 'nothing (same configuration)'
                          : row.differences.join('; ')}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="plot-footnote">Differences in brackets: green is better than the baseline (higher ACLR, lower bandwidth or back-off), red worse.</p>
    </section>
  );
}
