/** The engine's latest answer for the submitted configuration, and what went wrong if it failed. */
import type { StateCreator } from 'zustand';
import type { EngineResult } from '../../worker/client';
import type { AppState } from './store';

export type EngineStatus = 'idle' | 'running' | 'ready' | 'failed';

export interface EngineFailure {
  code: string;
  message: string;
}

export interface ResultsSlice {
  status: EngineStatus;
  /** Last successful result; kept (and shown as stale) while a newer request runs or fails. */
  result: EngineResult | null;
  /** submittedSeq of the draft `result` answers. */
  resultSeq: number;
  failure: EngineFailure | null;
  /** Set when the worker crashed and was restarted; shown until the next success. */
  engineNotice: string | null;
  requestStarted(): void;
  requestSucceeded(result: EngineResult, seq: number): void;
  requestFailed(failure: EngineFailure): void;
  engineRestarted(notice: string): void;
}

export const createResultsSlice: StateCreator<AppState, [], [], ResultsSlice> = (set) => ({
  status: 'idle',
  result: null,
  resultSeq: -1,
  failure: null,
  engineNotice: null,
  requestStarted: () => set({ status: 'running' }),
  requestSucceeded: (result, seq) =>
    set((state) => ({
      status: 'ready',
      result,
      resultSeq: seq,
      failure: null,
      engineNotice: null,
      // Keep the chosen symbol when the new waveform has it.
      symbolIndex: Math.min(state.symbolIndex, Math.max(0, result.waveform.symbolLayout.length - 1)),
    })),
  requestFailed: (failure) => set({ status: 'failed', failure }),
  engineRestarted: (notice) => set({ engineNotice: notice }),
});
