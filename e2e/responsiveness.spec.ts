import { expect, test } from '@playwright/test';
import { encodeConfigHash } from '../src/ui/persist/permalink';
import { waitForPlot } from './pageHelpers';

// Responsiveness, measured (never asserted): a single-slot LTE 20 MHz configuration (100 RB, TS 36.101 Table 5.6-1;
// one 0.5 ms slot = 7 symbols), then one-field changes. The page marks each change and measures until every plot on
// screen has drawn it (src/ui/perf/updateTimer.ts, User Timing "crestline:update"). The figures are printed and
// attached to the report.

const slotLte20 = { standard: 'lte', bandwidthMHz: 20, symbols: 7 };

// Playwright's trace recording snapshots the page around every action, on the page's own thread: it would be
// measured with the page. Off for this file.
test.use({ trace: 'off' });
const changes = ['16qam', '64qam', 'qpsk', '256qam', '16qam', 'qpsk', '64qam', 'qpsk'];

test('measures the time from a one-field change to every plot updated (LTE 20 MHz, one slot)', async ({ page }, testInfo) => {
  await page.goto(`/${encodeConfigHash(slotLte20)}`);
  for (const id of ['time-samples-plot', 'constellation-plot', 'resource-grid-plot', 'spectrum-plot', 'receiver-plot', 'backoff-plot']) {
    await waitForPlot(page.getByTestId(id));
  }
  // Let the pinned demo scenarios' background measurements finish, so they do not share the workers with the timing.
  await page.waitForTimeout(6000);
  const durations: number[] = [];
  const breakdowns: Record<string, number>[] = [];
  for (const modulation of changes) {
    // One evaluate that resolves on the next "crestline:update" measure: no polling on the page's thread meanwhile.
    const nextUpdate = page.evaluate(
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
    await page.getByLabel('Modulation', { exact: true }).selectOption(modulation);
    const { duration, drawn } = await nextUpdate;
    durations.push(duration);
    breakdowns.push(drawn);
    await page.waitForTimeout(200);
  }
  const sorted = [...durations].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)]!;
  const summary = {
    configuration: 'LTE 20 MHz uplink DFT-s-OFDM, full allocation, one slot (7 symbols), oversampling 1, modulation changes',
    changes: changes.length,
    medianMs: Math.round(median),
    minMs: Math.round(sorted[0]!),
    maxMs: Math.round(sorted.at(-1)!),
    allMs: durations.map((d) => Math.round(d)),
    plotDrawnAtMs: breakdowns,
  };
  console.log(`per plot (ms after the change): ${JSON.stringify(breakdowns.at(-1))}`);
  console.log(`update time (change → all plots drawn): median ${summary.medianMs} ms, min ${summary.minMs} ms, max ${summary.maxMs} ms over ${summary.changes} changes`);
  await testInfo.attach('update-time.json', { body: JSON.stringify(summary, null, 2), contentType: 'application/json' });
  expect(durations).toHaveLength(changes.length);
});
