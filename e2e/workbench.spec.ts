import { expect, test } from '@playwright/test';
import { canvasInk, metricValue, openSection, plotCaption, renderCount, shootPanel, traceNames, waitForPlot, watchPage } from './pageHelpers';

// The workbench in Debian chromium: the demo opens with both pinned scenarios, every panel draws from the worker pool,
// edits reach the plots and measurements, bad values stop at their field, and the page keeps to its own origin and a
// strict Content-Security-Policy. Screenshots of every panel are saved as artefacts.

const PANELS = ['time', 'constellation', 'grid', 'ccdf', 'spectrum', 'amplifier', 'receiver', 'backoff', 'comparison'] as const;

test('opens the demo: every panel draws from the workers, no console errors, no foreign requests, strict CSP', async ({ page, baseURL }, testInfo) => {
  const watch = watchPage(page, baseURL);
  const failedRequests: string[] = [];
  page.on('requestfailed', (request) => failedRequests.push(`${request.url()} ${request.failure()?.errorText ?? ''}`));
  await page.goto('/');
  await expect(page.getByRole('heading', { level: 1, name: 'Crestline' })).toBeVisible();
  await expect(page.getByLabel('Scenario', { exact: true })).toContainText('Brackenmoor Fen test lab');
  await expect(page.getByRole('note', { name: 'Safety caution' })).toContainText('licence');

  for (const id of ['time-samples-plot', 'constellation-plot', 'resource-grid-plot', 'spectrum-plot', 'amplifier-plot', 'receiver-plot']) {
    await waitForPlot(page.getByTestId(id));
  }
  expect(watch.workerUrls.some((url) => url.includes('engine.worker'))).toBe(true);

  // Demo: LTE 10 MHz, 40 RB of 16QAM from RB 5, 4× oversampling (TS 36.101 Table 5.6-1: 50 RB).
  await expect(page.locator('.summary-list').first()).toBeVisible();
  await expect(page.getByRole('region', { name: 'Result' })).toContainText('40 RB from RB 5, 16QAM');
  const timeTraces = await page.getByTestId('time-samples-plot').evaluate((element) =>
    ((element as HTMLElement & { figureData?: { name: string; x: ArrayLike<number> }[] }).figureData ?? []).map((t) => `${t.name}:${t.x.length}`),
  );
  // Symbol 0 spans 4 × (1024 + 80) = 4416 samples (TS 36.211 Table 5.6-1, scaled to N_FFT 1024 and 4×), drawn as
  // min/max buckets of 9 samples: 2 × ⌈4416/9⌉ = 982 points per trace.
  expect(timeTraces).toEqual(['I:982', 'Q:982', '|x|:982', 'peak:1']);
  await expect(plotCaption(page.getByTestId('time-samples-plot'))).toContainText('4416 samples');
  // The Rapp PA at 6 dB OBO leaves EVM well under the 16QAM limit of 12.5 % (TS 36.101 Table 6.5.2.1.1-1) and the
  // measured OBO equals the configured one.
  await expect(metricValue(page, 'evm')).toHaveText(/^\d+\.\d+$/);
  expect(Number(await metricValue(page, 'evm').textContent())).toBeLessThan(12.5);
  await expect(metricValue(page, 'obo')).toHaveText('6.00');
  await expect(page.locator('[data-metric="aclr-eutra"] [data-value]')).toHaveText(/^\d+\.\d$/);

  // The back-off sweep runs in the background; both pinned scenarios appear on it beside the current configuration.
  const backoffPlot = page.getByTestId('backoff-plot');
  await waitForPlot(backoffPlot);
  await expect.poll(() => traceNames(backoffPlot), { timeout: 30_000 }).toEqual(
    expect.arrayContaining(['Saltway uplink, OFDM (comparison): EVM', 'Saltway uplink, DFT-s-OFDM (current): EVM']),
  );
  await expect(metricValue(page, 'required-obo')).toHaveText(/^\d+\.\d\d/, { timeout: 30_000 });
  // DFT-s-OFDM needs less back-off than OFDM (the demo's point): the table shows a negative difference.
  const dftRow = page.locator('[data-panel="comparison"] tr[data-scenario-id="demo-dft-s-ofdm"]');
  await expect(dftRow).toContainText(/\(−\d+\.\d\d\)/, { timeout: 40_000 });

  await page.screenshot({ path: testInfo.outputPath('workbench-light.png'), fullPage: true });
  for (const panel of PANELS) await shootPanel(page, panel, testInfo.outputPath(`panel-${panel}-light.png`));
  await page.locator('.metrics-panel').screenshot({ path: testInfo.outputPath('panel-measurements-light.png') });

  await page.emulateMedia({ colorScheme: 'dark' });
  await expect(page.getByTestId('time-samples-plot').locator('.main-svg').first()).toHaveCSS('background-color', 'rgb(22, 27, 34)');
  await page.screenshot({ path: testInfo.outputPath('workbench-dark.png'), fullPage: true });
  for (const panel of PANELS) await shootPanel(page, panel, testInfo.outputPath(`panel-${panel}-dark.png`));

  expect(watch.consoleErrors).toEqual([]);
  expect(watch.foreignRequests).toEqual([]);

  // The Content-Security-Policy (index.html) refuses inline and remote scripts. DevTools-evaluated code is exempt
  // from CSP, so probe with script elements and read the browser's violation reports.
  const probe = await page.evaluate(async () => {
    const violations: string[] = [];
    document.addEventListener('securitypolicyviolation', (event) => violations.push(`${event.effectiveDirective} ${event.blockedURI}`));
    const inline = document.createElement('script');
    inline.textContent = 'window.__crestlineInlineRan = true;';
    document.body.append(inline);
    const remote = document.createElement('script');
    remote.src = 'https://scripts.example.invalid/remote.js';
    document.body.append(remote);
    await new Promise((resolve) => setTimeout(resolve, 200));
    return { inlineRan: 'crestlineInlineRan' in window, violations: violations.sort() };
  });
  expect(probe.inlineRan).toBe(false);
  expect(probe.violations).toEqual(['script-src-elem https://scripts.example.invalid/remote.js', 'script-src-elem inline']);
  const policy = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
  expect(policy).toContain("script-src 'self'");
  expect(policy).not.toContain("'unsafe-eval'");
  expect(failedRequests).toEqual(['https://scripts.example.invalid/remote.js csp']);
});

