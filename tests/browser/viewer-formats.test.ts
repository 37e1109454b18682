// The review viewer opens EDF+ and BDF+ recordings (tests/fixtures/edf, written by EDFlib) in headless Chromium
// (Debian's /usr/bin/chromium via playwright-core): the file is decoded in the worker by the core's EDF reader, the
// mapping step lists the signals with the chosen flow and CO2 marked, and the analysis gives the built CLI's numbers
// (summary.json and report.html byte for byte, the CLI run in the file's folder so both name it alike; the report
// lists the annotations in both); the file's annotations are drawn as markers on the overview (as many as
// summary.json lists) and listed, and choosing one moves the view to it (by click and by keyboard); a signal chosen
// by label in the mapping step gives the CLI's `--co2-col LABEL` output; a file whose CO2 signal is missing shows the
// CLI's one-line message. WFDB records (tests/fixtures/wfdb: format 16, format 212 over two signal files, and
// multi-frequency 212), their .hea header and signal files chosen together, give the CLI's outputs byte for byte; a
// header chosen without one of its signal files names it; dropped together they open.
//
// Without /usr/bin/chromium the tests are skipped with a message (tests/browser/viewer.test.ts fails under CI=true).

import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../src/report/caution';
import { formatNumber } from '../../src/report/format';
import { haveChromium, launchBrowser, recordErrors, ROOT, startViewer, type Browser, type Viewer } from './harness';

const FIXTURES = join(ROOT, 'tests', 'fixtures', 'edf');
/** WFDB fixtures (tests/fixtures/wfdb, written by their own script from the format's description): header, signal files */
const WFDB = join(ROOT, 'tests', 'fixtures', 'wfdb');
const WFDB_RECORDS: [string, string[]][] = [
  ['f16.hea', ['f16.dat']],
  ['f212.hea', ['f212_flow.dat', 'f212_co2.dat']],
  ['mf212.hea', ['mf212.dat']],
  ['f80.hea', ['f80.dat']],
];
const CLI = join(ROOT, 'bin', 'phasewise.cjs');

interface CliRun {
  status: number | null;
  stdout: string;
  stderr: string;
}

function cli(args: string[], cwd: string): CliRun {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd, encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

async function waitState(page: Page, states: string[], timeout = 30_000): Promise<string> {
  await page.waitForFunction((ss) => ss.includes(document.body.dataset.state ?? ''), states, { timeout });
  return page.evaluate(() => document.body.dataset.state ?? '');
}

async function downloadText(page: Page, selector: string): Promise<string> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.click(selector)]);
  return readFileSync((await dl.path())!, 'utf8');
}

const range = (page: Page) => page.evaluate(() => (window as unknown as { __phasewise: { range: [number, number] | null } }).__phasewise.range!);

