// Runs the type check, the linter and the whole test suite, and ends with the plain line `N passed, N failed` that CI
// reads. The type check and the linter count as one check each: a type or lint error makes the line say failed >= 1
// and the exit code non-zero. Arguments are passed on to vitest (`npm test -- tests/ingest`).
import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';

const bin = (name) => `node_modules/.bin/${name}`;
let passed = 0;
let failed = 0;

for (const [label, cmd, args] of [
  ['type check (tsc --noEmit -p .)', bin('tsc'), ['--noEmit', '-p', '.']],
  ['lint (eslint .)', bin('eslint'), ['.']],
]) {
  const r = spawnSync(cmd, args, { stdio: 'inherit' });
  if (r.status === 0) {
    passed++;
    console.log(`${label}: ok`);
  } else {
    failed++;
    console.log(`${label}: FAILED`);
  }
}

const report = 'vitest-report.json';
rmSync(report, { force: true });
const r = spawnSync(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)], { stdio: 'inherit' });
try {
  const j = JSON.parse(readFileSync(report, 'utf8'));
  passed += j.numPassedTests;
  failed += j.numFailedTests + (j.numFailedTestSuites ?? 0);
} catch {
  failed++;
}
if (r.status !== 0 && failed === 0) failed = 1;
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
