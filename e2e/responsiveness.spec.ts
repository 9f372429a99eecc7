import { expect, test } from '@playwright/test';
import { encodeConfigHash } from '../src/ui/persist/permalink';
import { waitForPlot } from './pageHelpers';

// Responsiveness, measured (never asserted): a single-slot LTE 20 MHz configuration (100 RB, TS 36.101 Table 5.6-1;
// one 0.5 ms slot = 7 symbols), then one-field changes. The page marks each change and measures until every plot on
// screen has drawn it (src/ui/perf/updateTimer.ts, User Timing "crestline:update"). The figures are printed and
// attached to the report.

const slotLte20 = { standard: 'lte', bandwidthMHz: 20, symbols: 7 };
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
    const before = await page.evaluate(() => performance.getEntriesByName('crestline:update').length);
    await page.getByLabel('Modulation', { exact: true }).selectOption(modulation);
    await expect.poll(() => page.evaluate(() => performance.getEntriesByName('crestline:update').length), { timeout: 15_000 }).toBeGreaterThan(before);
    const { duration, drawn } = await page.evaluate(() => {
      const update = performance.getEntriesByName('crestline:update').at(-1)!;
      // When each plot finished drawing, from the change (marks "crestline:drawn:<plot>:<seq>").
      const marks = performance
        .getEntriesByType('mark')
        .filter((m) => m.name.startsWith('crestline:drawn:') && m.startTime >= update.startTime && m.startTime <= update.startTime + update.duration + 1);
      return { duration: update.duration, drawn: Object.fromEntries(marks.map((m) => [m.name.split(':')[2]!, Math.round(m.startTime - update.startTime)])) };
    });
    durations.push(duration);
    breakdowns.push(drawn);
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
