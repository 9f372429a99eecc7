/**
 * The workbench store: the config, results, view and scenarios slices merged into one vanilla zustand store,
 * so its logic runs (and is tested) without React. Components read it through useAppStore.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import { createCcdfRunSlice, type CcdfRunSlice } from './ccdfRunSlice';
import { createConfigSlice, type ConfigSlice } from './configSlice';
import { createMeasurementsSlice, type MeasurementsSlice } from './measurementsSlice';
import { createResultsSlice, type ResultsSlice } from './resultsSlice';
import { createScenariosSlice, type ScenariosSlice } from './scenariosSlice';
import { createViewSlice, type ViewSlice } from './viewSlice';

export type AppState = ConfigSlice & ResultsSlice & ViewSlice & ScenariosSlice & MeasurementsSlice & CcdfRunSlice;
export type AppStore = StoreApi<AppState>;

export function createAppStore(): AppStore {
  return createStore<AppState>()((...args) => ({
    ...createConfigSlice(...args),
    ...createResultsSlice(...args),
    ...createViewSlice(...args),
    ...createScenariosSlice(...args),
    ...createMeasurementsSlice(...args),
    ...createCcdfRunSlice(...args),
  }));
}
