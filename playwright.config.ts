import { defineConfig } from '@playwright/test';

// CRESTLINE_E2E_PORT lets a second checkout run its browser tests beside another one on the same machine.
const port = Number(process.env.CRESTLINE_E2E_PORT ?? 4173);
const baseURL = `http://127.0.0.1:${port}`;

/** Debian's chromium (scripts/ensureChromium.sh installs it); Playwright downloads no browser. */
const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export default defineConfig({
  testDir: 'e2e',
  outputDir: 'test-results',
  timeout: 60_000,
  forbidOnly: !!process.env.CI,
  retries: 0,
  workers: 1,
  // The JSON report feeds the one-line summary that .ci/run prints.
  reporter: [['list'], ['json', { outputFile: 'reports/playwright.json' }]],
  use: {
    baseURL,
    headless: true,
    // A desktop bench screen: configuration, plots and measurements side by side.
    viewport: { width: 1600, height: 1000 },
    acceptDownloads: true,
    launchOptions: { executablePath: '/usr/bin/chromium', args: chromiumArgs },
    trace: 'retain-on-failure',
  },
  projects: [{ name: 'chromium', use: { browserName: 'chromium' } }],
  // `npm run test:e2e` builds first; this serves dist/.
  webServer: {
    command: `npx vite preview --host 127.0.0.1 --port ${port} --strictPort`,
    url: baseURL,
    reuseExistingServer: !process.env.CI,
    timeout: 60_000,
  },
});
