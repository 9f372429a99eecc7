import { expect, test } from '@playwright/test';
import { metricValue, plotCaption, shootPanel, traceNames, waitForPlot, watchPage } from './pageHelpers';

// The long Monte-Carlo CCDF run over the worker pool: progress with symbols/s and time left, partial curves while
// it runs, cancel, and a rerun to the end whose levels reach 1e-4 (enough symbols for ten values beyond it).

test('runs a long CCDF with progress, cancels it and runs it again to the end', async ({ page, baseURL }, testInfo) => {
  const watch = watchPage(page, baseURL);
  await page.goto('/');
  const plot = page.getByTestId('ccdf-plot');
  await waitForPlot(plot);
  await expect(plotCaption(plot)).toContainText('quick run');
  const panel = page.locator('[data-panel="ccdf"]');

  await panel.getByLabel('Long run', { exact: true }).selectOption('1000000');
  await panel.getByRole('button', { name: 'Run long CCDF' }).click();
  const status = panel.locator('.run-progress [role="status"]');
  await expect(status).toContainText(/\d+\.\d % · [\d,]+ of 1,000,000 symbols · [\d,]+ symbols\/s · .* left/, { timeout: 20_000 });
  // A partial curve from the merged lanes replaces the quick one while the run goes on.
  await expect(plotCaption(plot)).toContainText('long run in progress', { timeout: 20_000 });
  await shootPanel(page, 'ccdf', testInfo.outputPath('ccdf-running.png'));
  await panel.getByRole('button', { name: 'Cancel run' }).click();
  await expect(panel.locator('.run-progress')).toHaveAttribute('data-run-status', 'cancelled');
  await expect(status).toContainText('Cancelled after');
  await expect(plotCaption(plot)).toContainText('long run, cancelled');

  await panel.getByLabel('Long run', { exact: true }).selectOption('100000');
  await panel.getByRole('button', { name: 'Run again' }).click();
  await expect(panel.locator('.run-progress')).toHaveAttribute('data-run-status', 'done', { timeout: 90_000 });
  await expect(status).toContainText('Done: 100,000 symbols');
  await expect(plotCaption(plot)).toContainText('long run; 100,000 symbols');
  // PAPR at 1e-4 needs ≳ 10⁵ symbols (ten symbols beyond it; common practice): now reported, with its interval.
  await expect(metricValue(page, 'papr-1e-4')).toHaveText(/^\d+\.\d\d$/);
  expect(await traceNames(plot)).toEqual(expect.arrayContaining(['95 % interval', 'theory: complex Gaussian, e^−γ']));
  await panel.getByText('Symbol PAPR').click();
  await expect.poll(() => traceNames(plot)).toEqual(expect.arrayContaining([expect.stringMatching(/^OFDM theory, N = 480, α = 1$/)]));
  await shootPanel(page, 'ccdf', testInfo.outputPath('ccdf-long-run-papr.png'));
  await page.locator('.metrics-panel').screenshot({ path: testInfo.outputPath('measurements-after-long-run.png') });
  expect(watch.consoleErrors).toEqual([]);
});
