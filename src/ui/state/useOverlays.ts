import { useMemo, useRef } from 'react';
import type { SavedScenario } from '../persist/workspaceArchive';
import { plotThemes } from '../plotData/plotTheme';
import { useAppStore } from './AppStoreContext';
import type { ScenarioMeasurement } from './measurementsSlice';
import { scenarioKey } from './scenarioController';

export interface PinnedOverlay {
  id: string;
  name: string;
  /** The scenario's series colour (its place in the pinned list). */
  colour: string;
  measurement: ScenarioMeasurement | undefined;
  isBaseline: boolean;
  /** True when the configuration being edited is this scenario's (its overlay would hide under the current trace). */
  sameAsCurrent: boolean;
}

/** Pinned scenarios with their colours and measurements, for the overlay plots. */
export function usePinnedOverlays(): PinnedOverlay[] {
  const scenarios = useAppStore((state) => state.scenarios);
  const measurements = useAppStore((state) => state.scenarioMeasurements);
  const baselineId = useAppStore((state) => state.baselineId);
  const currentKey = useAppStore((state) => (state.submittedDraft === null ? null : JSON.stringify(state.submittedDraft)));
  const scheme = useAppStore((state) => state.colorScheme);
  const previous = useRef<PinnedOverlay[]>([]);
  const next = useMemo(() => {
    const series = plotThemes[scheme].series;
    return scenarios.map((s: SavedScenario, i) => ({
      id: s.id,
      name: s.name,
      colour: series[i % series.length] ?? '#888',
      measurement: measurements[s.id],
      isBaseline: s.id === baselineId,
      sameAsCurrent: currentKey !== null && scenarioKey(s) === currentKey,
    }));
  }, [scenarios, measurements, baselineId, currentKey, scheme]);
  // Keep the same array while nothing a plot uses changed (an edit of the form alone must not redraw the overlays).
  const same =
    next.length === previous.current.length &&
    next.every((o, i) => {
      const p = previous.current[i]!;
      return o.id === p.id && o.name === p.name && o.colour === p.colour && o.measurement === p.measurement && o.isBaseline === p.isBaseline && o.sameAsCurrent === p.sameAsCurrent;
    });
  if (!same) previous.current = next;
  return previous.current;
}
