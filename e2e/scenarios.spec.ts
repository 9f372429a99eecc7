import { expect, test } from '@playwright/test';
import { shootPanel, traceNames, waitForPlot, watchPage } from './pageHelpers';

// Pinned scenarios: pin, see them in the overlays and the comparison table, find them again after a reload
// (IndexedDB), and reproduce a configuration from its permalink.

test('pins two scenarios, overlays and tabulates them, and keeps them across a reload', async ({ page, baseURL }, testInfo) => {
  const watch = watchPage(page, baseURL);
  await page.goto('/');
  await waitForPlot(page.getByTestId('spectrum-plot'));
  const list = page.getByRole('list', { name: 'Pinned scenarios' });
  // The demo's two pins are there; remove them so this test pins its own two.
  await expect(list.getByRole('listitem')).toHaveCount(2);
  for (const name of ['Saltway uplink, DFT-s-OFDM', 'Saltway uplink, OFDM (comparison)']) await page.getByRole('button', { name: `Remove ${name}` }).click();
  await expect(list).toHaveCount(0);

  await page.getByLabel('Modulation', { exact: true }).selectOption('64qam');
  await page.getByLabel('Name for the pinned scenario').fill('Bench 64QAM');
  await page.getByRole('button', { name: 'Pin current' }).click();
  await page.getByLabel('Block 1 number of RBs', { exact: true }).fill('25');
  await page.getByLabel('Name for the pinned scenario').fill('Bench 64QAM, 25 RB');
  await page.getByRole('button', { name: 'Pin current' }).click();
  await expect(list.getByRole('listitem')).toHaveCount(2);

  // Both in the spectrum overlay and in the table, the first pinned one being the baseline.
  const spectrum = page.getByTestId('spectrum-plot');
  await expect.poll(() => traceNames(spectrum), { timeout: 20_000 }).toEqual(expect.arrayContaining(['Bench 64QAM', 'Bench 64QAM, 25 RB (current), transmitted']));
  const table = page.locator('[data-panel="comparison"]');
  await expect(table.locator('tbody tr')).toHaveCount(2);
  await expect(table.locator('tbody tr').first()).toContainText('baseline');
  await expect(table.locator('tbody tr').nth(1)).toContainText('allocation.numRb: 40 → 25');
  // Required OBO (fourth figure) once both back-off sweeps are in, with its difference from the baseline.
  await expect(table.locator('tbody tr').nth(1).locator('td.num').nth(3)).toHaveText(/^\d+\.\d\d \([+−]\d+\.\d\d\)$/, { timeout: 40_000 });
  await shootPanel(page, 'comparison', testInfo.outputPath('comparison-two-pins.png'));
  await shootPanel(page, 'spectrum', testInfo.outputPath('spectrum-overlay.png'));

  await expect(page.locator('[data-persistence]')).toHaveAttribute('data-persistence', 'saved');
  await page.reload();
  await expect(list.getByRole('listitem')).toHaveCount(2);
  await expect(page.getByRole('textbox', { name: 'Name of pinned scenario 1' })).toHaveValue('Bench 64QAM');
  await expect(page.getByRole('textbox', { name: 'Name of pinned scenario 2' })).toHaveValue('Bench 64QAM, 25 RB');
  await expect(page.getByLabel('Block 1 number of RBs', { exact: true })).toHaveValue('25');
  expect(watch.consoleErrors).toEqual([]);
});

test('opens a permalink with the same configuration', async ({ page, browser }) => {
  await page.goto('/');
  await waitForPlot(page.getByTestId('time-samples-plot'));
  await page.getByLabel('Standard', { exact: true }).selectOption('nr');
  await page.getByLabel('Channel bandwidth', { exact: true }).fill('40');
  await page.getByLabel('Waveform', { exact: true }).selectOption('ofdm');
  await page.getByLabel('Block 1 start RB', { exact: true }).fill('10');
  await page.getByLabel('Block 1 number of RBs', { exact: true }).fill('50');
  await expect(page).toHaveURL(/#config=/);
  const link = page.url();
  const draft = await page.evaluate(() => window.location.hash);

  // A fresh context (no saved workspace) opening the link shows exactly that configuration.
  const context = await browser.newContext();
  const other = await context.newPage();
  await other.goto(link);
  await expect(other.getByLabel('Scenario', { exact: true })).toContainText('Shared configuration');
  await expect(other.getByLabel('Standard', { exact: true })).toHaveValue('nr');
  await expect(other.getByLabel('Channel bandwidth', { exact: true })).toHaveValue('40');
  await expect(other.getByLabel('Waveform', { exact: true })).toHaveValue('ofdm');
  await expect(other.getByLabel('Block 1 start RB', { exact: true })).toHaveValue('10');
  await expect(other.getByLabel('Block 1 number of RBs', { exact: true })).toHaveValue('50');
  await waitForPlot(other.getByTestId('time-samples-plot'));
  // NR 40 MHz at 30 kHz: 106 RB (TS 38.101-1 Table 5.3.2-1).
  await expect(other.getByRole('region', { name: 'Result' })).toContainText('106 RB × 12 subcarriers');
  expect(await other.evaluate(() => window.location.hash)).toBe(draft);
  await context.close();
});
