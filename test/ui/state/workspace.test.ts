import { describe, expect, it } from 'vitest';
import { demoScenarios } from '../../../src/scenarios/demoScenario';
import { configDifferences, describeDifference } from '../../../src/ui/compare/configDifferences';
import { decodeConfigHash, encodeConfigHash } from '../../../src/ui/persist/permalink';
import { MemoryRecordStore } from '../../../src/ui/persist/recordStore';
import { createWorkspaceArchive } from '../../../src/ui/persist/workspaceArchive';
import { MAX_PINNED } from '../../../src/ui/state/scenariosSlice';
import { createAppStore } from '../../../src/ui/state/store';
import {
  connectPermalink,
  connectPersistence,
  DEMO_PIN_IDS,
  SHARED_SCENARIO_NAME,
  startWorkspace,
} from '../../../src/ui/state/workspaceController';

const wait = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('scenarios slice', () => {
  it('pins the current configuration, first pin becomes the baseline', () => {
    const store = createAppStore();
    store.getState().loadScenario(demoScenarios[0]!);
    const first = store.getState().pinCurrent('A', 1);
    store.getState().setField('modulation', 'qpsk');
    const second = store.getState().pinCurrent(undefined, 2);
    expect(first.ok && second.ok).toBe(true);
    const { scenarios, baselineId } = store.getState();
    expect(scenarios.map((s) => s.name)).toEqual(['A', demoScenarios[0]!.name]);
    expect(scenarios[1]!.config.modulation).toBe('qpsk');
    expect(scenarios[0]!.config.modulation).toBe('16qam'); // a pin is a copy
    expect(baselineId).toBe(scenarios[0]!.id);
    store.getState().unpin(scenarios[0]!.id);
    expect(store.getState().baselineId).toBe(scenarios[1]!.id);
  });

  it('refuses to pin a configuration with problems, or more than the limit', () => {
    const store = createAppStore();
    store.getState().loadScenario(demoScenarios[0]!);
    store.getState().setField('oversampling', 99);
    expect(store.getState().pinCurrent('bad', 1)).toEqual({ ok: false, reason: expect.stringContaining('has problems') });
    store.getState().setField('oversampling', 2);
    for (let i = 0; i < MAX_PINNED; i++) expect(store.getState().pinCurrent(`p${i}`, i).ok).toBe(true);
    expect(store.getState().pinCurrent('one too many', 9)).toEqual({ ok: false, reason: expect.stringContaining(`At most ${MAX_PINNED}`) });
  });

  it('opens a pinned scenario in the form', () => {
    const store = createAppStore();
    store.getState().loadScenario(demoScenarios[0]!);
    const pinned = store.getState().pinCurrent('mine', 1);
    store.getState().setField('bandwidthMHz', 5);
    if (pinned.ok) store.getState().openScenario(pinned.id);
    expect(store.getState().draft.bandwidthMHz).toBe(10);
    expect(store.getState().scenarioName).toBe('mine');
  });
});

describe('workspace start-up and saving', () => {
  it('opens the demo with both scenarios pinned and OFDM as the baseline when nothing is saved', async () => {
    const store = createAppStore();
    const outcome = await startWorkspace(store, createWorkspaceArchive(new MemoryRecordStore()), '', 5);
    expect(outcome).toEqual({ source: 'demo', notice: null });
    const state = store.getState();
    expect(state.scenarios.map((s) => s.id)).toEqual([...DEMO_PIN_IDS]);
    expect(state.baselineId).toBe(DEMO_PIN_IDS[1]);
    expect(state.draft).toEqual(demoScenarios[0]!.config);
    // The two pins differ only in the waveform (the comparison the demo makes).
    expect(configDifferences(state.scenarios[1]!.config, state.scenarios[0]!.config)?.map(describeDifference)).toEqual([
      'waveform: ofdm → dft-s-ofdm',
    ]);
  });

  it('saves changes and restores them after a “reload”, pins included', async () => {
    const records = new MemoryRecordStore<unknown>();
    const first = createAppStore();
    await startWorkspace(first, createWorkspaceArchive(records), '', 1);
    const stop = connectPersistence(first, createWorkspaceArchive(records), { debounceMs: 1 });
    first.getState().setField('modulation', '64qam');
    first.getState().pinCurrent('64QAM case', 2);
    await wait(30);
    expect(first.getState().persistence.status).toBe('saved');
    stop();

    const second = createAppStore();
    const outcome = await startWorkspace(second, createWorkspaceArchive(records), '', 3);
    expect(outcome.source).toBe('saved');
    expect(second.getState().scenarios.map((s) => s.name)).toEqual([demoScenarios[0]!.name, demoScenarios[1]!.name, '64QAM case']);
    expect(second.getState().draft.modulation).toBe('64qam');
  });

  it('says so when a save fails, and keeps the previous save', async () => {
    const records = new MemoryRecordStore<unknown>();
    const store = createAppStore();
    await startWorkspace(store, createWorkspaceArchive(records), '', 1);
    const stop = connectPersistence(store, createWorkspaceArchive(records), { debounceMs: 1 });
    store.getState().setField('modulation', 'qpsk');
    await wait(20);
    records.failNextAppends = 1;
    store.getState().setField('modulation', '256qam');
    await wait(20);
    expect(store.getState().persistence).toEqual({ status: 'failed', message: expect.stringContaining('earlier saved scenarios are kept') });
    stop();
    const restored = createAppStore();
    await startWorkspace(restored, createWorkspaceArchive(records), '', 2);
    expect(restored.getState().draft.modulation).toBe('qpsk');
  });

  it('opens a permalink’s configuration over the saved one, and reports a damaged link', async () => {
    const store = createAppStore();
    const linked = { standard: 'nr', bandwidthMHz: 50, modulation: '256qam' };
    const outcome = await startWorkspace(store, null, encodeConfigHash(linked), 1);
    expect(outcome.source).toBe('link');
    expect(store.getState().draft).toEqual(linked);
    expect(store.getState().scenarioName).toBe(SHARED_SCENARIO_NAME);
    const damaged = await startWorkspace(createAppStore(), null, '#config=%%%', 1);
    expect(damaged.notice).toContain('could not be read');
  });

  it('keeps the URL on the valid configuration being edited', async () => {
    const store = createAppStore();
    await startWorkspace(store, null, '', 1);
    const hashes: string[] = [];
    const stop = connectPermalink(store, (hash) => hashes.push(hash));
    store.getState().setField('oversampling', 40); // invalid: the link stays on the last valid one
    store.getState().setField('oversampling', 2);
    stop();
    expect(hashes).toHaveLength(2);
    expect(decodeConfigHash(hashes[1]!)).toEqual({ kind: 'config', config: { ...demoScenarios[0]!.config, oversampling: 2 } });
  });
});