test('follows waveform and modulation changes in the plots and the measurements', async ({ page, baseURL }) => {
  const watch = watchPage(page, baseURL);
  await page.goto('/');
  const constellation = page.getByTestId('constellation-plot');
  await waitForPlot(constellation);
  await expect(metricValue(page, 'aclr-eutra')).toHaveText(/^\d+\.\d$/);
  await expect(metricValue(page, 'ccdf-1e-3')).toHaveText(/^\d+\.\d\d$/);
  const aclrDfts = Number(await metricValue(page, 'aclr-eutra').textContent());
  const ccdfDfts = Number(await metricValue(page, 'ccdf-1e-3').textContent());
  const cmDfts = Number(await metricValue(page, 'cm').textContent());
  const ccdfPlot = page.getByTestId('ccdf-plot');
  const ccdfRenders = Number(await ccdfPlot.getAttribute('data-render-count'));

  // The same allocation as plain OFDM through the same PA: a larger envelope (power CCDF near e^−γ: 8.4 dB at 1e-3,
  // van Nee & Prasad 2000 ch. 6, against ~6.5 dB with transform precoding), more regrowth, lower ACLR, higher CM.
  await page.getByLabel('Waveform', { exact: true }).selectOption('ofdm');
  await expect.poll(async () => Number(await metricValue(page, 'aclr-eutra').textContent())).toBeLessThan(aclrDfts - 0.5);
  await expect.poll(async () => Number(await metricValue(page, 'ccdf-1e-3').textContent())).toBeGreaterThan(ccdfDfts + 1);
  expect(Number(await metricValue(page, 'cm').textContent())).toBeGreaterThan(cmDfts + 0.5);
  expect(Number(await ccdfPlot.getAttribute('data-render-count'))).toBeGreaterThan(ccdfRenders);

  const rendersBefore = await renderCount(constellation);
  await page.getByLabel('Modulation', { exact: true }).selectOption('qpsk');
  // QPSK: four ideal points (±1 ± j)/√2, TS 36.211 Table 7.1.2-1.
  await expect
    .poll(() =>
      constellation.evaluate((element) => {
        const trace = ((element as HTMLElement & { figureData?: { x: ArrayLike<number>; y: ArrayLike<number> }[] }).figureData ?? [])[0];
        const seen = new Set<string>();
        for (let i = 0; i < (trace?.x.length ?? 0); i++) seen.add(`${Number(trace!.x[i]).toFixed(6)},${Number(trace!.y[i]).toFixed(6)}`);
        return seen.size;
      }),
    )
    .toBe(4);
  expect(await renderCount(constellation)).toBeGreaterThan(rendersBefore);
  // The title carries the EVM readout of the received points.
  await expect(plotCaption(constellation)).toHaveText(/^Symbol 0: 480 QPSK data symbols; received EVM \d+\.\d+\s%$/);
  // The EVM limit follows the modulation: QPSK 17.5 % (TS 36.101 Table 6.5.2.1.1-1).
  await expect(page.locator('[data-metric="evm"] .metric-limit')).toContainText('17.5 %');

  await page.getByLabel('Symbol shown', { exact: true }).fill('3');
  const timePlot = page.getByTestId('time-samples-plot');
  await expect(plotCaption(timePlot)).toContainText('Symbol 3: time samples');

  // The traces are drawn on the canvas layer: pixels there, and a readout for the point under the pointer — here the
  // peak marker, placed with the axes Plotly laid out.
  const peak = await timePlot.evaluate((element) => {
    type Axis = { range: [number, number]; _offset: number; _length: number };
    const gd = element as HTMLElement & { figureData?: { name: string; x: number[]; y: number[] }[]; _fullLayout?: { xaxis: Axis; yaxis: Axis } };
    const trace = gd.figureData!.find((t) => t.name === 'peak')!;
    const { xaxis: xa, yaxis: ya } = gd._fullLayout!;
    return {
      x: xa._offset + ((trace.x[0]! - xa.range[0]) / (xa.range[1] - xa.range[0])) * xa._length,
      y: ya._offset + (1 - (trace.y[0]! - ya.range[0]) / (ya.range[1] - ya.range[0])) * ya._length,
      magnitude: trace.y[0]!,
    };
  });
  const ink = await canvasInk(timePlot);
  expect(ink.inked / ink.total).toBeGreaterThan(0.05);
  const box = (await timePlot.boundingBox())!;
  await page.mouse.move(box.x + peak.x + 1, box.y + peak.y + 1);
  const readout = timePlot.locator('xpath=..').locator('.plot-readout');
  await expect(readout).toBeVisible();
  await expect(readout.locator('span').first()).toHaveText(`peak |x| ${peak.magnitude.toPrecision(4)}`);
  await page.mouse.move(box.x + box.width + 40, box.y + box.height + 40);
  await expect(readout).toBeHidden();

  // A legend click hides a canvas-drawn curve (Plotly keeps the choice; the canvas redraws without it).
  const inked = async () => (await canvasInk(timePlot)).inked;
  const inkedBefore = await inked();
  const magnitudeEntry = timePlot.locator('g.traces').filter({ has: page.locator('.legendtext', { hasText: /^\|x\|$/ }) }).locator('.legendtoggle');
  await magnitudeEntry.click();
  await expect.poll(inked).toBeLessThan(inkedBefore * 0.9);
  await magnitudeEntry.click();
  await expect.poll(inked).toBe(inkedBefore);
  expect(watch.consoleErrors).toEqual([]);
});

