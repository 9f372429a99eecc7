/** How results are viewed: which OFDM symbol the plots show, the colour scheme, page notices. */
import type { StateCreator } from 'zustand';
import type { ColorScheme } from '../plotData/plotTheme';
import type { AppState } from './store';

/** "auto" follows the system's light/dark preference. */
export type ThemePreference = 'auto' | 'light' | 'dark';

export interface ViewSlice {
  /** OFDM symbol shown in the time and constellation plots (0-based). */
  symbolIndex: number;
  /** The scheme in effect (the preference resolved against the system's). */
  colorScheme: ColorScheme;
  themePreference: ThemePreference;
  /** A message for the whole page (e.g. a damaged link); null when there is none. */
  pageNotice: string | null;
  /** Milliseconds from the last configuration change until every plot showed it (perf/updateTimer.ts). */
  lastUpdateMs: number | null;
  setSymbolIndex(symbolIndex: number): void;
  setColorScheme(colorScheme: ColorScheme): void;
  setThemePreference(preference: ThemePreference): void;
  setPageNotice(notice: string | null): void;
  setLastUpdateMs(durationMs: number): void;
}

export const createViewSlice: StateCreator<AppState, [], [], ViewSlice> = (set) => ({
  symbolIndex: 0,
  colorScheme: 'light',
  themePreference: 'auto',
  pageNotice: null,
  lastUpdateMs: null,
  setSymbolIndex: (symbolIndex) =>
    set((state) => {
      const last = Math.max(0, (state.result?.waveform.symbolLayout.length ?? 1) - 1);
      const clamped = Number.isFinite(symbolIndex) ? Math.min(Math.max(0, Math.trunc(symbolIndex)), last) : 0;
      return { symbolIndex: clamped };
    }),
  setColorScheme: (colorScheme) => set({ colorScheme }),
  setThemePreference: (themePreference) => set({ themePreference }),
  setPageNotice: (pageNotice) => set({ pageNotice }),
  setLastUpdateMs: (lastUpdateMs) => set({ lastUpdateMs }),
});
