/**
 * The configuration being edited. `draft` is what the form holds; every change is checked against
 * the schema at once. A draft that passes becomes `submittedDraft` (a new object each time), which
 * the engine controller sends to the worker; engine-side issues come back through `setEngineIssues`.
 */
import type { StateCreator } from 'zustand';
import type { ConfigIssue } from '../../config/configParse';
import type { Scenario } from '../../scenarios/demoScenario';
import { applyFieldChange } from '../form/draftTransitions';
import { checkDraftAgainstSchema, issuesByPath, type ConfigDraft } from './configValidation';
import type { AppState } from './store';

export interface ConfigSlice {
  scenarioName: string;
  scenarioDescription: string;
  draft: ConfigDraft;
  /** Messages by dotted field path, from the schema check or from the engine. */
  fieldErrors: Readonly<Record<string, string>>;
  /** The latest schema-valid draft, for the engine; unchanged while the draft is invalid. */
  submittedDraft: ConfigDraft | null;
  /** Counts submitted drafts; results carry the number of the draft they answer. */
  submittedSeq: number;
  loadScenario(scenario: Scenario): void;
  /**
   * Sets the field at dotted `path` ("oversampling", "data.seed", "allocation"); `undefined` removes it
   * so the schema default applies. Fields the change makes meaningless go too (draftTransitions.ts).
   */
  setField(path: string, value: unknown): void;
  /** Replaces the whole draft (an imported or restored configuration), keeping the scenario name. */
  replaceDraft(draft: ConfigDraft, scenarioName?: string, scenarioDescription?: string): void;
  setEngineIssues(issues: readonly ConfigIssue[]): void;
  /** Sends the submitted draft again (e.g. after the worker crashed). */
  resubmit(): void;
}

function applyDraft(
  draft: ConfigDraft,
  seq: number,
): Pick<ConfigSlice, 'draft' | 'fieldErrors'> & Partial<Pick<ConfigSlice, 'submittedDraft' | 'submittedSeq'>> {
  const issues = checkDraftAgainstSchema(draft);
  if (issues.length > 0) return { draft, fieldErrors: issuesByPath(issues) };
  return { draft, fieldErrors: {}, submittedDraft: draft, submittedSeq: seq + 1 };
}

export const createConfigSlice: StateCreator<AppState, [], [], ConfigSlice> = (set, get) => ({
  scenarioName: '',
  scenarioDescription: '',
  draft: {},
  fieldErrors: {},
  submittedDraft: null,
  submittedSeq: 0,
  loadScenario: (scenario) =>
    set({
      scenarioName: scenario.name,
      scenarioDescription: scenario.description,
      ...applyDraft(structuredClone(scenario.config) as ConfigDraft, get().submittedSeq),
    }),
  setField: (path, value) => set((state) => applyDraft(applyFieldChange(state.draft, path, value), state.submittedSeq)),
  replaceDraft: (draft, scenarioName, scenarioDescription) =>
    set((state) => ({
      scenarioName: scenarioName ?? state.scenarioName,
      scenarioDescription: scenarioDescription ?? state.scenarioDescription,
      ...applyDraft(structuredClone(draft), state.submittedSeq),
    })),
  setEngineIssues: (issues) => set({ fieldErrors: issuesByPath(issues) }),
  resubmit: () =>
    set((state) =>
      state.submittedDraft === null ? {} : { submittedDraft: { ...state.submittedDraft }, submittedSeq: state.submittedSeq + 1 },
    ),
});
