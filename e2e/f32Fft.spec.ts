import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect, test } from '@playwright/test';
import { build, preview, type PreviewServer } from 'vite';

// The f32 statistics backend (@echogarden/pffft-wasm, WebAssembly SIMD) in Debian chromium, bundled by Vite as the
// app's worker is (worker format "es", target es2022): the .wasm file must be emitted as an asset and fetched from
// the same origin, and the page's Content-Security-Policy decides whether WebAssembly may compile.

const fixtureDir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'fixtures', 'f32Fft');
const port = 4183;
let outDir = '';
let server: PreviewServer | undefined;

test.beforeAll(async () => {
  outDir = mkdtempSync(path.join(tmpdir(), 'crestline-f32fft-'));
  const shared = { root: fixtureDir, configFile: false as const, logLevel: 'warn' as const, worker: { format: 'es' as const } };
  await build({
    ...shared,
    build: {
      outDir,
      emptyOutDir: true,
      target: 'es2022',
      rollupOptions: { input: { strict: path.join(fixtureDir, 'strict.html'), wasm: path.join(fixtureDir, 'wasm.html') } },
    },
  });
  server = await preview({ ...shared, build: { outDir }, preview: { host: '127.0.0.1', port, strictPort: true } });
});

test.afterAll(async () => {
  await server?.close();
  if (outDir) rmSync(outDir, { recursive: true, force: true });
});

interface PageResult {
  page: string;
  worker: { backend: string | null; failures: string[]; worstPaprDiffDb: number; f32SymbolsPerSecond: number };
}

async function open(pageName: string, page: import('@playwright/test').Page): Promise<PageResult> {
  const foreign: string[] = [];
  page.on('request', (r) => {
    if (!r.url().startsWith(`http://127.0.0.1:${port}/`)) foreign.push(r.url());
  });
  await page.goto(`http://127.0.0.1:${port}/${pageName}.html`);
  const result = page.locator('#result[data-done="true"]');
  await expect(result).toBeAttached({ timeout: 30_000 });
  expect(foreign, 'every request stays on the page origin').toEqual([]);
  return JSON.parse((await result.textContent()) ?? '{}') as PageResult;
}

test('loads the SIMD PFFFT build in a module worker and matches the f64 PAPR to 0.01 dB', async ({ page }, testInfo) => {
  const result = await open('wasm', page);
  await testInfo.attach('result.json', { body: JSON.stringify(result, null, 2), contentType: 'application/json' });
  expect(result.page).toBe('loaded');
  expect(result.worker.backend).toBe('pffft-wasm simd (f32)');
  expect(result.worker.failures).toEqual([]);
  expect(result.worker.worstPaprDiffDb).toBeLessThan(0.01);
  expect(result.worker.f32SymbolsPerSecond).toBeGreaterThan(0);
});

test("the page's own WebAssembly needs 'wasm-unsafe-eval' in script-src; the module worker does not inherit the meta CSP", async ({
  page,
}) => {
  const result = await open('strict', page);
  // A <meta> CSP governs the document only: a worker loaded from a same-origin URL takes its policy from its own
  // response headers (CSP Level 3 §7.1; `vite preview` sends none), so the worker still loads PFFFT.
  expect(result.page).toMatch(/^failed: .*(Content Security Policy|wasm-unsafe-eval|CompileError)/i);
  expect(result.worker.backend).toBe('pffft-wasm simd (f32)');
});