describe.skipIf(!haveChromium())('viewer: EDF+ and BDF+ recordings in headless Chromium', () => {
  let tmp = '';
  let viewer: Viewer | null = null;
  let browser: Browser | null = null;
  let page: Page;
  const problems: string[] = [];

  beforeAll(async () => {
    tmp = mkdtempSync(join(tmpdir(), 'phasewise-viewer-formats-'));
    const build = spawnSync(process.execPath, ['scripts/build.mjs'], { cwd: ROOT, encoding: 'utf8' });
    if (build.status !== 0) throw new Error(`build failed:\n${build.stderr}`);
    for (const name of ['c100.edf', 'd100.edf', 'b50.bdf']) copyFileSync(join(FIXTURES, name), join(tmp, name));
    for (const name of WFDB_RECORDS.flat(2)) copyFileSync(join(WFDB, name), join(tmp, name));
    viewer = await startViewer(join(tmp, 'web'));
    browser = await launchBrowser();
    page = browser.page;
    recordErrors(page, problems);
    await page.goto(viewer.url);
    await waitState(page, ['idle']);
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await viewer?.stop();
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  });

  for (const name of ['c100.edf', 'd100.edf', 'b50.bdf']) {
    it(`${name}: signals in the mapping step, the CLI's summary.json, annotation markers and list`, async () => {
      const run = cli(['analyse', name, '--out', `ref-${name}`, '--quiet', '--report'], tmp);
      expect(run.status, run.stderr).toBe(0);
      const refText = readFileSync(join(tmp, `ref-${name}`, 'summary.json'), 'utf8');
      const ref = JSON.parse(refText);
      const annotations = ref.input.annotations as { onset_s: number; duration_s: number | null; text: string }[];
      expect(annotations.length).toBe(2);

      await page.setInputFiles('#file-input', join(tmp, name));
      expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
      expect(await page.textContent('#map-preview th[data-role="flow"]')).toBe('Airflow');
      expect(await page.textContent('#map-preview th[data-role="co2"]')).toBe('CO2');
      // the signal fields only: no time column, delimiter or decimal mark for a file of signals
      expect(await page.locator('#map-flow_col option').allTextContents()).toEqual(['auto (Airflow)', 'Airflow', 'CO2']);
      expect(await page.locator('#map-fields [name="time_col"], #map-fields [name="delimiter"]').count()).toBe(0);
      expect(await page.isVisible('#caution')).toBe(true);
      await page.click('#analyse-button');
      expect(await waitState(page, ['done', 'error'])).toBe('done');

      expect(Number(await page.textContent('#sum-found'))).toBe(ref.breaths.found);
      expect(await page.locator('tr[data-metric="vd_aw_ml"] td.median').getAttribute('data-value')).toBe(formatNumber(ref.metrics.vd_aw_ml.median));
      expect(await downloadText(page, '#export-summary')).toBe(refText);
      // the saved report is analyse --report's, annotations section included
      const report = await downloadText(page, '#export-report');
      expect(report).toBe(readFileSync(join(tmp, `ref-${name}`, 'report.html'), 'utf8'));
      expect(report).toContain('<td>suction</td>');
      expect(await page.textContent('#caution')).toBe(CAUTION);
      expect(await page.isVisible('#caution')).toBe(true);

      // markers: the whole recording is in view at first, so every annotation is drawn
      await page.waitForFunction(() => document.getElementById('overview')?.dataset.annotationsDrawn !== undefined);
      expect(Number(await page.getAttribute('#overview', 'data-annotations-drawn'))).toBe(annotations.length);
      const entries = page.locator('#annotations button.annotation');
      expect(await entries.count()).toBe(annotations.length);
      expect(await entries.nth(0).textContent()).toBe('2.5 s · suction (1 s)');
      expect(await entries.nth(1).textContent()).toBe('42.5 s · PEEP 8');

      // a click on the second entry centres the view on it (zoomed to 20 s); only its marker is then in view
      const whole = await range(page);
      await entries.nth(1).click();
      await page.waitForFunction(() => {
        const r = (window as unknown as { __phasewise: { range: [number, number] } }).__phasewise.range;
        return r[1] - r[0] < 30;
      });
      const r1 = await range(page);
      expect(r1).not.toEqual(whole);
      expect(r1[0]).toBeLessThan(42.5);
      expect(r1[1]).toBeGreaterThan(42.5);
      expect(Math.abs((r1[0] + r1[1]) / 2 - 42.5)).toBeLessThan(0.01);
      await page.waitForFunction(() => document.getElementById('overview')?.dataset.annotationsDrawn === '1');

      // by keyboard: focus the first entry and press Enter; the view moves to the start of the recording
      await entries.nth(0).focus();
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => (window as unknown as { __phasewise: { range: [number, number] } }).__phasewise.range[1] < 30);
      const r0 = await range(page);
      expect(r0[0]).toBeLessThanOrEqual(2.5);
      expect(r0[1]).toBeGreaterThanOrEqual(3.5);
      if (name === 'd100.edf') expect(ref.input.gaps).toBe(1);
    });
  }

  it('a signal chosen by label in the mapping step gives the output of the CLI with --co2-col', async () => {
    const run = cli(['analyse', 'c100.edf', '--co2-col', 'CO2', '--out', 'ref-co2-col', '--quiet'], tmp);
    expect(run.status, run.stderr).toBe(0);
    const refText = readFileSync(join(tmp, 'ref-co2-col', 'summary.json'), 'utf8');
    expect(JSON.parse(refText).settings['ingest.co2_col']).toEqual({ value: 'CO2', origin: 'given' });
    await page.setInputFiles('#file-input', join(tmp, 'c100.edf'));
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
    await page.selectOption('#map-co2_col', 'CO2');
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
    await page.click('#analyse-button');
    expect(await waitState(page, ['done', 'error'])).toBe('done');
    expect(await downloadText(page, '#export-summary')).toBe(refText);
    if (process.env.PHASEWISE_KEEP_SHOTS) await page.screenshot({ path: join(process.env.PHASEWISE_KEEP_SHOTS, 'viewer-edf.png'), fullPage: true });
    // back to the defaults for the next test
    await page.click('#settings-button');
    await page.click('#settings-reset');
    await page.click('#settings-back');
  });

  it('an EDF without a CO2 signal: the CLI\'s one-line message, and no analysis', async () => {
    // c100.edf with its CO2 signal relabelled "EEG" and its dimension "uV" (header fields: labels 16 bytes per
    // signal from byte 256, dimensions 8 bytes per signal after the labels and the 80-byte transducer fields)
    const bytes = readFileSync(join(FIXTURES, 'c100.edf'));
    bytes.write('EEG             ', 256 + 16, 'latin1');
    bytes.write('uV      ', 256 + 3 * (16 + 80) + 8, 'latin1');
    writeFileSync(join(tmp, 'no-co2.edf'), bytes);
    const run = cli(['analyse', 'no-co2.edf', '--out', 'ref-no-co2', '--quiet'], tmp);
    expect(run.status).toBe(3);
    const message = run.stderr.trim().replace(/^phasewise: /, '');
    expect(message).toContain('no signal looks like CO2');
    await page.setInputFiles('#file-input', join(tmp, 'no-co2.edf'));
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('sniff-error');
    expect(await page.textContent('#map-error')).toBe(message);
    expect(await page.isDisabled('#analyse-button')).toBe(true);
    expect(await page.isVisible('#caution')).toBe(true);
  });

  for (const [header, signalFiles] of WFDB_RECORDS) {
    it(`WFDB ${header} chosen with ${signalFiles.join(' and ')}: the CLI's summary.json, breaths.csv and report.html`, async () => {
      const run = cli(['analyse', header, '--out', `ref-${header}`, '--quiet', '--report'], tmp);
      expect(run.status, run.stderr).toBe(0);
      const ref = (name: string) => readFileSync(join(tmp, `ref-${header}`, name), 'utf8');
      await page.setInputFiles('#file-input', [header, ...signalFiles].map((n) => join(tmp, n)));
      expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
      expect(await page.textContent('#file-name')).toContain([header, ...signalFiles].join(' + '));
      expect(await page.locator('#map-preview th[data-role="flow"]').count()).toBe(1);
      expect(await page.locator('#map-preview th[data-role="co2"]').textContent()).toBe('CO2');
      await page.click('#analyse-button');
      expect(await waitState(page, ['done', 'error'])).toBe('done');
      expect(Number(await page.textContent('#sum-found'))).toBe(JSON.parse(ref('summary.json')).breaths.found);
      expect(await downloadText(page, '#export-summary')).toBe(ref('summary.json'));
      expect(await downloadText(page, '#export-breaths')).toBe(ref('breaths.csv'));
      expect(await downloadText(page, '#export-report')).toBe(ref('report.html'));
      // a WFDB record has no annotations: no list, no marker
      expect(await page.isHidden('#annotations')).toBe(true);
      expect(await page.isVisible('#caution')).toBe(true);
    });
  }

  it('a WFDB header chosen without one of its signal files: the one-line message names it; dropped together they open', async () => {
    await page.setInputFiles('#file-input', [join(tmp, 'f212.hea'), join(tmp, 'f212_flow.dat')]);
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('sniff-error');
    const message = (await page.textContent('#map-error'))!;
    expect(message).toBe('f212.hea: the signal file "f212_co2.dat" named by the header is not among the files given ("f212_flow.dat"). Choose the .hea file together with its signal files.');
    expect(message).not.toContain('\n');
    expect(await page.isDisabled('#analyse-button')).toBe(true);
    // dropped together, the files open as one record
    const files = ['f212.hea', 'f212_flow.dat', 'f212_co2.dat'].map((n) => ({ name: n, bytes: [...readFileSync(join(tmp, n))] }));
    await page.evaluate((fs) => {
      const dt = new DataTransfer();
      for (const f of fs) dt.items.add(new File([new Uint8Array(f.bytes)], f.name));
      document.documentElement.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, files);
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
    expect(await page.textContent('#file-name')).toContain('f212.hea + f212_flow.dat + f212_co2.dat');
    // a signal file alone is read as a text table, which it is not: the message says to choose it with its header
    await page.setInputFiles('#file-input', join(tmp, 'f16.dat'));
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('sniff-error');
    expect(await page.textContent('#map-error')).toMatch(/^f16\.dat.*; if it is a WFDB signal file, choose it together with its \.hea header\.$/);
  });

  it('two recordings chosen at once: one line asking for one recording at a time', async () => {
    await page.setInputFiles('#file-input', [join(tmp, 'c100.edf'), join(tmp, 'b50.bdf')]);
    await page.waitForSelector('#error-box', { state: 'visible' });
    expect(await page.textContent('#error-box span')).toBe('2 files were chosen: open one recording at a time (several files only for a WFDB record: its .hea file together with its signal files).');
    await page.click('#error-box button');
  });

  it('no page error or console error', () => {
    expect(problems).toEqual([]);
  });
});
