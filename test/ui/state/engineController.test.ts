import { describe, expect, it } from 'vitest';
import { defaultScenario } from '../../../src/scenarios/demoScenario';
import { connectEngine } from '../../../src/ui/state/engineController';
import { createAppStore, type AppState, type AppStore } from '../../../src/ui/state/store';
import { createEngineClient } from '../../../src/worker/client';
import { InProcessWorker } from '../../worker/inProcessWorker';

// Store + controller + client + dispatcher + engine, with only the thread replaced (inProcessWorker.ts).

function waitFor(store: AppStore, predicate: (state: AppState) => boolean, timeoutMs = 5000): Promise<AppState> {
  return new Promise((resolve, reject) => {
    if (predicate(store.getState())) return resolve(store.getState());
    const timer = setTimeout(() => {
      unsubscribe();
      reject(new Error(`state not reached within ${timeoutMs} ms; status ${store.getState().status}`));
    }, timeoutMs);
    const unsubscribe = store.subscribe((state) => {
      if (!predicate(state)) return;
      clearTimeout(timer);
      unsubscribe();
      resolve(state);
    });
  });
}

function setup() {
  const store = createAppStore();
  // A smaller variant of the demo keeps the test quick: two symbols at oversampling 1.
  store.getState().loadScenario({ ...defaultScenario, config: { ...defaultScenario.config, symbols: 2, oversampling: 1 } });
  const client = createEngineClient({ createWorker: () => new InProcessWorker() });
  const disconnect = connectEngine(store, client);
  return { store, stop: () => (disconnect(), client.dispose()) };
}

describe('engine controller', () => {
  it('runs the loaded scenario and each valid change', async () => {
    const { store, stop } = setup();
    const first = await waitFor(store, (s) => s.status === 'ready');
    expect(first.result?.config.modulation).toBe('16qam');
    expect(first.result?.waveform.numSymbols).toBe(2);
    store.getState().setSymbolIndex(5);
    expect(store.getState().symbolIndex).toBe(1); // clamped to the last symbol of this waveform
    store.getState().setField('modulation', 'qpsk');
    const second = await waitFor(store, (s) => s.status === 'ready' && s.result?.config.modulation === 'qpsk');
    expect(second.failure).toBeNull();
    stop();
  });

  it('lands on the newest of several quick changes', async () => {
    const { store, stop } = setup();
    store.getState().setField('modulation', '64qam');
    store.getState().setField('modulation', '256qam');
    const settled = await waitFor(store, (s) => s.status === 'ready');
    expect(settled.result?.config.modulation).toBe('256qam');
    stop();
  });

  it('marks an engine-side configuration error at its field and keeps the last good result', async () => {
    const { store, stop } = setup();
    const good = await waitFor(store, (s) => s.status === 'ready');
    store.getState().setField('bandwidthMHz', 7);
    const failed = await waitFor(store, (s) => s.status === 'failed');
    expect(failed.failure?.code).toBe('INVALID_CONFIG');
    expect(failed.fieldErrors.bandwidthMHz).toContain('allowed: 1.4, 3, 5, 10, 15, 20');
    expect(failed.result).toBe(good.result);
    stop();
  });
});
