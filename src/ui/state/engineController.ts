/**
 * Connects the store to the engine client: each new schema-valid draft is sent to the worker and
 * the answer lands in the results slice. Superseded answers are ignored (the newest request wins);
 * configuration errors from the engine are marked at their fields.
 */
import { DspError } from '../../dsp/errors';
import { isSuperseded, type EngineClient } from '../../worker/client';
import type { ConfigDraft } from './configValidation';
import type { AppStore } from './store';

export interface EngineControllerOptions {
  /** Called when a configuration goes to the engine (the update timer marks it). */
  onSubmit?: (seq: number) => void;
}

export function connectEngine(store: AppStore, client: EngineClient, options: EngineControllerOptions = {}): () => void {
  const run = (draft: ConfigDraft): void => {
    const state = store.getState();
    const seq = state.submittedSeq;
    options.onSubmit?.(seq);
    state.requestStarted();
    client.generate(draft).then(
      (result) => {
        if (store.getState().submittedDraft !== draft) return; // a newer draft is on its way
        store.getState().requestSucceeded(result, seq);
      },
      (error: unknown) => {
        if (isSuperseded(error)) return;
        const current = store.getState();
        if (error instanceof DspError) {
          const issues = error.details?.issues;
          if (Array.isArray(issues)) current.setEngineIssues(issues as { path: string; message: string }[]);
          current.requestFailed({ code: error.code, message: error.message });
        } else {
          current.requestFailed({ code: 'INTERNAL', message: error instanceof Error ? error.message : String(error) });
        }
      },
    );
  };

  const initial = store.getState().submittedDraft;
  if (initial !== null) run(initial);
  return store.subscribe((state, previous) => {
    if (state.submittedDraft !== null && state.submittedDraft !== previous.submittedDraft) run(state.submittedDraft);
  });
}
