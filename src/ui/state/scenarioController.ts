/**
 * Measures every pinned scenario in the background — its spectrum and, with an amplifier, its back-off — so
 * the overlays and the comparison table have them. Each scenario has its own lanes, so a changed or removed
 * scenario's stale requests are superseded; results are keyed by the scenario's configuration JSON.
 */
import { isSuperseded, type EngineClient } from '../../worker/client';
import type { SavedScenario } from '../persist/workspaceArchive';
import type { AppStore } from './store';

export const scenarioKey = (scenario: Pick<SavedScenario, 'config'>) => JSON.stringify(scenario.config);

const lanes = (id: string) => ({ spectrum: `scenario:${id}:spectrum`, backoff: `scenario:${id}:backoff`, ccdf: `scenario:${id}:ccdf` });

/** Statistics of a pinned scenario: eight engine blocks (1024 symbols), enough for PAPR to 1e-2 and the CCDF to 1e-4. */
export const SCENARIO_CCDF = { symbols: 1024, precision: 'f32' } as const;

export function connectScenarioMeasurements(store: AppStore, client: EngineClient): () => void {
  const requested = new Map<string, string>(); // scenario id → key last requested

  const measure = (scenario: SavedScenario): void => {
    const key = scenarioKey(scenario);
    if (requested.get(scenario.id) === key) return;
    requested.set(scenario.id, key);
    const lane = lanes(scenario.id);
    const stillWanted = () => store.getState().scenarios.some((s) => s.id === scenario.id && scenarioKey(s) === key);
    client.spectrum(scenario.config, { lane: lane.spectrum, priority: 'background' }).then(
      (result) => stillWanted() && store.getState().scenarioMeasured(scenario.id, key, 'spectrum', result),
      (error: unknown) => !isSuperseded(error) && stillWanted() && store.getState().scenarioMeasurementFailed(scenario.id, key, 'spectrum', String((error as Error).message ?? error)),
    );
    client.ccdf(scenario.config, SCENARIO_CCDF, { lane: lane.ccdf, priority: 'background' }).then(
      (result) => stillWanted() && store.getState().scenarioMeasured(scenario.id, key, 'ccdf', result),
      (error: unknown) => !isSuperseded(error) && stillWanted() && store.getState().scenarioMeasurementFailed(scenario.id, key, 'ccdf', String((error as Error).message ?? error)),
    );
    if (scenario.config.amplifier !== undefined) {
      client.backoff(scenario.config, { lane: lane.backoff, priority: 'background' }).then(
        (result) => stillWanted() && store.getState().scenarioMeasured(scenario.id, key, 'backoff', result),
        (error: unknown) => !isSuperseded(error) && stillWanted() && store.getState().scenarioMeasurementFailed(scenario.id, key, 'backoff', String((error as Error).message ?? error)),
      );
    }
  };

  const sync = (scenarios: readonly SavedScenario[]): void => {
    const ids = scenarios.map((s) => s.id);
    for (const id of [...requested.keys()]) {
      if (!ids.includes(id)) {
        requested.delete(id);
        client.pool.cancelLane(lanes(id).spectrum);
        client.pool.cancelLane(lanes(id).backoff);
        client.pool.cancelLane(lanes(id).ccdf);
      }
    }
    store.getState().dropScenarioMeasurements(ids);
    for (const scenario of scenarios) measure(scenario);
  };

  sync(store.getState().scenarios);
  return store.subscribe((state, previous) => {
    if (state.scenarios !== previous.scenarios) sync(state.scenarios);
  });
}
