// The study index (index.html of `batch --report`) in real headless Chromium (Debian's /usr/bin/chromium via
// playwright-core), opened from file:// as a user would by double-click:
// - a batch of three small recordings (one with many short gaps, so most of its breaths are excluded): sorting by a
//   column orders the rows as the inline data say (order computed here from recordings.csv), the needs-a-look
//   filter leaves the one gapped recording, its link opens its report.html, thumbnails are drawn, and no request
//   other than file:// is made, no script error and no CSP violation occurs;
// - a study of 300 hand-made entries (built with the same builder): 100 rows per page, paging and filtering work.
//   How fast it opens is measured outside the suite (tests never time): npx tsx tests/browser/measure-index-load.ts.
//
// Without /usr/bin/chromium the tests are skipped with a message, except under CI=true, where that is a failure.

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { settingsPlan } from '../../src/batch/file-settings';
import { runBatch } from '../../src/batch/run-batch';
import { CAUTION } from '../../src/report/caution';
import { studyIndexHtml, type StudyIndexEntry } from '../../src/report/html/study-index';
import { parseCsv, read, writeRecording } from '../batch/helpers';
import { CHROMIUM, haveChromium, launchBrowser, openWatched, type Browser } from './harness';

const HAVE = haveChromium();
const IN_CI = process.env.CI === 'true';
if (!HAVE) console.warn(`\n*** study index browser tests ${IN_CI ? 'FAIL' : 'SKIPPED'}: ${CHROMIUM} not found (apt-get install -y chromium) ***\n`);

describe.runIf(!HAVE && IN_CI)('browser available in CI (study index)', () => {
  it('needs /usr/bin/chromium when CI=true', () => {
    throw new Error(`${CHROMIUM} is missing; CI must install Debian's chromium before the browser tests`);
  });
});

const shownRecordings = (page: Page) => page.$$eval('#study tbody tr', (trs) => trs.map((tr) => tr.getAttribute('data-recording')));

describe.skipIf(!HAVE)('study index.html in headless Chromium, from file://', () => {
  let tmp = '';
  let browser: Browser | null = null;

  beforeAll(async () => {
    tmp = mkdtempSync(join(tmpdir(), 'phasewise-index-test-'));
    writeRecording(join(tmp, 'data/a.csv'), 'adult-healthy', 3, 1);
    writeRecording(join(tmp, 'data/b.csv'), 'child-sidestream', 3, 2);
    writeRecording(join(tmp, 'data/c.csv'), 'adult-healthy', 3, 3);
    const lines = read(join(tmp, 'data'), 'c.csv').trimEnd().split('\n');
    const kept = lines.slice(1).filter((l) => Number(l.split(',')[0]) < 20 || Number(l.split(',')[0]) % 5 > 0.1);
    writeFileSync(join(tmp, 'data/c.csv'), [lines[0], ...kept].join('\n') + '\n');
    await runBatch({ inputs: ['data'], outDir: 'out', plan: settingsPlan({}), jobs: 1, resume: false, shard: null, progress: 'none', cwd: tmp, report: true });
    browser = await launchBrowser({ width: 1400, height: 1000 });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  });

  it('sorts, filters, follows a link to a report; only file:// requests', async () => {
    const table = parseCsv(read(join(tmp, 'out'), 'recordings.csv'));
    const url = pathToFileURL(join(tmp, 'out', 'index.html')).href;
    const { page, requests, problems } = await openWatched(browser!, url);
    expect(await shownRecordings(page)).toEqual(['data/a.csv', 'data/b.csv', 'data/c.csv']);
    expect(await page.textContent('.caution-text')).toBe(CAUTION);
    const thumbs = await page.$$eval('#study td.thumb svg path', (ps) => ps.filter((p) => (p as SVGGraphicsElement).getBBox().width > 5).length);
    expect(thumbs).toBeGreaterThan(3);

    // airway dead space median: ascending on the first click, descending on the second
    const byVd = [...table].sort((x, y) => Number(x.vd_aw_ml_median) - Number(y.vd_aw_ml_median)).map((t) => t.recording);
    expect(new Set(byVd).size).toBe(3);
    await page.click('th[data-key="vd_aw_ml_median"]');
    expect(await shownRecordings(page)).toEqual(byVd);
    await page.click('th[data-key="vd_aw_ml_median"]');
    expect(await shownRecordings(page)).toEqual([...byVd].reverse());
    const byExcluded = [...table].sort((x, y) => Number(x.breaths_excluded) - Number(y.breaths_excluded)).map((t) => t.recording);
    await page.click('th[data-key="breaths_excluded"]');
    expect(await shownRecordings(page)).toEqual(byExcluded);

    await page.check('#look');
    expect(await shownRecordings(page)).toEqual(['data/c.csv']);
    expect(await page.textContent('#shown')).toBe('1 of 3 recordings shown');
    await page.uncheck('#look');
    expect((await shownRecordings(page)).length).toBe(3);

    await page.check('#look');
    await Promise.all([page.waitForNavigation(), page.click('#study tbody tr a')]);
    expect(page.url()).toBe(pathToFileURL(join(tmp, 'out', 'recordings', 'data__c.csv', 'report.html')).href);
    expect(await page.textContent('#caution')).toBe(CAUTION);
    expect(requests.length).toBeGreaterThanOrEqual(2);
    expect(requests.filter((r) => !r.startsWith('file://'))).toEqual([]);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('a 300-recording study: 100 rows a page, paging and the filter work', async () => {
    const thumb = read(join(tmp, 'out', 'recordings', 'data__a.csv'), 'thumb.svg');
    const entries: StudyIndexEntry[] = Array.from({ length: 300 }, (_, k) => ({
      table: { recording: `r${String(k).padStart(3, '0')}.csv`, status: 'ok', duration_s: 600 + k, breaths_found: 100, breaths_ok: 100 - (k % 40),
        breaths_caution: 0, breaths_excluded: k % 40, delay_s: 1, delay_origin: 'estimated', vd_aw_ml_median: 150 + (k % 7) },
      // k % 40 in 25..39 has 25..39 % of its breaths excluded (at or over the 25 % threshold): 15 in each of the 7 full
      // runs of 40 (k < 280), none of k = 280..299 (k % 40 < 20): 105 need a look
      events: 0, delay_uncertainty_s: 0.001, delay_trusted: true, cautions: [], report: null, thumb,
    }));
    const file = join(tmp, 'big.html');
    writeFileSync(file, studyIndexHtml(entries, 'test'));
    const { page, requests, problems } = await openWatched(browser!, pathToFileURL(file).href);
    expect((await shownRecordings(page)).length).toBe(100);
    expect(await page.textContent('#pageinfo')).toBe('page 1 of 3');
    await page.click('#next');
    await page.click('#next');
    const last = await shownRecordings(page);
    expect(last.length).toBe(100);
    expect(last[99]).toBe('r299.csv');
    expect(await page.isDisabled('#next')).toBe(true);
    await page.check('#look');
    expect(await page.textContent('#shown')).toBe('105 of 300 recordings shown');
    expect((await shownRecordings(page)).length).toBe(100);
    expect(await page.textContent('#pageinfo')).toBe('page 1 of 2');
    await page.click('#next');
    expect((await shownRecordings(page)).length).toBe(5);
    expect(requests).toEqual([pathToFileURL(file).href]);
    expect(problems).toEqual([]);
    await page.close();
  });
});
