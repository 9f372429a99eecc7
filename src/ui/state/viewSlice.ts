/** How results are viewed: which OFDM symbol the plots show and the colour scheme. */
import type { StateCreator } from 'zustand';
import type { ColorScheme } from '../plotData/plotTheme';
import type { AppState } from './store';

export interface ViewSlice {
  /** OFDM symbol shown in the time and constellation plots (0-based). */
  symbolIndex: number;
  colorScheme: ColorScheme;
  setSymbolIndex(symbolIndex: number): void;
  setColorScheme(colorScheme: ColorScheme): void;
}

export const createViewSlice: StateCreator<AppState, [], [], ViewSlice> = (set) => ({
  symbolIndex: 0,
  colorScheme: 'light',
  setSymbolIndex: (symbolIndex) =>
    set((state) => {
      const last = Math.max(0, (state.result?.waveform.symbolLayout.length ?? 1) - 1);
      const clamped = Number.isFinite(symbolIndex) ? Math.min(Math.max(0, Math.trunc(symbolIndex)), last) : 0;
      return { symbolIndex: clamped };
    }),
  setColorScheme: (colorScheme) => set({ colorScheme }),
});
