import { ConfigPanel } from './panels/ConfigPanel';
import { ResultSummary } from './panels/ResultSummary';
import { SafetyNotice } from './panels/SafetyNotice';
import { ConstellationPlot } from './plots/ConstellationPlot';
import { TimeSamplesPlot } from './plots/TimeSamplesPlot';
import { useAppStore } from './state/AppStoreContext';

export function App() {
  const scenarioName = useAppStore((state) => state.scenarioName);
  const scenarioDescription = useAppStore((state) => state.scenarioDescription);
  return (
    <div className="app">
      <header className="app-header">
        <h1>Crestline</h1>
        <p className="tagline">OFDM / DFT-s-OFDM waveform workbench</p>
        <p className="scenario" aria-label="Scenario">
          <span className="scenario-name">{scenarioName}</span>
          <span className="scenario-description">{scenarioDescription}</span>
        </p>
      </header>
      <SafetyNotice />
      <main className="workbench">
        <ConfigPanel />
        <div className="plots">
          <section className="panel plot-panel plot-wide" aria-label="Time samples">
            <TimeSamplesPlot />
          </section>
          <div className="plot-row">
            <section className="panel plot-panel plot-square" aria-label="Constellation">
              <ConstellationPlot />
            </section>
            <ResultSummary />
          </div>
        </div>
      </main>
    </div>
  );
}
