import { expect, test, type Locator } from '@playwright/test';

// Smoke test of the workbench page in Debian chromium: the demo scenario loads, the engine runs in
// a module worker, both plots render from its result, and a modulation change reaches the plot.

/** Distinct (I, Q) points in the constellation trace Plotly holds on its graph div. */
async function distinctConstellationPoints(plot: Locator): Promise<number> {
  return plot.evaluate((element) => {
    const traces = (element as HTMLElement & { data?: { x: ArrayLike<number>; y: ArrayLike<number> }[] }).data ?? [];
    const trace = traces[0];
    if (trace === undefined) return 0;
    const seen = new Set<string>();
    for (let i = 0; i < trace.x.length; i++) seen.add(`${Number(trace.x[i]).toFixed(6)},${Number(trace.y[i]).toFixed(6)}`);
    return seen.size;
  });
}

async function renderCount(plot: Locator): Promise<number> {
  return Number((await plot.getAttribute('data-render-count')) ?? '0');
}

test('loads the demo scenario, plots one symbol from the worker and follows a modulation change', async ({
  page,
  baseURL,
}, testInfo) => {
  const consoleErrors: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error') consoleErrors.push(message.text());
  });
  page.on('pageerror', (error) => consoleErrors.push(`page error: ${error.message}`));
  const foreignRequests: string[] = [];
  page.on('request', (request) => {
    const url = request.url();
    if (!url.startsWith(baseURL ?? 'http://127.0.0.1') && !url.startsWith('data:') && !url.startsWith('blob:'))
      foreignRequests.push(url);
  });
  const failedRequests: string[] = [];
  page.on('requestfailed', (request) => failedRequests.push(`${request.url()} ${request.failure()?.errorText ?? ''}`));
  const workerUrls: string[] = [];
  page.on('worker', (worker) => workerUrls.push(worker.url()));

  await page.goto('/');
  await expect(page.getByRole('heading', { level: 1, name: 'Crestline' })).toBeVisible();
  await expect(page.getByLabel('Scenario', { exact: true })).toContainText('Brackenmoor Fen test lab');
  await expect(page.getByRole('note', { name: 'Safety caution' })).toContainText('licence');

  const timePlot = page.getByTestId('time-samples-plot');
  const constellationPlot = page.getByTestId('constellation-plot');
  await expect(timePlot).toHaveAttribute('data-render-count', /^[1-9]/);
  await expect(constellationPlot).toHaveAttribute('data-render-count', /^[1-9]/);
  expect(workerUrls.some((url) => url.includes('engine.worker'))).toBe(true);

  // Demo: LTE 10 MHz, 40 RB of 16QAM, 4× oversampling. One symbol: 480 data symbols, 16 distinct points
  // (TS 36.211 Table 7.1.3-1); symbol 0 spans 4 × (1024 + 80) samples (TS 36.211 Table 5.6-1, scaled).
  await expect(page.locator('.summary-list')).toContainText('40 RB from RB 5, 16QAM');
  expect(await distinctConstellationPoints(constellationPlot)).toBe(16);
  const timeTraces = await timePlot.evaluate((element) =>
    ((element as HTMLElement & { data?: { name: string; x: ArrayLike<number> }[] }).data ?? []).map(
      (t) => `${t.name}:${t.x.length}`,
    ),
  );
  expect(timeTraces).toEqual(['I:4416', 'Q:4416', '|x|:4416', 'peak:1']);
  await expect(timePlot.locator('.shapelayer path, .layer-below .shapelayer path').first()).toBeAttached();
  await page.screenshot({ path: testInfo.outputPath('workbench-light.png'), fullPage: true });

  const rendersBefore = await renderCount(constellationPlot);
  await page.getByLabel('Modulation', { exact: true }).selectOption('qpsk');
  await expect.poll(() => distinctConstellationPoints(constellationPlot)).toBe(4);
  expect(await renderCount(constellationPlot)).toBeGreaterThan(rendersBefore);
  await expect(constellationPlot.locator('.gtitle')).toHaveText('Symbol 0: 480 QPSK data symbols');

  await page.getByLabel('Symbol shown', { exact: true }).fill('3');
  await expect(timePlot.locator('.gtitle')).toContainText('Symbol 3: time samples');

  // An invalid value is marked at its field with the schema's message and is not sent to the engine.
  const rendersBeforeInvalid = await renderCount(timePlot);
  await page.getByLabel('Oversampling', { exact: true }).fill('17');
  const oversamplingField = page.locator('[data-field="oversampling"]');
  await expect(oversamplingField.getByRole('alert')).toHaveText('must be a whole number from 1 to 16');
  await expect(page.getByLabel('Oversampling', { exact: true })).toHaveAttribute('aria-invalid', 'true');
  await page.screenshot({ path: testInfo.outputPath('workbench-field-error.png'), fullPage: true });
  // A cross-field rule comes back from the engine and is marked at its field too.
  await page.getByLabel('Oversampling', { exact: true }).fill('2');
  await page.getByLabel('Channel bandwidth', { exact: true }).fill('7');
  await expect(page.locator('[data-field="bandwidthMHz"]').getByRole('alert')).toContainText('allowed: 1.4, 3, 5, 10, 15, 20');
  await page.getByLabel('Channel bandwidth', { exact: true }).fill('10');
  await expect(page.locator('[data-field="bandwidthMHz"]').getByRole('alert')).toHaveCount(0);
  await expect.poll(() => renderCount(timePlot)).toBeGreaterThan(rendersBeforeInvalid);

  await page.emulateMedia({ colorScheme: 'dark' });
  await expect(timePlot.locator('.main-svg').first()).toHaveCSS('background-color', 'rgb(22, 27, 34)');
  await page.screenshot({ path: testInfo.outputPath('workbench-dark.png'), fullPage: true });

  expect(consoleErrors).toEqual([]);
  expect(foreignRequests).toEqual([]);

  // The Content-Security-Policy (index.html) refuses inline and remote scripts. DevTools-evaluated code
  // is exempt from CSP, so probe with script elements and read the browser's violation reports.
  const probe = await page.evaluate(async () => {
    const violations: string[] = [];
    document.addEventListener('securitypolicyviolation', (event) =>
      violations.push(`${event.effectiveDirective} ${event.blockedURI}`),
    );
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
  expect(policy).toContain("script-src 'self';");
  expect(policy).not.toContain('unsafe-eval');
  // The browser reports the remote script as a request, but blocks it before it reaches the network.
  expect(failedRequests).toEqual(['https://scripts.example.invalid/remote.js csp']);
});
