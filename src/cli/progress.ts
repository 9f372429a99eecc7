import type { ExportStep } from '../io/exportPipeline';

/**
 * Prints export progress on stderr as a bar line at every 10 % and at each change of pass:
 * `[#####-----]  50 % write  61.4 of 122.9 M samples`. Call with undefined when done.
 */
export function createProgressPrinter(
  stderr: (line: string) => void,
  fileSamples: number,
): (step: Extract<ExportStep, { kind: 'progress' }> | undefined) => void {
  let lastTenth = -1;
  let lastPhase = '';
  return (step) => {
    if (!step) return;
    const fraction = step.totalSamples > 0 ? step.doneSamples / step.totalSamples : 1;
    const tenth = Math.floor(fraction * 10);
    if (tenth === lastTenth && step.phase === lastPhase) return;
    lastTenth = tenth;
    lastPhase = step.phase;
    const bar = `${'#'.repeat(tenth)}${'-'.repeat(10 - tenth)}`;
    const word = step.phase === 'analyse' ? 'analyse (level / resampler history)' : `write ${(fileSamples / 1e6).toFixed(1)} M samples`;
    stderr(`progress [${bar}] ${(100 * fraction).toFixed(0).padStart(3)} % ${word}`);
  };
}
