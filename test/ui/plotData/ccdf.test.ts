import { describe, expect, it } from 'vitest';
import { buildCcdfFigure, levelPoints, MAX_CCDF_POINTS, thinCurve } from '../../../src/ui/plotData/ccdf';
import { plotThemes } from '../../../src/ui/plotData/plotTheme';
import { createEngineClient } from '../../../src/worker/client';
import { InProcessWorker } from '../../worker/inProcessWorker';

// The CCDF figure over a real statistics run (LTE 1.4 MHz OFDM, 6 RB: TS 36.101 Table 5.6-1).

async function run() {
  const client = createEngineClient({ createWorker: () => new InProcessWorker(), poolSize: 1 });
  const result = await client.ccdf({ standard: 'lte', bandwidthMHz: 1.4, waveform: 'ofdm' }, { symbols: 2048, seed: 3 });
  client.dispose();
  return result;
}

describe('CCDF figure', () => {
  it('thins curves for drawing, keeps the last point and drops zero probabilities (log axis)', () => {
    const x = Float64Array.from({ length: 5000 }, (_, i) => i / 100);
    const y = Float64Array.from({ length: 5000 }, (_, i) => (i < 4990 ? 1 - i / 5000 : 0));
    const thin = thinCurve(x, y);
    expect(thin.x.length).toBeLessThanOrEqual(MAX_CCDF_POINTS + 1);
    expect(thin.y.every((p) => p > 0)).toBe(true);
    expect(thin.x.at(-1)).toBe(x[4989]);
  });

  it('draws the engine’s levels with their 95 % intervals and the matching theory', async () => {
    const result = await run();
    const points = levelPoints(result, 'power');
    // Each reported level comes from the report, with an interval around it.
    for (const p of points) {
      expect(result.report.ccdfDb[p.probability.toExponential(0) as '1e-1']).toBe(p.levelDb);
      if (p.lowDb !== null && p.highDb !== null) expect(p.lowDb).toBeLessThanOrEqual(p.levelDb);
    }
    const figure = buildCcdfFigure({ statistic: 'papr', current: { name: 'current', colour: '#000', result }, note: 'quick run', overlays: [] }, plotThemes.light);
    const names = figure.data.map((t) => t.name);
    expect(names).toContain(`OFDM theory, N = ${result.report.theory.numSubcarriers}, α = 1`);
    expect(names).toContain(`OFDM theory, N = ${result.report.theory.numSubcarriers}, α = 2.8`);
    expect(figure.layout.yaxis).toMatchObject({ type: 'log' });
    // 72 data subcarriers of 6 RB: the theory's N (van Nee & Prasad 2000, ch. 6).
    expect(result.report.theory.numSubcarriers).toBe(72);
  });
});
