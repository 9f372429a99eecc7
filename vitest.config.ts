import { configDefaults, defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    environment: 'node',
    include: ['test/**/*.test.ts'],
    exclude: [...configDefaults.exclude, 'e2e/**'],
    // The JSON report feeds the one-line summary that .ci/run prints.
    reporters: ['default', ['json', { outputFile: 'reports/vitest.json' }]],
  },
});