test('marks an invalid allocation at its field and never sends it to the engine', async ({ page }, testInfo) => {
  await page.goto('/');
  const timePlot = page.getByTestId('time-samples-plot');
  await waitForPlot(timePlot);
  const numRb = page.getByLabel('Block 1 number of RBs', { exact: true });

  // Schema rule: at least one RB. The field is marked at once and the plots keep the last valid configuration.
  const renders = await renderCount(timePlot);
  await numRb.fill('0');
  const allocation = page.locator('[data-field="allocation"]');
  await expect(allocation.getByRole('alert')).toContainText('must be a whole number of resource blocks ≥ 1');
  await expect(numRb).toHaveAttribute('aria-invalid', 'true');
  await page.waitForTimeout(300);
  expect(await renderCount(timePlot)).toBe(renders);

  // Cross-field rule from the engine: RBs 5…64 do not fit the 50-RB grid of LTE 10 MHz (TS 36.101 Table 5.6-1).
  await numRb.fill('60');
  await expect(allocation.getByRole('alert')).toContainText('exceed the grid of 50 RB');
  await expect(numRb).toHaveAttribute('aria-invalid', 'true');
  await shootPanel(page, 'time', testInfo.outputPath('unchanged-time-plot.png'));
  await page.locator('.config-panel').screenshot({ path: testInfo.outputPath('field-error-allocation.png') });

  // DFT-s-OFDM sizes: 7 RB (M_sc 84 = 2²·3·7) is not 2^a·3^b·5^c (TS 36.211 §5.3.3).
  await numRb.fill('7');
  await expect(allocation.getByRole('alert')).toContainText('2^a·3^b·5^c');
  await numRb.fill('40');
  await expect(allocation.getByRole('alert')).toHaveCount(0);

  // A schema message for an ordinary field, at the field.
  await page.getByLabel('Oversampling', { exact: true }).fill('17');
  await expect(page.locator('[data-field="oversampling"]').getByRole('alert')).toHaveText('must be a whole number from 1 to 16');
  // The optional sections carry their own fields: a DAC with 1 bit is refused by the schema.
  await openSection(page, 'impairments');
  await page.getByLabel('Impairments', { exact: true }).check();
  await page.getByLabel('DAC quantisation', { exact: true }).check();
  await page.getByLabel('Bits per rail', { exact: true }).fill('1');
  await expect(page.locator('[data-field="impairments.dac.bits"]').getByRole('alert')).toContainText('>=2');
});
