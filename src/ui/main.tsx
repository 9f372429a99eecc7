/**
 * Page entry: one store, one engine client (a pool of module workers), the workspace restored
 * (saved scenarios, permalink, or the demo), the savers connected, React mounted.
 */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { createEngineClient } from '../worker/client';
import { App } from './App';
import { browserTimingApi, createUpdateTimer } from './perf/updateTimer';
import { UpdateTimerContext } from './perf/UpdateTimerContext';
import { createIndexedDbStore } from './persist/indexedDbStore';
import { createWorkspaceArchive } from './persist/workspaceArchive';
import { AppStoreProvider } from './state/AppStoreContext';
import { CcdfRunContext } from './state/CcdfRunContext';
import { connectCcdfRuns } from './state/ccdfRunController';
import { EngineContext } from './state/EngineContext';
import { connectEngine } from './state/engineController';
import { connectScenarioMeasurements } from './state/scenarioController';
import { createAppStore } from './state/store';
import { connectPermalink, connectPersistence, startWorkspace } from './state/workspaceController';
import './styles.css';

const store = createAppStore();
const client = createEngineClient({
  onRestart: (notice) => store.getState().engineRestarted(`The engine worker crashed (${notice.reason}) and was restarted.`),
});

// Colour scheme: the user's choice, or the system's preference ("auto").
const darkQuery = window.matchMedia('(prefers-color-scheme: dark)');
const applyScheme = () => {
  const { themePreference } = store.getState();
  const scheme = themePreference === 'auto' ? (darkQuery.matches ? 'dark' : 'light') : themePreference;
  if (themePreference === 'auto') delete document.documentElement.dataset.theme;
  else document.documentElement.dataset.theme = themePreference;
  if (store.getState().colorScheme !== scheme) store.getState().setColorScheme(scheme);
};
applyScheme();
darkQuery.addEventListener('change', applyScheme);
store.subscribe((state, previous) => {
  if (state.themePreference !== previous.themePreference) applyScheme();
});

const updateTimer = createUpdateTimer(browserTimingApi());
updateTimer.subscribe(({ durationMs }) => store.getState().setLastUpdateMs(durationMs));

const ccdfRuns = connectCcdfRuns(store, client);

const archive = createWorkspaceArchive(createIndexedDbStore('crestline-workspace'));

async function start(): Promise<void> {
  const outcome = await startWorkspace(store, archive, window.location.hash, Date.now());
  if (outcome.notice !== null) store.getState().setPageNotice(outcome.notice);
  connectEngine(store, client, { onSubmit: (seq) => updateTimer.begin(seq) });
  connectScenarioMeasurements(store, client);
  connectPersistence(store, archive);
  connectPermalink(store, (hash) => window.history.replaceState(null, '', hash));
}

const rootElement = document.getElementById('root');
if (rootElement === null) throw new Error('index.html has no #root element.');
createRoot(rootElement).render(
  <StrictMode>
    <AppStoreProvider store={store}>
      <EngineContext.Provider value={client}>
        <CcdfRunContext.Provider value={ccdfRuns}>
          <UpdateTimerContext.Provider value={updateTimer}>
            <App />
          </UpdateTimerContext.Provider>
        </CcdfRunContext.Provider>
      </EngineContext.Provider>
    </AppStoreProvider>
  </StrictMode>,
);
void start();
