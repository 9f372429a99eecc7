import { MetricsPanel } from './metrics/MetricsPanel';
import { ComparisonTable } from './panels/ComparisonTable';
import { ConfigPanel } from './panels/ConfigPanel';
import { ResultSummary } from './panels/ResultSummary';
import { SafetyNotice } from './panels/SafetyNotice';
import { ScenariosPanel } from './panels/ScenariosPanel';
import { ThemeChoice } from './panels/ThemeChoice';
import { WorkspaceBar } from './panels/WorkspaceBar';
import { AmplifierPlot } from './plots/AmplifierPlot';
import { BackoffPlot } from './plots/BackoffPlot';
import { CcdfControls } from './plots/CcdfControls';
import { CcdfPlot } from './plots/CcdfPlot';
import { ConstellationPlot } from './plots/ConstellationPlot';
import { PlotPanel } from './plots/PlotPanel';
import { ReceiverPlot } from './plots/ReceiverPlot';
import { ResourceGridPlot } from './plots/ResourceGridPlot';
import { SpectrumPlot } from './plots/SpectrumPlot';
import { TimeSamplesPlot } from './plots/TimeSamplesPlot';
import { useAppStore } from './state/AppStoreContext';

export function App() {
  const scenarioName = useAppStore((state) => state.scenarioName);
  const scenarioDescription = useAppStore((state) => state.scenarioDescription);
  const pageNotice = useAppStore((state) => state.pageNotice);
  const setPageNotice = useAppStore((state) => state.setPageNotice);
  return (
    <div className="app">
      <header className="app-header">
        <div className="brand">
          <h1>Crestline</h1>
          <p className="tagline">OFDM / DFT-s-OFDM waveform workbench</p>
        </div>
        <div className="header-tools">
          <WorkspaceBar />
          <ThemeChoice />
        </div>
        <p className="scenario" aria-label="Scenario">
          <span className="scenario-name">{scenarioName}</span>
          <span className="scenario-description">{scenarioDescription}</span>
        </p>
      </header>
      <SafetyNotice />
      {pageNotice !== null && (
        <p className="page-notice" role="alert">
          {pageNotice}
          <button type="button" className="small-button" onClick={() => setPageNotice(null)}>
            Dismiss
          </button>
        </p>
      )}
      <main className="workbench">
        <ConfigPanel />
        <div className="plots">
          <PlotPanel title="Time samples" panelId="time" exportId="time-samples-plot" size="wide">
            <TimeSamplesPlot />
          </PlotPanel>
          <PlotPanel title="Constellation" panelId="constellation" exportId="constellation-plot">
            <ConstellationPlot />
          </PlotPanel>
          <PlotPanel title="Resource grid" panelId="grid" exportId="resource-grid-plot">
            <ResourceGridPlot />
          </PlotPanel>
          <PlotPanel title="Power statistics (CCDF)" panelId="ccdf" exportId="ccdf-plot" size="wide">
            <CcdfControls />
            <CcdfPlot />
          </PlotPanel>
          <PlotPanel title="Spectrum and adjacent channels" panelId="spectrum" exportId="spectrum-plot" size="wide">
            <SpectrumPlot />
          </PlotPanel>
          <PlotPanel title="Amplifier transfer" panelId="amplifier" exportId="amplifier-plot">
            <AmplifierPlot />
          </PlotPanel>
          <PlotPanel title="Receiver EVM" panelId="receiver" exportId="receiver-plot">
            <ReceiverPlot />
          </PlotPanel>
          <PlotPanel title="Back-off against limits" panelId="backoff" exportId="backoff-plot" size="wide">
            <BackoffPlot />
          </PlotPanel>
          <ComparisonTable />
        </div>
        <aside className="side-column" aria-label="Measurements and scenarios">
          <MetricsPanel />
          <ResultSummary />
          <ScenariosPanel />
        </aside>
      </main>
    </div>
  );
}
