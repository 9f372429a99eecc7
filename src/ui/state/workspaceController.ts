/**
 * Start-up and saving of the workspace:
 * - start: the newest saved snapshot gives the pinned scenarios and the configuration being edited;
 *   a permalink (#config=…) overrides the latter; with nothing saved, the demo opens with its two
 *   pinned scenarios (DFT-s-OFDM against OFDM, the OFDM case as the baseline);
 * - save: every change of the pins, the baseline or a valid configuration is saved (debounced) as a
 *   new snapshot; the status line says when a save failed, and earlier snapshots stay intact;
 * - permalink: the URL follows the configuration being edited (replaceState, no history entries).
 */
import { defaultScenario, demoScenarios } from '../../scenarios/demoScenario';
import { decodeConfigHash, encodeConfigHash } from '../persist/permalink';
import type { WorkspaceArchive } from '../persist/workspaceArchive';
import type { AppState, AppStore } from './store';

/** Ids of the demo's pinned scenarios (fixed, so a saved workspace keeps recognising them). */
export const DEMO_PIN_IDS = ['demo-dft-s-ofdm', 'demo-ofdm'] as const;

export const SHARED_SCENARIO_NAME = 'Shared configuration';

export type StartSource = 'link' | 'saved' | 'demo';

export interface StartOutcome {
  source: StartSource;
  /** Something the user should know (a damaged link, storage unavailable). */
  notice: string | null;
}

/** Loads the demo: its first scenario in the form, both pinned, the OFDM case as the baseline. */
export function loadDemo(store: AppStore, nowMs: number): void {
  const state = store.getState();
  state.loadScenario(defaultScenario);
  state.pinBuiltIn(
    demoScenarios.map((scenario, i) => ({ id: DEMO_PIN_IDS[i] ?? `demo-${i}`, scenario })),
    DEMO_PIN_IDS[1],
    nowMs,
  );
}

export async function startWorkspace(store: AppStore, archive: WorkspaceArchive | null, hash: string, nowMs: number): Promise<StartOutcome> {
  let notice: string | null = null;
  let source: StartSource = 'demo';
  store.getState().setPersistence(archive === null ? 'off' : 'loading');
  let snapshot = null;
  if (archive !== null) {
    try {
      snapshot = await archive.load();
      store.getState().setPersistence('saved');
    } catch (error) {
      notice = `Saved scenarios could not be read (${error instanceof Error ? error.message : String(error)}); changes will not be kept.`;
      store.getState().setPersistence('failed', notice);
    }
  }
  if (snapshot !== null) {
    store.getState().restoreWorkspace(snapshot);
    source = 'saved';
  } else {
    loadDemo(store, nowMs);
  }
  const link = decodeConfigHash(hash);
  if (link.kind === 'config') {
    const config = link.config;
    if (config !== null && typeof config === 'object' && !Array.isArray(config)) {
      // A reload of the page's own URL: the saved configuration is the same, keep its name.
      const same = snapshot !== null && JSON.stringify(snapshot.current.config) === JSON.stringify(config);
      if (!same) {
        store.getState().replaceDraft(config as Record<string, unknown>, SHARED_SCENARIO_NAME, 'Opened from a link; the form shows the configuration it holds.');
        source = 'link';
      }
    } else {
      notice = 'The link holds no configuration object; the last workspace is shown instead.';
    }
  } else if (link.kind === 'invalid') {
    notice = `${link.message} The last workspace is shown instead.`;
  }
  return { source, notice };
}

function workspaceOf(state: AppState) {
  const current = state.submittedDraft ?? state.draft;
  return {
    scenarios: state.scenarios,
    baselineId: state.baselineId,
    current: { name: state.scenarioName, description: state.scenarioDescription, config: { ...current } },
  };
}

export interface PersistenceOptions {
  debounceMs?: number;
  now?: () => number;
}

/** Saves the workspace after each relevant change (debounced). Returns the unsubscribe function. */
export function connectPersistence(store: AppStore, archive: WorkspaceArchive, options: PersistenceOptions = {}): () => void {
  const debounceMs = options.debounceMs ?? 300;
  const now = options.now ?? (() => Date.now());
  let timer: ReturnType<typeof setTimeout> | null = null;
  let generation = 0;

  const saveSoon = () => {
    if (timer !== null) clearTimeout(timer);
    store.getState().setPersistence('saving');
    timer = setTimeout(() => {
      timer = null;
      const mine = ++generation;
      void archive.save(workspaceOf(store.getState()), now()).then((outcome) => {
        if (mine !== generation && outcome.ok) return; // a newer save will report
        if (outcome.ok) store.getState().setPersistence('saved');
        else store.getState().setPersistence('failed', `Saving failed (${outcome.message}). Your earlier saved scenarios are kept.`);
      });
    }, debounceMs);
  };

  const unsubscribe = store.subscribe((state, previous) => {
    if (
      state.scenarios !== previous.scenarios ||
      state.baselineId !== previous.baselineId ||
      state.scenarioName !== previous.scenarioName ||
      (state.submittedDraft !== previous.submittedDraft && state.submittedDraft !== null)
    ) {
      saveSoon();
    }
  });
  return () => {
    unsubscribe();
    if (timer !== null) clearTimeout(timer);
  };
}

/** Keeps the URL's hash on the configuration being edited (valid drafts only). */
export function connectPermalink(store: AppStore, replaceHash: (hash: string) => void): () => void {
  // submittedDraft has passed the schema already (configSlice's applyDraft); an unchanged link is not written again.
  let written: string | null = null;
  const write = (state: AppState) => {
    if (state.submittedDraft === null) return;
    const hash = encodeConfigHash(state.submittedDraft);
    if (hash !== written) replaceHash(hash);
    written = hash;
  };
  write(store.getState());
  return store.subscribe((state, previous) => {
    if (state.submittedDraft !== previous.submittedDraft) write(state);
  });
}
