import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { expect, test, type Download } from '@playwright/test';
import { parseWaveformConfig } from '../src/config/configParse';
import { defaultScenario } from '../src/scenarios/demoScenario';
import { exportToMemory } from '../src/io/exportMemory';
import { listUstarMembers } from '../src/io/ustar';
import { waitForPlot, watchPage } from './pageHelpers';

// Export from the browser: the dialog previews level, peak, clipping and checksum; the saved SigMF recording parses,
// its sha512 matches, and its bytes equal what src/io builds in Node for the same configuration (the CLI's path).

test('exports a SigMF recording whose metadata parses and whose sha512 matches', async ({ page, baseURL }, testInfo) => {
  const watch = watchPage(page, baseURL);
  await page.goto('/');
  await waitForPlot(page.getByTestId('time-samples-plot'));
  await page.getByRole('button', { name: 'Export IQ…' }).click();
  const dialog = page.getByRole('dialog', { name: 'Export IQ file' });
  await expect(dialog).toBeVisible();
  await expect(dialog.getByRole('note', { name: 'Export safety caution' })).toContainText('licence');
  await dialog.getByLabel('Format').selectOption('sigmf-ci16');
  await dialog.getByLabel('Level', { exact: true }).selectOption('rms');
  await dialog.getByLabel('RMS level').fill('-18');
  const shownSha = dialog.locator('[data-report="sha512"]');
  await expect(shownSha).toHaveText(/^[0-9a-f]{128}$/, { timeout: 20_000 });
  await expect(dialog.locator('[data-report="RMS level"]')).toHaveText(/^-18\.0\d dBFS$/);
  await expect(dialog.locator('[data-report="Clipping"]')).toContainText('none');
  await dialog.screenshot({ path: testInfo.outputPath('export-dialog.png') });

  const files: Download[] = [];
  page.on('download', (download) => files.push(download));
  await dialog.getByRole('button', { name: 'Save files' }).click();
  await expect.poll(() => files.length).toBe(2);
  const byName = new Map(files.map((d) => [d.suggestedFilename(), d]));
  const base = 'saltway-uplink-dft-s-ofdm';
  expect([...byName.keys()].sort()).toEqual([`${base}.sigmf-data`, `${base}.sigmf-meta`]);
  const data = await readFile((await byName.get(`${base}.sigmf-data`)!.path())!);
  const meta = JSON.parse(await readFile((await byName.get(`${base}.sigmf-meta`)!.path())!, 'utf8')) as {
    global: Record<string, unknown>;
    captures: unknown[];
  };

  // SigMF core fields (SigMF specification v1.x, global object): datatype, sample rate, sha512 of the data file.
  expect(meta.global['core:datatype']).toBe('ci16_le');
  expect(meta.global['core:sample_rate']).toBe(61.44e6); // 1024 × 15 kHz × 4 (TS 36.211 Table 5.6-1 scaling)
  const sha = createHash('sha512').update(data).digest('hex');
  expect(meta.global['core:sha512']).toBe(sha);
  expect(await shownSha.textContent()).toBe(sha);
  // ci16_le: 4 bytes per complex sample; 14 symbols of 4 × (1024 + CP) samples = 61 440 samples.
  expect(data.byteLength).toBe(61440 * 4);
  expect(meta.captures).toHaveLength(1);

  // The same bytes as src/io's export for this configuration in Node (what `crestline generate` writes).
  const expected = exportToMemory(parseWaveformConfig(defaultScenario.config), { format: 'sigmf-ci16', level: { mode: 'rms', levelDbfs: -18 } });
  expect(Buffer.compare(data, Buffer.from(expected.data))).toBe(0);
  expect(expected.sha512Hex).toBe(sha);
  expect(watch.consoleErrors).toEqual([]);
});

