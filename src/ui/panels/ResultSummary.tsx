import { displayName } from './configFields';
import { useAppStore } from '../state/AppStoreContext';

const formatRate = (hz: number) => `${(hz / 1e6).toFixed(hz % 1e4 === 0 ? 2 : 4)} Msps`;

/** What the engine made: numerology, sizes, timing, warnings and failures. */
export function ResultSummary() {
  const status = useAppStore((state) => state.status);
  const result = useAppStore((state) => state.result);
  const failure = useAppStore((state) => state.failure);
  const engineNotice = useAppStore((state) => state.engineNotice);
  const symbolIndex = useAppStore((state) => state.symbolIndex);
  const setSymbolIndex = useAppStore((state) => state.setSymbolIndex);
  const resubmit = useAppStore((state) => state.resubmit);
  const lastUpdateMs = useAppStore((state) => state.lastUpdateMs);

  const waveform = result?.waveform;
  const numerology = waveform?.summary.numerology;
  const rows: [string, string][] =
    waveform !== undefined && numerology !== undefined
      ? [
          ['Waveform', displayName(waveform.summary.waveform)],
          ['Grid', `${numerology.numRb} RB × 12 subcarriers, Δf ${numerology.subcarrierSpacingHz / 1e3} kHz`],
          [
            'Allocation',
            waveform.summary.allocations
              .map((block) => `${block.numRb} RB from RB ${block.startRb}, ${displayName(block.modulation)}`)
              .join('; '),
          ],
          [
            'FFT size',
            `${numerology.fftSize} (×${result?.config.oversampling ?? 1} → ${waveform.symbolLayout[0]?.fftSize ?? '–'})`,
          ],
          ['Sample rate', formatRate(waveform.sampleRateHz)],
          ['Samples', `${waveform.numSamples.toLocaleString('en')} (${waveform.numSymbols} symbols)`],
          ['Engine time', `${result?.elapsedMs.toFixed(1) ?? '–'} ms`],
          ['Screen update', lastUpdateMs === null ? '–' : `${lastUpdateMs.toFixed(0)} ms (change → all plots drawn)`],
        ]
      : [];
  const numSymbols = waveform?.numSymbols ?? 1;

  return (
    <section className="panel result-summary" aria-labelledby="result-heading" aria-busy={status === 'running'}>
      <h2 id="result-heading">
        Result <span className={`status status-${status}`}>{status === 'running' ? 'updating…' : status}</span>
      </h2>
      <div className="field symbol-picker">
        <label htmlFor="symbol-index">Symbol shown</label>
        <input
          id="symbol-index"
          type="number"
          min={0}
          max={numSymbols - 1}
          step={1}
          value={symbolIndex}
          onChange={(event) => setSymbolIndex(Number(event.target.value))}
        />
        <span className="unit">of 0–{numSymbols - 1}</span>
      </div>
      {rows.length > 0 && (
        <dl className="summary-list">
          {rows.map(([term, value]) => (
            <div key={term}>
              <dt>{term}</dt>
              <dd>{value}</dd>
            </div>
          ))}
        </dl>
      )}
      {engineNotice !== null && (
        <p className="engine-notice" role="alert">
          {engineNotice}
          <button type="button" onClick={resubmit}>
            Run again
          </button>
        </p>
      )}
      {failure !== null && (
        <p className="engine-failure" role="alert">
          <strong>{failure.code}:</strong> {failure.message}
          {result !== null && ' The plots show the last configuration that worked.'}
        </p>
      )}
      {waveform !== undefined && waveform.warnings.length > 0 && (
        <ul className="warnings" aria-label="Engine warnings">
          {waveform.warnings.map((warning) => (
            <li key={warning}>{warning}</li>
          ))}
        </ul>
      )}
    </section>
  );
}
