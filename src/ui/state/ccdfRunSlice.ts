/**
 * The long Monte-Carlo run of the configuration being edited (power CCDF and PAPR down to small probabilities) and how
 * the statistics are viewed. The run itself is driven by ccdfRunController.ts; this slice holds its state.
 */
import type { StateCreator } from 'zustand';
import type { CcdfRunProgress } from '../../worker/ccdfRun';
import type { CcdfRunSpec } from '../../worker/ccdfTypes';
import type { CcdfResult } from '../../worker/client';
import type { AppState } from './store';

export type LongRunStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'failed';
export type CcdfStatistic = 'power' | 'papr';
/** Probability keys of the engine's level report (src/dsp/metrics/ccdfLevels.ts LEVEL_KEYS). */
export type ProbabilityKey = '1e-1' | '1e-2' | '1e-3' | '1e-4' | '1e-5';
export const PROBABILITY_KEYS: readonly ProbabilityKey[] = ['1e-1', '1e-2', '1e-3', '1e-4', '1e-5'];

export interface LongRunState {
  status: LongRunStatus;
  runKey: string | null;
  /** JSON of the configuration the run measures (its result is shown only while that configuration is edited). */
  configKey: string | null;
  spec: CcdfRunSpec | null;
  progress: CcdfRunProgress | null;
  /** Latest merged report (partial while running). */
  result: CcdfResult | null;
  error: string | null;
}

export interface CcdfRunSlice {
  longRun: LongRunState;
  longRunSymbols: number;
  longRunPrecision: 'f64' | 'f32';
  ccdfStatistic: CcdfStatistic;
  /** Probabilities at which the measurements panel reports levels. */
  ccdfProbabilities: readonly ProbabilityKey[];
  setLongRunSymbols(symbols: number): void;
  setLongRunPrecision(precision: 'f64' | 'f32'): void;
  setCcdfStatistic(statistic: CcdfStatistic): void;
  toggleCcdfProbability(key: ProbabilityKey): void;
  longRunStarted(runKey: string, configKey: string, spec: CcdfRunSpec): void;
  longRunProgress(runKey: string, progress: CcdfRunProgress): void;
  longRunPartial(runKey: string, result: CcdfResult): void;
  longRunEnded(runKey: string, outcome: 'done' | 'cancelled'): void;
  longRunFailed(runKey: string, message: string): void;
}

const idle: LongRunState = { status: 'idle', runKey: null, configKey: null, spec: null, progress: null, result: null, error: null };

export const createCcdfRunSlice: StateCreator<AppState, [], [], CcdfRunSlice> = (set) => {
  const forRun = (runKey: string, update: (run: LongRunState) => Partial<LongRunState>) =>
    set((state) => (state.longRun.runKey === runKey ? { longRun: { ...state.longRun, ...update(state.longRun) } } : {}));
  return {
    longRun: idle,
    longRunSymbols: 100_000,
    longRunPrecision: 'f32',
    ccdfStatistic: 'power',
    ccdfProbabilities: ['1e-2', '1e-3', '1e-4'],
    setLongRunSymbols: (longRunSymbols) => set({ longRunSymbols }),
    setLongRunPrecision: (longRunPrecision) => set({ longRunPrecision }),
    setCcdfStatistic: (ccdfStatistic) => set({ ccdfStatistic }),
    toggleCcdfProbability: (key) =>
      set((state) => {
        const has = state.ccdfProbabilities.includes(key);
        const next = has ? state.ccdfProbabilities.filter((k) => k !== key) : [...state.ccdfProbabilities, key];
        return { ccdfProbabilities: PROBABILITY_KEYS.filter((k) => next.includes(k)) };
      }),
    longRunStarted: (runKey, configKey, spec) => set({ longRun: { ...idle, status: 'running', runKey, configKey, spec } }),
    longRunProgress: (runKey, progress) => forRun(runKey, () => ({ progress })),
    longRunPartial: (runKey, result) => forRun(runKey, () => ({ result })),
    longRunEnded: (runKey, outcome) => forRun(runKey, () => ({ status: outcome })),
    longRunFailed: (runKey, message) => forRun(runKey, () => ({ status: 'failed', error: message })),
  };
};
