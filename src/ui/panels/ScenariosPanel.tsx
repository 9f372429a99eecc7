import { useId, useState } from 'react';
import { configFileName, formatConfigJson } from '../persist/configFile';
import { downloadFile } from '../download';
import { useAppStore } from '../state/AppStoreContext';
import { MAX_PINNED } from '../state/scenariosSlice';

const statusText: Record<string, string> = {
  off: 'Not saved (storage unavailable)',
  loading: 'Reading saved scenarios…',
  saving: 'Saving…',
  saved: 'Saved in this browser',
  failed: 'Saving failed',
};

/** Pinned scenarios: pin the current configuration, choose the baseline, open, export or remove. */
export function ScenariosPanel() {
  const scenarios = useAppStore((state) => state.scenarios);
  const baselineId = useAppStore((state) => state.baselineId);
  const persistence = useAppStore((state) => state.persistence);
  const scenarioName = useAppStore((state) => state.scenarioName);
  const pinCurrent = useAppStore((state) => state.pinCurrent);
  const unpin = useAppStore((state) => state.unpin);
  const setBaseline = useAppStore((state) => state.setBaseline);
  const openScenario = useAppStore((state) => state.openScenario);
  const renameScenario = useAppStore((state) => state.renameScenario);
  const [name, setName] = useState('');
  const [pinError, setPinError] = useState<string | null>(null);
  const nameId = useId();

  const pin = () => {
    const outcome = pinCurrent(name === '' ? undefined : name, Date.now());
    if (outcome.ok) {
      setName('');
      setPinError(null);
    } else setPinError(outcome.reason);
  };

  return (
    <section className="panel scenarios-panel" aria-labelledby="scenarios-heading">
      <h2 id="scenarios-heading">Pinned scenarios</h2>
      <form
        className="pin-form"
        onSubmit={(event) => {
          event.preventDefault();
          pin();
        }}
      >
        <label htmlFor={nameId} className="visually-hidden">
          Name for the pinned scenario
        </label>
        <input id={nameId} type="text" value={name} placeholder={scenarioName || 'Scenario name'} onChange={(event) => setName(event.target.value)} />
        <button type="submit" className="button button-primary" disabled={scenarios.length >= MAX_PINNED}>
          Pin current
        </button>
      </form>
      {pinError !== null && (
        <p className="field-error" role="alert">
          {pinError}
        </p>
      )}
      {scenarios.length === 0 ? (
        <p className="muted">Nothing pinned. Pin the configuration to compare it with others on the overlays and in the table.</p>
      ) : (
        <ol className="scenario-list" aria-label="Pinned scenarios">
          {scenarios.map((scenario, i) => (
            <li key={scenario.id} data-scenario-id={scenario.id}>
              <span className={`series-swatch series-${i % 6}`} aria-hidden="true" />
              <input
                className="scenario-name-input"
                aria-label={`Name of pinned scenario ${i + 1}`}
                defaultValue={scenario.name}
                onBlur={(event) => renameScenario(scenario.id, event.target.value)}
                onKeyDown={(event) => {
                  if (event.key === 'Enter') (event.target as HTMLInputElement).blur();
                }}
              />
              <label className="baseline-choice">
                <input
                  type="radio"
                  name="baseline"
                  checked={baselineId === scenario.id}
                  onChange={() => setBaseline(scenario.id)}
                  aria-label={`Use ${scenario.name} as the baseline`}
                />
                baseline
              </label>
              <span className="scenario-actions">
                <button type="button" className="small-button" onClick={() => openScenario(scenario.id)} aria-label={`Open ${scenario.name} in the form`}>
                  Open
                </button>
                <button
                  type="button"
                  className="small-button"
                  aria-label={`Save ${scenario.name} as JSON`}
                  onClick={() => downloadFile(formatConfigJson(scenario.config), configFileName(scenario.name), 'application/json')}
                >
                  JSON
                </button>
                <button type="button" className="icon-button" onClick={() => unpin(scenario.id)} aria-label={`Remove ${scenario.name}`}>
                  ×
                </button>
              </span>
            </li>
          ))}
        </ol>
      )}
      <p className={`persistence persistence-${persistence.status}`} role={persistence.status === 'failed' ? 'alert' : 'status'} data-persistence={persistence.status}>
        {statusText[persistence.status]}
        {persistence.message !== null && persistence.status === 'failed' ? `: ${persistence.message}` : ''}
      </p>
    </section>
  );
}
