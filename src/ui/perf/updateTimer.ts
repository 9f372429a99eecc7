/**
 * How long a configuration change takes to reach every plot, measured with the User Timing API:
 * `begin(seq)` marks "crestline:change:<seq>" when a valid configuration goes to the engine; each
 * plot reports when it has drawn data of that configuration; when every plot on screen has, the
 * timer records the measure "crestline:update" (and keeps the figure for the status line).
 * Measured in the browser tests and reported; never asserted.
 */

export const UPDATE_MEASURE = 'crestline:update';

export interface TimingApi {
  mark(name: string): void;
  measure(name: string, startMark: string): number | undefined;
  clearMarks(name: string): void;
}

export interface UpdateTimer {
  /** A configuration with sequence number `seq` was sent to the engine. */
  begin(seq: number): void;
  /** Plot `plotId` is on screen and will report its renders. */
  register(plotId: string): void;
  unregister(plotId: string): void;
  /** Plot `plotId` now shows data of configuration `seq`. */
  rendered(plotId: string, seq: number): void;
  /** Last complete update: configuration seq and milliseconds from change to the last plot. */
  last(): { seq: number; durationMs: number } | null;
  subscribe(listener: (last: { seq: number; durationMs: number }) => void): () => void;
}

export function browserTimingApi(): TimingApi {
  return {
    mark: (name) => void performance.mark(name),
    measure: (name, startMark) => performance.measure(name, startMark).duration,
    clearMarks: (name) => performance.clearMarks(name),
  };
}

export function createUpdateTimer(timing: TimingApi): UpdateTimer {
  const plots = new Map<string, number>();
  const listeners = new Set<(last: { seq: number; durationMs: number }) => void>();
  let pendingSeq: number | null = null;
  let lastUpdate: { seq: number; durationMs: number } | null = null;
  const markName = (seq: number) => `crestline:change:${seq}`;

  const check = () => {
    if (pendingSeq === null || plots.size === 0) return;
    for (const seq of plots.values()) if (seq < pendingSeq) return;
    const seq = pendingSeq;
    pendingSeq = null;
    const durationMs = timing.measure(UPDATE_MEASURE, markName(seq));
    timing.clearMarks(markName(seq));
    if (durationMs === undefined) return;
    lastUpdate = { seq, durationMs };
    for (const listener of listeners) listener(lastUpdate);
  };

  return {
    begin: (seq) => {
      if (pendingSeq !== null) timing.clearMarks(markName(pendingSeq));
      pendingSeq = seq;
      timing.mark(markName(seq));
    },
    register: (plotId) => {
      if (!plots.has(plotId)) plots.set(plotId, -1);
    },
    unregister: (plotId) => {
      plots.delete(plotId);
      check();
    },
    rendered: (plotId, seq) => {
      plots.set(plotId, Math.max(seq, plots.get(plotId) ?? -1));
      check();
    },
    last: () => lastUpdate,
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}
