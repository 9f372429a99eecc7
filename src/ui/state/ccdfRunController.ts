/**
 * Starts and cancels long Monte-Carlo runs of the configuration being edited (src/worker/ccdfRun.ts over the pool)
 * and feeds their progress and partial reports into the store. One run at a time: a new run cancels the previous.
 */
import { startCcdfRun, type CcdfRunHandle } from '../../worker/ccdfRun';
import type { EngineClient } from '../../worker/client';
import type { AppStore } from './store';

export interface CcdfRunControls {
  /** Runs the current valid configuration with the chosen symbols and precision; false when the form has problems. */
  start(): boolean;
  cancel(): void;
}

export function connectCcdfRuns(store: AppStore, client: EngineClient): CcdfRunControls {
  let handle: CcdfRunHandle | null = null;
  return {
    start: () => {
      const state = store.getState();
      const draft = state.submittedDraft;
      if (draft === null || state.draft !== draft || Object.keys(state.fieldErrors).length > 0) return false;
      handle?.cancel();
      const spec = { symbols: state.longRunSymbols, precision: state.longRunPrecision };
      const current = startCcdfRun(client, { config: draft, run: spec }, {
        onProgress: (p) => store.getState().longRunProgress(current.runKey, p),
        onPartial: (r) => store.getState().longRunPartial(current.runKey, r),
      });
      handle = current;
      store.getState().longRunStarted(current.runKey, JSON.stringify(draft), spec);
      current.done.then(
        (result) => store.getState().longRunEnded(current.runKey, result === null ? 'cancelled' : 'done'),
        (error: unknown) => store.getState().longRunFailed(current.runKey, error instanceof Error ? error.message : String(error)),
      );
      return true;
    },
    cancel: () => {
      handle?.cancel();
      handle = null;
    },
  };
}
