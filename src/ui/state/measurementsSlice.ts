/**
 * Measurements of the configuration being edited, each from its own worker request so the fast ones reach the
 * screen first: spectrum (PSD, ACLR, OBW, amplifier curves) and EVM; later the power CCDF and the back-off.
 * Each carries the sequence number of the draft it answers (for the update timer and to drop stale answers).
 */
import type { StateCreator } from 'zustand';
import type { BackoffResult, CcdfResult, EvmResult, SpectrumResult } from '../../worker/client';
import type { AppState } from './store';

export type MeasurementKind = 'spectrum' | 'evm' | 'backoff' | 'ccdf';

export interface MeasurementState<T> {
  data: T | null;
  /** submittedSeq of the draft `data` answers (−1 before the first). */
  seq: number;
  status: 'idle' | 'running' | 'ready' | 'failed';
  error: string | null;
}

const empty = <T>(): MeasurementState<T> => ({ data: null, seq: -1, status: 'idle', error: null });

export type ScenarioMeasurementKind = 'spectrum' | 'backoff' | 'ccdf';

/** What has been measured for one pinned scenario; `key` is its configuration's JSON (a changed scenario starts afresh). */
export interface ScenarioMeasurement {
  key: string;
  spectrum?: SpectrumResult;
  backoff?: BackoffResult;
  ccdf?: CcdfResult;
  errors: Partial<Record<ScenarioMeasurementKind, string | undefined>>;
}

export interface MeasurementsSlice {
  spectrum: MeasurementState<SpectrumResult>;
  evm: MeasurementState<EvmResult>;
  backoff: MeasurementState<BackoffResult>;
  /** The quick statistics run of each draft (QUICK_CCDF symbols). */
  ccdf: MeasurementState<CcdfResult>;
  /** Measurements of each pinned scenario (by scenario id), for the overlays and the comparison table. */
  scenarioMeasurements: Readonly<Record<string, ScenarioMeasurement>>;
  scenarioMeasured(id: string, key: string, kind: ScenarioMeasurementKind, data: unknown): void;
  scenarioMeasurementFailed(id: string, key: string, kind: ScenarioMeasurementKind, message: string): void;
  dropScenarioMeasurements(keepIds: readonly string[]): void;
  measurementStarted(kind: MeasurementKind): void;
  measurementSucceeded(kind: 'spectrum', data: SpectrumResult, seq: number): void;
  measurementSucceeded(kind: 'evm', data: EvmResult, seq: number): void;
  measurementSucceeded(kind: 'backoff', data: BackoffResult, seq: number): void;
  measurementSucceeded(kind: 'ccdf', data: CcdfResult, seq: number): void;
  measurementFailed(kind: MeasurementKind, message: string): void;
  /** Nothing to measure for draft `seq` (e.g. no amplifier for the back-off). */
  measurementCleared(kind: MeasurementKind, seq: number): void;
}

export const createMeasurementsSlice: StateCreator<AppState, [], [], MeasurementsSlice> = (set) => ({
  spectrum: empty<SpectrumResult>(),
  evm: empty<EvmResult>(),
  backoff: empty<BackoffResult>(),
  ccdf: empty<CcdfResult>(),
  scenarioMeasurements: {},
  scenarioMeasured: (id, key, kind, data) =>
    set((state) => {
      const previous = state.scenarioMeasurements[id];
      const base: ScenarioMeasurement = previous?.key === key ? previous : { key, errors: {} };
      return { scenarioMeasurements: { ...state.scenarioMeasurements, [id]: { ...base, [kind]: data, errors: { ...base.errors, [kind]: undefined } } } };
    }),
  scenarioMeasurementFailed: (id, key, kind, message) =>
    set((state) => {
      const previous = state.scenarioMeasurements[id];
      const base: ScenarioMeasurement = previous?.key === key ? previous : { key, errors: {} };
      return { scenarioMeasurements: { ...state.scenarioMeasurements, [id]: { ...base, errors: { ...base.errors, [kind]: message } } } };
    }),
  dropScenarioMeasurements: (keepIds) =>
    set((state) => ({ scenarioMeasurements: Object.fromEntries(Object.entries(state.scenarioMeasurements).filter(([id]) => keepIds.includes(id))) })),
  measurementStarted: (kind) => set((state) => ({ [kind]: { ...state[kind], status: 'running' } }) as Partial<AppState>),
  measurementSucceeded: (kind: MeasurementKind, data: SpectrumResult | EvmResult | BackoffResult | CcdfResult, seq: number) =>
    set({ [kind]: { data, seq, status: 'ready', error: null } } as Partial<AppState>),
  measurementCleared: (kind, seq) => set({ [kind]: { data: null, seq, status: 'idle', error: null } } as Partial<AppState>),
  measurementFailed: (kind, message) => set((state) => ({ [kind]: { ...state[kind], status: 'failed', error: message } }) as Partial<AppState>),
});
