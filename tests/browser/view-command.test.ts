// `phasewise view` in headless Chromium (Debian's /usr/bin/chromium via playwright-core): the packaged viewer
// (dist/web, built by `node scripts/build.mjs --package`, which npm test runs first) served by the CLI opens the
// recording named on the command line at once (a text table, an EDF+ file with its annotations, a WFDB header with
// its signal files), and (started without one) its start screen offers the bundled samples; a sample opened from
// there analyses to the CLI's breath count and median airway dead space. No request leaves the page's own origin and no CSP violation occurs.
// Without /usr/bin/chromium the tests are skipped with a message (tests/browser/viewer.test.ts fails under CI=true).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { haveChromium, launchBrowser, recordErrors, ROOT, startServer, type Browser, type Viewer } from './harness';

const OPENED = 'child-sidestream.csv';
const PICKED = 'adult-healthy.csv';
/** an EDF+ recording (tests/fixtures/edf, written by EDFlib) named on the command line */
const EDF = join(ROOT, 'tests', 'fixtures', 'edf', 'c100.edf');
/** a WFDB header (tests/fixtures/wfdb) whose two signal files are beside it */
const WFDB = join(ROOT, 'tests', 'fixtures', 'wfdb', 'f212.hea');

function cliSummary(dir: string, sample: string, path = join(ROOT, 'sample-waveforms', sample)): { breaths: { found: number }; metrics: { vd_aw_ml: { median: number } } } {
  const out = join(dir, sample);
  const r = spawnSync(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', path, '--out', out, '--quiet'], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`phasewise analyse ${sample} failed:\n${r.stderr}`);
  return JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
}

async function waitState(page: Page, states: string[], timeout = 30_000): Promise<string> {
  await page.waitForFunction((ss) => ss.includes(document.body.dataset.state ?? ''), states, { timeout });
  return page.evaluate(() => document.body.dataset.state ?? '');
}

async function analyseAndCheck(page: Page, ref: ReturnType<typeof cliSummary>): Promise<void> {
  expect(await waitState(page, ['mapped', 'sniff-error', 'error'])).toBe('mapped');
  await page.click('#analyse-button');
  expect(await waitState(page, ['done', 'error'])).toBe('done');
  expect(Number(await page.textContent('#sum-found'))).toBe(ref.breaths.found);
  expect(await page.textContent('tr[data-metric="vd_aw_ml"] td.median')).toBe(ref.metrics.vd_aw_ml.median.toFixed(1));
}

describe.skipIf(!haveChromium())('phasewise view in headless Chromium', () => {
  let tmp = '';
  let viewer: Viewer | null = null;
  let plain: Viewer | null = null;
  let edf: Viewer | null = null;
  let wfdb: Viewer | null = null;
  let browser: Browser | null = null;
  let page: Page;
  const requests: string[] = [];
  const problems: string[] = [];

  beforeAll(async () => {
    if (!existsSync(join(ROOT, 'dist', 'web', 'index.html'))) throw new Error('dist/web is missing: run `npm run build:package` (npm test does) first');
    tmp = mkdtempSync(join(tmpdir(), 'phasewise-view-test-'));
    viewer = await startServer([join(ROOT, 'bin', 'phasewise.cjs'), 'view', join(ROOT, 'sample-waveforms', OPENED), '--port', '0']);
    plain = await startServer([join(ROOT, 'bin', 'phasewise.cjs'), 'view', '--port', '0']);
    edf = await startServer([join(ROOT, 'bin', 'phasewise.cjs'), 'view', EDF, '--port', '0']);
    wfdb = await startServer([join(ROOT, 'bin', 'phasewise.cjs'), 'view', WFDB, '--port', '0']);
    browser = await launchBrowser();
    page = browser.page;
    await page.addInitScript(() => {
      (window as unknown as { __csp: string[] }).__csp = [];
      document.addEventListener('securitypolicyviolation', (e) => (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI}`));
    });
    browser.ctx.on('request', (r) => requests.push(r.url()));
    recordErrors(page, problems);
    await page.goto(viewer.url);
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await viewer?.stop();
    await plain?.stop();
    await edf?.stop();
    await wfdb?.stop();
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  });

  it('opens the recording given on the command line at once', async () => {
    // the page fetches the recording after it loads: wait for its name rather than read it at once (a fresh machine
    // was slower than the page once and read an empty name)
    await page.waitForFunction((n) => (document.getElementById('file-name')?.textContent ?? '').includes(n), OPENED, { timeout: 30_000 });
    expect(await page.textContent('#file-name')).toContain(OPENED);
    await analyseAndCheck(page, cliSummary(tmp, OPENED));
  });

  it('offers every bundled sample on the start screen; one opened from there gives the CLI numbers', async () => {
    await page.goto(plain!.url);
    await waitState(page, ['idle']);
    await page.waitForSelector('#samples-box', { state: 'visible' });
    const names = await page.locator('#samples button').allTextContents();
    expect(names).toEqual(readdirSync(join(ROOT, 'sample-waveforms')).filter((n) => n.endsWith('.csv')).sort());
    await page.click(`#samples button:text-is("${PICKED}")`);
    await page.waitForFunction((n) => (document.getElementById('file-name')?.textContent ?? '').includes(n), PICKED);
    await analyseAndCheck(page, cliSummary(tmp, PICKED));
  });

  it('opens an EDF+ recording given on the command line: the CLI numbers and the file\'s annotations', async () => {
    await page.goto(edf!.url);
    await page.waitForFunction(() => (document.getElementById('file-name')?.textContent ?? '').includes('c100.edf'), undefined, { timeout: 30_000 });
    await analyseAndCheck(page, cliSummary(tmp, 'c100.edf', EDF));
    expect(await page.locator('#annotations button.annotation').allTextContents()).toEqual(['2.5 s · suction (1 s)', '42.5 s · PEEP 8']);
  });

  it('opens a WFDB header given on the command line with the signal files it names: the CLI numbers', async () => {
    await page.goto(wfdb!.url);
    await page.waitForFunction(() => (document.getElementById('file-name')?.textContent ?? '').includes('f212.hea + f212_flow.dat + f212_co2.dat'), undefined, { timeout: 30_000 });
    await analyseAndCheck(page, cliSummary(tmp, 'f212.hea', WFDB));
  });

  it('makes no request outside its own origin and no CSP violation', async () => {
    const origins = [viewer, plain, edf, wfdb].map((v) => new URL(v!.url).origin);
    expect(requests.length).toBeGreaterThan(3);
    expect(requests.filter((u) => !origins.some((o) => u.startsWith(`${o}/`)) && !u.startsWith('blob:') && !u.startsWith('data:'))).toEqual([]);
    expect(await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp)).toEqual([]);
    expect(problems).toEqual([]);
  });
});
