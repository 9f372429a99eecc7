import { parseWaveformConfig } from '../../../src/config/configParse';
import type { WaveformConfigInput } from '../../../src/config/schema';
import { runIdentityOf, statisticsFactsOf, type MeasurementContext } from '../../../src/dsp/montecarlo/measurementContext';
import { buildMeasureReport, type MeasureReport } from '../../../src/dsp/montecarlo/measureReport';
import { createSetupMeasurer, resolveMeasurementSetup, type MeasurementRequest } from '../../../src/dsp/montecarlo/measurementSetup';
import { allBlockIndices } from '../../../src/dsp/montecarlo/runPlan';
import { createInlineLane, runMonteCarloBlocks } from '../../../src/dsp/montecarlo/runScheduler';
import type { RunStats } from '../../../src/dsp/montecarlo/runStats';

/** Runs the statistics of a configuration on `numLanes` inline lanes (no spectrum) and builds the report. */
export async function runStatistics(
  input: WaveformConfigInput,
  request: MeasurementRequest,
  numLanes = 1,
): Promise<{ report: MeasureReport; stats: RunStats; context: MeasurementContext }> {
  const setup = resolveMeasurementSetup(parseWaveformConfig(input), request);
  const lanes = Array.from({ length: numLanes }, () => createSetupMeasurer(setup));
  const stats = await runMonteCarloBlocks(
    lanes.map((l) => createInlineLane(l.measurer)),
    setup.run,
    allBlockIndices(setup.run),
  );
  const context: MeasurementContext = {
    identity: runIdentityOf(setup),
    statistics: statisticsFactsOf(lanes[0]!.plan, lanes[0]!.source),
    spectrum: null,
    warnings: setup.warnings,
    notes: setup.notes,
  };
  return { report: buildMeasureReport(context, stats), stats, context };
}
