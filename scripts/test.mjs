// Runs the whole test suite and ends with the plain line `N passed, N failed` that CI reads.
import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';

const report = 'vitest-report.json';
rmSync(report, { force: true });
const r = spawnSync('npx', ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)], { stdio: 'inherit' });
let passed = 0;
let failed = 0;
try {
  const j = JSON.parse(readFileSync(report, 'utf8'));
  passed = j.numPassedTests;
  failed = j.numFailedTests + (j.numFailedTestSuites ?? 0);
} catch {
  failed = 1;
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(r.status === 0 && failed === 0 ? 0 : 1);
