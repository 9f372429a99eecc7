import { expect, test, type Page } from '@playwright/test';
import { encodeConfigHash } from '../src/ui/persist/permalink';
import { waitForPlot } from './pageHelpers';

// Responsiveness, measured (never asserted): a single-slot LTE 20 MHz configuration (100 RB, TS 36.101 Table 5.6-1;
// one 0.5 ms slot = 7 symbols), then one-field changes. The page marks each change and measures until every plot on
// screen has drawn it (src/ui/perf/updateTimer.ts, User Timing "crestline:update"). The figures are printed and
// attached to the report.

const slotLte20 = { standard: 'lte', bandwidthMHz: 20, symbols: 7, allocation: { startRb: 0, numRb: 100 } };

// Playwright's trace recording snapshots the page around every action, on the page's own thread: it would be
// measured with the page. Off for this file.
test.use({ trace: 'off' });
const modulations = ['16qam', '64qam', 'qpsk', '256qam', '16qam', 'qpsk', '64qam', 'qpsk'];
// Allocation sizes in RB for DFT-s-OFDM: 2^a·3^b·5^c (TS 36.211 §5.3.3); each also redraws the resource grid.
const allocationsRb = ['75', '100', '50', '96', '100', '60', '100', '80'];

/** Waits for the next "crestline:update" measure with one evaluate (no polling on the page's thread meanwhile). */
function nextUpdate(page: Page) {
  return page.evaluate(
    () =>
      new Promise<{ duration: number; drawn: Record<string, number> }>((resolve) => {
        const observer = new PerformanceObserver((list) => {
          const update = list.getEntries().find((entry) => entry.name === 'crestline:update');
          if (update === undefined) return;
          observer.disconnect();
          // When each plot finished drawing and each engine answer arrived, from the change (marks
          // "crestline:drawn:<plot>:<seq>", "crestline:answer:<kind>:<seq>" with the engine's own time).
          const drawn: Record<string, number> = {};
          for (const mark of performance.getEntriesByType('mark') as PerformanceMark[]) {
            if (mark.startTime < update.startTime || mark.startTime > update.startTime + update.duration + 1) continue;
            const [, what, name] = mark.name.split(':');
            const at = Math.round(mark.startTime - update.startTime);
            if (what === 'drawn') drawn[name!] = at;
            if (what === 'answer') {
              const engineMs = (mark.detail as { engineMs?: number | null } | null)?.engineMs;
              drawn[`${name} answer`] = at;
              if (typeof engineMs === 'number') drawn[`${name} engine`] = Math.round(engineMs);
            }
          }
          resolve({ duration: update.duration, drawn });
        });
        observer.observe({ type: 'measure' });
      }),
  );
}

async function measure(page: Page, label: string, values: readonly string[], apply: (value: string) => Promise<void>) {
  const durations: number[] = [];
  const breakdowns: Record<string, number>[] = [];
  for (const value of values) {
    const update = nextUpdate(page);
    await apply(value);
    const { duration, drawn } = await update;
    durations.push(duration);
    breakdowns.push(drawn);
    await page.waitForTimeout(200);
  }
  const sorted = [...durations].sort((a, b) => a - b);
  const summary = {
    change: label,
    changes: values.length,
    medianMs: Math.round(sorted[Math.floor(sorted.length / 2)]!),
    minMs: Math.round(sorted[0]!),
    maxMs: Math.round(sorted.at(-1)!),
    allMs: durations.map((d) => Math.round(d)),
    plotDrawnAtMs: breakdowns,
  };
  console.log(`${label}, per plot (ms after the change): ${JSON.stringify(breakdowns.at(-1))}`);
  console.log(`update time (change → all plots drawn), ${label}: median ${summary.medianMs} ms, min ${summary.minMs} ms, max ${summary.maxMs} ms over ${summary.changes} changes`);
  return summary;
}

test('measures the time from a one-field change to every plot updated (LTE 20 MHz, one slot)', async ({ page }, testInfo) => {
  await page.goto(`/${encodeConfigHash(slotLte20)}`);
  for (const id of ['time-samples-plot', 'constellation-plot', 'resource-grid-plot', 'spectrum-plot', 'receiver-plot', 'backoff-plot']) {
    await waitForPlot(page.getByTestId(id));
  }
  // Let the pinned demo scenarios' background measurements finish, so they do not share the workers with the timing.
  await page.waitForTimeout(6000);
  const byModulation = await measure(page, 'modulation', modulations, (m) => page.getByLabel('Modulation', { exact: true }).selectOption(m).then(() => undefined));
  const byAllocation = await measure(page, 'allocation size', allocationsRb, (rb) => page.getByLabel('Block 1 number of RBs', { exact: true }).fill(rb));
  const report = {
    configuration: 'LTE 20 MHz uplink DFT-s-OFDM from RB 0, one slot (7 symbols), oversampling 1',
    results: [byModulation, byAllocation],
  };
  await testInfo.attach('update-time.json', { body: JSON.stringify(report, null, 2), contentType: 'application/json' });
  expect(byModulation.allMs).toHaveLength(modulations.length);
  expect(byAllocation.allMs).toHaveLength(allocationsRb.length);
});
