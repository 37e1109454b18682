// report.html (`analyse --report`) in real headless Chromium (Debian's /usr/bin/chromium via playwright-core), opened
// from file:// as a user would by double-click: the summary table's numbers and the breath counts equal the CLI's
// summary.json (rounded here to the registry's decimals), the caution is shown, the breath and trend charts are
// non-empty SVG, no request other than the file itself is made and no CSP violation occurs, and printing to PDF on
// A4 and on US Letter gives at most three pages (counted as `/Type /Page` objects in the PDF bytes).
// Two recordings: the messy sample (gaps, an excluded breath) and the healthy one with a blood-gas file.
//
// Without /usr/bin/chromium the tests are skipped with a message, except under CI=true, where that is a failure.

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { breathMetric, TERMINAL_SUMMARY_ROWS } from '../../src/metrics/registry';
import { CAUTION } from '../../src/report/caution';
import { CHROMIUM, haveChromium, launchBrowser, openWatched, ROOT, type Browser } from './harness';

const HAVE = haveChromium();
const IN_CI = process.env.CI === 'true';
if (!HAVE) console.warn(`\n*** report browser tests ${IN_CI ? 'FAIL' : 'SKIPPED'}: ${CHROMIUM} not found (apt-get install -y chromium) ***\n`);

describe.runIf(!HAVE && IN_CI)('browser available in CI (report)', () => {
  it('needs /usr/bin/chromium when CI=true', () => {
    throw new Error(`${CHROMIUM} is missing; CI must install Debian's chromium before the browser tests`);
  });
});

const GAS_CSV = 'time_s,paco2_mmhg,pao2_mmhg,sao2_pct,svo2_pct,hb_g_dl,fio2_pct\n60,39.5,95,97,70,13,40\n100,39.2,96,97,71,13,40\n';

interface Case {
  name: string;
  sample: string;
  extra: (tmp: string) => string[];
}

const CASES: Case[] = [
  { name: 'messy', sample: 'adult-spontaneous-messy.csv', extra: () => [] },
  { name: 'gas', sample: 'adult-healthy.csv', extra: (tmp) => ['--gas', join(tmp, 'gas.csv'), '--apparatus-ml', '30'] },
];

function run(cmd: string, args: string[], cwd: string): void {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (${r.status}):\n${r.stdout}\n${r.stderr}`);
}

/** Pages of a PDF: its `/Type /Page` objects (not the `/Pages` tree nodes). */
function pdfPages(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length;
}

describe.skipIf(!HAVE)('report.html in headless Chromium, from file://', () => {
  let tmp = '';
  let browser: Browser | null = null;

  beforeAll(async () => {
    tmp = mkdtempSync(join(tmpdir(), 'phasewise-report-test-'));
    writeFileSync(join(tmp, 'gas.csv'), GAS_CSV);
    run(process.execPath, ['scripts/build.mjs'], ROOT);
    for (const c of CASES) {
      const args = ['analyse', join('sample-waveforms', c.sample), '--out', join(tmp, c.name), '--report', '--quiet', ...c.extra(tmp)];
      run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), ...args], ROOT);
    }
    browser = await launchBrowser({ width: 900, height: 1200 });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  });

  for (const c of CASES) {
    it(`${c.name}: numbers equal summary.json, caution, non-empty charts, no outside request, A4 and Letter print ≤ 3 pages`, async () => {
      const summary = JSON.parse(readFileSync(join(tmp, c.name, 'summary.json'), 'utf8'));
      const url = pathToFileURL(join(tmp, c.name, 'report.html')).href;
      const { page, requests, problems } = await openWatched(browser!, url);

      // summary table: every median, quartile and n, and the breath counts
      let checked = 0;
      for (const key of TERMINAL_SUMMARY_ROWS) {
        const m = summary.metrics[key];
        if (!m || m.n === 0) continue;
        const d = breathMetric(key).decimals;
        for (const stat of ['median', 'p25', 'p75']) {
          const text = await page.textContent(`[data-metric="${key}"][data-stat="${stat}"]`);
          expect(Number(text), `${key} ${stat}`).toBe(Number((m[stat] as number).toFixed(d)));
        }
        expect(Number(await page.textContent(`[data-metric="${key}"][data-stat="n"]`))).toBe(m.n);
        checked++;
      }
      expect(checked).toBeGreaterThan(15);
      for (const k of ['found', 'ok', 'caution', 'excluded']) expect(Number(await page.textContent(`[data-count="${k}"]`)), k).toBe(summary.breaths[k]);
      expect(await page.textContent('#caution')).toBe(CAUTION);
      expect(await page.isVisible('#caution')).toBe(true);

      // charts: the breath chart, the overlay and the trends are drawn SVG with a data path of non-zero size
      const charts = await page.$$eval('#breaths svg, #trends svg', (svgs) =>
        svgs.map((s) => {
          const paths = Array.from(s.querySelectorAll('path')).map((p) => (p as SVGGraphicsElement).getBBox());
          const box = s.getBoundingClientRect();
          return { width: box.width, height: box.height, drawn: paths.filter((b) => b.width > 1 && b.height > 1).length };
        }),
      );
      expect(charts.length).toBe(2 + 6);
      for (const ch of charts) {
        expect(ch.width).toBeGreaterThan(100);
        expect(ch.height).toBeGreaterThan(50);
        expect(ch.drawn).toBeGreaterThan(0);
      }

      for (const format of ['A4', 'Letter']) {
        const pages = pdfPages(Buffer.from(await page.pdf({ format })));
        expect(pages, format).toBeGreaterThanOrEqual(1);
        expect(pages, format).toBeLessThanOrEqual(3);
      }

      expect(requests).toEqual([url]);
      expect(problems).toEqual([]);
      await page.close();
    });
  }

  it('the page counter counts page objects, not the page tree', () => {
    const fake = Buffer.from('1 0 obj << /Type /Pages /Kids [2 0 R 3 0 R] >> 2 0 obj << /Type /Page >> 3 0 obj <</Type/Page/Parent 1 0 R>>', 'latin1');
    expect(pdfPages(fake)).toBe(2);
  });
});
