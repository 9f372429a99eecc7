import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { DspError } from '../../../src/dsp/errors';
import { defaultScenario } from '../../../src/scenarios/demoScenario';
import { checkDraftAgainstSchema, fieldMessage, issuesByPath, unplacedIssues } from '../../../src/ui/state/configValidation';
import { createAppStore } from '../../../src/ui/state/store';

describe('config slice', () => {
  it('loads the demo scenario as a schema-valid draft ready for the engine', () => {
    const store = createAppStore();
    store.getState().loadScenario(defaultScenario);
    const state = store.getState();
    expect(state.scenarioName).toBe(defaultScenario.name);
    expect(state.draft).toEqual(defaultScenario.config);
    expect(state.draft).not.toBe(defaultScenario.config); // edits never touch the built-in scenario
    expect(state.fieldErrors).toEqual({});
    expect(state.submittedDraft).toBe(state.draft);
  });

  it('marks an invalid value at its field and keeps it from the engine', () => {
    const store = createAppStore();
    store.getState().loadScenario(defaultScenario);
    const submitted = store.getState().submittedDraft;
    store.getState().setField('oversampling', 17);
    expect(store.getState().fieldErrors).toEqual({ oversampling: 'must be a whole number from 1 to 16' });
    expect(store.getState().submittedDraft).toBe(submitted);
    store.getState().setField('oversampling', '');
    expect(store.getState().fieldErrors.oversampling).toBe('must be a whole number from 1 to 16');
    store.getState().setField('oversampling', 2);
    expect(store.getState().fieldErrors).toEqual({});
    expect(store.getState().submittedDraft).toMatchObject({ oversampling: 2 });
  });

  it('removes a field set to undefined and drops the NR-only spacing when leaving NR', () => {
    const store = createAppStore();
    store.getState().loadScenario(defaultScenario);
    store.getState().setField('standard', 'nr');
    store.getState().setField('subcarrierSpacingKHz', 15);
    expect(store.getState().draft.subcarrierSpacingKHz).toBe(15);
    store.getState().setField('standard', 'lte');
    expect('subcarrierSpacingKHz' in store.getState().draft).toBe(false);
    store.getState().setField('symbols', undefined);
    expect('symbols' in store.getState().draft).toBe(false);
  });

  it('resubmits the same draft as a new object (to rerun after a crash)', () => {
    const store = createAppStore();
    store.getState().loadScenario(defaultScenario);
    const before = store.getState().submittedDraft;
    store.getState().resubmit();
    expect(store.getState().submittedDraft).not.toBe(before);
    expect(store.getState().submittedDraft).toEqual(before);
  });
});

describe('configValidation', () => {
  // The page's schema check must say what the engine's parseWaveformConfig says for schema errors.
  const badDrafts = [
    { oversampling: 17 },
    { modulation: '8psk' },
    { symbols: 0, link: 'sideways' },
    { bandwidthMHz: 'ten' },
    { colour: 'blue' },
    { allocation: { startRb: -1, numRb: 4 } },
  ];
  it.each(badDrafts)('reports the same issues as parseWaveformConfig for %j', (draft) => {
    let engineIssues: unknown;
    try {
      parseWaveformConfig(draft);
    } catch (error) {
      engineIssues = (error as DspError).details?.issues;
    }
    expect(engineIssues).toBeDefined();
    expect(checkDraftAgainstSchema(draft)).toEqual(engineIssues);
  });

  it('passes a draft whose problems only the engine can see (cross-field rules)', () => {
    expect(checkDraftAgainstSchema({ bandwidthMHz: 7 })).toEqual([]);
    expect(() => parseWaveformConfig({ bandwidthMHz: 7 })).toThrow(DspError);
  });

  it('places nested issues under their form field and lists the rest', () => {
    const errors = issuesByPath([
      { path: 'allocation.numRb', message: 'too many RB' },
      { path: 'allocation.numRb', message: 'not a DFT size' },
      { path: '(top level)', message: 'unknown field "x"' },
    ]);
    expect(fieldMessage(errors, 'allocation')).toBe('too many RB; not a DFT size');
    expect(fieldMessage(errors, 'alloc')).toBeUndefined();
    expect(unplacedIssues(errors, ['allocation'])).toEqual(['(top level): unknown field "x"']);
  });
});

describe('view slice', () => {
  it('clamps the symbol index to the waveform', () => {
    const store = createAppStore();
    store.getState().setSymbolIndex(5); // no result yet: one symbol assumed
    expect(store.getState().symbolIndex).toBe(0);
    store.getState().setSymbolIndex(Number.NaN);
    expect(store.getState().symbolIndex).toBe(0);
  });
});
