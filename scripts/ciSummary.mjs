// Prints the one line CI reads, "N passed, N failed", from the JSON reports that vitest
// (reports/vitest.json) and Playwright (reports/playwright.json) write. Plain Node, no
// dependencies, so it still runs when `npm ci` failed. A missing report means that runner never
// got to run (an earlier step failed): it counts as one failure, so the line never looks clean.
// Usage: node scripts/ciSummary.mjs [reportsDir]   Exit code: 0 when something ran and nothing failed.
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';

const reportsDir = process.argv[2] ?? 'reports';

function readJson(name) {
  const file = path.join(reportsDir, name);
  if (!existsSync(file)) return { found: false, data: undefined };
  try {
    return { found: true, data: JSON.parse(readFileSync(file, 'utf8')) };
  } catch (error) {
    return { found: true, data: undefined, error: `${file} is not valid JSON (${error.message})` };
  }
}

/** Vitest's jest-style report; a file that failed to load has status "failed" and no assertions. */
function countVitest(report) {
  const brokenFiles = (report.testResults ?? []).filter(
    (file) => file.status === 'failed' && (file.assertionResults ?? []).length === 0,
  ).length;
  return { passed: report.numPassedTests ?? 0, failed: (report.numFailedTests ?? 0) + brokenFiles };
}

/** Playwright's report: "expected" passed, "flaky" passed on retry, "unexpected" failed; errors are global (e.g. webServer). */
function countPlaywright(report) {
  const stats = report.stats ?? {};
  const globalErrors = (report.errors ?? []).length;
  return { passed: (stats.expected ?? 0) + (stats.flaky ?? 0), failed: (stats.unexpected ?? 0) + globalErrors };
}

let passed = 0;
let failed = 0;
for (const [name, count, label] of [
  ['vitest.json', countVitest, 'vitest'],
  ['playwright.json', countPlaywright, 'playwright'],
]) {
  const { found, data, error } = readJson(name);
  if (error) {
    console.log(`ciSummary: ${error}`);
    failed += 1;
  } else if (!found) {
    console.log(`ciSummary: no ${label} report (${path.join(reportsDir, name)}): its tests did not run; counted as 1 failed`);
    failed += 1;
  } else {
    const c = count(data);
    console.log(`ciSummary: ${label}: ${c.passed} passed, ${c.failed} failed`);
    passed += c.passed;
    failed += c.failed;
  }
}
console.log(`${passed} passed, ${failed} failed`);
process.exitCode = failed === 0 && passed > 0 ? 0 : 1;
