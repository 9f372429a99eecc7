/**
 * Connects the store to the engine client: each new schema-valid draft is sent to the worker pool as
 * separate requests — the waveform (time, constellation, grid), the spectrum and the EVM — each in its
 * own lane, so the newest draft wins per kind and fast answers are drawn first. Answers for a draft
 * that has since been replaced are ignored; configuration errors from the engine are marked at their fields.
 */
import { DspError } from '../../dsp/errors';
import { isSuperseded, type EngineClient } from '../../worker/client';
import type { ConfigDraft } from './configValidation';
import type { AppStore } from './store';

export interface EngineControllerOptions {
  /** Called when a configuration goes to the engine (the update timer marks it). */
  onSubmit?: (seq: number) => void;
}

const describe = (error: unknown) => (error instanceof Error ? error.message : String(error));

export function connectEngine(store: AppStore, client: EngineClient, options: EngineControllerOptions = {}): () => void {
  const current = (draft: ConfigDraft) => store.getState().submittedDraft === draft;

  const run = (draft: ConfigDraft): void => {
    const state = store.getState();
    const seq = state.submittedSeq;
    options.onSubmit?.(seq);
    state.requestStarted();
    client.generate(draft).then(
      (result) => {
        if (current(draft)) store.getState().requestSucceeded(result, seq);
      },
      (error: unknown) => {
        if (isSuperseded(error) || !current(draft)) return;
        const now = store.getState();
        if (error instanceof DspError) {
          const issues = error.details?.issues;
          if (Array.isArray(issues)) now.setEngineIssues(issues as { path: string; message: string }[]);
          now.requestFailed({ code: error.code, message: error.message });
        } else {
          now.requestFailed({ code: 'INTERNAL', message: describe(error) });
        }
      },
    );
    state.measurementStarted('spectrum');
    client.spectrum(draft).then(
      (result) => {
        if (current(draft)) store.getState().measurementSucceeded('spectrum', result, seq);
      },
      (error: unknown) => {
        if (!isSuperseded(error) && current(draft)) store.getState().measurementFailed('spectrum', describe(error));
      },
    );
    state.measurementStarted('evm');
    client.evm(draft).then(
      (result) => {
        if (current(draft)) store.getState().measurementSucceeded('evm', result, seq);
      },
      (error: unknown) => {
        if (!isSuperseded(error) && current(draft)) store.getState().measurementFailed('evm', describe(error));
      },
    );
  };

  const initial = store.getState().submittedDraft;
  if (initial !== null) run(initial);
  return store.subscribe((state, previous) => {
    if (state.submittedDraft !== null && state.submittedDraft !== previous.submittedDraft) run(state.submittedDraft);
  });
}
