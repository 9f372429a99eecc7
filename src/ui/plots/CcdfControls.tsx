import { useId } from 'react';
import { useAppStore } from '../state/AppStoreContext';
import { PROBABILITY_KEYS, type CcdfStatistic } from '../state/ccdfRunSlice';
import { useCcdfRuns } from '../state/CcdfRunContext';

const SYMBOL_CHOICES = [10_000, 100_000, 1_000_000];
const fmtInt = (n: number) => Math.round(n).toLocaleString('en');

function formatSeconds(s: number | null): string {
  if (s === null || !Number.isFinite(s)) return '–';
  if (s < 60) return `${s.toFixed(s < 10 ? 1 : 0)} s`;
  return `${Math.floor(s / 60)} min ${Math.round(s % 60)} s`;
}

/** Which statistic, which probabilities, and the long Monte-Carlo run: symbols, arithmetic, run/cancel, progress. */
export function CcdfControls() {
  const statistic = useAppStore((state) => state.ccdfStatistic);
  const setStatistic = useAppStore((state) => state.setCcdfStatistic);
  const probabilities = useAppStore((state) => state.ccdfProbabilities);
  const toggle = useAppStore((state) => state.toggleCcdfProbability);
  const symbols = useAppStore((state) => state.longRunSymbols);
  const setSymbols = useAppStore((state) => state.setLongRunSymbols);
  const precision = useAppStore((state) => state.longRunPrecision);
  const setPrecision = useAppStore((state) => state.setLongRunPrecision);
  const longRun = useAppStore((state) => state.longRun);
  const currentKey = useAppStore((state) => (state.submittedDraft === null ? null : JSON.stringify(state.submittedDraft)));
  const valid = useAppStore((state) => Object.keys(state.fieldErrors).length === 0);
  const runs = useCcdfRuns();
  const id = useId();
  const running = longRun.status === 'running';
  const stale = longRun.configKey !== null && longRun.configKey !== currentKey;
  const p = longRun.progress;

  return (
    <div className="ccdf-controls">
      <div className="control-row">
        <span className="segmented" role="radiogroup" aria-label="Statistic">
          {(['power', 'papr'] as CcdfStatistic[]).map((s) => (
            <label key={s} className={statistic === s ? 'active' : undefined}>
              <input type="radio" name={`${id}-statistic`} checked={statistic === s} onChange={() => setStatistic(s)} />
              {s === 'power' ? 'Instantaneous power' : 'Symbol PAPR'}
            </label>
          ))}
        </span>
        <fieldset className="probabilities">
          <legend>Levels reported at</legend>
          {PROBABILITY_KEYS.map((key) => (
            <label key={key}>
              <input type="checkbox" checked={probabilities.includes(key)} onChange={() => toggle(key)} />
              {key}
            </label>
          ))}
        </fieldset>
      </div>
      <div className="control-row long-run" aria-label="Long Monte-Carlo run">
        <label htmlFor={`${id}-symbols`}>Long run</label>
        <select id={`${id}-symbols`} value={symbols} onChange={(event) => setSymbols(Number(event.target.value))} disabled={running}>
          {SYMBOL_CHOICES.map((n) => (
            <option key={n} value={n}>
              {fmtInt(n)} symbols
            </option>
          ))}
        </select>
        <label htmlFor={`${id}-precision`} className="visually-hidden">
          Arithmetic
        </label>
        <select id={`${id}-precision`} value={precision} onChange={(event) => setPrecision(event.target.value as 'f64' | 'f32')} disabled={running}>
          <option value="f32">f32 (WebAssembly FFT)</option>
          <option value="f64">f64 (exact transforms)</option>
        </select>
        {running ? (
          <button type="button" className="button" onClick={() => runs.cancel()}>
            Cancel run
          </button>
        ) : (
          <button type="button" className="button button-primary" disabled={!valid} onClick={() => runs.start()}>
            {longRun.status === 'idle' || stale ? 'Run long CCDF' : 'Run again'}
          </button>
        )}
      </div>
      {/* Always present (fixed height), so starting a run does not move the plot. */}
      <div className="run-progress" data-run-status={longRun.status}>
        <progress max={1} value={p?.fraction ?? 0} aria-label="Long run progress" style={longRun.status === 'idle' ? { visibility: 'hidden' } : undefined} />
        <span role="status" aria-live="polite">
          {longRun.status === 'idle'
            ? 'Each edit runs a quick 128-symbol estimate; a long run reaches the small probabilities.'
            : longRun.status === 'running' && p !== null
            ? `${(100 * p.fraction).toFixed(1)} % · ${fmtInt(p.symbolsDone)} of ${fmtInt(p.symbolsTotal)} symbols · ${p.symbolsPerSecond === null ? '–' : fmtInt(p.symbolsPerSecond)} symbols/s · ${formatSeconds(p.secondsLeft)} left`
            : longRun.status === 'done'
              ? `Done: ${fmtInt(p?.symbolsTotal ?? 0)} symbols in ${formatSeconds(p?.elapsedSeconds ?? null)}${stale ? ' (for an earlier configuration)' : ''}`
              : longRun.status === 'cancelled'
                ? `Cancelled after ${fmtInt(p?.symbolsDone ?? 0)} symbols; the plot keeps what was merged.`
                : `Failed: ${longRun.error ?? ''}`}
        </span>
      </div>
    </div>
  );
}
