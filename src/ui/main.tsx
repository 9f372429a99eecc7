/**
 * Page entry: one store, one engine client (module worker), the demo scenario loaded, React mounted.
 */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { defaultScenario } from '../scenarios/demoScenario';
import { createEngineClient } from '../worker/client';
import { App } from './App';
import { AppStoreProvider } from './state/AppStoreContext';
import { connectEngine } from './state/engineController';
import { createAppStore } from './state/store';
import './styles.css';

const store = createAppStore();
const client = createEngineClient({
  onRestart: (notice) => store.getState().engineRestarted(`The engine worker crashed (${notice.reason}) and was restarted.`),
});

const darkQuery = window.matchMedia('(prefers-color-scheme: dark)');
const followScheme = () => store.getState().setColorScheme(darkQuery.matches ? 'dark' : 'light');
followScheme();
darkQuery.addEventListener('change', followScheme);

store.getState().loadScenario(defaultScenario);
connectEngine(store, client);

const rootElement = document.getElementById('root');
if (rootElement === null) throw new Error('index.html has no #root element.');
createRoot(rootElement).render(
  <StrictMode>
    <AppStoreProvider store={store}>
      <App />
    </AppStoreProvider>
  </StrictMode>,
);
