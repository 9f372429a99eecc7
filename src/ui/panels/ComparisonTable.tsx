import { useMemo } from 'react';
import { configDifferences, describeDifference } from '../compare/configDifferences';
import { useAppStore } from '../state/AppStoreContext';
import { displayName } from './configFields';

/** Short description of a configuration for the table (after the schema's defaults). */
function summarize(config: Record<string, unknown>): { carrier: string; waveform: string; allocation: string } {
  const standard = String(config.standard ?? 'lte').toUpperCase();
  const bandwidth = config.standard === 'custom' ? 'custom grid' : `${String(config.bandwidthMHz ?? 20)} MHz`;
  const link = String(config.link ?? 'uplink');
  const waveform = String(config.waveform ?? (link === 'downlink' ? 'ofdm' : 'dft-s-ofdm'));
  const blocks = config.allocation === undefined ? [] : [config.allocation].flat() as { startRb?: unknown; numRb?: unknown; modulation?: unknown }[];
  const modulation = displayName(String(config.modulation ?? 'qpsk'));
  const allocation =
    blocks.length === 0
      ? `whole grid, ${modulation}`
      : blocks.map((b) => `${String(b.numRb)} RB @${String(b.startRb)} ${displayName(String(b.modulation ?? config.modulation ?? 'qpsk'))}`).join(' + ');
  return { carrier: `${standard} ${bandwidth} ${link}`, waveform: displayName(waveform), allocation };
}

/** The pinned scenarios side by side, with what differs from the baseline. */
export function ComparisonTable() {
  const scenarios = useAppStore((state) => state.scenarios);
  const baselineId = useAppStore((state) => state.baselineId);
  const baseline = scenarios.find((s) => s.id === baselineId) ?? null;
  const rows = useMemo(
    () =>
      scenarios.map((scenario, i) => ({
        scenario,
        colour: i % 6,
        summary: summarize(scenario.config),
        differences: baseline === null || scenario.id === baseline.id ? null : configDifferences(baseline.config, scenario.config),
      })),
    [scenarios, baseline],
  );
  if (scenarios.length === 0) return null;
  return (
    <section className="panel comparison-panel plot-wide" aria-labelledby="comparison-heading" data-panel="comparison">
      <h2 id="comparison-heading">Comparison{baseline !== null && <span className="muted"> against {baseline.name}</span>}</h2>
      <div className="table-scroll">
        <table className="comparison-table">
          <thead>
            <tr>
              <th scope="col">Scenario</th>
              <th scope="col">Carrier</th>
              <th scope="col">Waveform</th>
              <th scope="col">Allocation</th>
              <th scope="col">Differs from baseline in</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(({ scenario, colour, summary, differences }) => (
              <tr key={scenario.id} className={scenario.id === baselineId ? 'is-baseline' : undefined} data-scenario-id={scenario.id}>
                <th scope="row">
                  <span className={`series-swatch series-${colour}`} aria-hidden="true" />
                  {scenario.name}
                  {scenario.id === baselineId && <span className="badge">baseline</span>}
                </th>
                <td>{summary.carrier}</td>
                <td>{summary.waveform}</td>
                <td>{summary.allocation}</td>
                <td className="differences">
                  {scenario.id === baselineId
                    ? '—'
                    : differences === null
                      ? 'not comparable (invalid configuration)'
                      : differences.length === 0
                        ? 'nothing (same configuration)'
                        : differences.map(describeDifference).join('; ')}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
