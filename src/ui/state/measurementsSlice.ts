/**
 * Measurements of the configuration being edited, each from its own worker request so the fast ones reach the
 * screen first: spectrum (PSD, ACLR, OBW, amplifier curves) and EVM; later the power CCDF and the back-off.
 * Each carries the sequence number of the draft it answers (for the update timer and to drop stale answers).
 */
import type { StateCreator } from 'zustand';
import type { EvmResult, SpectrumResult } from '../../worker/client';
import type { SpectrumOverlay } from '../plotData/spectrum';
import type { AppState } from './store';

export type MeasurementKind = 'spectrum' | 'evm';

export interface MeasurementState<T> {
  data: T | null;
  /** submittedSeq of the draft `data` answers (−1 before the first). */
  seq: number;
  status: 'idle' | 'running' | 'ready' | 'failed';
  error: string | null;
}

const empty = <T>(): MeasurementState<T> => ({ data: null, seq: -1, status: 'idle', error: null });

export interface MeasurementsSlice {
  spectrum: MeasurementState<SpectrumResult>;
  evm: MeasurementState<EvmResult>;
  /** Spectra of the pinned scenarios other than the configuration being edited (scenario measurements fill it). */
  spectrumOverlays: readonly SpectrumOverlay[];
  measurementStarted(kind: MeasurementKind): void;
  measurementSucceeded(kind: 'spectrum', data: SpectrumResult, seq: number): void;
  measurementSucceeded(kind: 'evm', data: EvmResult, seq: number): void;
  measurementFailed(kind: MeasurementKind, message: string): void;
}

export const createMeasurementsSlice: StateCreator<AppState, [], [], MeasurementsSlice> = (set) => ({
  spectrum: empty<SpectrumResult>(),
  evm: empty<EvmResult>(),
  spectrumOverlays: [],
  measurementStarted: (kind) => set((state) => ({ [kind]: { ...state[kind], status: 'running' } }) as Partial<AppState>),
  measurementSucceeded: (kind: MeasurementKind, data: SpectrumResult | EvmResult, seq: number) =>
    set({ [kind]: { data, seq, status: 'ready', error: null } } as Partial<AppState>),
  measurementFailed: (kind, message) => set((state) => ({ [kind]: { ...state[kind], status: 'failed', error: message } }) as Partial<AppState>),
});
