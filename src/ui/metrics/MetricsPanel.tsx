import { useId, useMemo } from 'react';
import { useAppStore } from '../state/AppStoreContext';
import { useCcdfResult } from '../state/useCcdfResult';
import { buildMetricRows, type MetricRow } from './metricRows';

function MetricLine({ row }: { row: MetricRow }) {
  const tipId = useId();
  return (
    <tr data-metric={row.id} className={row.status === 'fail' ? 'metric-fail' : undefined}>
      <th scope="row">
        <button type="button" className="metric-term" aria-describedby={tipId}>
          {row.label}
        </button>
        <span role="tooltip" id={tipId} className="metric-tip">
          <strong>{row.label}</strong> ({row.unit}): {row.definition}
          <br />
          <em>{row.standard}</em>
        </span>
      </th>
      <td className="num">
        <span data-value>{row.value}</span> <span className="unit">{row.unit}</span>
        {(row.limit !== null || row.status !== null) && (
          <span className="metric-limit">
            {row.limit !== null && <span>limit {row.limit}</span>}
            {row.status !== null && <span className={`verdict verdict-${row.status}`}>{row.status === 'pass' ? 'pass' : 'FAIL'}</span>}
          </span>
        )}
      </td>
    </tr>
  );
}

/** The figures of the configuration being edited, grouped, each with unit, definition and standard. */
export function MetricsPanel() {
  const spectrum = useAppStore((state) => state.spectrum);
  const evm = useAppStore((state) => state.evm);
  const backoff = useAppStore((state) => state.backoff);
  const hasAmplifier = useAppStore((state) => state.submittedDraft?.amplifier !== undefined);
  const ccdf = useCcdfResult();
  const probabilities = useAppStore((state) => state.ccdfProbabilities);
  const rows = useMemo(
    () =>
      buildMetricRows({
        spectrum: spectrum.data,
        evm: evm.data,
        backoff: backoff.data,
        hasAmplifier,
        ccdf: ccdf.result,
        probabilities,
        ccdfSource: `${ccdf.note}, ${ccdf.result?.report.symbols.toLocaleString('en') ?? '–'} symbols`,
      }),
    [spectrum.data, evm.data, backoff.data, hasAmplifier, ccdf.result, ccdf.note, probabilities],
  );
  const groups = [...new Set(rows.map((r) => r.group))];
  const busy = spectrum.status === 'running' || evm.status === 'running' || ccdf.result === null;
  return (
    <section className="panel metrics-panel" aria-labelledby="metrics-heading" aria-busy={busy}>
      <h2 id="metrics-heading">
        Measurements <span className={`status status-${busy ? 'running' : 'ready'}`}>{busy ? 'updating…' : 'current'}</span>
      </h2>
      <table className="metrics-table">
        {groups.map((group) => (
          <tbody key={group}>
            <tr className="metric-group">
              <th colSpan={2} scope="rowgroup">
                {group}
              </th>
            </tr>
            {rows
              .filter((r) => r.group === group)
              .map((row) => (
                <MetricLine key={row.id} row={row} />
              ))}
          </tbody>
        ))}
      </table>
      {(spectrum.error !== null || evm.error !== null) && (
        <p className="engine-failure" role="alert">
          {[spectrum.error, evm.error].filter(Boolean).join(' ')}
        </p>
      )}
    </section>
  );
}
