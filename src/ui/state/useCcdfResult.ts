import { useAppStore } from './AppStoreContext';
import type { CcdfResult } from '../../worker/client';

/**
 * The statistics to show for the configuration being edited: the long run's (partial or final) report when it
 * measures this configuration, else the quick run's; with a note saying which.
 */
export function useCcdfResult(): { result: CcdfResult | null; note: string; seq: number; fromLongRun: boolean } {
  const quick = useAppStore((state) => state.ccdf);
  const longRun = useAppStore((state) => state.longRun);
  const currentKey = useAppStore((state) => (state.submittedDraft === null ? null : JSON.stringify(state.submittedDraft)));
  if (longRun.result !== null && longRun.configKey === currentKey) {
    const note =
      longRun.status === 'running'
        ? `long run in progress (${Math.round(100 * (longRun.progress?.fraction ?? 0))} %)`
        : longRun.status === 'cancelled'
          ? 'long run, cancelled'
          : 'long run';
    return { result: longRun.result, note, seq: quick.seq, fromLongRun: true };
  }
  return { result: quick.data, note: 'quick run', seq: quick.seq, fromLongRun: false };
}