// The SigMF archive: one .sigmf tar (SigMF specification v1.2, Archive: a folder NAME/ with NAME.sigmf-meta and
// NAME.sigmf-data) whose data member has the bytes src/io builds in Node and whose metadata's sha512 matches them.
test('exports a SigMF archive that holds the recording, with the same bytes as the command line', async ({ page, baseURL }) => {
  const watch = watchPage(page, baseURL);
  await page.goto('/');
  await waitForPlot(page.getByTestId('time-samples-plot'));
  await page.getByRole('button', { name: 'Export IQ…' }).click();
  const dialog = page.getByRole('dialog', { name: 'Export IQ file' });
  await dialog.getByLabel('Format').selectOption('sigmf-archive');
  await expect(dialog.locator('[data-report="sha512"]')).toHaveText(/^[0-9a-f]{128}$/, { timeout: 20_000 });
  const files: Download[] = [];
  page.on('download', (download) => files.push(download));
  await dialog.getByRole('button', { name: 'Save files' }).click();
  await expect.poll(() => files.length).toBe(1);
  await page.waitForTimeout(300);
  expect(files).toHaveLength(1);
  const base = 'saltway-uplink-dft-s-ofdm';
  expect(files[0]!.suggestedFilename()).toBe(`${base}.sigmf`);
  const bytes = new Uint8Array(await readFile((await files[0]!.path())!));
  const members = listUstarMembers(bytes.length, (offset, length) => bytes.subarray(offset, offset + length), `${base}.sigmf`);
  expect(members.map((m) => m.name)).toEqual([base, `${base}/${base}.sigmf-data`, `${base}/${base}.sigmf-meta`]);
  const member = (name: string) => {
    const m = members.find((x) => x.name === name)!;
    return bytes.subarray(m.dataOffsetBytes, m.dataOffsetBytes + m.sizeBytes);
  };
  const data = member(`${base}/${base}.sigmf-data`);
  const meta = JSON.parse(new TextDecoder().decode(member(`${base}/${base}.sigmf-meta`))) as { global: Record<string, unknown> };
  const expected = exportToMemory(parseWaveformConfig(defaultScenario.config), { format: 'sigmf-archive' });
  // Float samples are byte-identical to Node's: every transcendental function on the path from the configuration to
  // the samples is src/dsp/math's (IEEE 754-2019 §5.4 operations only), not Math.sin/cos/exp/log/pow, which ECMA-262
  // §21.3.2 leaves implementation-approximated and which differ between Node 20 and Debian's chromium.
  const shown = Buffer.from(data.buffer, data.byteOffset, data.byteLength);
  const node = Buffer.from(expected.data.buffer, expected.data.byteOffset, expected.data.byteLength);
  expect(shown.length).toBe(node.length);
  let differing = 0;
  for (let i = 0; i < shown.length; i += 4) if (shown.readUInt32LE(i) !== node.readUInt32LE(i)) differing += 1;
  console.log(`SigMF archive, browser vs Node: ${differing} of ${shown.length / 4} float32 values differ`);
  expect(Buffer.compare(shown, node)).toBe(0);
  expect(meta.global['core:datatype']).toBe('cf32_le');
  expect(meta.global['core:sha512']).toBe(createHash('sha512').update(data).digest('hex'));
  expect(watch.consoleErrors).toEqual([]);
});

// Plot images: a canvas-drawn plot exports its complete figure as vectors — every trace, the title, the shapes —
// not only the axes Plotly holds on screen; CSV carries every point (figureCsv).
test('exports a canvas-drawn plot as SVG with its traces, and as CSV with every point', async ({ page, baseURL }) => {
  const watch = watchPage(page, baseURL);
  await page.goto('/');
  const plot = page.getByTestId('time-samples-plot');
  await waitForPlot(plot);
  const points = await plot.evaluate((element) => ((element as HTMLElement & { figureData?: { x: ArrayLike<number> }[] }).figureData ?? []).map((t) => t.x.length));
  const files: Download[] = [];
  page.on('download', (download) => files.push(download));
  await page.getByRole('button', { name: 'Time samples as SVG' }).click();
  await page.getByRole('button', { name: 'Time samples curves as CSV' }).click();
  await expect.poll(() => files.length).toBe(2);
  const [svgFile, csvFile] = files;
  const svg = await readFile((await svgFile!.path())!, 'utf8');
  expect(svgFile!.suggestedFilename()).toMatch(/\.svg$/);
  // Three line traces drawn as SVG paths with their points (I, Q, |x|), the peak marker, the title and the CP label.
  const traceLines = [...svg.matchAll(/<path class="js-line" d="([^"]+)"/g)].map((m) => m[1]!.split('L').length);
  expect(traceLines.length).toBeGreaterThanOrEqual(3);
  expect(Math.max(...traceLines)).toBeGreaterThan(100);
  expect(svg).toContain('Symbol 0: time samples');
  expect(svg).toContain('CP 320 samples');
  const csv = await readFile((await csvFile!.path())!, 'utf8');
  expect(csv.trimEnd().split('\n')).toHaveLength(1 + points.reduce((a, b) => a + b, 0));
  expect(watch.consoleErrors).toEqual([]);
});
