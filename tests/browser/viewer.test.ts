// End-to-end test of the review viewer in real headless Chromium (Debian's /usr/bin/chromium via playwright-core).
//
// Builds the CLI and the page, runs the CLI on sample-waveforms/adult-healthy.csv (from inside that folder, so both
// tools name the file the same way), serves the page with scripts/viewer.mjs, loads the same file through the file
// input and checks: breath count and median airway dead space shown = the CLI's summary.json; every exported file
// (breaths.csv, summary.json, trends.csv, events.csv) and the saved report.html = the CLI's byte for byte; stepping with the keyboard;
// excluding a breath changes the summary (checked against a median computed here from the CLI's breaths.csv) and
// marks the exported status; re-including restores the CLI output; a blood-gas file gives the PaCO2 line and the
// same six files as `analyse --gas`; a changed setting exported as a settings file gives the CLI the same files; the
// breath view canvas is painted; a screenshot is saved; no request leaves the page's own origin and no CSP
// violation occurs.
//
// Without /usr/bin/chromium the tests are skipped with a message, except under CI=true, where that is a failure.

import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber } from '../../src/report/format';
import { CAUTION } from '../../src/report/caution';
import { BREATHS_CSV_COLUMNS } from '../../src/report/breaths-csv';
import { CHROMIUM, haveChromium, launchBrowser, recordErrors, ROOT, startViewer, type Browser, type Viewer } from './harness';

const HAVE = haveChromium();
const IN_CI = process.env.CI === 'true';
if (!HAVE) {
  const msg = `browser tests ${IN_CI ? 'FAIL' : 'SKIPPED'}: ${CHROMIUM} not found (install Debian's chromium: apt-get install -y chromium)`;
  console.warn(`\n*** ${msg} ***\n`);
}

describe.runIf(!HAVE && IN_CI)('browser available in CI', () => {
  it('needs /usr/bin/chromium when CI=true', () => {
    throw new Error(`${CHROMIUM} is missing; CI must install Debian's chromium before the browser tests`);
  });
});

const SAMPLE = 'adult-healthy.csv';
const PLAIN_FILES = ['breaths.csv', 'summary.json', 'trends.csv', 'events.csv'];
const GAS_FILES = [...PLAIN_FILES, 'gas.csv', 'paco2_estimates.csv'];
const EXPORT_BUTTON: Record<string, string> = {
  'breaths.csv': '#export-breaths',
  'summary.json': '#export-summary',
  'trends.csv': '#export-trends',
  'events.csv': '#export-events',
  'gas.csv': '#export-gas',
  'paco2_estimates.csv': '#export-estimates',
};

