import { useMemo } from 'react';
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
  const submitted = useAppStore((state) => state.submittedDraft);
  const scheme = useAppStore((state) => state.colorScheme);
  return useMemo(() => {
    const currentKey = submitted === null ? null : JSON.stringify(submitted);
    const series = plotThemes[scheme].series;
    return scenarios.map((s: SavedScenario, i) => ({
      id: s.id,
      name: s.name,
      colour: series[i % series.length] ?? '#888',
      measurement: measurements[s.id],
      isBaseline: s.id === baselineId,
      sameAsCurrent: currentKey !== null && scenarioKey(s) === currentKey,
    }));
  }, [scenarios, measurements, baselineId, submitted, scheme]);
}
