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
  /** The back-off sweep takes seconds: it starts only after the configuration has rested this long (default 500 ms). */
  backoffDelayMs?: number;
}

const describe = (error: unknown) => (error instanceof Error ? error.message : String(error));

/**
 * User Timing mark "crestline:answer:<kind>:<seq>" when an answer for the edited configuration arrives, with the
 * engine's own time in its detail: the responsiveness report splits the update time into engine and drawing with it.
 */
function markAnswer(kind: string, seq: number, engineMs?: number): void {
  if (typeof performance === 'undefined' || typeof performance.mark !== 'function') return;
  performance.mark(`crestline:answer:${kind}:${seq}`, { detail: { engineMs: engineMs ?? null } });
}

/**
 * The quick statistics run of every draft: one engine block of random symbols at ≥ 4× oversampling, single
 * precision (the WebAssembly FFT when it has loaded). Enough for the power CCDF to ~1e-4 on large grids; the long
 * run (ccdfRunController.ts) goes further.
 */
export const QUICK_CCDF = { symbols: 128, precision: 'f32' } as const;

export function connectEngine(store: AppStore, client: EngineClient, options: EngineControllerOptions = {}): () => void {
  const current = (draft: ConfigDraft) => store.getState().submittedDraft === draft;

  let backoffTimer: ReturnType<typeof setTimeout> | null = null;
  const runBackoff = (draft: ConfigDraft, seq: number): void => {
    if (backoffTimer !== null) clearTimeout(backoffTimer);
    client.pool.cancelLane('backoff');
    if (draft.amplifier === undefined) {
      store.getState().measurementCleared('backoff', seq);
      return;
    }
    store.getState().measurementStarted('backoff');
    backoffTimer = setTimeout(() => {
      backoffTimer = null;
      client.backoff(draft).then(
        (result) => {
          if (current(draft)) store.getState().measurementSucceeded('backoff', result, seq);
        },
        (error: unknown) => {
          if (!isSuperseded(error) && current(draft)) store.getState().measurementFailed('backoff', describe(error));
        },
      );
    }, options.backoffDelayMs ?? 500);
  };

  const run = (draft: ConfigDraft): void => {
    const state = store.getState();
    const seq = state.submittedSeq;
    options.onSubmit?.(seq);
    // The EVM takes longest (three receiver passes): it goes first, so it runs on one worker while the waveform,
    // the spectrum and the quick statistics run on the other (or on whichever is free first).
    state.measurementStarted('evm');
    client.evm(draft).then(
      (result) => {
        markAnswer('evm', seq, result.elapsedMs);
        if (current(draft)) store.getState().measurementSucceeded('evm', result, seq);
      },
      (error: unknown) => {
        if (!isSuperseded(error) && current(draft)) store.getState().measurementFailed('evm', describe(error));
      },
    );
    state.requestStarted();
    client.generate(draft).then(
      (result) => {
        markAnswer('waveform', seq, result.elapsedMs);
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
        markAnswer('spectrum', seq, result.elapsedMs);
        if (current(draft)) store.getState().measurementSucceeded('spectrum', result, seq);
      },
      (error: unknown) => {
        if (!isSuperseded(error) && current(draft)) store.getState().measurementFailed('spectrum', describe(error));
      },
    );
    state.measurementStarted('ccdf');
    client.ccdf(draft, QUICK_CCDF).then(
      (result) => {
        markAnswer('ccdf', seq);
        if (current(draft)) store.getState().measurementSucceeded('ccdf', result, seq);
      },
      (error: unknown) => {
        if (!isSuperseded(error) && current(draft)) store.getState().measurementFailed('ccdf', describe(error));
      },
    );
    runBackoff(draft, seq);
  };

  const initial = store.getState().submittedDraft;
  if (initial !== null) run(initial);
  const unsubscribe = store.subscribe((state, previous) => {
    if (state.submittedDraft !== null && state.submittedDraft !== previous.submittedDraft) run(state.submittedDraft);
  });
  return () => {
    unsubscribe();
    if (backoffTimer !== null) clearTimeout(backoffTimer);
  };
}
