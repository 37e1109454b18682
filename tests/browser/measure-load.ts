// Measures how the viewer copes with a large recording (not part of the test suite; needs /usr/bin/chromium):
//   node bin/phasewise.cjs simulate adult-stable-long --minutes 1440 --out /tmp/x.csv
//   npx tsx tests/browser/measure-load.ts /tmp/x.csv [--no-build] [--cli-out DIR]
// --cli-out DIR: also export breaths.csv, summary.json, trends.csv and events.csv and compare them with the CLI's
// files in DIR (run the CLI from the file's folder with the bare file name, so both name the file the same way).
// Prints: load time (click on Analyse -> review shown), worker time, main-thread heartbeat during the load (longest
// gap between animation frames, latest 50 ms timer), peak memory of the browser processes, and the time of a few
// interactions afterwards (whole-recording overview window, zoom, stepping breaths).

import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { haveChromium, launchBrowser, startViewer } from './harness';

const file = process.argv[2];
if (!file) {
  process.stderr.write('usage: npx tsx tests/browser/measure-load.ts FILE.csv [--no-build]\n');
  process.exit(2);
}
if (!haveChromium()) {
  process.stderr.write('measure-load: /usr/bin/chromium not found (apt-get install -y chromium)\n');
  process.exit(2);
}

/** Summed resident memory of the chromium processes, MB. */
function chromiumRssMb(): number {
  try {
    const out = execFileSync('ps', ['-C', 'chromium', '-o', 'rss='], { encoding: 'utf8' });
    return out.split('\n').reduce((s, l) => s + (Number(l.trim()) || 0), 0) / 1024;
  } catch {
    return NaN;
  }
}

const out = mkdtempSync(join(tmpdir(), 'phasewise-measure-'));
const viewer = await startViewer(process.argv.includes('--no-build') ? join(process.cwd(), 'dist', 'web') : join(out, 'web'), !process.argv.includes('--no-build'));
const browser = await launchBrowser({ width: 1400, height: 1000 });
const page = browser.page;
page.on('pageerror', (e) => process.stderr.write(`page error: ${e.message}\n`));
try {
  await page.goto(viewer.url);
  await page.waitForFunction(() => document.body.dataset.state === 'idle');
  const rssBefore = chromiumRssMb();
  await page.setInputFiles('#file-input', file);
  await page.waitForFunction(() => document.body.dataset.state === 'mapped', null, { timeout: 60_000 });
  let peak = 0;
  const sampler = setInterval(() => (peak = Math.max(peak, chromiumRssMb())), 500);
  const t0 = Date.now();
  await page.click('#analyse-button');
  await page.waitForFunction(() => document.body.dataset.state === 'done' || document.body.dataset.state === 'error', null, { timeout: 900_000, polling: 250 });
  const wall = Date.now() - t0;
  clearInterval(sampler);
  const state = await page.evaluate(() => document.body.dataset.state);
  if (state !== 'done') throw new Error(`analysis ended in state ${state}: ${await page.textContent('#error-box')}`);
  const load = await page.evaluate(() => (window as unknown as { __phasewise: { load: unknown } }).__phasewise.load);
  // interactions after the load
  const timed = async (what: string, fn: () => Promise<unknown>) => {
    const a = Date.now();
    await fn();
    return [what, Date.now() - a] as const;
  };
  const waitPoints = () => page.waitForFunction(() => Number(document.getElementById('overview')!.dataset.points) > 0);
  const interactions = [
    await timed('whole recording window', async () => {
      await page.click('#ov-in');
      await page.waitForTimeout(50);
      await page.click('#ov-whole');
      await waitPoints();
    }),
    await timed('10 x next breath (keyboard)', async () => {
      await page.locator('body').click({ position: { x: 5, y: 400 } });
      for (let k = 0; k < 10; k++) await page.keyboard.press('ArrowRight');
      await page.waitForFunction(() => (window as unknown as { __phasewise: { selected: number } }).__phasewise.selected === 10);
    }),
    await timed('End (last breath, overview follows)', async () => {
      await page.keyboard.press('End');
      await page.waitForTimeout(30);
    }),
    await timed('exclude a breath (summary, trends, events recomputed)', async () => {
      await page.keyboard.press('x');
      await page.waitForFunction(() => document.getElementById('sum-excluded')!.textContent !== '0');
    }),
    await timed('trends tab (all breaths)', async () => {
      await page.click('#tabs button[data-pane="trends"]');
      await page.waitForSelector('#trends [data-trend]');
    }),
  ];
  const found = await page.textContent('#sum-found');
  const cliOut = process.argv.includes('--cli-out') ? process.argv[process.argv.indexOf('--cli-out') + 1]! : null;
  const compared: Record<string, string> = {};
  if (cliOut) {
    await page.click('#tabs button[data-pane="review"]');
    await page.keyboard.press('x'); // re-include the breath excluded above
    await page.waitForFunction(() => document.body.dataset.state === 'done' && document.getElementById('sum-excluded')!.textContent === '0');
    const buttons: Record<string, string> = { 'breaths.csv': '#export-breaths', 'summary.json': '#export-summary', 'trends.csv': '#export-trends', 'events.csv': '#export-events' };
    for (const [name, sel] of Object.entries(buttons)) {
      const [dl] = await Promise.all([page.waitForEvent('download'), page.click(sel)]);
      const got = readFileSync((await dl.path())!, 'utf8');
      compared[name] = got === readFileSync(join(cliOut, name), 'utf8') ? 'identical' : 'DIFFERENT';
    }
  }
  const shot = join(out, 'big.png');
  await page.click('#tabs button[data-pane="review"]');
  await page.screenshot({ path: shot });
  const report = {
    file,
    file_mb: Number((statSync(file).size / 1e6).toFixed(1)),
    breaths_shown: Number(found),
    wall_ms_click_to_review: wall,
    page_load_stats: load,
    chromium_rss_mb: { before: Math.round(rssBefore), peak_during_load: Math.round(peak), after: Math.round(chromiumRssMb()) },
    interactions_ms: Object.fromEntries(interactions),
    ...(cliOut ? { compared_with_cli: compared } : {}),
    screenshot: shot,
  };
  process.stdout.write(JSON.stringify(report, null, 2) + '\n');
} finally {
  await browser.close();
  await viewer.stop();
  if (!process.env.PHASEWISE_KEEP_SHOTS) rmSync(out, { recursive: true, force: true });
}
