import { expect, type Locator, type Page } from '@playwright/test';

/** Console errors, page errors and requests beyond the page's origin, collected for a final check. */
export function watchPage(page: Page, baseURL: string | undefined) {
  const consoleErrors: string[] = [];
  const foreignRequests: string[] = [];
  const workerUrls: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error') consoleErrors.push(message.text());
  });
  page.on('pageerror', (error) => consoleErrors.push(`page error: ${error.message}`));
  page.on('request', (request) => {
    const url = request.url();
    if (!url.startsWith(baseURL ?? 'http://127.0.0.1') && !url.startsWith('data:') && !url.startsWith('blob:')) foreignRequests.push(url);
  });
  page.on('worker', (worker) => workerUrls.push(worker.url()));
  return { consoleErrors, foreignRequests, workerUrls };
}

export async function renderCount(plot: Locator): Promise<number> {
  return Number((await plot.getAttribute('data-render-count')) ?? '0');
}

/** Waits until `plot` has drawn at least once. */
export async function waitForPlot(plot: Locator): Promise<void> {
  await expect(plot).toHaveAttribute('data-render-count', /^[1-9]/, { timeout: 20_000 });
}

/** Names of the traces a plot shows (its complete figure, drawn by Plotly or on the canvas layer). */
export async function traceNames(plot: Locator): Promise<string[]> {
  return plot.evaluate((element) => ((element as HTMLElement & { figureData?: { name?: string }[] }).figureData ?? []).map((t) => t.name ?? ''));
}

/** The title of a canvas-drawn plot (shown as page text beside its graph div). */
export function plotCaption(plot: Locator): Locator {
  return plot.locator('xpath=..').locator('.plot-caption');
}

/** Pixels with any ink on a canvas-drawn plot's canvas layer (src/ui/plots/canvasLayer.ts), and all of its pixels. */
export async function canvasInk(plot: Locator): Promise<{ inked: number; total: number }> {
  return plot.evaluate((element) => {
    const canvas = element.querySelector('canvas.plot-canvas-layer') as HTMLCanvasElement;
    const pixels = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
    let inked = 0;
    for (let i = 3; i < pixels.length; i += 4) if (pixels[i]! > 0) inked += 1;
    return { inked, total: pixels.length / 4 };
  });
}

/** The value cell of a metric in the measurements panel. */
export function metricValue(page: Page, id: string): Locator {
  return page.locator(`[data-metric="${id}"] [data-value]`);
}

/** Opens a closed form section (optional blocks start closed). */
export async function openSection(page: Page, id: string): Promise<void> {
  const section = page.locator(`[data-section="${id}"]`);
  if ((await section.getAttribute('open')) === null) await section.locator('summary').click();
}

/** Screenshot of one panel into the test's output folder (the artefacts reviewers look at). */
export async function shootPanel(page: Page, panel: string, path: string): Promise<void> {
  await page.locator(`[data-panel="${panel}"]`).screenshot({ path });
}