function run(cmd: string, args: string[], cwd: string): string {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (${r.status}):\n${r.stdout}\n${r.stderr}`);
  return r.stdout;
}

async function downloadText(page: Page, selector: string): Promise<{ name: string; text: string; bytes: Buffer }> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.click(selector)]);
  const bytes = readFileSync((await dl.path())!);
  return { name: dl.suggestedFilename(), text: bytes.toString('utf8'), bytes };
}

/** breaths.csv -> rows (numbers; empty cells NaN), for independent checks. */
function parseBreathsCsv(text: string): Record<string, string | number>[] {
  const [head, ...lines] = text.trimEnd().split('\n');
  const cols = head!.split(',');
  return lines.map((l) => {
    const cells = l.split(',');
    const o: Record<string, string | number> = {};
    cols.forEach((c, i) => (o[c] = c === 'status' ? cells[i]! : cells[i] === '' ? NaN : Number(cells[i])));
    return o;
  });
}

function medianOf(xs: number[]): number {
  const s = xs.filter(Number.isFinite).sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

async function waitState(page: Page, states: string[], timeout = 30_000): Promise<string> {
  await page.waitForFunction((ss) => ss.includes(document.body.dataset.state ?? ''), states, { timeout });
  return page.evaluate(() => document.body.dataset.state ?? '');
}

describe.skipIf(!HAVE)('review viewer in headless Chromium', () => {
  let tmp = '';
  let viewer: Viewer | null = null;
  let browser: Browser | null = null;
  let page: Page;
  let refCsv = '';
  let refSummaryText = '';
  let refSummary: { breaths: { found: number; ok: number; excluded: number }; metrics: Record<string, { median: number | null; n: number }> };
  const requests: string[] = [];
  const problems: string[] = [];

  beforeAll(async () => {
    tmp = mkdtempSync(join(tmpdir(), 'phasewise-viewer-test-'));
    run(process.execPath, ['scripts/build.mjs'], ROOT);
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', SAMPLE, '--out', join(tmp, 'ref'), '--quiet', '--report'], join(ROOT, 'sample-waveforms'));
    refCsv = readFileSync(join(tmp, 'ref', 'breaths.csv'), 'utf8');
    refSummaryText = readFileSync(join(tmp, 'ref', 'summary.json'), 'utf8');
    refSummary = JSON.parse(refSummaryText);
    viewer = await startViewer(join(tmp, 'web'));
    browser = await launchBrowser();
    page = browser.page;
    await page.addInitScript(() => {
      (window as unknown as { __csp: string[] }).__csp = [];
      document.addEventListener('securitypolicyviolation', (e) => (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI}`));
    });
    browser.ctx.on('request', (r) => requests.push(r.url())); // page and worker
    recordErrors(page, problems);
    await page.goto(viewer.url);
    await waitState(page, ['idle']);
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await viewer?.stop();
    if (tmp && !process.env.PHASEWISE_KEEP_SHOTS) rmSync(tmp, { recursive: true, force: true });
  });

  it('shows the caution line and the open screen', async () => {
    expect(await page.textContent('#caution')).toBe(CAUTION);
    expect(await page.isVisible('#caution')).toBe(true);
    expect(await page.isVisible('#drop-zone')).toBe(true);
  });

  it('prefills the column mapping from the file and analyses it', async () => {
    await page.setInputFiles('#file-input', join(ROOT, 'sample-waveforms', SAMPLE));
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
    expect(await page.textContent('#map-preview th[data-role="flow"]')).toContain('flow_lps');
    expect(await page.textContent('#map-preview th[data-role="co2"]')).toContain('co2_mmhg');
    expect(await page.locator('#map-preview tr').count()).toBeGreaterThan(5);
    expect(await page.isVisible('#caution')).toBe(true);
    await page.click('#analyse-button');
    expect(await waitState(page, ['done', 'error'])).toBe('done');
  });

  it('shows the CLI breath count and median airway dead space', async () => {
    expect(Number(await page.textContent('#sum-found'))).toBe(refSummary.breaths.found);
    expect(Number(await page.textContent('#sum-ok'))).toBe(refSummary.breaths.ok);
    const ref = refSummary.metrics.vd_aw_ml!;
    const cell = page.locator('tr[data-metric="vd_aw_ml"] td.median');
    expect(await cell.textContent()).toBe(ref.median!.toFixed(1));
    expect(await cell.getAttribute('data-value')).toBe(formatNumber(ref.median));
    expect(await page.isVisible('#caution')).toBe(true);
  });

  it('exports every file byte-identical to the CLI before any exclusion', async () => {
    for (const name of PLAIN_FILES) {
      const f = await downloadText(page, EXPORT_BUTTON[name]!);
      expect(f.name).toBe(name);
      expect(f.text, name).toBe(readFileSync(join(tmp, 'ref', name), 'utf8'));
    }
  });

  it("saves report.html byte-identical to analyse --report's", async () => {
    const f = await downloadText(page, '#export-report');
    expect(f.name).toBe('report.html');
    expect(f.text).toBe(readFileSync(join(tmp, 'ref', 'report.html'), 'utf8'));
  });

  it('steps through breaths with the arrow keys', async () => {
    const rows = parseBreathsCsv(refCsv);
    const label = () => page.textContent('#breath-label');
    expect(await label()).toBe(`breath 1 of ${rows.length}`);
    await page.locator('body').click({ position: { x: 5, y: 300 } });
    for (let k = 0; k < 3; k++) await page.keyboard.press('ArrowRight');
    expect(await label()).toBe(`breath 4 of ${rows.length}`);
    expect(await page.evaluate(() => (window as unknown as { __phasewise: { selected: number } }).__phasewise.selected)).toBe(3);
    expect(await page.textContent('#breath-metrics td[data-key="vd_aw_ml"]')).toBe((rows[3]!.vd_aw_ml as number).toFixed(1));
    await page.keyboard.press('ArrowLeft');
    expect(await label()).toBe(`breath 3 of ${rows.length}`);
    await page.keyboard.press('End');
    expect(await label()).toBe(`breath ${rows.length} of ${rows.length}`);
    await page.keyboard.press('Home');
    expect(await label()).toBe(`breath 1 of ${rows.length}`);
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    expect(await label()).toBe(`breath 4 of ${rows.length}`);
  });

  it('excludes a breath with a reason: the summary and the exports change; re-including restores them', async () => {
    const rows = parseBreathsCsv(refCsv);
    await page.selectOption('#exclude-reason', 'cough');
    await page.locator('body').click({ position: { x: 5, y: 300 } });
    await page.keyboard.press('x');
    expect(await page.textContent('#breath-status')).toBe('excluded_by_user:cough');
    expect(await waitState(page, ['done'])).toBe('done');
    expect(Number(await page.textContent('#sum-ok'))).toBe(refSummary.breaths.ok - 1);
    expect(Number(await page.textContent('#sum-excluded'))).toBe(refSummary.breaths.excluded + 1);
    // the new median, computed here from the CLI's breaths.csv without breath 4
    const others = rows.filter((r, i) => i !== 3 && r.status === 'ok').map((r) => r.vd_aw_ml as number);
    const expected = medianOf(others);
    const cell = page.locator('tr[data-metric="vd_aw_ml"] td.median');
    // (breaths.csv holds 6 significant digits, hence the tolerance)
    expect(Math.abs(Number(await cell.getAttribute('data-value')) - expected)).toBeLessThan(1e-5 * Math.abs(expected));
    expect(await cell.getAttribute('data-value')).not.toBe(formatNumber(refSummary.metrics.vd_aw_ml!.median));

    const csv = await downloadText(page, '#export-breaths');
    const refLines = refCsv.split('\n');
    const lines = csv.text.split('\n');
    expect(lines.length).toBe(refLines.length);
    const statusCol = BREATHS_CSV_COLUMNS.indexOf('status');
    const qualityCol = BREATHS_CSV_COLUMNS.indexOf('quality');
    lines.forEach((l, i) => {
      if (i !== 4) expect(l).toBe(refLines[i]);
    });
    const cells = lines[4]!.split(',');
    expect(cells[statusCol]).toBe('excluded_by_user:cough');
    expect(cells[qualityCol]).toBe('excluded');
    const rest = (c: string[]) => c.filter((_, j) => j !== statusCol && j !== qualityCol);
    expect(rest(cells)).toEqual(rest(refLines[4]!.split(',')));
    const sum = JSON.parse((await downloadText(page, '#export-summary')).text);
    expect(sum.breaths.ok).toBe(refSummary.breaths.ok - 1);
    expect(sum.breaths.excluded_by_reason.excluded_by_user).toBe(1);
    expect(sum.metrics.vd_aw_ml.n).toBe(refSummary.metrics.vd_aw_ml!.n - 1);
    expect(Math.abs(sum.metrics.vd_aw_ml.median - expected)).toBeLessThan(1e-5 * Math.abs(expected));
    expect(sum.notes.some((n: string) => n.includes('breath 4 (cough)'))).toBe(true);
    // the saved report shows the hand exclusion: one ok breath fewer, the excluded_by_user code and its note
    const report = (await downloadText(page, '#export-report')).text;
    expect(report).toContain(`data-count="ok">${refSummary.breaths.ok - 1}<`);
    expect(report).toContain('excluded_by_user');
    expect(report).toContain('breath 4 (cough)');

    await page.keyboard.press('x');
    expect(await page.textContent('#breath-status')).toBe('ok');
    expect(await waitState(page, ['done'])).toBe('done');
    expect(Number(await page.textContent('#sum-ok'))).toBe(refSummary.breaths.ok);
    expect((await downloadText(page, '#export-breaths')).text).toBe(refCsv);
    expect((await downloadText(page, '#export-summary')).text).toBe(refSummaryText);
  });

  it('paints the breath view, saves a screenshot and exports a PNG', async () => {
    // the re-inclusion before this test recomputes the outputs in the worker: under load that was still running in one
    // full run, the breath view had no scene yet and the PNG export did nothing; wait until the page is done
    expect(await waitState(page, ['done'])).toBe('done');
    await page.waitForFunction(() => (document.querySelector<HTMLCanvasElement>('#breath-chart canvas')?.width ?? 0) > 300);
    const painted = await page.evaluate(() => {
      const c = document.querySelector<HTMLCanvasElement>('#breath-chart canvas')!;
      const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
      let ink = 0;
      let co2 = 0;
      for (let i = 0; i < d.length; i += 4) {
        if (d[i + 3]! > 0 && !(d[i]! > 240 && d[i + 1]! > 240 && d[i + 2]! > 240)) ink++;
        if (Math.abs(d[i]! - 0xc0) < 30 && Math.abs(d[i + 1]! - 0x57) < 30 && Math.abs(d[i + 2]! - 0x2a) < 30 && d[i + 3]! > 200) co2++;
      }
      return { w: c.width, h: c.height, ink, co2 };
    });
    expect(painted.w).toBeGreaterThan(300);
    expect(painted.ink).toBeGreaterThan(5000);
    expect(painted.co2).toBeGreaterThan(300);
    const shot = join(tmp, 'viewer-review.png');
    await page.screenshot({ path: shot, fullPage: true });
    console.log(`screenshot: ${shot}${process.env.PHASEWISE_KEEP_SHOTS ? '' : ' (removed after the run; set PHASEWISE_KEEP_SHOTS=1 to keep it)'}`);
    expect(readFileSync(shot).subarray(1, 4).toString('latin1')).toBe('PNG');
    const png = await downloadText(page, '#export-png');
    expect(png.name).toMatch(/^adult-healthy-breath-4\.png$/);
    expect(png.bytes.subarray(1, 4).toString('latin1')).toBe('PNG');
    expect(png.bytes.readUInt32BE(16)).toBe(painted.w);
  });

  it('shows the trends', async () => {
    await page.click('#tabs button[data-pane="trends"]');
    const ids = await page.locator('#trends [data-trend]').evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.trend));
    expect(ids).toEqual(expect.arrayContaining(['deadspace', 'vdvt', 'slope3', 'petco2', 'vtco2']));
    await page.click('#tabs button[data-pane="review"]');
  });

  it('loads blood gases: PaCO2 line, dead-space areas, the same files as analyse --gas', async () => {
    const rows = parseBreathsCsv(refCsv);
    const gasDir = join(tmp, 'gasrun');
    mkdirSync(gasDir);
    copyFileSync(join(ROOT, 'sample-waveforms', SAMPLE), join(gasDir, SAMPLE));
    writeFileSync(join(gasDir, 'gas.csv'), 'time_s,paco2_mmhg\n90,40.5\n170,41.2\n');
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', SAMPLE, '--gas', 'gas.csv', '--out', 'out', '--quiet', '--report'], gasDir);
    await page.setInputFiles('#gas-input', join(gasDir, 'gas.csv'));
    await page.waitForSelector('#gas-table tr:nth-child(3)');
    expect(await waitState(page, ['done'])).toBe('done');
    await page.selectOption('#shading', 'fletcher');
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    // breath 4 starts before the first gas sample: no PaCO2 line
    expect(await page.textContent('#breath-label')).toBe(`breath 4 of ${rows.length}`);
    expect(await page.locator('#breath-metrics th', { hasText: 'with PaCO2' }).count()).toBe(0);
    // the first breath starting at or after 90 s uses the 90 s sample (as the per-breath Enghoff values do)
    const target = rows.findIndex((r) => (r.t_start_s as number) >= 90);
    await page.keyboard.press('Home');
    for (let k = 0; k < target; k++) await page.keyboard.press('ArrowRight');
    expect(await page.textContent('#breath-label')).toBe(`breath ${target + 1} of ${rows.length}`);
    expect(await page.textContent('#breath-metrics')).toContain('with PaCO2 40.5 mmHg');
    expect(await page.textContent('#breath-metrics td[data-key="vdvt_enghoff"]')).not.toBe('–');
    for (const name of GAS_FILES) {
      const f = await downloadText(page, EXPORT_BUTTON[name]!);
      expect(f.text, name).toBe(readFileSync(join(gasDir, 'out', name), 'utf8'));
    }
    expect((await downloadText(page, '#export-report')).text, 'report.html').toBe(readFileSync(join(gasDir, 'out', 'report.html'), 'utf8'));
    // the trends draw Enghoff VD/VT and PaCO2 from the estimated PaCO2 between gases beside the per-breath values
    await page.click('#tabs button[data-pane="trends"]');
    await page.waitForSelector('#trends [data-trend="vdvt"]');
    expect(await page.textContent('#trends [data-trend="vdvt"] .u-legend')).toContain('Enghoff, estimated PaCO2');
    expect(await page.textContent('#trends [data-trend="petco2"] .u-legend')).toContain('PaCO2 estimate');
    await page.click('#tabs button[data-pane="review"]');
  });

  it('takes the patient options of the gas analysis: the same files as analyse --gas --weight --gas-window', async () => {
    const gasDir = join(tmp, 'gasrun');
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', SAMPLE, '--gas', 'gas.csv', '--weight', '70', '--gas-window', '90', '--out', 'out-opts', '--quiet'], gasDir);
    // typing then leaving the field fires its change event (as a user does), which recomputes the gas table
    for (const [id, value] of [['#gas-weight', '70'], ['#gas-window', '90']] as const) {
      await page.fill(id, value);
      await page.locator(id).evaluate((el) => (el as HTMLInputElement).blur());
      expect(await waitState(page, ['done'])).toBe('done');
    }
    for (const name of ['gas.csv', 'summary.json']) {
      const f = await downloadText(page, EXPORT_BUTTON[name]!);
      expect(f.text, name).toBe(readFileSync(join(gasDir, 'out-opts', name), 'utf8'));
    }
    for (const id of ['#gas-weight', '#gas-window']) {
      await page.fill(id, '');
      await page.locator(id).evaluate((el) => (el as HTMLInputElement).blur());
      expect(await waitState(page, ['done'])).toBe('done');
    }
  });

  it("takes the blood-gas constants: the same files as analyse --settings with a gas section, which its settings file carries", async () => {
    const gasDir = join(tmp, 'gasrun');
    writeFileSync(join(gasDir, 'gas-constants.json'), JSON.stringify({ gas: { rq: 1, band_level: 0.95 } }));
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', SAMPLE, '--gas', 'gas.csv', '--settings', 'gas-constants.json', '--out', 'out-constants', '--quiet'], gasDir);
    await page.click('details.gas-constants summary');
    for (const [id, value] of [['#gas-set-rq', '1'], ['#gas-set-band_level', '0.95']] as const) {
      await page.fill(id, value);
      await page.locator(id).evaluate((el) => (el as HTMLInputElement).blur());
      expect(await waitState(page, ['done'])).toBe('done');
    }
    for (const name of ['gas.csv', 'summary.json', 'paco2_estimates.csv']) {
      const f = await downloadText(page, EXPORT_BUTTON[name]!);
      expect(f.text, name).toBe(readFileSync(join(gasDir, 'out-constants', name), 'utf8'));
    }
    const settings = await downloadText(page, '#export-settings');
    expect(JSON.parse(settings.text)).toEqual({ gas: { rq: 1, band_level: 0.95 } });
    for (const id of ['#gas-set-rq', '#gas-set-band_level']) {
      await page.fill(id, '');
      await page.locator(id).evaluate((el) => (el as HTMLInputElement).blur());
      expect(await waitState(page, ['done'])).toBe('done');
    }
  });

  it('writes a settings file the CLI reads to the same outputs', async () => {
    await page.click('#settings-button');
    await page.fill('#set-analysis-apparatus_ml', '12');
    await page.locator('#set-analysis-apparatus_ml').dispatchEvent('change');
    const settings = await downloadText(page, '#settings-save');
    expect(JSON.parse(settings.text)).toEqual({ analysis: { apparatus_ml: 12 } });
    await page.click('#settings-apply');
    expect(await waitState(page, ['done', 'error'])).toBe('done');
    // the gas file stays loaded, so the CLI gets it too
    const gasDir = join(tmp, 'gasrun');
    writeFileSync(join(gasDir, 'settings.json'), settings.bytes);
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', SAMPLE, '--gas', 'gas.csv', '--settings', 'settings.json', '--out', 'out2', '--quiet'], gasDir);
    for (const name of GAS_FILES) {
      const f = await downloadText(page, EXPORT_BUTTON[name]!);
      expect(f.text, name).toBe(readFileSync(join(gasDir, 'out2', name), 'utf8'));
      if (name === 'summary.json') expect(JSON.parse(f.text).settings['analysis.apparatus_ml']).toEqual({ value: 12, origin: 'given' });
    }
  });

  it('refuses an unusable file with a one-line message naming the file, and takes a dropped file', async () => {
    await page.click('#tabs button[data-pane="review"]').catch(() => undefined);
    await page.setInputFiles('#file-input', { name: 'notes.csv', mimeType: 'text/csv', buffer: Buffer.from('date,comment\n2024-01-01,hello\n2024-01-02,world\n') });
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('sniff-error');
    const msg = (await page.textContent('#map-error'))!;
    expect(msg).toMatch(/^notes\.csv/);
    expect(msg).not.toContain('\n');
    expect(msg).not.toMatch(/at \w+ \(|Error:/);
    expect(await page.isDisabled('#analyse-button')).toBe(true);
    // drag and drop of the sample file
    const text = readFileSync(join(ROOT, 'sample-waveforms', SAMPLE), 'utf8');
    await page.evaluate(([t, name]) => {
      const dt = new DataTransfer();
      dt.items.add(new File([t], name, { type: 'text/csv' }));
      document.documentElement.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, [text, SAMPLE] as const);
    expect(await waitState(page, ['mapped', 'sniff-error'])).toBe('mapped');
    await page.click('#analyse-button');
    expect(await waitState(page, ['done', 'error'])).toBe('done');
    expect(Number(await page.textContent('#sum-found'))).toBe(refSummary.breaths.found);
  });

  it('made no request outside its own origin and met its Content-Security-Policy', async () => {
    const foreign = requests.filter((u) => !u.startsWith(viewer!.url) && !u.startsWith('data:') && !u.startsWith('blob:'));
    expect(foreign).toEqual([]);
    expect(await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp)).toEqual([]);
    expect(problems).toEqual([]);
  });
});
