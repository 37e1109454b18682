// Loads every sample recording in the viewer and compares its exports with the CLI's, byte for byte (a wider check
// than the test suite's single file; takes about a minute). Needs /usr/bin/chromium and a built CLI.
//   node scripts/build.mjs && npx tsx tests/browser/compare-samples.ts [--no-build]

import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launchBrowser, ROOT, startViewer } from './harness';

const FILES = ['breaths.csv', 'summary.json', 'trends.csv', 'events.csv'];
const BUTTON: Record<string, string> = { 'breaths.csv': '#export-breaths', 'summary.json': '#export-summary', 'trends.csv': '#export-trends', 'events.csv': '#export-events' };

const tmp = mkdtempSync(join(tmpdir(), 'phasewise-compare-'));
const samples = readdirSync(join(ROOT, 'sample-waveforms')).filter((f) => f.endsWith('.csv'));
const viewer = await startViewer(process.argv.includes('--no-build') ? join(ROOT, 'dist', 'web') : join(tmp, 'web'), !process.argv.includes('--no-build'));
const browser = await launchBrowser();
const page = browser.page;
let failures = 0;
try {
  await page.goto(viewer.url);
  await page.waitForFunction(() => document.body.dataset.state === 'idle');
  for (const name of samples) {
    const dir = join(tmp, name.replace(/\.csv$/, ''));
    spawnSync('mkdir', ['-p', dir]);
    copyFileSync(join(ROOT, 'sample-waveforms', name), join(dir, name));
    const r = spawnSync(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', name, '--out', 'out', '--quiet'], { cwd: dir, encoding: 'utf8' });
    if (r.status !== 0) {
      console.log(`${name}: CLI failed (${r.status}) ${r.stderr.trim()}`);
      failures++;
      continue;
    }
    await page.setInputFiles('#file-input', join(dir, name));
    await page.waitForFunction(() => ['mapped', 'sniff-error'].includes(document.body.dataset.state ?? ''));
    if ((await page.evaluate(() => document.body.dataset.state)) === 'sniff-error') {
      console.log(`${name}: the viewer refused the file: ${await page.textContent('#map-error')}`);
      failures++;
      continue;
    }
    await page.click('#analyse-button');
    await page.waitForFunction(() => ['done', 'error'].includes(document.body.dataset.state ?? ''), null, { timeout: 120_000 });
    const results: string[] = [];
    for (const f of FILES) {
      const [dl] = await Promise.all([page.waitForEvent('download'), page.click(BUTTON[f]!)]);
      const got = readFileSync((await dl.path())!, 'utf8');
      const want = readFileSync(join(dir, 'out', f), 'utf8');
      results.push(`${f} ${got === want ? 'identical' : 'DIFFERENT'}`);
      if (got !== want) {
        failures++;
        writeFileSync(join(dir, `viewer-${f}`), got);
        const a = want.split('\n');
        const b = got.split('\n');
        const i = a.findIndex((l, k) => l !== b[k]);
        console.log(`  ${f}: first difference at line ${i + 1}:\n    cli:    ${a[i]}\n    viewer: ${b[i]}`);
      }
    }
    console.log(`${name}: breaths ${await page.textContent('#sum-found')} · ${results.join(' · ')}`);
  }
} finally {
  await browser.close();
  await viewer.stop();
  if (!process.env.PHASEWISE_KEEP_SHOTS) rmSync(tmp, { recursive: true, force: true });
  else console.log(`kept ${tmp}`);
}
console.log(failures ? `${failures} difference(s)` : 'all identical');
process.exit(failures ? 1 : 0);
