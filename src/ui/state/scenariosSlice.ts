/**
 * Pinned scenarios: named copies of configurations that overlay on the CCDF, spectrum and back-off
 * plots and line up in the comparison table, one of them the baseline the others are compared with.
 * Persistence (persistenceController.ts) saves them; this slice only holds and edits them.
 */
import type { StateCreator } from 'zustand';
import type { Scenario } from '../../scenarios/demoScenario';
import type { SavedScenario, Workspace } from '../persist/workspaceArchive';
import type { AppState } from './store';

/** Most scenarios pinned at once (each costs a background measurement and a trace per overlay). */
export const MAX_PINNED = 6;

export type PersistenceStatus = 'off' | 'loading' | 'saving' | 'saved' | 'failed';

export interface ScenariosSlice {
  scenarios: SavedScenario[];
  baselineId: string | null;
  persistence: { status: PersistenceStatus; message: string | null };
  /**
   * Pins the configuration being edited under `name` (default: the scenario name). Refused, with a
   * reason, while the draft has problems or when MAX_PINNED scenarios are pinned.
   */
  pinCurrent(name: string | undefined, nowMs: number): { ok: true; id: string } | { ok: false; reason: string };
  unpin(id: string): void;
  renameScenario(id: string, name: string): void;
  setBaseline(id: string | null): void;
  /** Loads a pinned scenario into the form. */
  openScenario(id: string): void;
  /** Pins built-in scenarios with fixed ids (the demo), replacing any pins. */
  pinBuiltIn(scenarios: readonly { id: string; scenario: Scenario }[], baselineId: string | null, nowMs: number): void;
  restoreWorkspace(workspace: Workspace): void;
  setPersistence(status: PersistenceStatus, message?: string | null): void;
}

let idCounter = 0;
function newScenarioId(nowMs: number): string {
  idCounter += 1;
  return `scn-${nowMs.toString(36)}-${idCounter.toString(36)}`;
}

export const createScenariosSlice: StateCreator<AppState, [], [], ScenariosSlice> = (set, get) => ({
  scenarios: [],
  baselineId: null,
  persistence: { status: 'off', message: null },
  pinCurrent: (name, nowMs) => {
    const state = get();
    if (Object.keys(state.fieldErrors).length > 0 || state.submittedDraft !== state.draft) {
      return { ok: false, reason: 'The configuration has problems (marked in the form); fix them before pinning it.' };
    }
    if (state.scenarios.length >= MAX_PINNED) {
      return { ok: false, reason: `At most ${MAX_PINNED} scenarios can be pinned; remove one first.` };
    }
    const id = newScenarioId(nowMs);
    const chosen = (name ?? '').trim() || state.scenarioName.trim() || `Scenario ${state.scenarios.length + 1}`;
    const scenario: SavedScenario = {
      id,
      name: chosen,
      description: state.scenarioDescription,
      config: structuredClone(state.draft) as Record<string, unknown>,
      pinnedAtMs: nowMs,
    };
    set({ scenarios: [...state.scenarios, scenario], baselineId: state.baselineId ?? id });
    return { ok: true, id };
  },
  unpin: (id) =>
    set((state) => {
      const scenarios = state.scenarios.filter((s) => s.id !== id);
      const baselineId = state.baselineId === id ? (scenarios[0]?.id ?? null) : state.baselineId;
      return { scenarios, baselineId };
    }),
  renameScenario: (id, name) =>
    set((state) => ({
      scenarios: state.scenarios.map((s) => (s.id === id && name.trim() !== '' ? { ...s, name: name.trim() } : s)),
    })),
  setBaseline: (id) => set((state) => ({ baselineId: id === null || state.scenarios.some((s) => s.id === id) ? id : state.baselineId })),
  openScenario: (id) => {
    const scenario = get().scenarios.find((s) => s.id === id);
    if (scenario !== undefined) get().replaceDraft(scenario.config, scenario.name, scenario.description);
  },
  pinBuiltIn: (builtIn, baselineId, nowMs) =>
    set({
      scenarios: builtIn.map(({ id, scenario }) => ({
        id,
        name: scenario.name,
        description: scenario.description,
        config: structuredClone(scenario.config) as Record<string, unknown>,
        pinnedAtMs: nowMs,
      })),
      baselineId,
    }),
  restoreWorkspace: (workspace) => {
    set({
      scenarios: structuredClone(workspace.scenarios),
      baselineId: workspace.scenarios.some((s) => s.id === workspace.baselineId) ? workspace.baselineId : (workspace.scenarios[0]?.id ?? null),
    });
    get().replaceDraft(workspace.current.config, workspace.current.name, workspace.current.description);
  },
  setPersistence: (status, message = null) => set({ persistence: { status, message } }),
});
