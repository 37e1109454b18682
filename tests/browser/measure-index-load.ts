// Measures how fast a large study index opens (not part of the test suite; tests never time; needs /usr/bin/chromium):
//   npx tsx tests/browser/measure-index-load.ts [RECORDINGS ...]   (default 300 1000)
// For each size, builds index.html from that many hand-made entries with one real-sized thumbnail (the builder the
// batch uses) and opens it from file:// five times in headless Chromium; prints the file size and the load event's
// time (navigation timing, ms) as min-max of the five.
import { mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { studyIndexHtml, type StudyIndexEntry } from '../../src/report/html/study-index';
import { haveChromium, launchBrowser } from './harness';

if (!haveChromium()) {
  process.stderr.write('measure-index-load: /usr/bin/chromium not found (apt-get install -y chromium)\n');
  process.exit(2);
}
const sizes = process.argv.slice(2).map(Number).filter((n) => n > 0);
// a thumbnail of typical size (~3 kB): 40 polylines of 20 points
const line = Array.from({ length: 20 }, (_, i) => `${i * 3},${20 - i}`).join(' ');
const thumb = `<svg viewBox="0 0 60 24" width="60" height="24">${Array.from({ length: 40 }, () => `<polyline points="${line}"/>`).join('')}</svg>`;
const dir = mkdtempSync(join(tmpdir(), 'phasewise-index-load-'));
const browser = await launchBrowser();
try {
  for (const n of sizes.length ? sizes : [300, 1000]) {
    const entries: StudyIndexEntry[] = Array.from({ length: n }, (_, k) => ({
      table: { recording: `r${String(k).padStart(4, '0')}.csv`, status: 'ok', duration_s: 600 + k, breaths_found: 100, breaths_ok: 100 - (k % 40),
        breaths_caution: 0, breaths_excluded: k % 40, delay_s: 1, delay_origin: 'estimated', vd_aw_ml_median: 150 + (k % 7) },
      events: 0, delay_uncertainty_s: 0.001, delay_trusted: true, cautions: [], report: null, thumb,
    }));
    const file = join(dir, `index-${n}.html`);
    writeFileSync(file, studyIndexHtml(entries, 'measure'));
    const times: number[] = [];
    for (let r = 0; r < 5; r++) {
      const page = await browser.ctx.newPage();
      await page.goto(pathToFileURL(file).href);
      times.push(await page.evaluate(() => (performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming).loadEventEnd));
      await page.close();
    }
    console.log(`${n} recordings: ${(statSync(file).size / 1e6).toFixed(2)} MB, load event ${Math.min(...times).toFixed(0)}-${Math.max(...times).toFixed(0)} ms (5 runs)`);
  }
} finally {
  await browser.close();
  rmSync(dir, { recursive: true, force: true });
}
